/**
 * Points of a component's boundary (or interior) by multiplier: the root
 * (multiplier 1), the period-doubling point (-1), or any t = r e^{2 pi i theta}.
 *
 * Method (docs/methods.md C3): Newton on the 2x2 complex system
 *   F^p(w, b) = w,  D_z F^p(w, b) = t
 * in (w, b), Jacobian [[D_z - 1, D_c], [D_zz, D_cz]] with the A6 recurrences.
 * Start from (w, b) = (0, nucleus) (0 lies on the superattracting cycle) and
 * walk t from 0 to its target in small steps, each solved by Newton.
 * Source: mathr.co.uk/web/m-interior-point.html (C. Heiland-Allen).
 *
 * The walk runs at a modest precision (enough to resolve the component); the
 * end point is then polished at the full precision and confirmed by polishing
 * again at more bits: it is reported only when both agree to the digits asked.
 */
import { bitsForDigits, cadd, cdiv, cmul, csub, fixedScale, fromDecimal, fromNumber, rescale, bitLength, toNumber, mul } from '../precise/fixed.js';
import type { FixedComplex, FixedScale } from '../precise/fixed.js';
import type { ComplexDecimal } from './nucleus.js';
import { findNucleus, formatComplex, log2SizeAt } from './nucleus.js';
import { NewtonError } from './newton-error.js';

/** Steps of the walk in t from 0 to its target. */
export const WALK_STEPS = 16;
/** How often a failed walk step may be halved before giving up. */
export const MAX_HALVINGS = 10;
/** Components with a size above 10^-DOUBLE_WALK_DIGITS are walked in doubles, leaving 6 or more digits to spare. */
const DOUBLE_WALK_DIGITS = 9;

/**
 * The parameter b on the component of period `period` around `nucleus` where
 * the attracting cycle has multiplier `multiplier` (1: root, -1: period
 * doubling point), to `digits` digits after the point.
 */
export function findBoundaryPoint(period: number, nucleus: ComplexDecimal, multiplier: { re: number; im: number }, digits: number): ComplexDecimal {
  return findBoundaryPointFixed(period, nucleus, multiplier, digits).point;
}

/**
 * findBoundaryPoint at the multiplier e^{2 pi i num/den} taken exactly (unitRoot at the working
 * precision, so no double's rounding of cos and sin enters the digits); num/den = 0 is the root.
 */
export function findBoundaryPointAtAngle(period: number, nucleus: ComplexDecimal, num: number, den: number, digits: number): ComplexDecimal {
  return componentPoint(period, nucleus, { num, den }, digits).result.point;
}

export interface BoundaryPointFixed {
  point: ComplexDecimal;
  /** b and w at the confirming precision. */
  b: FixedComplex;
  w: FixedComplex;
  scale: FixedScale;
}

export function findBoundaryPointFixed(period: number, nucleus: ComplexDecimal, multiplier: { re: number; im: number }, digits: number): BoundaryPointFixed {
  return componentPoint(period, nucleus, multiplier, digits).result;
}

/** Where a satellite hangs: the parent's period and nucleus, and the internal angle num/den. */
export interface Attachment {
  readonly period: number;
  readonly nucleus: ComplexDecimal;
  readonly num: number;
  readonly den: number;
}

/**
 * The root of a component (multiplier 1) and, for a satellite, its parent
 * and internal angle. At a satellite's root the p-cycle collides with the
 * parent's k-cycle (p = kq) and the C3 system is singular, so Newton there
 * crawls; instead the walk stops at t = 0.999, the k-cycle near the p-cycle
 * is found (Newton on F^k(u) = u) and, when its multiplier is close to
 * e^{2 pi i r/q}, the root is solved as the parent's boundary point at that
 * multiplier, where the system is regular.
 */
export function componentRoot(period: number, nucleus: ComplexDecimal, digits: number): { root: ComplexDecimal; parent: Attachment | null } {
  const r = componentPoint(period, nucleus, { re: 1, im: 0 }, digits);
  return { root: r.result.point, parent: r.parent };
}

