/**
 * Cost follows the pixels (issue 17): the plate of span 1e-1000 at c = i,
 * 16x12 pixels, `--iterations auto`, whose limit the probe of the view finds
 * (plane/deep/probe-limit.ts). Before the probe, `auto` took the depth rule's
 * 7 665 010 iterations and computed the 3390-bit reference orbit to that
 * length: 111 s and 2.86 GB (issue 17). The same cost is rendered again, for
 * a ratio in one run, by giving that limit explicitly (a given limit renders
 * as before, byte for byte) when QUADATLAS_BENCH_DEEP_BEFORE=1; it is off by
 * default because it needs about two minutes and 3 GB.
 * Targets: under 3 s and under 200 MB.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';
import { autoIterations } from '../src/view/sheet.js';

const SPAN = '1e-1000';

interface AutoSummary {
  seconds: number;
  iterations: number;
  peakMemoryMiB: number;
  iterationsChoice?: { probeSeconds: number };
  precision: { referenceSeconds: number; tableSeconds: number; memory: { referenceIterates: number; bound: number } };
}

function plate(root: string, iterations: string): AutoSummary {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-auto-'));
  try {
    const args = [
      path.join(root, 'dist/src/cli/main.js'),
      'plate',
      '--center',
      '0,1',
      '--span',
      SPAN,
      '--size',
      '16x12',
      '--iterations',
      iterations,
      '--out',
      path.join(dir, 'p.png'),
      '--no-sidecar',
      '--json',
    ];
    const r = spawnSync(process.execPath, args, { encoding: 'utf8', maxBuffer: 1 << 24 });
    if (r.status !== 0) throw new Error(`deep auto plate failed: ${r.stderr}`);
    return JSON.parse(r.stdout) as AutoSummary;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function row(label: string, s: AutoSummary): BenchRow {
  return {
    label,
    figures: {
      seconds: s.seconds,
      'peak MiB': s.peakMemoryMiB,
      iterations: s.iterations,
      'orbit iterates': s.precision.memory.referenceIterates,
      'probe s': s.iterationsChoice?.probeSeconds ?? null,
      'reference s': s.precision.referenceSeconds,
      'table s': s.precision.tableSeconds,
      'bound MiB': s.precision.memory.bound / 2 ** 20,
    },
  };
}

export const deepAutoSection: BenchSection = {
  name: 'deep-auto',
  title: 'deep plate, iterations auto: 16x12 at span 1e-1000 near c = i (issue 17; targets 3 s, 200 MB)',
  run(context: BenchContext): BenchRow[] {
    const now = plate(context.root, 'auto');
    const rows = [row('probe (auto)', now)];
    context.note(
      `targets: ${now.seconds < 3 ? 'met' : 'missed'} 3 s (${now.seconds} s), ${now.peakMemoryMiB < 200 ? 'met' : 'missed'} 200 MB (${now.peakMemoryMiB} MiB peak resident)`,
    );
    if (process.env['QUADATLAS_BENCH_DEEP_BEFORE'] === '1') {
      const before = plate(context.root, String(autoIterations(SPAN)));
      rows.push(row('depth rule (before)', before));
      context.note(
        `the probe is ${(before.seconds / now.seconds).toFixed(0)}x faster and needs ${(before.peakMemoryMiB / now.peakMemoryMiB).toFixed(0)}x less memory than the depth rule`,
      );
    } else {
      context.note("before (issue 17, the depth rule's 7 665 010 iterations): 111 s and 2.86 GB; QUADATLAS_BENCH_DEEP_BEFORE=1 renders it again in this run for a ratio");
    }
    return rows;
  },
};
