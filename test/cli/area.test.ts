import { readFileSync } from 'node:fs';
import path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';

// Area of the Mandelbrot set by pixel counting: 1.5065918849 +/- 2.8e-9,
// T. Förstemann (2012); docs/checks.md.
const FORSTEMANN = 1.5065918849;

interface Area {
  interior: number;
  undecided: number;
  nearBoundary: number;
  uncertainty: number;
  pixelArea: number;
}

/** A whole-set render (the view holds |c| <= 2 on the real axis and |Im c| <= 1.23 > the set's 1.13). */
function wholeSet(size: string, extra: string[] = []): { area: Area; pixels: { total: number; undecided: number } } {
  const dir = tempDir();
  const r = runCli([
    'plate',
    '--center',
    '-0.75,0',
    '--span',
    '2.8',
    '--size',
    size,
    '--iterations',
    '20000',
    '--samples',
    '1',
    '--out',
    path.join(dir, 'a.png'),
    '--json',
    ...extra,
  ]);
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout) as { area: Area; pixels: { total: number; undecided: number } };
}

function npyBody(file: string): Buffer {
  const b = readFileSync(file);
  return b.subarray(10 + b.readUInt16LE(8));
}

/** Whether the orbit of 0 under z^2 + c leaves |z| <= 2 within n steps: plain doubles, written only here. */
function escapes(a: number, b: number, n: number): boolean {
  let x = 0,
    y = 0;
  for (let k = 0; k < n; k++) {
    const t = x * x - y * y + a;
    y = 2 * x * y + b;
    x = t;
    if (x * x + y * y > 4) return true;
  }
  return false;
}

describe('quadatlas plate --json: area with an uncertainty that holds (docs/methods.md A7)', () => {
  const sizes = ['800x700', '420x368'];
  let runs: Array<ReturnType<typeof wholeSet>> = [];
  beforeAll(() => {
    runs = sizes.map((s) => wholeSet(s));
  });

  for (const [i, size] of sizes.entries()) {
    it(`Förstemann (2012) 1.5065918849 in [estimate-u, estimate+u] at ${size}`, () => {
      const { area } = runs[i]!;
      expect(Math.abs(area.interior - FORSTEMANN)).toBeLessThanOrEqual(area.uncertainty);
      // u counts the undecided pixels and the near-boundary ones, nothing else.
      expect(area.uncertainty).toBeCloseTo(area.undecided + area.nearBoundary, 12);
      // Not vacuous: the interval excludes 0 and twice the area.
      expect(area.uncertainty).toBeLessThan(FORSTEMANN / 2);
    });
  }

  it('gives the finer render the smaller uncertainty (the 2 sqrt 2 spacing band about the boundary narrows)', () => {
    expect(runs[0]!.area.uncertainty).toBeLessThan(runs[1]!.area.uncertainty);
  });

  it("counts exactly the pixels the rule names, and the corners of the others lie on their centre's side", () => {
    // The rule, recomputed from the --data arrays: a decided pixel is near the boundary when its
    // distance estimate is below 2 sqrt 2 spacings (or missing). The others are claimed to lie wholly
    // on one side (true distance >= b/4 >= half the diagonal, docs/methods.md A2, A6): each corner of
    // those closest to the threshold (b < 8 spacings) is tested by a plain escape loop of 1e5 steps.
    // The check has teeth: trusting b itself (a threshold of 1/sqrt 2 spacings) puts 140 corners of
    // this render on the wrong side (measured).
    const dir = tempDir();
    const W = 200,
      H = 175,
      h = 2.8 / W;
    const s = wholeSet(`${W}x${H}`, ['--data', dir]);
    const period = new Int32Array(new Uint8Array(npyBody(path.join(dir, 'period.npy'))).buffer);
    const distance = new Float64Array(new Uint8Array(npyBody(path.join(dir, 'distance.npy'))).buffer);
    let near = 0,
      undecided = 0,
      checked = 0;
    const wrong: string[] = [];
    for (let j = 0; j < H; j++) {
      for (let i = 0; i < W; i++) {
        const k = j * W + i;
        const p = period[k]!;
        if (p === -1) {
          undecided++;
          continue;
        }
        const r = distance[k]! / h;
        if (!(r >= 2 * Math.SQRT2)) {
          near++;
          continue;
        }
        if (r >= 8) continue;
        for (const [di, dj] of [
          [0, 0],
          [1, 0],
          [0, 1],
          [1, 1],
        ] as const) {
          const a = -0.75 + (i + di - W / 2) * h;
          const b = (H / 2 - (j + dj)) * h;
          checked++;
          if (escapes(a, b, 100_000) !== (p === 0)) wrong.push(`pixel ${i},${j} corner ${di},${dj}`);
        }
      }
    }
    expect(Math.round(s.area.nearBoundary / s.area.pixelArea)).toBe(near);
    expect(s.pixels.undecided).toBe(undecided);
    expect(checked).toBeGreaterThan(1000);
    expect(wrong).toEqual([]);
  });
});
