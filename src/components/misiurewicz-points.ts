/**
 * Misiurewicz points of exact preperiod K and period P (docs/methods.md D7).
 *
 * Convention: K and P are the preperiod and period of the critical value's
 * orbit, z_1 = c, z_{n+1} = z_n^2 + c: z_{K+1+P} = z_{K+1}, with K and P the
 * least such (z_K is not periodic). The external angles of c then have
 * preperiod exactly K under doubling and period P, or q P when q rays meet at
 * each point of the cycle (the landing of rays at a repelling cycle,
 * Douady-Hubbard): c at angles 5/12 and 7/12 has K = 2, P = 1. Hutz and
 * Towsley count the critical point 0 in the preperiod: their type (m, n) is
 * ours (m - 1, n).
 *
 * The equation with the lower solutions divided out is their Misiurewicz
 * polynomial (B. Hutz, A. Towsley, "Misiurewicz points for polynomial maps
 * and transversality", New York J. Math. 21 (2015) 297-319, section 3): with
 * m = K + 1,
 *   H(c) = prod_{d | P} [(z_{m+d} - z_m) / (z_{m-1+d} - z_{m-1})]^mu(P/d)
 * divided, when P | K, by the centres of exact period P, prod_{d | P} z_d^mu(P/d).
 * Its roots are simple and are exactly the (K, P) points; their number
 * (Corollary 3.3, d = 2) is Phi(P) (2^K - 1) when P | K and Phi(P) 2^K
 * otherwise, Phi(P) = sum_{d | P} mu(P/d) 2^(d-1) (the centres of period P).
 * Newton and Aberth-Ehrlich need only H'/H, a sum of logarithmic
 * derivatives, so H is never expanded.
 */
import { bitLength, bitsForDigits, cdiv, fixedScale, fromDecimal, fromNumber, rescale, toNumber } from '../precise/fixed.js';
import type { FixedComplex, FixedScale } from '../precise/fixed.js';
import { NewtonError } from './newton-error.js';
import { UserError } from '../check/user-error.js';
import { formatComplex } from './nucleus.js';
import type { ComplexDecimal } from './nucleus.js';

/** Möbius mu(n). */
export function mobius(n: number): number {
  let r = 1;
  let m = n;
  for (let k = 2; k * k <= m; k += 1) {
    if (m % k === 0) {
      m /= k;
      if (m % k === 0) return 0;
      r = -r;
    }
  }
  return m > 1 ? -r : r;
}

/** The divisors d of p with mu(p/d) != 0, each with its sign. */
function signedDivisors(p: number): { d: number; mu: number }[] {
  const out: { d: number; mu: number }[] = [];
  for (let d = 1; d <= p; d += 1) if (p % d === 0 && mobius(p / d) !== 0) out.push({ d, mu: mobius(p / d) });
  return out;
}

/** Hutz-Towsley Corollary 3.3 for z^2 + c in our convention (K >= 1): the number of (K, P) points. */
export function misiurewiczCount(preperiod: number, period: number): number {
  let centres = 0;
  for (const { d, mu } of signedDivisors(period)) centres += mu * 2 ** (d - 1);
  return preperiod % period === 0 ? centres * (2 ** preperiod - 1) : centres * 2 ** preperiod;
}

/**
 * The terms of H'/H: pairs (a, b, sign) standing for sign (z_a' - z_b') / (z_a - z_b),
 * a > b >= 0, z_0 = 0.
 */
function logTerms(preperiod: number, period: number): { a: number; b: number; sign: number }[] {
  const m = preperiod + 1;
  const terms: { a: number; b: number; sign: number }[] = [];
  for (const { d, mu } of signedDivisors(period)) {
    terms.push({ a: m + d, b: m, sign: mu });
    terms.push({ a: m - 1 + d, b: m - 1, sign: -mu });
    if (preperiod % period === 0) terms.push({ a: d, b: 0, sign: -mu });
  }
  return terms;
}

/** Above this |z| the orbit is followed by its logarithm (squares of larger values overflow within a few steps). */
const BIG = 1e64;

/**
 * H'/H at c in doubles, written into out[0], out[1]; false when it is not finite
 * (c on a lower solution). Once |z_n| passes BIG the orbit is kept as
 * log z_n and r_n = z_n'/z_n (log z_{n+1} = 2 log z_n + log(1 + c z_n^-2)),
 * so starting points far outside the set do not overflow.
 */