/**
 * componentRoot with the fixed-point solution it came from: for a satellite,
 * (w, b) solve the parent's system at multiplier e^{2 pi i num/den}
 * (certify-root.ts proves them).
 */
export function componentRootFixed(period: number, nucleus: ComplexDecimal, digits: number): { result: BoundaryPointFixed; parent: Attachment | null } {
  return componentPoint(period, nucleus, { re: 1, im: 0 }, digits);
}

/** A multiplier: a complex double, or exactly e^{2 pi i num/den}. */
export type Multiplier = { re: number; im: number } | { num: number; den: number };

/** The multiplier (times `fraction`) at scale s; e^{2 pi i num/den} is computed to full precision. */
export function multiplierAt(m: Multiplier, s: FixedScale, fraction = 1): FixedComplex {
  if ('re' in m) return { re: fromNumber(m.re * fraction, s), im: fromNumber(m.im * fraction, s) };
  const u = unitRoot(m.num, m.den, s);
  if (fraction === 1) return u;
  const f = fromNumber(fraction, s);
  return { re: mul(u.re, f, s), im: mul(u.im, f, s) };
}

/** e^{2 pi i num/den} at scale s: the double value polished by Newton on u^den = 1. */
export function unitRoot(num: number, den: number, s: FixedScale): FixedComplex {
  const a = (2 * Math.PI * num) / den;
  let u: FixedComplex = { re: fromNumber(Math.cos(a), s), im: fromNumber(Math.sin(a), s) };
  const one: FixedComplex = { re: s.one, im: 0n };
  for (let it = 0; it < 64; it += 1) {
    // u <- u - (u^den - 1) / (den u^(den-1)) = u - (u - u^(1-den)) / den
    let pw = one; // u^(den-1)
    for (let k = 1; k < den; k += 1) pw = cmul(pw, u, s);
    const step = cdiv(csub(cmul(pw, u, s), one), { re: pw.re * BigInt(den), im: pw.im * BigInt(den) }, s);
    u = csub(u, step);
    if (Math.max(bitLength(step.re), bitLength(step.im)) <= 2) break;
  }
  return u;
}

