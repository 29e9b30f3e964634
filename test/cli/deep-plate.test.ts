import { readFileSync } from 'node:fs';
import path from 'node:path';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { DEFAULT_ESCAPE_RADIUS } from '../../src/plane/sample-parameters.js';
import { runCli, tempDir } from '../helpers/run-cli.js';

/** The data part of an NPY file as a typed array. */
function npy<T>(file: string, make: (b: ArrayBuffer) => T): T {
  const b = readFileSync(file);
  const body = b.subarray(10 + b.readUInt16LE(8));
  return make(new Uint8Array(body).buffer);
}

interface DeepView {
  re: string;
  im: string;
  span: string;
  width: number;
  height: number;
  iterations: number;
}

/** Renders a small deep plate with its data arrays; returns the smooth counts and periods. */
function render(v: DeepView, extra: string[] = []): { smooth: Float64Array; period: Int32Array; json: Record<string, unknown>; dir: string } {
  const dir = tempDir();
  const r = runCli([
    'plate',
    '--center',
    `${v.re},${v.im}`,
    '--span',
    v.span,
    '--size',
    `${v.width}x${v.height}`,
    '--iterations',
    String(v.iterations),
    '--samples',
    '1',
    '--out',
    path.join(dir, 'p.png'),
    '--data',
    dir,
    '--json',
    ...extra,
  ]);
  expect(r.status, r.stderr).toBe(0);
  return {
    smooth: npy(path.join(dir, 'smooth.npy'), (b) => new Float64Array(b)),
    period: npy(path.join(dir, 'period.npy'), (b) => new Int32Array(b)),
    json: JSON.parse(r.stdout) as Record<string, unknown>,
    dir,
  };
}

/**
 * Direct iteration of z -> z^2 + c in decimal.js (the independent npm
 * reference) at pixel (i, j)'s exact centre, c = centre + ((i + 1/2) - W/2) s
 * + i (H/2 - (j + 1/2)) s with s = span / W; returns the escape count
 * (first n with |z_n| > R) or 0 if it does not escape within the limit.
 */
function directCount(v: DeepView, i: number, j: number, digits: number): number {
  const D = Decimal.clone({ precision: digits, toExpNeg: -9e15, minE: -9e15 });
  const s = new D(v.span).div(v.width);
  const cr = new D(v.re).plus(s.times(i + 0.5 - v.width / 2));
  const ci = new D(v.im).plus(s.times(v.height / 2 - (j + 0.5)));
  let x = new D(0),
    y = new D(0);
  const r2 = DEFAULT_ESCAPE_RADIUS * DEFAULT_ESCAPE_RADIUS;
  for (let n = 1; n <= v.iterations; n++) {
    const nx = x.times(x).minus(y.times(y)).plus(cr);
    y = x.times(y).times(2).plus(ci);
    x = nx;
    if (x.times(x).plus(y.times(y)).toNumber() > r2) return n;
  }
  return 0;
}

// Views near the Misiurewicz point c = i (docs/checks.md: orbit i, -1+i, -i, -1+i, ...), where every
// pixel escapes after a number of iterations that grows with the depth, so decimal.js can follow them.
const VIEWS: Array<[string, DeepView, number]> = [
  ['1e-20', { re: '0.0000000000000000000001', im: '1.0000000000000000000037', span: '1e-20', width: 24, height: 18, iterations: 20000 }, 45],
  [
    '1e-60',
    {
      re: '0.0000000000000000000000000000000000000000000000000000000000001',
      im: '1.0000000000000000000000000000000000000000000000000000000000037',
      span: '1e-60',
      width: 24,
      height: 18,
      iterations: 20000,
    },
    85,
  ],
  [
    '1e-320',
    {
      re: '1e-321',
      im: '1.0000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000037',
      span: '1e-320',
      width: 24,
      height: 18,
      iterations: 20000,
    },
    345,
  ],
];

describe('deep plates against direct decimal.js iteration', () => {
  for (const [name, view, digits] of VIEWS) {
    it(`match escape counts at span ${name} on sampled pixels (at most 1 in 16 may sit on an escape boundary)`, () => {
      const { smooth, period, json } = render(view);
      expect(json['arithmetic']).toBe('deep');
      let differ = 0;
      let sampled = 0;
      let escaped = 0;
      for (let j = 1; j < view.height; j += 5) {
        for (let i = 2; i < view.width; i += 6) {
          const k = j * view.width + i;
          const ours = period[k] === 0 ? Math.ceil(smooth[k]!) : 0;
          const direct = directCount(view, i, j, digits);
          sampled++;
          if (direct > 0) escaped++;
          if (ours !== direct) differ++;
        }
      }
      expect(sampled).toBe(16);
      // Near c = i every sampled pixel escapes, so the comparison is between real counts.
      expect(escaped).toBe(16);
      // Measured: 0 of 16 differ at each span. Stated tolerance: pixels whose orbit passes within
      // rounding of the escape circle may flip by one iteration.
      expect(differ).toBeLessThanOrEqual(1);
    });
  }
});