export function logDerivative(preperiod: number, period: number, cr: number, ci: number, out: Float64Array, scratch?: Float64Array): boolean {
  const n = preperiod + 1 + period;
  // per index: z (re, im), z' (re, im), log z (re, im), r = z'/z (re, im), escaped flag
  const s = scratch !== undefined && scratch.length >= 9 * (n + 1) ? scratch : new Float64Array(9 * (n + 1));
  let zr = 0,
    zi = 0,
    dr = 0,
    di = 0,
    lr = 0,
    li = 0,
    rr = 0,
    ri = 0,
    big = false;
  s.fill(0, 0, 9);
  for (let k = 1; k <= n; k += 1) {
    if (!big) {
      const ndr = 2 * (zr * dr - zi * di) + 1;
      di = 2 * (zr * di + zi * dr);
      dr = ndr;
      const nzr = zr * zr - zi * zi + cr;
      zi = 2 * zr * zi + ci;
      zr = nzr;
      const m = Math.hypot(zr, zi);
      if (m > BIG) {
        big = true;
        lr = Math.log(m);
        li = Math.atan2(zi, zr);
        const q = zr * zr + zi * zi;
        rr = (dr * zr + di * zi) / q;
        ri = (di * zr - dr * zi) / q;
      }
    } else {
      // w = c z^-2 = c exp(-2 log z)
      const e = Math.exp(-2 * lr);
      const er = e * Math.cos(-2 * li);
      const ei = e * Math.sin(-2 * li);
      const wr = cr * er - ci * ei;
      const wi = cr * ei + ci * er;
      // r' = (2 r + z^-2) / (1 + w)
      const nr = 2 * rr + er;
      const ni = 2 * ri + ei;
      const qr = 1 + wr;
      const qq = qr * qr + wi * wi;
      rr = (nr * qr + ni * wi) / qq;
      ri = (ni * qr - nr * wi) / qq;
      lr = 2 * lr + 0.5 * Math.log(qq);
      li = 2 * li + Math.atan2(wi, qr);
    }
    const o = 9 * k;
    s[o] = zr;
    s[o + 1] = zi;
    s[o + 2] = dr;
    s[o + 3] = di;
    s[o + 4] = lr;
    s[o + 5] = li;
    s[o + 6] = rr;
    s[o + 7] = ri;
    s[o + 8] = big ? 1 : 0;
  }
  let sr = 0,
    si = 0;
  for (const t of logTerms(preperiod, period)) {
    const a = 9 * t.a;
    const b = 9 * t.b;
    let tr: number, ti: number;
    if (s[a + 8] === 0) {
      const ur = s[a + 2]! - s[b + 2]!;
      const ui = s[a + 3]! - s[b + 3]!;
      const vr = s[a]! - s[b]!;
      const vi = s[a + 1]! - s[b + 1]!;
      const q = vr * vr + vi * vi;
      tr = (ur * vr + ui * vi) / q;
      ti = (ui * vr - ur * vi) / q;
    } else {
      // (r_a - z_b'/z_a) / (1 - z_b/z_a), with 1/z_a = exp(-log z_a)
      const e = Math.exp(-s[a + 4]!);
      const ir = e * Math.cos(-s[a + 5]!);
      const ii = e * Math.sin(-s[a + 5]!);
      let pr: number, pi: number, gr: number, gi: number;
      if (s[b + 8] === 0) {
        pr = s[b]! * ir - s[b + 1]! * ii;
        pi = s[b]! * ii + s[b + 1]! * ir;
        gr = s[b + 2]! * ir - s[b + 3]! * ii;
        gi = s[b + 2]! * ii + s[b + 3]! * ir;
      } else {
        const f = Math.exp(s[b + 4]! - s[a + 4]!);
        pr = f * Math.cos(s[b + 5]! - s[a + 5]!);
        pi = f * Math.sin(s[b + 5]! - s[a + 5]!);
        gr = pr * s[b + 6]! - pi * s[b + 7]!;
        gi = pr * s[b + 7]! + pi * s[b + 6]!;
      }
      const nr = s[a + 6]! - gr;
      const ni = s[a + 7]! - gi;
      const qr = 1 - pr;
      const qi = -pi;
      const q = qr * qr + qi * qi;
      tr = (nr * qr + ni * qi) / q;
      ti = (ni * qr - nr * qi) / q;
    }
    sr += t.sign * tr;
    si += t.sign * ti;
  }
  out[0] = sr;
  out[1] = si;
  return Number.isFinite(sr) && Number.isFinite(si);
}

