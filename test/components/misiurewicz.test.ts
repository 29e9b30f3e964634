// Misiurewicz points of exact preperiod K and period P (docs/methods.md D7,
// docs/checks.md "Misiurewicz points"), held against sources outside the code:
// the count of B. Hutz and A. Towsley, New York J. Math. 21 (2015) 297-319,
// Corollary 3.3 (written here, their preperiod m is our K + 1); exact algebra in
// Python with mpmath.polyroots (test/oracles/misiurewicz-poly.py); the orbit
// iterated in decimal.js; the angles' preperiod and period by long division.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { listMisiurewicz } from '../../src/components/misiurewicz-list.js';
import type { MisiurewiczListing } from '../../src/components/misiurewicz-list.js';
import { haveMpmath, PYTHON } from '../oracles/mpmath.js';
import { requireInCi } from '../helpers/require-in-ci.js';
import { ROOT } from '../helpers/run-cli.js';
import { spawnSync } from 'node:child_process';

/** Hutz-Towsley Corollary 3.3 for d = 2: (m, n) = (K + 1, P); (2^m - 2^(m-1) - 2 + 1) Phi(n) when n | m - 1, else (2^m - 2^(m-1)) Phi(n). */
function hutzTowsley(k: number, p: number): number {
  const mu = (n: number): number => {
    let r = 1;
    for (let q = 2; q <= n; q += 1) {
      if (n % q !== 0) continue;
      n /= q;
      if (n % q === 0) return 0;
      r = -r;
    }
    return r;
  };
  let phi = 0;
  for (let d = 1; d <= p; d += 1) if (p % d === 0) phi += mu(p / d) * 2 ** (d - 1);
  const m = k + 1;
  return (m - 1) % p === 0 ? (2 ** m - 2 ** (m - 1) - 1) * phi : (2 ** m - 2 ** (m - 1)) * phi;
}

const cache = new Map<string, MisiurewiczListing>();
function list(k: number, p: number, angles = false): MisiurewiczListing {
  const key = `${k},${p},${angles}`;
  if (!cache.has(key)) cache.set(key, listMisiurewicz(k, p, 30, undefined, angles));
  return cache.get(key)!;
}

const D = Decimal.clone({ precision: 80 });

/** z_0 .. z_n at c in decimal.js. */
function orbit(re: string, im: string, n: number): [Decimal, Decimal][] {
  const cr = new D(re);
  const ci = new D(im);
  const z: [Decimal, Decimal][] = [[new D(0), new D(0)]];
  for (let j = 0; j < n; j += 1) {
    const [a, b] = z[z.length - 1]!;
    z.push([a.times(a).minus(b.times(b)).plus(cr), a.times(b).times(2).plus(ci)]);
  }
  return z;
}
const dist = (a: [Decimal, Decimal], b: [Decimal, Decimal]): number => Math.hypot(a[0].minus(b[0]).toNumber(), a[1].minus(b[1]).toNumber());

/** Preperiod and period of n/d under doubling by long division of the orbit (exact integers). */
function doubling(n: bigint, d: bigint): { preperiod: number; period: number } {
  const seen = new Map<bigint, number>();
  let x = n % d;
  for (let i = 0; ; i += 1) {
    const j = seen.get(x);
    if (j !== undefined) return { preperiod: j, period: i - j };
    seen.set(x, i);
    x = (2n * x) % d;
  }
}

const CASES: [number, number][] = [
  [1, 1],
  [1, 2],
  [2, 1],
  [2, 2],
  [1, 3],
  [3, 1],
  [2, 3],
  [3, 2],
  [1, 4],
  [4, 1],
  [3, 3],
  [2, 4],
  [4, 2],
  [5, 3],
  [4, 4],
];

const ANGLE_CASES: [number, number][] = [
  [2, 1],
  [3, 1],
  [3, 3],
  [2, 4],
  [4, 4],
];

describe('listMisiurewicz: every point of exact preperiod K and period P', () => {
  for (const [k, p] of CASES) {
    it(`(${k}, ${p}): ${hutzTowsley(k, p)} points, as Hutz-Towsley Corollary 3.3 counts, each of orbit type exactly (${k}, ${p}) in decimal.js`, () => {
      const l = list(k, p);
      expect(l.points.length).toBe(hutzTowsley(k, p));
      for (const pt of l.points) {
        const z = orbit(pt.c.re, pt.c.im, k + 1 + p);
        // z_{K+1+P} = z_{K+1} to the 30 printed digits (the orbit map's Lipschitz constant 4^(K+P) loses at most 0.6 (K+P) digits)
        expect(dist(z[k + 1 + p]!, z[k + 1]!)).toBeLessThan(1e-20);
        // exact: preperiod not below K, period not a proper divisor of P
        expect(dist(z[k + p]!, z[k]!)).toBeGreaterThan(1e-6);
        for (let d = 1; d < p; d += 1) if (p % d === 0) expect(dist(z[k + 1 + d]!, z[k + 1]!)).toBeGreaterThan(1e-6);
      }
    });
  }

  it('every angle of preperiod K and period P lands on exactly one listed point of type (K, d), d | P: (3,1) and (3,3) share the 24 angles of preperiod 3, period 3', () => {
    // angles of preperiod exactly 3 and period 3: 2^(3-1) * (2^3 - 2) = 24 (2 of the 8 period-3 numerators have period 1)
    const land = [list(3, 1, true), list(3, 3, true)].flatMap((l) => l.points.flatMap((pt) => pt.angles)).filter((a) => doubling(a.num, a.den).period === 3);
    expect(land.length).toBe(24);
    expect(new Set(land.map((a) => `${a.num}/${a.den}`)).size).toBe(24);
  });

  it('every listed angle has preperiod K and a period that is a multiple of P (by long division); c at 5/12, 7/12 is (2, 1) on the fixed point alpha', () => {
    for (const [k, p] of ANGLE_CASES) {
      for (const pt of list(k, p, true).points) {
        for (const a of pt.angles) {
          const o = doubling(a.num, a.den);
          expect(o.preperiod).toBe(k);
          expect(o.period % p).toBe(0);
        }
      }
    }
    const real = list(2, 1, true).points.find((pt) => pt.im === 0)!;
    expect(real.angles.map((a) => `${a.num}/${a.den}`)).toEqual(['5/12', '7/12']);
  });
});

describe('listMisiurewicz against exact algebra (Python Fractions) and mpmath.polyroots', () => {
  const program = path.join(ROOT, 'test/oracles/misiurewicz-poly.py');
  const small: [number, number][] = [
    [1, 1],
    [2, 1],
    [1, 3],
    [3, 1],
    [2, 2],
    [3, 2],
    [2, 3],
    [1, 4],
  ];
  it.skipIf(!requireInCi(haveMpmath, 'mpmath'))('the squarefree part of z_{K+1+P} - z_{K+1} with lower types removed has as many roots as listed, at the listed points', () => {
    const r = spawnSync(PYTHON, [program, ...small.map(([k, p]) => `${k},${p}`)], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const lines = r.stdout.trim().split('\n');
    for (const [i, [k, p]] of small.entries()) {
      const want = JSON.parse(lines[i]!) as { count: number; roots: [string, string][] };
      const got = list(k, p).points;
      expect(got.length).toBe(want.count);
      for (const [re, im] of want.roots) {
        const near = Math.min(...got.map((g) => Math.hypot(g.re - Number(re), g.im - Number(im))));
        // polyroots at 40 digits against our 30-digit points: both far below the spacing (> 1e-3 here)
        expect(near).toBeLessThan(1e-12);
      }
    }
  });
});
