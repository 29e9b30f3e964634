// The census held against computations that share no code with it: decimal.js
// iteration of F_p and F_p' written here, an Aberth-Ehrlich solver written here
// (docs/methods.md C5(a); O. Aberth, Math. Comp. 27 (1973) 339-344; L. W. Ehrlich,
// Comm. ACM 10 (1967) 107-108), and mpmath's polyroots on the integer
// coefficients of F_p (Debian python3-mpmath).
import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { census } from '../../src/components/census.js';
import type { CensusComponent } from '../../src/components/census.js';
import { haveMpmath, runMpmath } from '../oracles/mpmath.js';
import { requireInCi } from '../helpers/require-in-ci.js';

const D = Decimal.clone({ precision: 60 });

/** F_q and F_q' at c (z <- z^2 + c, d <- 2 z d + 1 from 0) in decimal.js. */
function jet(q: number, re: Decimal, im: Decimal): { fr: Decimal; fi: Decimal; dr: Decimal; di: Decimal } {
  let zr = new D(0),
    zi = new D(0),
    dr = new D(0),
    di = new D(0);
  for (let k = 0; k < q; k += 1) {
    const ndr = zr.times(dr).minus(zi.times(di)).times(2).plus(1);
    di = zr.times(di).plus(zi.times(dr)).times(2);
    dr = ndr;
    const nzr = zr.times(zr).minus(zi.times(zi)).plus(re);
    zi = zr.times(zi).times(2).plus(im);
    zr = nzr;
  }
  return { fr: zr, fi: zi, dr, di };
}

/** |F_q / F_q'| at c. */
function newtonStep(q: number, re: Decimal, im: Decimal): Decimal {
  const j = jet(q, re, im);
  return j.fr
    .pow(2)
    .plus(j.fi.pow(2))
    .div(j.dr.pow(2).plus(j.di.pow(2)))
    .sqrt();
}

/** Hunt & Ott's size estimate |1 / (beta lambda^2)| (docs/methods.md C4) in doubles, written here. */
function size(p: number, cr: number, ci: number): number {
  let zr = 0,
    zi = 0,
    lr = 1,
    li = 0,
    br = 1,
    bi = 0;
  for (let k = 1; k < p; k += 1) {
    [zr, zi] = [zr * zr - zi * zi + cr, 2 * zr * zi + ci];
    [lr, li] = [2 * (zr * lr - zi * li), 2 * (zr * li + zi * lr)];
    const m = lr * lr + li * li;
    br += lr / m;
    bi -= li / m;
  }
  return 1 / (Math.hypot(br, bi) * (lr * lr + li * li));
}

/** The exact value of a double in decimal.js (new Decimal(x) takes the shortest decimal that rounds to x, not x). */
function exact(x: number): Decimal {
  let e = 0;
  while (!Number.isInteger(x)) {
    x *= 2;
    e -= 1;
  }
  return new D(BigInt(x).toString()).times(new D(2).pow(e));
}

/** The independent checks of one census nucleus. */
function check(p: number, c: CensusComponent): void {
  const re = exact(c.reHi).plus(exact(c.reLo));
  const im = exact(c.imHi).plus(exact(c.imLo));
  const s = size(p, c.reHi, c.imHi);
  const where = `period ${p} nucleus ${c.reHi}, ${c.imHi}`;
  // a zero of F_p to within 1e-10 of its component's size, or to the resolution of double-double
  // (2^-103 at |c| = 2, 1.2e-31) for the components near -2 at periods 19 and 20, smaller than 1e-21
  expect(newtonStep(p, re, im).lt(Math.max(1e-10 * s, 1.2e-31)), where).toBe(true);
  // and not a zero of F_d for any proper divisor d: its Newton step towards one is at least 1e-3 sizes
  for (let d = 1; d < p; d += 1) if (p % d === 0) expect(newtonStep(d, re, im).gt(1e-3 * s), `${where}, divisor ${d}`).toBe(true);
}

