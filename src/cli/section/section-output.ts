/**
 * Writing what a `section` subcommand made: the metadata text stored in the
 * file (the same `{ tool, version, ..., sheet }` JSON a plate carries), the
 * output itself (temp file + rename), and the JSON sidecar FILE.json holding
 * `{ metadata, summary }` as plates write it.
 */
import { mkdir, stat } from 'node:fs/promises';
import path from 'node:path';
import { writeFileAtomic } from '../../io/write-file-atomic.js';
import type { Json } from '../../section/sheet-fields.js';
import { Received, UserError } from '../../check/user-error.js';
import { toolVersion } from '../../io/tool-version.js';

/** The metadata JSON text: tool, version, derived values (for the reader), then the sheet. */
export function sectionMetadata(record: Json, derived: Json = {}): string {
  return JSON.stringify({ tool: 'quadatlas', version: toolVersion(), ...derived, sheet: record });
}

/**
 * Checks, before any work, that `file` can be written: not an existing
 * directory, and its directory exists or can be created.
 */
export async function prepareOutput(file: string, field: string): Promise<void> {
  const isDir = await stat(file).then(
    (s) => s.isDirectory(),
    () => false,
  );
  if (isDir) throw new UserError(field, 'a file name (this is an existing directory)', file);
  const dir = path.dirname(path.resolve(file));
  try {
    await mkdir(dir, { recursive: true });
  } catch (err) {
    throw new UserError(field, 'a file in a directory that exists or can be created', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? 'error'})`));
  }
}

export async function writeOutput(file: string, data: string | Uint8Array, field: string): Promise<void> {
  try {
    await writeFileAtomic(file, data);
  } catch (err) {
    throw new UserError(field, 'a writable file path', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`));
  }
}

/** Writes FILE.json = { metadata, summary } and returns its name. */
export async function writeSidecar(file: string, metadata: string, summary: Json, field: string): Promise<string> {
  const sidecar = `${file}.json`;
  await writeOutput(sidecar, `${JSON.stringify({ metadata: JSON.parse(metadata) as unknown, summary }, null, 2)}\n`, field);
  return sidecar;
}
