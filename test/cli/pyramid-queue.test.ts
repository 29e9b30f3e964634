import { requireInCi } from '../helpers/require-in-ci.js';
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, rmSync } from 'node:fs';
import { createServer } from 'node:net';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { checkRedis } from '../../src/render/pyramid-queue.js';
import { CLI, tempDir } from '../helpers/run-cli.js';
import { runWithEnv, treeDifferences, treeFiles } from './pyramid-helpers.js';

const REDIS = '/usr/bin/redis-server';
const haveRedis = existsSync(REDIS);
if (!haveRedis) console.warn('skipping queue-mode tests: redis-server is not installed (apt-get install redis-server; .ci/run installs it)');

const COMMON = ['--center', '-0.75,0.1', '--span', '2.9', '--size', '400x256', '--iterations', '200', '--samples', '4', '--tile-size', '64', '--base-url', 'http://127.0.0.1:9/p'];
const TILE_COUNT = 39;

let root: string;
let redis: ChildProcess | undefined;
let url: string;

async function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer().listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

interface Finished {
  code: number | null;
  stdout: string;
  stderr: string;
}

function start(args: readonly string[], env: Record<string, string> = {}): { child: ChildProcess; done: Promise<Finished> } {
  const child = spawn(process.execPath, [CLI, ...args], { env: { ...process.env, NO_COLOR: '1', ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout!.on('data', (d: Buffer) => (stdout += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
  const done = new Promise<Finished>((resolve) => child.once('exit', (code) => resolve({ code, stdout, stderr })));
  return { child, done };
}

beforeAll(async () => {
  root = tempDir('quadatlas-queue-');
  if (!haveRedis) return;
  const port = await freePort();
  url = `redis://127.0.0.1:${port}`;
  redis = spawn(REDIS, ['--port', String(port), '--bind', '127.0.0.1', '--save', '', '--appendonly', 'no'], { stdio: 'ignore' });
  for (let i = 0; ; i++) {
    try {
      await checkRedis({ host: '127.0.0.1', port, db: 0 });
      break;
    } catch (err) {
      if (i > 100) throw err;
      await new Promise((r) => setTimeout(r, 50));
    }
  }
});

afterAll(async () => {
  if (redis !== undefined && redis.exitCode === null) {
    const gone = new Promise((r) => redis!.once('exit', r));
    redis.kill('SIGTERM');
    await gone;
  }
  rmSync(root, { recursive: true, force: true });
});

describe.skipIf(!requireInCi(haveRedis, 'redis-server'))('quadatlas pyramid --queue with quadatlas worker', () => {
  it('two workers share the tiles, a tile made to fail once is retried, two producers of one pyramid render each tile once, and the result equals the single run', async () => {
    const single = path.join(root, 'single');
    expect(runWithEnv(['pyramid', ...COMMON, '--out-dir', single]).status).toBe(0);

    const workers = [0, 1].map(() => start(['worker', '--queue', url, '--workers', '1', '--json'], { QUADATLAS_FAIL_ONCE: '2,5' }));
    const dir = path.join(root, 'queued');
    const producers = [0, 1].map(() => start(['pyramid', ...COMMON, '--out-dir', dir, '--queue', url, '--json']));
    const results = await Promise.all(producers.map((p) => p.done));
    for (const r of results) {
      expect(r.stderr).not.toMatch(/error|expected/i);
      expect(r.code, r.stderr).toBe(0);
      expect(JSON.parse(r.stdout)).toMatchObject({ mode: 'queue', finished: true, tiles: { total: TILE_COUNT, missing: 0 } });
    }
    // Clean shutdown: SIGTERM, the tiles in hand are finished, exit code 0.
    for (const w of workers) w.child.kill('SIGTERM');
    const stopped = await Promise.all(workers.map((w) => w.done));
    const summaries = stopped.map((s) => {
      expect(s.code).toBe(0);
      return JSON.parse(s.stdout) as { tiles: { rendered: number; skipped: number; failedAttempts: number } };
    });
    for (const s of summaries) expect(s.tiles.rendered).toBeGreaterThan(0);
    expect(summaries[0]!.tiles.rendered + summaries[1]!.tiles.rendered).toBe(TILE_COUNT);
    expect(summaries[0]!.tiles.failedAttempts + summaries[1]!.tiles.failedAttempts).toBe(2);
    expect(treeDifferences(treeFiles(dir), treeFiles(single))).toEqual([]);

    // Run again on the finished folder: nothing to queue, the same files.
    const again = runWithEnv(['pyramid', ...COMMON, '--out-dir', dir, '--queue', url, '--json']);
    expect(again.status).toBe(0);
    expect(JSON.parse(again.stdout)).toMatchObject({ tiles: { share: 0, rendered: 0, skipped: TILE_COUNT } });
    expect(treeDifferences(treeFiles(dir), treeFiles(single))).toEqual([]);
  });
});
