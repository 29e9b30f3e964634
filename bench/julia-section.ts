/**
 * Julia plate benchmark, run through the built command line as a user would:
 * a 1600x1200 plate of the rabbit's dynamical plane at 9 samples, with 1
 * worker and with all workers (the speed-up).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';

interface Summary {
  seconds: number;
  peakMemoryMiB: number;
  pixels: { refined: number; total: number };
}

function julia(root: string, args: readonly string[]): Summary {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-'));
  try {
    const cli = path.join(root, 'dist/src/cli/main.js');
    const r = spawnSync(process.execPath, [cli, 'julia', ...args, '--out', path.join(dir, 'j.png'), '--no-sidecar', '--json'], { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`julia failed: ${r.stderr}`);
    return JSON.parse(r.stdout) as Summary;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const RABBIT = ['--c', '-0.12256116687665,0.74486176661974', '--iterations', '2000', '--size', '1600x1200', '--samples', '9'];

export const juliaSection: BenchSection = {
  name: 'julia',
  title: 'Julia plates through the CLI: the rabbit at 1600x1200, 9 samples',
  run(context: BenchContext): BenchRow[] {
    const cores = os.availableParallelism();
    julia(context.root, ['--c', '-1,0', '--size', '200x150', '--samples', '1']); // warm-up
    const one = julia(context.root, [...RABBIT, '--workers', '1']);
    const all = julia(context.root, [...RABBIT, '--workers', String(cores)]);
    context.note(`speed-up = wall time with 1 worker / wall time with ${cores} workers, same plate, one run each`);
    return [
      {
        label: 'rabbit 1600x1200, 9 samples, 1 worker',
        figures: { seconds: one.seconds, 'peak MiB': one.peakMemoryMiB, 'refined %': (100 * one.pixels.refined) / one.pixels.total, 'speed-up': 1 },
      },
      {
        label: `rabbit 1600x1200, 9 samples, ${cores} workers`,
        figures: { seconds: all.seconds, 'peak MiB': all.peakMemoryMiB, 'refined %': (100 * all.pixels.refined) / all.pixels.total, 'speed-up': one.seconds / all.seconds },
      },
    ];
  },
};