function componentPoint(period: number, nucleus: ComplexDecimal, multiplier: Multiplier, digits: number): { result: BoundaryPointFixed; parent: Attachment | null } {
  if ('re' in multiplier && (!Number.isFinite(multiplier.re) || !Number.isFinite(multiplier.im))) {
    throw new NewtonError('multiplier', 'a finite complex multiplier', multiplier, 'not finite');
  }
  const probe = fixedScale(bitsForDigits(Math.max(digits, 20), 32));
  const c0 = { re: fromDecimal(nucleus.re, probe, 'nucleus'), im: fromDecimal(nucleus.im, probe, 'nucleus') };
  const log2size = log2SizeAt(period, c0, probe);
  const depthDigits = Number.isFinite(log2size) ? Math.max(0, Math.ceil(-log2size / Math.log2(10))) : 0;
  const walkBits = bitsForDigits(depthDigits + 10, 32);
  const sw = fixedScale(walkBits);
  let b: FixedComplex = { re: rescale(c0.re, probe.bits, walkBits), im: rescale(c0.im, probe.bits, walkBits) };
  let w: FixedComplex = { re: 0n, im: 0n };
  const nearRoot = 're' in multiplier ? Math.hypot(multiplier.re - 1, multiplier.im) < 1e-9 : multiplier.num % multiplier.den === 0;
  const reach = nearRoot ? 0.999 : 1;
  // WALK_STEPS equal steps, each halved (up to MAX_HALVINGS times) where
  // Newton fails: near a cusp the system grows nearly singular and a full
  // step can leave the basin of the cycle being followed.
  let done = 0;
  let step = reach / WALK_STEPS;
  // Components at least 1e-9 across are walked in doubles (the walk only has to stay on the cycle being
  // followed; the point is then solved at full precision below); smaller ones in BigInt at walkBits.
  // Where doubles fail (near a cusp the system grows nearly singular), the walk goes on in BigInt from there.
  let inDoubles = depthDigits <= DOUBLE_WALK_DIGITS;
  const wd = { re: 0, im: 0 };
  const bd = { re: toNumber(b.re, sw), im: toNumber(b.im, sw) };
  while (done < reach) {
    const f = Math.min(reach, done + step);
    let ok: boolean;
    if (inDoubles) {
      const wTry = { ...wd };
      const bTry = { ...bd };
      ok = solveDouble(period, wTry, bTry, multiplierDouble(multiplier, f), 60);
      if (ok) {
        Object.assign(wd, wTry);
        Object.assign(bd, bTry);
      } else {
        inDoubles = false;
        w = { re: fromNumber(wd.re, sw), im: fromNumber(wd.im, sw) };
        b = { re: fromNumber(bd.re, sw), im: fromNumber(bd.im, sw) };
        continue;
      }
    } else {
      const r = solve(period, w, b, multiplierAt(multiplier, sw, f), sw, 60);
      ok = r !== null;
      if (r !== null) ({ w, b } = r);
    }
    if (!ok) {
      step /= 2;
      if (step < reach / (WALK_STEPS * 2 ** MAX_HALVINGS)) throw failure(period, nucleus, multiplier, `Newton failed on the walk at t = ${f} of the way`);
      continue;
    }
    done = f;
  }
  if (inDoubles) {
    w = { re: fromNumber(wd.re, sw), im: fromNumber(wd.im, sw) };
    b = { re: fromNumber(bd.re, sw), im: fromNumber(bd.im, sw) };
  }
  if (nearRoot) {
    const parent = findParent(period, w, b, sw, digits);
    if (parent !== null) {
      const pr = componentPoint(parent.period, parent.nucleus, { num: parent.num, den: parent.den }, digits);
      return { result: pr.result, parent };
    }
  }
  const bits = bitsForDigits(Math.max(digits, depthDigits + 12), 32);
  const s = fixedScale(bits);
  const t = multiplierAt(multiplier, s);
  const r1 = solve(period, up(w, sw, s), up(b, sw, s), t, s, 200);
  if (r1 === null) throw failure(period, nucleus, multiplier, `Newton did not converge at ${bits} bits`);
  const bits2 = bits + Math.max(32, Math.ceil(bits / 4));
  const s2 = fixedScale(bits2);
  const t2 = multiplierAt(multiplier, s2);
  const r2 = solve(period, up(r1.w, s, s2), up(r1.b, s, s2), t2, s2, 200);
  if (r2 === null) throw failure(period, nucleus, multiplier, `the result did not confirm at ${bits2} bits`);
  const tol = (s2.one * 10n) / (2n * 10n ** BigInt(digits + 1));
  const dre = r2.b.re - rescale(r1.b.re, bits, bits2);
  const dim = r2.b.im - rescale(r1.b.im, bits, bits2);
  if ((dre < 0n ? -dre : dre) > tol || (dim < 0n ? -dim : dim) > tol) {
    throw failure(period, nucleus, multiplier, `the result moved when confirmed at ${bits2} bits`);
  }
  return { result: { point: formatComplex(r2.b, s2, digits), b: r2.b, w: r2.w, scale: s2 }, parent: null };
}

/**
 * Near a root (b, with w on the p-cycle): the proper divisor k of p whose
 * k-cycle next to w has multiplier close to a primitive q-th root of unity,
 * q = p/k; null for a primitive component.
 */
