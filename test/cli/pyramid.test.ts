import { spawn } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { PNG } from 'pngjs';
import sharp from 'sharp';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CLI, tempDir } from '../helpers/run-cli.js';
import { pngSize, promisedTiles, runWithEnv, treeDifferences, treeFiles } from './pyramid-helpers.js';

// A small pyramid: 400x256 base in 64-pixel tiles = 4 levels, 28 + 8 + 2 + 1 tiles.
const VIEW = ['--center', '-0.75,0.1', '--span', '2.9', '--size', '400x256', '--iterations', '200', '--samples', '4'];
const COMMON = [...VIEW, '--tile-size', '64', '--base-url', 'http://127.0.0.1:9/p'];
const TILE_COUNT = 39;

let root: string;
let single: string;
let singleTree: Map<string, Buffer>;

beforeAll(() => {
  root = tempDir('quadatlas-pyramid-');
  single = path.join(root, 'single');
  const r = runWithEnv(['pyramid', ...COMMON, '--out-dir', single, '--json']);
  expect(r.stderr).toBe('');
  expect(r.status).toBe(0);
  singleTree = treeFiles(single);
});

afterAll(() => rmSync(root, { recursive: true, force: true }));

describe('quadatlas pyramid', () => {
  it('pyramid --json reports every tile rendered, the levels, time and peak memory', () => {
    const dir = path.join(root, 'again');
    const r = runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--json', '--workers', '1']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout) as { tiles: { total: number; rendered: number; skipped: number }; levels: number; finished: boolean; peakMemoryMiB: number; seconds: number };
    expect(s.tiles).toMatchObject({ total: TILE_COUNT, rendered: TILE_COUNT, skipped: 0 });
    expect(s.levels).toBe(4);
    expect(s.finished).toBe(true);
    expect(s.peakMemoryMiB).toBeGreaterThan(10);
    // One worker or all cores: the same bytes.
    expect(treeDifferences(treeFiles(dir), singleTree)).toEqual([]);
  });

  it('pyramid writes the tiles info.json promises (IIIF 3.0 paths), each a PNG of the promised size, and nothing else', () => {
    const info = JSON.parse(readFileSync(path.join(single, 'tiles/info.json'), 'utf8')) as Parameters<typeof promisedTiles>[0] & Record<string, unknown>;
    expect(info).toMatchObject({
      '@context': 'http://iiif.io/api/image/3/context.json',
      id: 'http://127.0.0.1:9/p/tiles',
      type: 'ImageService3',
      protocol: 'http://iiif.io/api/image',
      profile: 'level0',
      width: 400,
      height: 256,
    });
    const promised = promisedTiles(info, 'png');
    expect(promised).toHaveLength(TILE_COUNT);
    for (const t of promised) {
      const bytes = singleTree.get(path.join('tiles', t.path));
      expect(bytes, t.path).toBeDefined();
      expect(pngSize(bytes!), t.path).toEqual([t.width, t.height]);
    }
    for (const s of info['sizes'] as Array<{ width: number; height: number }>) expect(singleTree.has(`tiles/full/${s.width},${s.height}/0/default.png`)).toBe(true);
    const tileFiles = [...singleTree.keys()].filter((k) => k.startsWith('tiles/') && k.endsWith('.png'));
    expect(tileFiles).toHaveLength(TILE_COUNT);
    const js = singleTree.get('tiles/info.js')!.toString();
    expect(
      JSON.parse(
        js
          .slice(js.indexOf('=') + 1)
          .trim()
          .replace(/;$/, ''),
      ),
    ).toEqual(info);
    expect(singleTree.has('index.html') && singleTree.has('viewer/openseadragon.min.js') && singleTree.has('viewer/LICENSE.txt')).toBe(true);
  });

  it('pyramid shards (flag, Slurm and Kubernetes variables) then --finish give the single run byte for byte', () => {
    const dir = path.join(root, 'shards');
    const a = runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--shard', '0/3', '--json']);
    expect(a.status).toBe(0);
    expect(JSON.parse(a.stdout)).toMatchObject({ mode: 'shard', shard: '0/3', finished: false, tiles: { share: 13, rendered: 13 } });
    // Too early: tiles of shards 1 and 2 are missing.
    const early = runWithEnv(['pyramid', '--finish', '--out-dir', dir]);
    expect(early.status).toBe(2);
    expect(early.stderr.trim().split('\n')).toHaveLength(1);
    expect(early.stderr).toMatch(/26 of 39 tiles missing/);
    // Slurm --array=1-5:2 task 3 is shard (3 - 1) / 2 = 1 of 3.
    const slurm = { SLURM_ARRAY_TASK_ID: '3', SLURM_ARRAY_TASK_MIN: '1', SLURM_ARRAY_TASK_STEP: '2', SLURM_ARRAY_TASK_COUNT: '3' };
    const b = runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--json'], slurm);
    expect(JSON.parse(b.stdout)).toMatchObject({ shard: '1/3' });
    const c = runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--shards', '3', '--json'], { JOB_COMPLETION_INDEX: '2' });
    expect(JSON.parse(c.stdout)).toMatchObject({ shard: '2/3' });
    const f = runWithEnv(['pyramid', '--finish', '--out-dir', dir, '--base-url', 'http://127.0.0.1:9/p', '--json']);
    expect(f.status).toBe(0);
    expect(treeDifferences(treeFiles(dir), singleTree)).toEqual([]);
  });

  it('pyramid killed part-way leaves only whole tiles, and the rerun skips them and ends with the same bytes', async () => {
    const dir = path.join(root, 'killed');
    const child = spawn(process.execPath, [CLI, 'pyramid', ...COMMON, '--out-dir', dir, '--workers', '1'], { stdio: 'ignore' });
    const countTiles = (): number => {
      let n = 0;
      const walk = (d: string): void => {
        if (!existsSync(d)) return;
        for (const e of readdirSync(d, { withFileTypes: true })) {
          if (e.isDirectory()) walk(path.join(d, e.name));
          else if (e.name.startsWith('default.')) n++;
        }
      };
      walk(path.join(dir, 'tiles'));
      return n;
    };
    while (countTiles() < 6) await new Promise((r) => setTimeout(r, 10));
    child.kill('SIGKILL');
    await new Promise((r) => child.once('exit', r));
    const partial = treeFiles(dir);
    const done = [...partial.keys()].filter((k) => k.endsWith('default.png'));
    expect(done.length).toBeGreaterThanOrEqual(6);
    expect(done.length).toBeLessThan(TILE_COUNT);
    expect(partial.has('tiles/info.json')).toBe(false);
    for (const k of done) {
      const png = PNG.sync.read(partial.get(k)!); // throws on a truncated file
      expect(partial.get(k)!.equals(singleTree.get(k)!), k).toBe(true);
      expect(png.width).toBeGreaterThan(0);
    }
    const r = runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout) as { tiles: { skipped: number; rendered: number } };
    expect(s.tiles.skipped).toBe(done.length);
    expect(s.tiles.rendered).toBe(TILE_COUNT - done.length);
    expect(treeDifferences(treeFiles(dir), singleTree)).toEqual([]);
  });

  it('pyramid --format jpg writes JPEG tiles of the promised sizes', async () => {
    const dir = path.join(root, 'jpeg');
    const r = runWithEnv([
      'pyramid',
      '--center',
      '-0.75,0',
      '--span',
      '3',
      '--size',
      '150x100',
      '--iterations',
      '100',
      '--samples',
      '1',
      '--tile-size',
      '64',
      '--format',
      'jpg',
      '--quality',
      '80',
      '--out-dir',
      dir,
    ]);
    expect(r.status).toBe(0);
    const info = JSON.parse(readFileSync(path.join(dir, 'tiles/info.json'), 'utf8')) as Parameters<typeof promisedTiles>[0];
    for (const t of promisedTiles(info, 'jpg')) {
      const m = await sharp(path.join(dir, 'tiles', t.path)).metadata();
      expect([m.format, m.width, m.height]).toEqual(['jpeg', t.width, t.height]);
    }
  });
});

