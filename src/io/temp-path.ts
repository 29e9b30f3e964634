import { randomBytes } from 'node:crypto';
import path from 'node:path';

/**
 * A fresh temporary name beside `finalPath` (same directory, so the final
 * rename stays on one file system and is atomic): ".<name>.<random>.tmp".
 * Hidden and ending in .tmp so a half-written file never looks like a result.
 */
export function tempPathFor(finalPath: string): string {
  const dir = path.dirname(finalPath);
  const base = path.basename(finalPath);
  return path.join(dir, `.${base}.${randomBytes(6).toString('hex')}.tmp`);
}