function findParent(period: number, w: FixedComplex, b: FixedComplex, s: FixedScale, digits: number): Attachment | null {
  const one: FixedComplex = { re: s.one, im: 0n };
  for (let k = 1; k < period; k += 1) {
    if (period % k !== 0) continue;
    const q = period / k;
    let u = w;
    let mu: FixedComplex = one;
    let ok = false;
    for (let it = 0; it < 60; it += 1) {
      let z = u;
      let dz = one;
      for (let j = 0; j < k; j += 1) {
        dz = cmul(dbl(z), dz, s);
        z = cadd(cmul(z, z, s), b);
      }
      mu = dz;
      const den = csub(dz, one);
      if (den.re === 0n && den.im === 0n) break;
      const step = cdiv(csub(z, u), den, s);
      u = csub(u, step);
      if (Math.max(bitLength(step.re), bitLength(step.im)) <= 17) {
        ok = true;
        break;
      }
    }
    if (!ok) continue;
    const mr = toNumber(mu.re, s);
    const mi = toNumber(mu.im, s);
    if (Math.abs(Math.hypot(mr, mi) - 1) > 0.05) continue;
    let r = Math.round((Math.atan2(mi, mr) / (2 * Math.PI)) * q);
    r = ((r % q) + q) % q;
    if (r === 0 || gcd(r, q) !== 1) continue;
    const expected = (2 * Math.PI * r) / q;
    if (Math.hypot(mr - Math.cos(expected), mi - Math.sin(expected)) > 0.1) continue;
    const parentNucleus = findNucleus(k, formatComplex(b, s, Math.ceil(s.bits / Math.log2(10))), digits).nucleus;
    return { period: k, nucleus: parentNucleus, num: r, den: q };
  }
  return null;
}