describe('quadatlas pyramid: bad input', () => {
  const oneLine = (r: { status: number | null; stderr: string; stdout: string }, pattern: RegExp): void => {
    expect(r.status).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(pattern);
  };

  it('pyramid into a folder holding another view fails with one line and exit 2, and touches nothing', () => {
    const before = treeFiles(single);
    oneLine(
      runWithEnv(['pyramid', ...COMMON, '--span', '2.5', '--out-dir', single]),
      /Expected an empty folder or one holding this same pyramid for --out-dir but received .*different/,
    );
    expect(treeDifferences(treeFiles(single), before)).toEqual([]);
  });

  it('pyramid into a non-empty folder without pyramid.json fails with exit 2', () => {
    const dir = path.join(root, 'busy');
    mkdirSync(dir, { recursive: true });
    writeFileSync(path.join(dir, 'notes.txt'), 'mine');
    oneLine(runWithEnv(['pyramid', ...COMMON, '--out-dir', dir]), /not empty and has no pyramid\.json/);
  });

  it('pyramid refuses a bad --shard, --format, --tile-size and --queue URL with exit 2', () => {
    const dir = path.join(root, 'bad');
    oneLine(runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--shard', '3/3']), /for --shard/);
    oneLine(runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--format', 'gif']), /Expected png or jpg for --format/);
    oneLine(runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--tile-size', '8']), /for --tile-size/);
    oneLine(runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--queue', 'http://x']), /for --queue/);
    oneLine(runWithEnv(['pyramid', '--finish', '--out-dir', path.join(root, 'nothing-here')]), /pyramid folder/);
  });

  it('pyramid --queue and worker --queue with nobody listening fail within seconds, exit 2', () => {
    for (const args of [
      ['pyramid', ...COMMON, '--out-dir', path.join(root, 'q'), '--queue', 'redis://127.0.0.1:1'],
      ['worker', '--queue', 'redis://127.0.0.1:1'],
    ]) {
      const t0 = Date.now();
      oneLine(runWithEnv(args), /Expected a reachable Redis server for --queue but received redis:\/\/127\.0\.0\.1:1 \(ECONNREFUSED\)/);
      expect(Date.now() - t0).toBeLessThan(8000);
    }
  });
});