// The period-79 copy beside c = i (nucleus located by `quadatlas locate --period 79`), as a periodic reference.
const RE79 = '0.0000000000000000000000000000056601783822120579436465436167707854399762373350100776036003776325215751641144544769727625509114596865';
const IM79 = '0.9999999999999999999999999999971756386712434047927096950958000911478774441797251960078428535562965546474977099556868901645866371002';
const MINI: DeepView = { re: RE79, im: IM79, span: '1e-60', width: 48, height: 36, iterations: 30000 };

describe('deep plates: skipping, reproducibility and the interior', () => {
  it('skipping by the bilinear approximation changes no period and escape counts by at most 1 on at most 2% of pixels', () => {
    const on = render(MINI, ['--reference', `${RE79},${IM79},79`]);
    const off = render(MINI, ['--reference', `${RE79},${IM79},79`, '--no-skip']);
    const stats = on.json['deepIterations'] as { skippedFraction: number };
    expect(stats.skippedFraction).toBeGreaterThan(0.5);
    expect((off.json['deepIterations'] as { skipped: number }).skipped).toBe(0);
    let changed = 0;
    for (let k = 0; k < on.period.length; k++) {
      if (on.period[k] !== off.period[k]) {
        // An interior/undecided flip at the iteration limit is the only period change allowed.
        expect([on.period[k], off.period[k]]).toContain(-1);
        changed++;
        continue;
      }
      if (on.period[k] === 0) {
        const d = Math.abs(Math.ceil(on.smooth[k]!) - Math.ceil(off.smooth[k]!));
        expect(d).toBeLessThanOrEqual(1);
        if (d > 0) changed++;
      }
    }
    expect(changed / on.period.length).toBeLessThanOrEqual(0.02);
  });

  it('finds the period-79 copy inside (periods are multiples of 79 there: its bulbs have periods q 79)', () => {
    const { period } = render(MINI, ['--reference', `${RE79},${IM79},79`]);
    const centre = (MINI.height / 2) * MINI.width + MINI.width / 2;
    expect(period[centre]).toBe(79);
    for (const p of period) if (p > 0) expect(p % 79).toBe(0);
  });

  it('writes the same bytes for 1 and 2 workers and tile sizes 16 and 64, and again from the metadata', () => {
    const dir = tempDir();
    const base = ['plate', '--center', `${RE79},${IM79}`, '--span', '3e-58', '--size', '96x64', '--iterations', 'auto', '--samples', '4', '--reference', `${RE79},${IM79},79`];
    expect(runCli([...base, '--workers', '1', '--tile-size', '64', '--out', path.join(dir, 'a.png')]).status).toBe(0);
    expect(runCli([...base, '--workers', '2', '--tile-size', '16', '--out', path.join(dir, 'b.png')]).status).toBe(0);
    expect(runCli(['plate', '--again', path.join(dir, 'a.png'), '--out', path.join(dir, 'c.png')]).status).toBe(0);
    const a = readFileSync(path.join(dir, 'a.png'));
    expect(readFileSync(path.join(dir, 'b.png')).equals(a)).toBe(true);
    expect(readFileSync(path.join(dir, 'c.png')).equals(a)).toBe(true);
    const meta = JSON.parse(readFileSync(path.join(dir, 'a.png.json'), 'utf8')) as {
      metadata: { arithmetic: string; referenceBits: number; iterations: number; sheet: { view: { re: string } } };
    };
    expect(meta.metadata.arithmetic).toBe('deep');
    expect(meta.metadata.referenceBits).toBeGreaterThan(190);
    expect(meta.metadata.sheet.view.re).toBe(RE79);
  });
});

describe('deep plates, bad input', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['span of zero', ['--span', '0e-400'], /view\.span/],
    ['non-numeric digits', ['--center', '0.12x4,1'], /view\.re/],
    [
      'iteration count beyond the machine for the deep arithmetic',
      ['--center', '0,1', '--span', '1e-40', '--iterations', '2000000000'],
      /for --iterations \(sheet field iterations\)/,
    ],
    ['bad arithmetic', ['--arith', 'quad'], /for --arith \(sheet field arithmetic\)/],
  ];
  for (const [name, args, field] of cases) {
    it(`rejects a ${name} with one line and exit code 2`, () => {
      const dir = tempDir();
      const r = runCli(['plate', '--size', '20x20', ...args, '--out', path.join(dir, 'p.png')]);
      expect(r.status).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(field);
    });
  }

  it('keeps a centre with fewer digits than the span needs exact as written', () => {
    const dir = tempDir();
    const r = runCli(['plate', '--center', '0,1', '--span', '1e-30', '--size', '16x12', '--iterations', '3000', '--out', path.join(dir, 'p.png')]);
    expect(r.status, r.stderr).toBe(0);
    const meta = JSON.parse(readFileSync(path.join(dir, 'p.png.json'), 'utf8')) as { metadata: { arithmetic: string; sheet: { view: { re: string; im: string; span: string } } } };
    expect(meta.metadata.arithmetic).toBe('deep');
    expect(meta.metadata.sheet.view).toMatchObject({ re: '0', im: '1', span: '1e-30' });
  });
});