/** A seeded generator (mulberry32), so the sample is the same on every run. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** All 2^(p-1) zeros of F_p by Aberth-Ehrlich in doubles, each polished by two decimal.js Newton steps. */
function aberth(p: number): Array<[Decimal, Decimal]> {
  const n = 2 ** (p - 1);
  const re = new Float64Array(n),
    im = new Float64Array(n);
  for (let k = 0; k < n; k += 1) {
    const a = (2 * Math.PI * (k + 0.25)) / n;
    re[k] = 2.2 * Math.cos(a);
    im[k] = 2.2 * Math.sin(a);
  }
  for (let sweep = 0; sweep < 2000; sweep += 1) {
    let moved = 0;
    for (let k = 0; k < n; k += 1) {
      let zr = 0,
        zi = 0,
        dr = 0,
        di = 0;
      for (let j = 0; j < p; j += 1) {
        [dr, di] = [2 * (zr * dr - zi * di) + 1, 2 * (zr * di + zi * dr)];
        [zr, zi] = [zr * zr - zi * zi + re[k]!, 2 * zr * zi + im[k]!];
      }
      const dm = dr * dr + di * di;
      const nr = (zr * dr + zi * di) / dm,
        ni = (zi * dr - zr * di) / dm; // N = F / F'
      let sr = 0,
        si = 0;
      for (let j = 0; j < n; j += 1) {
        if (j === k) continue;
        const xr = re[k]! - re[j]!,
          xi = im[k]! - im[j]!;
        const m = xr * xr + xi * xi;
        sr += xr / m;
        si -= xi / m;
      }
      // w = N / (1 - N S)
      const ar = 1 - (nr * sr - ni * si),
        ai = -(nr * si + ni * sr);
      const am = ar * ar + ai * ai;
      const wr = (nr * ar + ni * ai) / am,
        wi = (ni * ar - nr * ai) / am;
      re[k] -= wr;
      im[k] -= wi;
      moved = Math.max(moved, Math.hypot(wr, wi) / Math.max(1e-300, Math.hypot(re[k]!, im[k]!)));
    }
    if (moved < 1e-15) break;
  }
  return Array.from(re, (r, k) => {
    let cr = new D(r),
      ci = new D(im[k]!);
    for (let it = 0; it < 3; it += 1) {
      const j = jet(p, cr, ci);
      const m = j.dr.pow(2).plus(j.di.pow(2));
      cr = cr.minus(j.fr.times(j.dr).plus(j.fi.times(j.di)).div(m));
      ci = ci.minus(j.fi.times(j.dr).minus(j.fr.times(j.di)).div(m));
    }
    return [cr, ci] as [Decimal, Decimal];
  });
}

/** Matches the census one-to-one with the exact-period-p members of `zeros` (each within 1e-8 sizes of exactly one). */
function matchAll(p: number, comps: readonly CensusComponent[], zeros: Array<[Decimal, Decimal]>): void {
  const exactZeros = zeros.filter(([r, i]) => {
    for (let d = 1; d < p; d += 1) if (p % d === 0 && newtonStep(d, r, i).lt(1e-20)) return false;
    return true;
  });
  expect(exactZeros.length, `exact-period-${p} zeros`).toBe(comps.length);
  const used = new Set<number>();
  for (const c of comps) {
    const s = size(p, c.reHi, c.imHi);
    const near = exactZeros
      .map(
        ([r, i], k) =>
          [
            k,
            r
              .minus(exact(c.reHi))
              .minus(exact(c.reLo))
              .pow(2)
              .plus(i.minus(exact(c.imHi)).minus(exact(c.imLo)).pow(2))
              .sqrt()
              .toNumber(),
          ] as const,
      )
      .filter(([, d]) => d < 1e-8 * s);
    expect(near.length, `period ${p} nucleus ${c.reHi}, ${c.imHi}`).toBe(1);
    used.add(near[0]![0]);
  }
  expect(used.size).toBe(exactZeros.length);
}

describe('census nuclei checked independently of the census code', () => {
  it('every census nucleus of periods 1..12 is a zero of F_p (decimal.js Newton step < 1e-10 size) and of no F_d, d | p, d < p', async () => {
    for (let p = 1; p <= 12; p += 1) for (const c of (await census(p)).components) check(p, c);
  });
  it('a seeded sample of 40 nuclei per period 13..20 passes the same decimal.js checks', async () => {
    const rand = seeded(20261202);
    for (let p = 13; p <= 20; p += 1) {
      const comps = (await census(p, { workers: 2 })).components;
      for (let k = 0; k < 40; k += 1) check(p, comps[Math.floor(rand() * comps.length)]!);
      // the component nearest -2 is the smallest (size about 2^(6 - 4p)): always include it
      check(
        p,
        comps.reduce((a, b) => (b.reHi < a.reHi ? b : a)),
      );
    }
  });
  it('the census of periods 2..8 is exactly the set of exact-period-p zeros of F_p from an Aberth-Ehrlich solver written here', async () => {
    for (let p = 2; p <= 8; p += 1) matchAll(p, (await census(p)).components, aberth(p));
  });
  it.skipIf(!requireInCi(haveMpmath, 'python3-mpmath'))('the census of periods 2..6 matches mpmath.polyroots on the integer coefficients of F_p', async () => {
    const program = (p: number): string => `
from mpmath import mp, polyroots
mp.dps = 40
f = [0, 1]
for k in range(1, ${p}):
    g = [0] * (2 * len(f) - 1)
    for i, x in enumerate(f):
        for j, y in enumerate(f):
            g[i + j] += x * y
    g[1] += 1
    f = g
for r in polyroots(f[::-1], maxsteps=400, extraprec=400):
    print(mp.nstr(mp.re(r), 35), mp.nstr(mp.im(r), 35))
`;
    for (let p = 2; p <= 6; p += 1) {
      const zeros = runMpmath(program(p))
        .trim()
        .split('\n')
        .map((l) => l.split(' ').map((t) => new D(t)) as [Decimal, Decimal]);
      expect(zeros).toHaveLength(2 ** (p - 1));
      matchAll(p, (await census(p)).components, zeros);
    }
  });
});
