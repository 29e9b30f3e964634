import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { DEFAULT_ESCAPE_RADIUS } from '../../src/plane/sample-parameters.js';
import { requireInCi } from '../helpers/require-in-ci.js';
import { runCli, tempDir } from '../helpers/run-cli.js';
import { PYTHON } from '../oracles/mpmath.js';
import { spawnSync } from 'node:child_process';
import { decimalAt, decimalEscapeCount } from '../plane/deep/helpers.js';

/** The data part of an NPY file as a typed array. */
function npy<T>(file: string, make: (b: ArrayBuffer) => T): T {
  const b = readFileSync(file);
  const body = b.subarray(10 + b.readUInt16LE(8));
  return make(new Uint8Array(body).buffer);
}

const havePython = requireInCi(spawnSync(PYTHON, ['-c', 'pass']).status === 0, 'python3');

// The view of issue 17: span 1e-1000 at the Misiurewicz point c = i, 16x12 pixels.
const W = 16,
  H = 12;
const VIEW = ['--center', '0,1', '--span', '1e-1000', '--size', `${W}x${H}`, '--iterations', 'auto', '--samples', '1'];

interface Summary {
  iterations: number;
  iterationsRule: string;
  iterationsChoice: { rule: string; probe: { grid: string; stop: string; ceiling: number; levels: Array<{ limit: number; undecided: number }> } };
  precision: { memory: { referenceIterates: number; referenceBytes: number; tableBytes: number; bound: number } };
  pixels: { total: number; escaped: number; undecided: number };
  peakMemoryMiB: number;
}

function render(workers: number): { dir: string; json: Summary; png: Buffer; smooth: Float64Array; period: Int32Array } {
  const dir = tempDir();
  const r = runCli(['plate', ...VIEW, '--workers', String(workers), '--out', path.join(dir, 'p.png'), '--data', dir, '--json']);
  expect(r.status, r.stderr).toBe(0);
  return {
    dir,
    json: JSON.parse(r.stdout) as Summary,
    png: readFileSync(path.join(dir, 'p.png')),
    smooth: npy(path.join(dir, 'smooth.npy'), (b) => new Float64Array(b)),
    period: npy(path.join(dir, 'period.npy'), (b) => new Int32Array(b)),
  };
}

/**
 * Direct iteration of z -> z^2 + c in Python's arbitrary-precision integers
 * (fixed point with 3600 fractional bits, floor rounding; an implementation
 * outside the project's BigInt code) at every pixel centre
 * c = i + ((2i + 1 - W) / 2W + i (H - 2j - 1) / 2W) 1e-1000 (pixel (i, j)
 * samples the centre of its cell, j downwards: docs/architecture.md
 * conventions), returning escape counts (first n with |z_n| > R) row-major.
 * Near the Misiurewicz point c = i (docs/checks.md: orbit i, -1+i, -i, ...)
 * every pixel escapes.
 * The c are exact rationals rounded once to 2^-3600 ~ 1e-1084, 84 digits
 * below the span; the count of 2700 iterations multiplies rounding errors
 * by about |4 (1 + i)|^1350 ~ 1e1016 relative to 2^-3600, so an escape count
 * could move only for an orbit within 1e-68 of the escape circle.
 */
function directCounts(limit: number): number[] {
  const program = `
B = 3600
W, H, R = ${W}, ${H}, ${DEFAULT_ESCAPE_RADIUS}
den = 2 * W * 10**1000
r2 = (R * R) << (2 * B)
out = []
for j in range(H):
    for i in range(W):
        cr = ((2 * i + 1 - W) << B) // den
        ci = (1 << B) + (((H - 2 * j - 1) << B) // den)
        x = y = 0
        n = 0
        while n < ${limit}:
            x, y = ((x * x - y * y) >> B) + cr, ((x * y) >> (B - 1)) + ci
            n += 1
            if x * x + y * y > r2:
                break
        else:
            n = 0
        out.append(n)
print(' '.join(map(str, out)))
`;
  const r = spawnSync(PYTHON, ['-c', program], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`python3 failed: ${r.stderr}`);
  return r.stdout.trim().split(' ').map(Number);
}

