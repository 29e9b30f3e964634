import { constants } from 'node:fs';
import { access, stat } from 'node:fs/promises';
import { UserError } from '../cli/user-error.js';

/**
 * Throws UserError(field, 'a writable directory', path) unless `path` names an
 * existing directory this process may create files in.
 */
export async function checkWritableDirectory(path: string, field: string): Promise<void> {
  let isDir = false;
  try {
    isDir = (await stat(path)).isDirectory();
  } catch {
    isDir = false;
  }
  if (!isDir) throw new UserError(field, 'a writable directory', path);
  try {
    await access(path, constants.W_OK | constants.X_OK);
  } catch {
    throw new UserError(field, 'a writable directory', path);
  }
}
