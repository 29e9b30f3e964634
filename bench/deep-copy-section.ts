/**
 * A deep copy of high period (issue 17): a 640x480 plate framing a copy of
 * period 1012 at a span of 1.39e-301 (the component's size is 1.39e-302),
 * `--iterations auto`, one sample a pixel, the nucleus as periodic reference
 * (one cycle of 1012 iterates, indexed modulo the period).
 * Target: under 60 s. With QUADATLAS_BENCH_BASE naming the previous commit
 * built beside this one (base-checkout.ts), the plate is also rendered there
 * in the same run, and "faster" is its seconds / ours.
 *
 * How the copy was found (navigation, not search): the angles
 * 0.001 B^n 1 (B = (010)^8 0101, 28 digits) give islands of period 4 + 28 n
 * closing in on the Misiurewicz point of preperiod 1 and period 28 that
 * `quadatlas locate --misiurewicz 1,28 --near` finds next to the n = 2
 * island (`locate --angle`, period 60). Each next nucleus was started from
 * the geometric extrapolation M + (c_n - M)^2 / (c_(n-1) - M) and refined by
 * the nucleus Newton of `locate --near` (4 or 5 steps each, the guess
 * within about the square of the step); n = 36 is period 1012.
 * `quadatlas locate --near RE,IM --period 1012 --digits 320` confirms it:
 * size 1.39e-302, a cardioid (primitive: a copy of the set).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';
import { compareWithBase } from './base-checkout.js';

/** Nucleus of the period-1012 copy (320 digits, from `quadatlas locate --near ... --period 1012 --digits 320`). */
const NUCLEUS = {
  re: '-0.10091241103834597940522362381945945151369336997047240738212476476740692352725753724255636274903423268339828014255391335749445291808115330825862684714609421343653022275807874460254542345539466297142215455528590434144426173333566182253936581334190943392296694442412409551572138240812632188810229380361892278694727358677229',
  im: '0.95630605224003776824480728556755687565466937366854951637096196309358267916527254376011233964800161108656166084339397812259354761868035578735357587699820592910578547922364424316938421050458724389870596054108235690276453617763626181347394419467968611312519573380874242061407364000563266223763969162501680674109492009887201',
};
const PERIOD = 1012;
const SPAN = '1.39e-301';

interface CopySummary {
  seconds: number;
  iterations: number;
  peakMemoryMiB: number;
  pixels: { total: number; interior: number };
  iterationsChoice?: { probeSeconds: number };
  precision: { referenceBits: number; referenceSeconds: number; tableSeconds: number };
  deepIterations: { stepped: number; skipped: number; skips: number; skippedFraction: number };
}

function plate(root: string): CopySummary {
  const dir = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-bench-copy-'));
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
      'auto',
      '--samples',
      '1',
      '--reference',
      `${NUCLEUS.re},${NUCLEUS.im},${PERIOD}`,
      '--out',
      path.join(dir, 'p.png'),
      '--no-sidecar',
      '--json',
    ];
    const r = spawnSync(process.execPath, args, { encoding: 'utf8', maxBuffer: 1 << 24 });
    if (r.status !== 0) throw new Error(`deep copy plate failed: ${r.stderr}`);
    return JSON.parse(r.stdout) as CopySummary;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

function figures(s: CopySummary): Record<string, number | null> {
  return {
    seconds: s.seconds,
    'peak MiB': s.peakMemoryMiB,
    iterations: s.iterations,
    'probe s': s.iterationsChoice?.probeSeconds ?? null,
    'table s': s.precision.tableSeconds,
    'ops/pixel': (s.deepIterations.stepped + s.deepIterations.skips) / s.pixels.total,
    'skipped %': 100 * s.deepIterations.skippedFraction,
    'interior px': s.pixels.interior,
  };
}

export const deepCopySection: BenchSection = {
  name: 'deep-copy',
  title: 'deep plate: 640x480 framing a period-1012 copy at span 1.39e-301, iterations auto (issue 17; target 60 s), and the previous commit beside it',
  run(context: BenchContext): BenchRow[] {
    // one pair: each plate takes tens of seconds on both cores
    const cmp = compareWithBase(context, 1, plate, (s) => s.seconds);
    const s = cmp?.after[0] ?? plate(context.root);
    context.note(`target: ${s.seconds < 60 ? 'met' : 'missed'} 60 s (${s.seconds} s); reference ${s.precision.referenceBits} bits, limit ${s.iterations} (auto)`);
    const rows: BenchRow[] = [];
    if (cmp !== undefined) rows.push({ label: 'period 1012, 1.39e-301, previous commit', figures: figures(cmp.before[0]!) });
    rows.push({ label: 'period 1012, 1.39e-301', figures: { ...figures(s), ...(cmp === undefined ? {} : { faster: cmp.faster.median }) } });
    return rows;
  },
};