describe.runIf(havePython)('plate --iterations auto at span 1e-1000 near c = i (issue 17)', () => {
  const one = render(1);
  const two = render(2);

  it('chooses the limit by the probe, the same for 1 and 2 workers, with the same bytes', () => {
    expect(one.json.iterationsChoice.rule).toBe('probe');
    expect(two.json.iterations).toBe(one.json.iterations);
    expect(two.json.iterationsChoice.probe).toEqual(one.json.iterationsChoice.probe);
    expect(two.png.equals(one.png)).toBe(true);
    // The probe stopped because its count stopped changing, not at the depth rule's ceiling (7 665 010).
    expect(one.json.iterationsChoice.probe.stop).toBe('stable');
    expect(one.json.iterations).toBeLessThan(one.json.iterationsChoice.probe.ceiling / 100);
    const meta = JSON.parse(readFileSync(path.join(one.dir, 'p.png.json'), 'utf8')) as {
      metadata: { iterations: number; iterationsRule: string; iterationsProbe: unknown; sheet: { iterations: unknown } };
    };
    expect(meta.metadata.iterations).toBe(one.json.iterations);
    expect(meta.metadata.iterationsRule).toBe('probe');
    expect(meta.metadata.iterationsProbe).toEqual(one.json.iterationsChoice.probe);
    // the sheet keeps 'auto', so --again probes again and gives the same bytes
    expect(meta.metadata.sheet.iterations).toBe('auto');
    const again = runCli(['plate', '--again', path.join(one.dir, 'p.png'), '--out', path.join(one.dir, 'q.png')]);
    expect(again.status, again.stderr).toBe(0);
    expect(readFileSync(path.join(one.dir, 'q.png')).equals(one.png)).toBe(true);
  });

  it('keeps the reference orbit to the chosen limit and within the stated memory bound', () => {
    const m = one.json.precision.memory;
    expect(m.referenceIterates).toBeLessThanOrEqual(one.json.iterations);
    expect(m.referenceBytes + m.tableBytes).toBeLessThanOrEqual(m.bound);
    expect(m.bound).toBeLessThan(200 * 2 ** 20);
  });

  it('gives every pixel the escape count of direct high-precision iteration (Python integers), within 1', () => {
    const direct = directCounts(one.json.iterations);
    expect(direct).toHaveLength(W * H);
    // every pixel escapes below the limit (direct count > 0), so the limit lost none of them
    expect(Math.min(...direct)).toBeGreaterThan(0);
    let worst = 0;
    for (let k = 0; k < W * H; k++) {
      expect(one.period[k]).toBe(0);
      worst = Math.max(worst, Math.abs(Math.ceil(one.smooth[k]!) - direct[k]!));
    }
    // stated tolerance 1 (issue 17); measured 0
    expect(worst).toBeLessThanOrEqual(1);
    expect(one.json.pixels.undecided).toBe(0);
  });

  it('agrees with the decimal.js helper of the deep tests on two opposite corners', () => {
    // decimal.js at 1012 digits (its logarithm, which the helper takes for the smooth
    // count, stops near 1025 with guard digits), 11 digits below the pixel spacing
    const D = decimalAt(1012);
    const s = new D('1e-1000').div(W);
    const direct = directCounts(one.json.iterations);
    for (const [i, j] of [
      [0, 0],
      [W - 1, H - 1],
    ] as const) {
      const cr = s.times(i + 0.5 - W / 2);
      const ci = new D(1).plus(s.times(H / 2 - (j + 0.5)));
      const n = decimalEscapeCount(D, cr, ci, one.json.iterations, DEFAULT_ESCAPE_RADIUS);
      expect(n).toBe(direct[j * W + i]);
      expect(Math.abs(Math.ceil(one.smooth[j * W + i]!) - n)).toBeLessThanOrEqual(1);
    }
  });
});

// The period-79 copy beside c = i (nucleus located by `quadatlas locate --period 79`, as in deep-plate.test.ts).
const RE79 = '0.0000000000000000000000000000056601783822120579436465436167707854399762373350100776036003776325215751641144544769727625509114596865';
const IM79 = '0.9999999999999999999999999999971756386712434047927096950958000911478774441797251960078428535562965546474977099556868901645866371002';

describe('plate --reference RE,IM,79 --iterations auto', () => {
  it('stores one cycle of the nucleus (80 iterates, Z_0..Z_79) whatever the limit, and states the bound for it', () => {
    const dir = tempDir();
    const r = runCli([
      'plate',
      '--center',
      `${RE79},${IM79}`,
      '--span',
      '3e-58',
      '--size',
      '32x24',
      '--iterations',
      'auto',
      '--samples',
      '1',
      '--reference',
      `${RE79},${IM79},79`,
      '--out',
      path.join(dir, 'p.png'),
      '--json',
    ]);
    expect(r.status, r.stderr).toBe(0);
    const json = JSON.parse(r.stdout) as Summary;
    expect(json.iterations).toBeGreaterThan(79);
    expect(json.precision.memory.referenceIterates).toBe(79);
    // bound (render-sheet.ts deepBound): (79 + 1) iterates x 40 orbit bytes, and a
    // table with an entry at every start m = 1..78 on each of its 8 levels
    // (skips of 1 to 128), 84 bytes an entry
    expect(json.precision.memory.bound).toBe(80 * 40 + 78 * 8 * 84);
    expect(json.precision.memory.referenceBytes + json.precision.memory.tableBytes).toBeLessThanOrEqual(json.precision.memory.bound);
  });
});

describe('plate --iterations and --reference, bad input', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['limit that is neither a number nor auto', ['--iterations', 'autox'], /for --iterations \(sheet field iterations\) but received "autox"/],
    ['limit of zero', ['--iterations', '0'], /for --iterations \(sheet field iterations\)/],
    [
      'periodic reference that is not a nucleus (c = i has z_3 = -i)',
      ['--reference', '0,1,3', '--iterations', 'auto'],
      /Expected a nucleus of period 3 .* for --reference \(sheet field reference\) but received \|z_3\| = 1\.00/,
    ],
  ];
  for (const [name, args, field] of cases) {
    it(`rejects a ${name} with one line, exit code 2 and no file`, () => {
      const dir = tempDir();
      const r = runCli(['plate', '--center', '0,1', '--span', '1e-40', '--size', '16x12', ...args, '--out', path.join(dir, 'p.png')]);
      expect(r.status).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(field);
      expect(() => readFileSync(path.join(dir, 'p.png'))).toThrow();
    });
  }
});
