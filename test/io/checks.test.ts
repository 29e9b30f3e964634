import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { pathToFileURL } from 'node:url';
import { chmod, mkdir, readdir, readFile, statfs, writeFile } from 'node:fs/promises';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { UserError } from '../../src/check/user-error.js';
import { checkFreeSpace, formatBytes } from '../../src/io/check-free-space.js';
import { checkWritableDirectory } from '../../src/io/check-writable-directory.js';
import { writeFileAtomic } from '../../src/io/write-file-atomic.js';
import { scratchDir } from './io-fixtures.js';

let dir = '';
let cleanup: () => Promise<void> = async () => undefined;
beforeEach(async () => ({ dir, cleanup } = await scratchDir()));
afterEach(async () => {
  await chmod(dir, 0o755).catch(() => undefined);
  await cleanup();
});

describe('checkWritableDirectory', () => {
  it('accepts a writable directory and leaves nothing in it', async () => {
    await expect(checkWritableDirectory(dir, 'out')).resolves.toBeUndefined();
    expect(await readdir(dir)).toEqual([]);
  });

  it('throws a UserError naming the field for a missing directory', async () => {
    const missing = path.join(dir, 'nope');
    const err = await checkWritableDirectory(missing, 'out').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(UserError);
    expect((err as UserError).message).toBe(`Expected a writable directory for out but received ${JSON.stringify(missing)}`);
  });

  it('throws a UserError for a path that is a file, not a directory', async () => {
    await writeFile(path.join(dir, 'f'), 'x');
    await expect(checkWritableDirectory(path.join(dir, 'f'), 'out')).rejects.toBeInstanceOf(UserError);
  });

  // Permission bits do not bind root: as root, the check runs in a child as an unprivileged user
  // (uid 65534) on a directory with mode 0555 (built dist/), so the read-only case is tested either way.
  it('throws a UserError for a read-only directory', async () => {
    if (process.getuid?.() !== 0) {
      const ro = path.join(dir, 'ro');
      await mkdir(ro);
      await chmod(ro, 0o555);
      await expect(checkWritableDirectory(ro, 'out')).rejects.toBeInstanceOf(UserError);
      return;
    }
    const base = mkdtempSync(path.join(tmpdir(), 'quadatlas-ro-'));
    try {
      await chmod(base, 0o755);
      const ro = path.join(base, 'ro');
      await mkdir(ro);
      await chmod(ro, 0o555);
      const module = pathToFileURL(path.resolve('dist/src/io/check-writable-directory.js')).href;
      const program = `import(${JSON.stringify(module)}).then((m) => m.checkWritableDirectory(${JSON.stringify(ro)}, 'out')).then(() => process.exit(0), (e) => process.exit(e.name === 'UserError' ? 3 : 1))`;
      const r = spawnSync(process.execPath, ['--input-type=module', '-e', program], { uid: 65534, gid: 65534, encoding: 'utf8' });
      expect(r.status, r.stderr).toBe(3);
    } finally {
      rmSync(base, { recursive: true, force: true });
    }
  });

  // For root as well: Linux's /sys accepts no new files from anyone (sysfs), though access(2) says W_OK.
  it('throws a UserError for a directory no one may create files in (/sys)', async () => {
    await expect(checkWritableDirectory('/sys', 'out')).rejects.toBeInstanceOf(UserError);
  });
});

describe('checkFreeSpace', () => {
  it('passes when the disk holds the bytes and throws a UserError when it cannot', async () => {
    const s = await statfs(dir);
    const free = s.bavail * s.bsize;
    await expect(checkFreeSpace(dir, 1024, 'out')).resolves.toBeUndefined();
    const err = await checkFreeSpace(dir, free + 2 ** 40, 'out').catch((e: unknown) => e);
    expect(err).toBeInstanceOf(UserError);
    expect((err as UserError).field).toBe('out');
    expect((err as UserError).message).toMatch(/^Expected a directory with at least .* free for out but received /);
  });

  it('formats byte counts in binary units', () => {
    expect([formatBytes(512), formatBytes(1536), formatBytes(3 * 2 ** 30)]).toEqual(['512 B', '1.5 KiB', '3.0 GiB']);
  });
});

describe('writeFileAtomic', () => {
  it('writes text as UTF-8 and bytes as given, replacing an existing file, with no temporary left', async () => {
    const file = path.join(dir, 'a.json');
    await writeFile(file, 'old');
    await writeFileAtomic(file, '{"venue":"Harrowgate Institute","Ω":1}');
    expect(await readFile(file, 'utf8')).toBe('{"venue":"Harrowgate Institute","Ω":1}');
    await writeFileAtomic(file, new Uint8Array([0, 255, 1]));
    expect(Array.from(await readFile(file))).toEqual([0, 255, 1]);
    expect(await readdir(dir)).toEqual(['a.json']);
  });

  it('leaves no file when the directory is missing', async () => {
    await expect(writeFileAtomic(path.join(dir, 'no', 'a.json'), 'x')).rejects.toThrow(/ENOENT/);
    expect(await readdir(dir)).toEqual([]);
  });
});
