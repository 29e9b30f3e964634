/**
 * Pyramid benchmarks, through the built command line as a user would run it:
 * a whole pyramid of a 16384 x 16384 base (wall time, tiles per second, peak
 * memory), and a 65536 x 65536 run stopped after a bounded time, whose peak
 * memory shows that memory does not grow with the base size. The stop time
 * is QUADATLAS_BENCH_PYRAMID_STOP seconds (default 120).
 */
import { spawn, spawnSync } from 'node:child_process';
import { mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';

/** The CLI built beside this file (dist/bench -> dist/src/cli). */
const CLI = path.join(path.dirname(fileURLToPath(import.meta.url)), '../src/cli/main.js');
const VIEW = ['--center', '-0.75,0', '--span', '3', '--iterations', '1000', '--samples', '4'];

interface Summary {
  seconds: number;
  tilesPerSecond: number;
  peakMemoryMiB: number;
  levels: number;
  tiles: { total: number; rendered: number };
  bytesWritten: number;
}

/** VmHWM (peak resident set) of a running process, MiB, from /proc (Linux). */
function peakOf(pid: number): number | null {
  try {
    const m = /VmHWM:\s+(\d+) kB/.exec(readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Math.round(Number(m[1]) / 1024) : null;
  } catch {
    return null;
  }
}

function countTiles(dir: string): number {
  let n = 0;
  const walk = (d: string): void => {
    let entries;
    try {
      entries = readdirSync(d, { withFileTypes: true });
    } catch {
      return;
    }
    for (const e of entries) {
      if (e.isDirectory()) walk(path.join(d, e.name));
      else if (e.name.startsWith('default.')) n++;
    }
  };
  walk(dir);
  return n;
}

async function stoppedRun(size: string, stopSeconds: number): Promise<{ seconds: number; tiles: number; peakMiB: number | null }> {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-pyr-'));
  try {
    const child = spawn(process.execPath, [CLI, 'pyramid', ...VIEW, '--size', size, '--out-dir', path.join(dir, 'p')], { stdio: 'ignore' });
    const t0 = performance.now();
    let peak: number | null = null;
    while (child.exitCode === null && performance.now() - t0 < stopSeconds * 1000) {
      await new Promise((r) => setTimeout(r, 500));
      peak = peakOf(child.pid!) ?? peak;
    }
    const seconds = (performance.now() - t0) / 1000;
    child.kill('SIGKILL');
    await new Promise((r) => (child.exitCode === null ? child.once('exit', r) : r(undefined)));
    return { seconds, tiles: countTiles(path.join(dir, 'p', 'tiles')), peakMiB: peak };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export const pyramidSection: BenchSection = {
  name: 'pyramid',
  title: 'pyramids through the CLI: a 16384^2 base in full, and a 65536^2 base stopped after a bounded time',
  async run(context: BenchContext): Promise<BenchRow[]> {
    const stop = Number(process.env['QUADATLAS_BENCH_PYRAMID_STOP'] ?? 120);
    const cores = os.availableParallelism();
    const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-pyr-'));
    let full: Summary;
    try {
      const warm = spawnSync(process.execPath, [CLI, 'pyramid', ...VIEW, '--size', '512x512', '--out-dir', path.join(dir, 'warm')], { encoding: 'utf8' });
      if (warm.status !== 0) throw new Error(`pyramid failed: ${warm.stderr}`);
      const r = spawnSync(process.execPath, [CLI, 'pyramid', ...VIEW, '--size', '16384x16384', '--out-dir', path.join(dir, 'p'), '--json'], {
        encoding: 'utf8',
        maxBuffer: 1 << 24,
      });
      if (r.status !== 0) throw new Error(`pyramid failed: ${r.stderr}`);
      full = JSON.parse(r.stdout) as Summary;
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
    const big = await stoppedRun('65536x65536', stop);
    context.note(`whole set (-0.75,0 span 3), 1000 iterations, 4 samples per refined pixel, 256-pixel PNG tiles, ${cores} workers`);
    context.note(`the 65536^2 run (87381 tiles in 9 levels, coarsest first) was killed after ${stop} s; its peak is VmHWM read from /proc every 0.5 s`);
    return [
      {
        label: `16384x16384 base, ${full.levels} levels`,
        figures: {
          tiles: full.tiles.total,
          seconds: full.seconds,
          'tiles/s': full.tilesPerSecond,
          'peak MiB': full.peakMemoryMiB,
          'MiB written': Math.round(full.bytesWritten / 2 ** 20),
        },
      },
      {
        label: `65536x65536 base, stopped after ${stop} s`,
        figures: { tiles: big.tiles, seconds: big.seconds, 'tiles/s': big.tiles / big.seconds, 'peak MiB': big.peakMiB, 'MiB written': null },
      },
    ];
  },
};