/**
 * Every root of H in doubles, by the Aberth-Ehrlich iteration (O. Aberth,
 * Math. Comp. 27 (1973) 339-344; docs/methods.md C5(a)) on H'/H, started on
 * a circle of radius 2.5 around the set; updates in place in index order
 * (deterministic). Returns re, im pairs, and the sweeps taken.
 */
export function aberthMisiurewicz(
  preperiod: number,
  period: number,
  onProgress?: (done: number, total: number) => void,
): { roots: Float64Array; sweeps: number; converged: boolean } {
  const n = misiurewiczCount(preperiod, period);
  const z = new Float64Array(2 * n);
  for (let j = 0; j < n; j += 1) {
    const t = (2 * Math.PI * (j + 0.25)) / n + 0.4;
    z[2 * j] = 2.5 * Math.cos(t);
    z[2 * j + 1] = 2.5 * Math.sin(t);
  }
  const done = new Uint8Array(n);
  const g = new Float64Array(2);
  const scratch = new Float64Array(9 * (preperiod + period + 2));
  let left = n;
  let sweeps = 0;
  const MAX_SWEEPS = 2000;
  for (; sweeps < MAX_SWEEPS && left > 0; sweeps += 1) {
    for (let i = 0; i < n; i += 1) {
      if (done[i] === 1) continue;
      const cr = z[2 * i]!;
      const ci = z[2 * i + 1]!;
      if (!logDerivative(preperiod, period, cr, ci, g, scratch)) {
        // on a pole (a lower solution): nudge off it
        z[2 * i] = cr + 1e-9;
        continue;
      }
      let sr = 0,
        si = 0;
      for (let j = 0; j < n; j += 1) {
        if (j === i) continue;
        const dr = cr - z[2 * j]!;
        const di = ci - z[2 * j + 1]!;
        const q = dr * dr + di * di;
        sr += dr / q;
        si -= di / q;
      }
      // w = 1 / (H'/H - S)
      const ar = g[0]! - sr;
      const ai = g[1]! - si;
      const q = ar * ar + ai * ai;
      const wr = ar / q;
      const wi = -ai / q;
      z[2 * i] = cr - wr;
      z[2 * i + 1] = ci - wi;
      if (Math.hypot(wr, wi) <= 1e-15 * Math.max(1, Math.hypot(cr, ci))) {
        done[i] = 1;
        left -= 1;
      }
    }
    onProgress?.(n - left, n);
  }
  return { roots: z, sweeps, converged: left === 0 };
}

/** z_1 .. z_n and z_1' .. z_n' at c in fixed point (index 0 is z_0 = 0). */
function orbitFixed(c: FixedComplex, n: number, s: FixedScale): { z: FixedComplex[]; dz: FixedComplex[] } | null {
  const z: FixedComplex[] = [{ re: 0n, im: 0n }];
  const dz: FixedComplex[] = [{ re: 0n, im: 0n }];
  let zr = 0n,
    zi = 0n,
    dr = 0n,
    di = 0n;
  for (let k = 1; k <= n; k += 1) {
    const ndr = ((zr * dr - zi * di) >> (s.shift - 1n)) + s.one;
    di = (zr * di + zi * dr) >> (s.shift - 1n);
    dr = ndr;
    const nzr = ((zr * zr - zi * zi) >> s.shift) + c.re;
    zi = ((zr * zi) >> (s.shift - 1n)) + c.im;
    zr = nzr;
    if (bitLength(zr) > s.bits + 8 || bitLength(zi) > s.bits + 8) return null;
    z.push({ re: zr, im: zi });
    dz.push({ re: dr, im: di });
  }
  return { z, dz };
}

