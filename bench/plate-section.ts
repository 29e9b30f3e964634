/**
 * Renderer benchmarks, run through the built command line as a user would.
 * Every figure is the plate's own time from job start to the final rename
 * (the summary's `seconds`), median of RUNS runs with min and max; process
 * start (Node, module loading, worker start-up) is the rest of the wall time
 * and is reported separately.
 *
 * - 2-worker speed-up (1 worker against 2, same plate, same run) on the
 *   1600x1600 whole-set plate (3000 iterations, 1 sample), the 4000x4000
 *   whole-set plate at 4 samples, and the A3 poster preset;
 * - the A3 poster against the previous commit built beside this one, when
 *   QUADATLAS_BENCH_BASE names that checkout (base-checkout.ts).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';
import { compareWithBase, spread } from './base-checkout.js';

const RUNS = 3;

interface Summary {
  seconds: number;
  peakMemoryMiB: number;
  pixels: { refined: number; total: number };
}

interface Timed {
  plate: number;
  wall: number;
  peakMiB: number;
  refined: number;
}

function run(root: string, args: readonly string[]): Timed {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-'));
  try {
    const cli = path.join(root, 'dist/src/cli/main.js');
    const t0 = process.hrtime.bigint();
    const r = spawnSync(process.execPath, [cli, ...args.map((a) => a.replace('{dir}', dir))], { encoding: 'utf8', maxBuffer: 64 * 1024 * 1024 });
    const wall = Number(process.hrtime.bigint() - t0) / 1e9;
    if (r.status !== 0) throw new Error(`${args.join(' ')} failed: ${r.stderr}`);
    const s = JSON.parse(r.stdout) as Summary;
    return { plate: s.seconds, wall, peakMiB: s.peakMemoryMiB, refined: (100 * s.pixels.refined) / s.pixels.total };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function plateArgs(args: readonly string[]): string[] {
  return ['plate', ...args, '--out', '{dir}/p.png', '--no-sidecar', '--json'];
}

/** The A3 poster preset rendered from its sheet file (a sidecar holding the sheet), into the run's folder. */
function posterArgs(sheetFile: string): string[] {
  return ['plate', '--again', sheetFile, '--out', '{dir}/poster.tif', '--no-sidecar', '--json'];
}

function row(label: string, runs: Timed[], extra: Record<string, number | string> = {}): BenchRow {
  const p = spread(runs.map((r) => r.plate));
  const start = spread(runs.map((r) => r.wall - r.plate));
  return {
    label,
    figures: {
      seconds: p.median,
      min: p.min,
      max: p.max,
      'start s': start.median,
      'peak MiB': Math.max(...runs.map((r) => r.peakMiB)),
      ...extra,
    },
  };
}

/** Runs `args` RUNS times with 1 worker and RUNS times with 2, interleaved, and returns the two rows. */
function speedUp(root: string, name: string, args: string[]): BenchRow[] {
  const one: Timed[] = [];
  const two: Timed[] = [];
  for (let k = 0; k < RUNS; k++) {
    one.push(run(root, [...args, '--workers', '1']));
    two.push(run(root, [...args, '--workers', '2']));
  }
  const ratio = spread(one.map((o, k) => o.plate / two[k]!.plate));
  return [
    row(`${name}, 1 worker`, one),
    row(`${name}, 2 workers`, two, { 'speed-up': ratio.median, 'speed-up min': ratio.min, 'speed-up max': ratio.max, 'refined %': two[0]!.refined }),
  ];
}

export const plateSection: BenchSection = {
  name: 'plate',
  title: 'plates through the CLI: 2-worker speed-up (job start to final rename, median of 3 with min and max)',
  run(context: BenchContext): BenchRow[] {
    const root = context.root;
    const whole = ['--center', '-0.75,0', '--span', '3'];
    run(root, plateArgs([...whole, '--size', '200x150', '--iterations', '500'])); // warm-up (disk cache)
    const rows: BenchRow[] = [];
    rows.push(...speedUp(root, 'whole set 1600x1600, 3000 it., 1 sample', plateArgs([...whole, '--size', '1600x1600', '--iterations', '3000', '--samples', '1'])));
    rows.push(...speedUp(root, 'whole set 4000x4000, 2000 it., 4 samples', plateArgs([...whole, '--size', '4000x4000', '--iterations', '2000', '--samples', '4'])));
    context.note('speed-up = plate seconds with 1 worker / with 2 workers, paired runs; "start s" = wall time of the process minus the plate time');
    context.note('peak memory is the maxRSS of the whole process (main thread and all workers)');
    return rows;
  },
};

/** The A3 poster preset (4961x3508, 16 samples, 4000 it., 16-bit TIFF): speed-up, and the previous commit beside this one. */
export const posterSection: BenchSection = {
  name: 'poster',
  title: 'the A3 poster preset: 2-worker speed-up, and this commit against the previous one built beside it',
  run(context: BenchContext): BenchRow[] {
    const root = context.root;
    const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-sheet-'));
    try {
      const sheetFile = path.join(dir, 'poster.tif.json');
      const show = spawnSync(process.execPath, [path.join(root, 'dist/src/cli/main.js'), 'presets', 'show', 'edges-poster-a3'], { encoding: 'utf8' });
      if (show.status !== 0) throw new Error(`presets show failed: ${show.stderr}`);
      writeFileSync(
        sheetFile,
        JSON.stringify({
          metadata: {
            tool: 'quadatlas',
            version: (JSON.parse(readFileSync(path.join(root, 'package.json'), 'utf8')) as { version: string }).version,
            sheet: JSON.parse(show.stdout) as unknown,
          },
        }),
      );
      const args = posterArgs(sheetFile);
      const rows = speedUp(root, 'A3 poster', args);
      const cmp = compareWithBase(
        context,
        RUNS,
        (checkout) => run(checkout, [...args, '--workers', '2']),
        (t) => t.plate,
      );
      if (cmp !== undefined) {
        rows.push(row('A3 poster, previous commit, 2 workers', cmp.before));
        rows.push(row('A3 poster, this commit, 2 workers', cmp.after, { faster: cmp.faster.median, 'faster min': cmp.faster.min, 'faster max': cmp.faster.max }));
      }
      return rows;
    } finally {
      rmSync(dir, { recursive: true, force: true });
    }
  },
};
