/**
 * The deep-plate benchmark (issue: deep plates): a 640x480 plate framing a
 * period-127 copy of the set near c = i at a span of 1.8e-94 with 100 000
 * iterations, rendered through the CLI twice in the same run: with the
 * bilinear-approximation table and with skipping turned off. Reports wall
 * time, reference-orbit and table time, and per-pixel operations (single
 * steps plus skips) in both runs.
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';

/** Nucleus of a period-127 component near c = i (located with `quadatlas locate --period 127`, 125 digits). */
const NUCLEUS = {
  re: '0.00000000000000000000000000000000000000000000000490942215891984087114281698536224667501983962485439266521007574980292998504139',
  im: '0.99999999999999999999999999999999999999999999999755025704918244277486444248376333102294230571605166336073417911116008314382389',
};
const SPAN = '1.8e-94';

interface DeepSummary {
  seconds: number;
  pixels: { total: number };
  precision: { referenceBits: number; referenceSeconds: number; tableSeconds: number };
  deepIterations: { stepped: number; skipped: number; skips: number; skippedFraction: number };
}

function plate(root: string, extra: readonly string[]): DeepSummary {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-deep-'));
  try {
    const args = [
      path.join(root, 'dist/src/cli/main.js'),
      'plate',
      '--center',
      `${NUCLEUS.re},${NUCLEUS.im}`,
      '--span',
      SPAN,
      '--size',
      '640x480',
      '--iterations',
      '100000',
      '--samples',
      '1',
      '--reference',
      `${NUCLEUS.re},${NUCLEUS.im},127`,
      '--out',
      path.join(dir, 'p.png'),
      '--no-sidecar',
      '--json',
      ...extra,
    ];
    const r = spawnSync(process.execPath, args, { encoding: 'utf8' });
    if (r.status !== 0) throw new Error(`deep plate failed: ${r.stderr}`);
    return JSON.parse(r.stdout) as DeepSummary;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

export const deepSection: BenchSection = {
  name: 'deep',
  title: 'deep plate: 640x480, span 1.8e-94 framing a period-127 copy, 100 000 iterations, skipping on and off',
  run(context: BenchContext): BenchRow[] {
    const on = plate(context.root, []);
    const off = plate(context.root, ['--no-skip']);
    const n = on.pixels.total;
    const opsOn = (on.deepIterations.stepped + on.deepIterations.skips) / n;
    const opsOff = off.deepIterations.stepped / n;
    context.note(`reference orbit ${on.precision.referenceBits} bits; per-pixel operations = single steps + skips (Newton and period checks included)`);
    context.note(
      `skipping gives ${(opsOff / opsOn).toFixed(1)}x fewer per-pixel operations and ${(off.seconds / on.seconds).toFixed(1)}x less wall time (issue 17 target: 30x fewer operations; the earlier target was 10x)`,
    );
    return [
      {
        label: 'with skipping',
        figures: {
          seconds: on.seconds,
          'reference s': on.precision.referenceSeconds,
          'table s': on.precision.tableSeconds,
          'ops/pixel': opsOn,
          'skipped %': 100 * on.deepIterations.skippedFraction,
        },
      },
      {
        label: 'skipping off',
        figures: { seconds: off.seconds, 'reference s': off.precision.referenceSeconds, 'table s': off.precision.tableSeconds, 'ops/pixel': opsOff, 'skipped %': 0 },
      },
    ];
  },
};