/** One Newton step on H in fixed point: the step 1 / (H'/H), or null off the domain. */
function newtonStep(preperiod: number, period: number, c: FixedComplex, s: FixedScale): FixedComplex | null {
  const o = orbitFixed(c, preperiod + 1 + period, s);
  if (o === null) return null;
  let sum: FixedComplex = { re: 0n, im: 0n };
  for (const t of logTerms(preperiod, period)) {
    const num = { re: o.dz[t.a]!.re - o.dz[t.b]!.re, im: o.dz[t.a]!.im - o.dz[t.b]!.im };
    const den = { re: o.z[t.a]!.re - o.z[t.b]!.re, im: o.z[t.a]!.im - o.z[t.b]!.im };
    // an exact zero of a numerator factor: c is a root at this precision (-2, i are exact in binary); of a denominator: a pole
    if (den.re === 0n && den.im === 0n) return t.sign > 0 ? { re: 0n, im: 0n } : null;
    const q = cdiv(num, den, s);
    sum = t.sign > 0 ? { re: sum.re + q.re, im: sum.im + q.im } : { re: sum.re - q.re, im: sum.im - q.im };
  }
  if (sum.re === 0n && sum.im === 0n) return null;
  return cdiv({ re: s.one, im: 0n }, sum, s);
}

/** Fixed-point bits for a (K, P) point shown to `digits` digits: the digits, guard bits, and 2 bits per iterate (points crowd as 4^-(K+P)). */
export function misiurewiczBits(preperiod: number, period: number, digits: number): number {
  return bitsForDigits(digits + 10, 32) + 2 * (preperiod + period);
}

/** Newton on H from c at scale s until the step is below 2^-(bits - 24) twice; null when it does not converge. */
function newtonFixed(preperiod: number, period: number, start: FixedComplex, s: FixedScale): FixedComplex | null {
  let c = start;
  let close = 0;
  for (let step = 0; step < 400; step += 1) {
    const h = newtonStep(preperiod, period, c, s);
    if (h === null) return null;
    c = { re: c.re - h.re, im: c.im - h.im };
    if (Math.max(bitLength(h.re), bitLength(h.im)) <= 24) {
      close += 1;
      if (close >= 2) return c;
    } else close = 0;
  }
  return null;
}

/** The exact preperiod and period of c's critical value orbit, found from |z_a - z_b| against 2^-(bits/2). */
export interface MisiurewiczType {
  preperiod: number;
  period: number;
  /** log2 of the smallest |z_a - z_b| among the pairs that must differ (the margin of the exactness check). */
  log2Separation: number;
}

/**
 * The orbit type of c: the least P' <= maxPeriod and then the least K' with
 * z_{K'+1+P'} = z_{K'+1} to within 2^-(bits/2); null when none.
 */
export function orbitType(c: FixedComplex, s: FixedScale, maxPreperiod: number, maxPeriod: number): MisiurewiczType | null {
  const o = orbitFixed(c, maxPreperiod + 1 + maxPeriod, s);
  if (o === null) return null;
  const tol = s.bits / 2;
  const log2dist = (a: number, b: number): number => {
    const dr = o.z[a]!.re - o.z[b]!.re;
    const di = o.z[a]!.im - o.z[b]!.im;
    return Math.max(bitLength(dr < 0n ? -dr : dr), bitLength(di < 0n ? -di : di)) - s.bits;
  };
  const equal = (a: number, b: number): boolean => log2dist(a, b) < -tol;
  const m = maxPreperiod + 1;
  for (let p = 1; p <= maxPeriod; p += 1) {
    if (!equal(m + p, m)) continue;
    let k = maxPreperiod;
    while (k > 0 && equal(k + p, k)) k -= 1;
    // margin: z_k vs z_{k+p} (preperiod exact), z_{m+d} vs z_m for d < p (period exact)
    let sep = k > 0 ? log2dist(k + p, k) : Infinity;
    for (let d = 1; d < p; d += 1) sep = Math.min(sep, log2dist(m + d, m));
    return { preperiod: k, period: p, log2Separation: sep };
  }
  return null;
}

/** A located (K, P) point: decimal text to `digits` digits, the fixed-point value, its checked type. */
export interface MisiurewiczPoint {
  c: ComplexDecimal;
  fixed: FixedComplex;
  scale: FixedScale;
  type: MisiurewiczType;
}

/**
 * Newton on H from a double or decimal start to the (K, P) point, confirmed
 * at higher precision (it must not move by half a unit of the last digit) and
 * its orbit type checked exactly (K, P). Throws NewtonError naming `field`.
 */
