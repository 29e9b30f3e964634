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
    const light = [...WHOLE, '--size', '1600x1200', '--samples', '4'];
    // A print-like plate where rendering dominates: the spiral inlet preset's view, 9 samples, 6000 iterations.
    const heavy = ['--center', '-0.7453,0.1127', '--span', '0.0065', '--iterations', '6000', '--size', '1600x1200', '--samples', '9'];
    plate(context.root, [...WHOLE, '--size', '200x150', '--samples', '1']); // warm-up (disk cache, JIT of the CLI)
    const rows: BenchRow[] = [];
    for (const [name, args] of [
      ['whole set 1600x1200, 4 samples, 2000 it.', light],
      ['spiral inlet 1600x1200, 9 samples, 6000 it.', heavy],
    ] as const) {
      const one = plate(context.root, [...args, '--workers', '1']);
      const all = plate(context.root, [...args, '--workers', String(cores)]);
      rows.push({ label: `${name}, 1 worker`, figures: { seconds: one.seconds, 'peak MiB': one.peakMemoryMiB, 'speed-up': 1 } });
      rows.push({ label: `${name}, ${cores} workers`, figures: { seconds: all.seconds, 'peak MiB': all.peakMemoryMiB, 'speed-up': one.seconds / all.seconds } });
    }
    const big = plate(context.root, [...WHOLE, '--size', '4000x4000', '--samples', '4']);
    rows.push({
      label: `4000x4000 full set, 4 samples, ${cores} workers`,
      figures: { seconds: big.seconds, 'peak MiB': big.peakMemoryMiB, 'refined %': (100 * big.pixels.refined) / big.pixels.total },
    });
    context.note(
      `speed-up = wall time with 1 worker / wall time with ${cores} workers, same plate, one run each; a fixed ~0.5 s (start-up, per-worker warm-up, the last strip's encoding) weighs on short plates`,
    );
    context.note('peak memory is the maxRSS of the whole process (main thread and all workers)');
    return rows;
  },
};
