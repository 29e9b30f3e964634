import { statfs } from 'node:fs/promises';
import { UserError } from '../check/user-error.js';

/**
 * Throws a UserError naming `field` when the file system holding `dir` has
 * fewer than `bytesNeeded` bytes available to this (unprivileged) process
 * (statfs bavail * bsize). A directory statfs cannot read passes silently:
 * the write itself will then report the real problem.
 */
export async function checkFreeSpace(dir: string, bytesNeeded: number, field: string): Promise<void> {
  let available: number;
  try {
    const s = await statfs(dir);
    available = s.bavail * s.bsize;
  } catch {
    return;
  }
  if (bytesNeeded > available) {
    throw new UserError(field, `a directory with at least ${formatBytes(bytesNeeded)} free`, `${dir} (${formatBytes(available)} free)`);
  }
}

/** Bytes in the largest binary unit that keeps the number at or above 1. */
export function formatBytes(n: number): string {
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB', 'PiB'];
  let v = n;
  let u = 0;
  while (v >= 1024 && u < units.length - 1) {
    v /= 1024;
    u += 1;
  }
  return u === 0 ? `${v} B` : `${v.toFixed(1)} ${units[u]}`;
}