export function refineMisiurewicz(preperiod: number, period: number, start: { re: string | number; im: string | number }, digits: number, field = 'near'): MisiurewiczPoint {
  const shown = `${String(start.re)},${String(start.im)}`;
  const bits = misiurewiczBits(preperiod, period, digits);
  const s = fixedScale(bits);
  const from = (v: string | number): bigint => (typeof v === 'number' ? fromNumber(v, s) : fromDecimal(v, s, field));
  const c1 = newtonFixed(preperiod, period, { re: from(start.re), im: from(start.im) }, s);
  const expected = `a start point in the Newton basin of a Misiurewicz point of preperiod ${preperiod} and period ${period}`;
  if (c1 === null) throw new NewtonError(field, expected, shown, `Newton did not converge at ${bits} bits`);
  const bits2 = bits + 64;
  const s2 = fixedScale(bits2);
  const c2 = newtonFixed(preperiod, period, { re: rescale(c1.re, bits, bits2), im: rescale(c1.im, bits, bits2) }, s2);
  if (c2 === null) throw new NewtonError(field, expected, shown, `the result did not confirm at ${bits2} bits`);
  const tol = (s2.one * 10n) / (2n * 10n ** BigInt(digits + 1));
  const dre = c2.re - rescale(c1.re, bits, bits2);
  const dim = c2.im - rescale(c1.im, bits, bits2);
  if ((dre < 0n ? -dre : dre) > tol || (dim < 0n ? -dim : dim) > tol) throw new NewtonError(field, expected, shown, `the result moved when confirmed at ${bits2} bits`);
  const type = orbitType(c2, s2, preperiod, period);
  if (type === null || type.preperiod !== preperiod || type.period !== period) {
    const got = type === null ? 'no preperiodic orbit' : `preperiod ${type.preperiod} and period ${type.period}`;
    throw new NewtonError(field, expected, shown, `Newton converged to a point of ${got}`);
  }
  return { c: formatComplex(c2, s2, digits), fixed: c2, scale: s2, type };
}

/**
 * Span of a plate that frames the point's local picture: M near a Misiurewicz
 * point c0 is asymptotically the Julia set near c0 scaled by the derivative of
 * c -> z_{K+1}(c) (Tan Lei, "Similarity between the Mandelbrot set and Julia
 * sets", Comm. Math. Phys. 134 (1990) 587-617), so 2 / |d z_{K+1} / dc| shows a
 * unit piece of the Julia set around the cycle.
 */
export function misiurewiczSpan(point: MisiurewiczPoint, preperiod: number): { span: number; log10Span: number } {
  const o = orbitFixed(point.fixed, preperiod + 1, point.scale);
  if (o === null) return { span: 3.2, log10Span: Math.log10(3.2) };
  const d = o.dz[preperiod + 1]!;
  const bl = Math.max(bitLength(d.re), bitLength(d.im));
  const shift = Math.max(0, bl - 60);
  const dr = toNumber(d.re >> BigInt(shift), point.scale);
  const di = toNumber(d.im >> BigInt(shift), point.scale);
  const log10 = Math.log10(2) - Math.log10(Math.hypot(dr, di)) - shift * Math.log10(2);
  return { span: 10 ** log10, log10Span: log10 };
}

/**
 * Reads "K,P" (preperiod, period, positive integers) for `field`, each within
 * its bound; one UserError naming the field (and which of the two is wrong).
 */
export function parseMisiurewiczType(text: unknown, field: string, maxPreperiod: number, maxPeriod: number): { preperiod: number; period: number } {
  const m = typeof text === 'string' ? /^\s*([+-]?\d+)\s*,\s*([+-]?\d+)\s*$/.exec(text) : null;
  if (m === null) throw new UserError(field, 'K,P: a preperiod and a period, positive integers such as 1,2', text);
  const k = Number(m[1]);
  const p = Number(m[2]);
  if (!Number.isSafeInteger(k) || k < 1 || k > maxPreperiod) throw new UserError(`${field} preperiod`, `an integer between 1 and ${maxPreperiod}`, m[1]);
  if (!Number.isSafeInteger(p) || p < 1 || p > maxPeriod) throw new UserError(`${field} period`, `an integer between 1 and ${maxPeriod}`, m[2]);
  return { preperiod: k, period: p };
}
