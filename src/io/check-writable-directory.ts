import { mkdir, stat, open, rm } from 'node:fs/promises';
import path from 'node:path';
import { Received, UserError } from '../check/user-error.js';
import { releaseTemp, tempPathFor } from './temp-path.js';

/**
 * Throws UserError(field, 'a writable directory', path) unless `path` names an
 * existing directory in which this process can create a file. It creates and
 * removes a hidden probe file rather than asking access(2): access answers
 * yes for root on read-only trees such as /proc and for mounts that refuse
 * writes for other reasons.
 */
export async function checkWritableDirectory(dir: string, field: string): Promise<void> {
  let isDir = false;
  try {
    isDir = (await stat(dir)).isDirectory();
  } catch {
    isDir = false;
  }
  if (!isDir) throw new UserError(field, 'a writable directory', dir);
  const probe = tempPathFor(path.join(dir, 'probe'));
  try {
    const fh = await open(probe, 'wx');
    await fh.close();
  } catch {
    releaseTemp(probe);
    throw new UserError(field, 'a writable directory', dir);
  }
  await rm(probe, { force: true });
  releaseTemp(probe);
}

/**
 * Checks, before any work, that `file` can be written: it is not an existing
 * directory, and its directory exists or can be created and takes a new file.
 */
export async function prepareOutputFile(file: string, field: string): Promise<void> {
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
  await checkWritableDirectory(dir, field);
}
