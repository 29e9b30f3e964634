/**
 * pyramid.json: the record of a pyramid in its own output folder. It is
 * written before the first tile, so every later run (a resumed run, another
 * shard, `--finish`, a queue worker on another machine) renders from the same
 * record and refuses a folder that holds something else.
 */
import { addTempRoot, removeStaleTempsUnder } from './temp-path.js';
import { createHash } from 'node:crypto';
import { mkdir, readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { Received, UserError } from '../check/user-error.js';
import { sameSpec, type PyramidSpec } from '../view/pyramid-spec.js';
import { writeFileAtomic } from './write-file-atomic.js';

export const MANIFEST_NAME = 'pyramid.json';

/** A short key for a (folder, spec) pair: queue job ids and worker caches use it. */
export function pyramidKey(dir: string, spec: PyramidSpec): string {
  return createHash('sha256').update(path.resolve(dir)).update('\0').update(JSON.stringify(spec)).digest('hex').slice(0, 16);
}

/** The spec recorded in `dir`, or undefined when there is none. */
export async function readPyramidSpec(dir: string, field = '--out-dir'): Promise<PyramidSpec | undefined> {
  let text: string;
  try {
    text = await readFile(path.join(dir, MANIFEST_NAME), 'utf8');
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === 'ENOENT' || (err as NodeJS.ErrnoException).code === 'ENOTDIR') return undefined;
    throw new UserError(field, 'a readable pyramid folder', new Received(`${dir} (${(err as NodeJS.ErrnoException).code ?? 'unreadable'})`));
  }
  try {
    const spec = JSON.parse(text) as PyramidSpec;
    if (spec.kind !== 'pyramid' || typeof spec.tileSize !== 'number') throw new Error('not a pyramid record');
    return spec;
  } catch (err) {
    throw new UserError(field, `a folder whose ${MANIFEST_NAME} was written by quadatlas`, new Received(`${dir} (${(err as Error).message})`));
  }
}

/** Our own temporary files (tempPathFor) do not make a folder non-empty. */
function isTemporary(name: string): boolean {
  return /^\..*\.tmp$/.test(name);
}

/**
 * Makes `dir` ready for the pyramid `spec`: creates it, and writes the record
 * when the folder is empty; accepts a folder that already holds the same
 * pyramid (resume, another shard); refuses anything else.
 */
export async function preparePyramidDir(dir: string, spec: PyramidSpec): Promise<void> {
  try {
    await mkdir(dir, { recursive: true });
  } catch (err) {
    throw new UserError('--out-dir', 'a folder that exists or can be created', new Received(`${dir} (${(err as NodeJS.ErrnoException).code ?? 'error'})`));
  }
  addTempRoot(dir);
  await removeStaleTempsUnder(dir);
  const check = (existing: PyramidSpec): void => {
    if (!sameSpec(existing, spec)) {
      throw new UserError(
        '--out-dir',
        'an empty folder or one holding this same pyramid',
        new Received(`${dir} (holds a pyramid of a different sheet, size, tile size or format)`),
      );
    }
    if (existing.version !== spec.version) {
      throw new UserError(
        '--out-dir',
        `a pyramid started by quadatlas ${spec.version} (tiles of two versions may not match)`,
        new Received(`${dir} (started by quadatlas ${existing.version})`),
      );
    }
  };
  const existing = await readPyramidSpec(dir);
  if (existing !== undefined) return check(existing);
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => !isTemporary(n));
  } catch (err) {
    throw new UserError('--out-dir', 'a readable folder', new Received(`${dir} (${(err as NodeJS.ErrnoException).code ?? 'error'})`));
  }
  if (names.length > 0) {
    // Another shard or producer may have written the record between the two looks.
    const late = await readPyramidSpec(dir);
    if (late !== undefined) return check(late);
    throw new UserError('--out-dir', 'an empty folder or one holding this same pyramid', new Received(`${dir} (not empty and has no ${MANIFEST_NAME})`));
  }
  try {
    await writeFileAtomic(path.join(dir, MANIFEST_NAME), `${JSON.stringify(spec, null, 2)}\n`);
  } catch (err) {
    throw new UserError('--out-dir', 'a writable folder', new Received(`${dir} (${(err as NodeJS.ErrnoException).code ?? 'error'})`));
  }
}
