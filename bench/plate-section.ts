/**
 * Renderer benchmarks, run through the built command line as a user would:
 * the speed-up of one plate from 1 worker to all workers, and the wall time
 * and peak memory of a full-set plate at 4000 x 4000 with 4 samples per pixel.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';

interface Summary {
  seconds: number;
  peakMemoryMiB: number;
  kernelSamples: number;
  pixels: { refined: number; total: number };
}

function plate(root: string, args: readonly string[]): Summary {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-'));
  try {
    const cli = path.join(root, 'dist/src/cli/main.js');
    const r = spawnSync(process.execPath, [cli, 'plate', ...args, '--out', path.join(dir, 'p.png'), '--no-sidecar', '--json'], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`plate failed: ${r.stderr}`);
    return JSON.parse(r.stdout) as Summary;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const WHOLE = ['--center', '-0.75,0', '--span', '3', '--iterations', '2000'];

export const plateSection: BenchSection = {
  name: 'plate',
  title: 'plates through the CLI: worker speed-up, and a 4000x4000 full-set plate at 4 samples',
  run(context: BenchContext): BenchRow[] {
    const cores = os.availableParallelism();
    const speedArgs = [...WHOLE, '--size', '1600x1200', '--samples', '4'];
    plate(context.root, [...WHOLE, '--size', '200x150', '--samples', '1']); // warm-up (disk cache, JIT of the CLI)
    const one = plate(context.root, [...speedArgs, '--workers', '1']);
    const all = plate(context.root, [...speedArgs, '--workers', String(cores)]);
    const big = plate(context.root, [...WHOLE, '--size', '4000x4000', '--samples', '4']);
    context.note(`speed-up = wall time with 1 worker / wall time with ${cores} workers, same 1600x1200 plate, one run each`);
    context.note('peak memory is the maxRSS of the whole process (main thread and all workers)');
    return [
      { label: '1600x1200, 4 samples, 1 worker', figures: { seconds: one.seconds, 'peak MiB': one.peakMemoryMiB, 'speed-up': 1 } },
      { label: `1600x1200, 4 samples, ${cores} workers`, figures: { seconds: all.seconds, 'peak MiB': all.peakMemoryMiB, 'speed-up': one.seconds / all.seconds } },
      { label: `4000x4000 full set, 4 samples, ${cores} workers`, figures: { seconds: big.seconds, 'peak MiB': big.peakMemoryMiB, 'refined %': (100 * big.pixels.refined) / big.pixels.total } },
    ];
  },
};
