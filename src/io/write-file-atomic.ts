import { open, rename, rm } from 'node:fs/promises';
import { releaseTemp, tempPathFor } from './temp-path.js';

/**
 * Writes `data` (a string is written as UTF-8) to `path` all at once: to a
 * temporary name beside it, flushed to disk, then renamed over `path`, so a
 * reader sees the old file or the whole new one, never half of it.
 */
export async function writeFileAtomic(path: string, data: string | Uint8Array): Promise<void> {
  const tmp = tempPathFor(path);
  try {
    const fh = await open(tmp, 'wx');
    try {
      await fh.writeFile(data);
      await fh.sync();
    } finally {
      await fh.close();
    }
    await rename(tmp, path);
  } catch (err) {
    await rm(tmp, { force: true });
    throw err;
  } finally {
    releaseTemp(tmp);
  }
}