function gcd(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

function failure(period: number, nucleus: ComplexDecimal, multiplier: Multiplier, detail: string): NewtonError {
  return new NewtonError('multiplier', `a multiplier reachable from the period-${period} nucleus ${nucleus.re},${nucleus.im}`, multiplier, detail);
}

function up(a: FixedComplex, from: FixedScale, to: FixedScale): FixedComplex {
  return { re: rescale(a.re, from.bits, to.bits), im: rescale(a.im, from.bits, to.bits) };
}

/**
 * Newton on (F^p(w,b) - w, D_z F^p(w,b) - t). Converged when the step in b
 * and w is under 2^17 ulp twice in a row;
 * null after maxSteps.
 */
function solve(period: number, w0: FixedComplex, b0: FixedComplex, t: FixedComplex, s: FixedScale, maxSteps: number): { w: FixedComplex; b: FixedComplex } | null {
  let w = w0;
  let b = b0;
  const one: FixedComplex = { re: s.one, im: 0n };
  let close = 0;
  for (let step = 0; step < maxSteps; step += 1) {
    let z = w;
    let dz: FixedComplex = one;
    let dc: FixedComplex = { re: 0n, im: 0n };
    let dzz: FixedComplex = { re: 0n, im: 0n };
    let dcz: FixedComplex = { re: 0n, im: 0n };
    for (let k = 0; k < period; k += 1) {
      const z2 = dbl(z);
      dcz = dbl(cadd(cmul(z, dcz, s), cmul(dc, dz, s)));
      dzz = dbl(cadd(cmul(z, dzz, s), cmul(dz, dz, s)));
      dc = cadd(cmul(z2, dc, s), one);
      dz = cmul(z2, dz, s);
      z = cadd(cmul(z, z, s), b);
      if (bitLength(z.re) > s.bits + 32 || bitLength(z.im) > s.bits + 32) return null;
    }
    const f1 = csub(z, w);
    const f2 = csub(dz, t);
    const dzm1 = csub(dz, one);
    const det = csub(cmul(dzm1, dcz, s), cmul(dc, dzz, s));
    if (det.re === 0n && det.im === 0n) return null;
    const db = cdiv(csub(cmul(dzm1, f2, s), cmul(dzz, f1, s)), det, s);
    const dw = cdiv(csub(cmul(dcz, f1, s), cmul(dc, f2, s)), det, s);
    b = csub(b, db);
    w = csub(w, dw);
    const size = Math.max(bitLength(db.re), bitLength(db.im), bitLength(dw.re), bitLength(dw.im));
    if (size <= 17) {
      close += 1;
      if (close >= 2) return { w, b };
    }
  }
  return null;
}

function dbl(a: FixedComplex): FixedComplex {
  return { re: a.re << 1n, im: a.im << 1n };
}

/** The multiplier times `fraction` as a complex double (the walk in doubles). */
function multiplierDouble(m: Multiplier, fraction: number): { re: number; im: number } {
  if ('re' in m) return { re: m.re * fraction, im: m.im * fraction };
  const a = (2 * Math.PI * m.num) / m.den;
  return { re: Math.cos(a) * fraction, im: Math.sin(a) * fraction };
}

/**
 * solve in complex doubles, updating w and b in place: Newton on
 * (F^p(w,b) - w, D_z F^p(w,b) - t), converged when the step is below 1e-13
 * of the scale twice in a row; false after maxSteps or on overflow. Also
 * the listing's fast path (fast-row.ts).
 */
export function solveDouble(period: number, w: { re: number; im: number }, b: { re: number; im: number }, t: { re: number; im: number }, maxSteps: number): boolean {
  let close = 0;
  for (let step = 0; step < maxSteps; step += 1) {
    let zr = w.re,
      zi = w.im;
    let dzr = 1,
      dzi = 0,
      dcr = 0,
      dci = 0,
      dzzr = 0,
      dzzi = 0,
      dczr = 0,
      dczi = 0;
    for (let k = 0; k < period; k += 1) {
      // dcz <- 2 (z dcz + dc dz); dzz <- 2 (z dzz + dz^2); dc <- 2 z dc + 1; dz <- 2 z dz; z <- z^2 + b
      const ndczr = 2 * (zr * dczr - zi * dczi + dcr * dzr - dci * dzi);
      const ndczi = 2 * (zr * dczi + zi * dczr + dcr * dzi + dci * dzr);
      const ndzzr = 2 * (zr * dzzr - zi * dzzi + dzr * dzr - dzi * dzi);
      const ndzzi = 2 * (zr * dzzi + zi * dzzr + 2 * dzr * dzi);
      const ndcr = 2 * (zr * dcr - zi * dci) + 1;
      const ndci = 2 * (zr * dci + zi * dcr);
      const ndzr = 2 * (zr * dzr - zi * dzi);
      const ndzi = 2 * (zr * dzi + zi * dzr);
      const nzr = zr * zr - zi * zi + b.re;
      const nzi = 2 * zr * zi + b.im;
      dczr = ndczr;
      dczi = ndczi;
      dzzr = ndzzr;
      dzzi = ndzzi;
      dcr = ndcr;
      dci = ndci;
      dzr = ndzr;
      dzi = ndzi;
      zr = nzr;
      zi = nzi;
      if (!(Math.abs(zr) + Math.abs(zi) < 1e8)) return false;
    }
    const f1r = zr - w.re,
      f1i = zi - w.im;
    const f2r = dzr - t.re,
      f2i = dzi - t.im;
    const mr = dzr - 1,
      mi = dzi;
    // det = (dz - 1) dcz - dc dzz
    const detr = mr * dczr - mi * dczi - (dcr * dzzr - dci * dzzi);
    const deti = mr * dczi + mi * dczr - (dcr * dzzi + dci * dzzr);
    const d2 = detr * detr + deti * deti;
    if (!(d2 > 0) || !Number.isFinite(d2)) return false;
    // db = ((dz - 1) f2 - dzz f1) / det; dw = (dcz f1 - dc f2) / det
    const nbr = mr * f2r - mi * f2i - (dzzr * f1r - dzzi * f1i);
    const nbi = mr * f2i + mi * f2r - (dzzr * f1i + dzzi * f1r);
    const nwr = dczr * f1r - dczi * f1i - (dcr * f2r - dci * f2i);
    const nwi = dczr * f1i + dczi * f1r - (dcr * f2i + dci * f2r);
    const dbr = (nbr * detr + nbi * deti) / d2,
      dbi = (nbi * detr - nbr * deti) / d2;
    const dwr = (nwr * detr + nwi * deti) / d2,
      dwi = (nwi * detr - nwr * deti) / d2;
    if (!Number.isFinite(dbr + dbi + dwr + dwi)) return false;
    b.re -= dbr;
    b.im -= dbi;
    w.re -= dwr;
    w.im -= dwi;
    const size = Math.max(Math.abs(dbr), Math.abs(dbi), Math.abs(dwr), Math.abs(dwi));
    if (size <= 1e-12 * Math.max(1, Math.abs(b.re) + Math.abs(b.im))) {
      close += 1;
      if (close >= 2) return true;
    }
  }
  return false;
}
