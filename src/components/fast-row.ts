/**
 * The fast path of a listing row (docs/methods.md C7): the nucleus and the
 * root of a component confirmed in double-double arithmetic with an error
 * bound, instead of two BigInt Newton runs each.
 *
 * Nucleus: Newton on F^p(0, c) from the census' double-double position, the
 * orbit in double-double, the derivative in doubles (an approximate
 * Jacobian only slows convergence from quadratic to a factor of about 1e-16
 * per step). Root: the double walk of C3, then Newton on (F^p(w,b) - w,
 * D_z F^p(w,b) - t) with both residuals in double-double; satellites are
 * solved on their parent at t = e^{2 pi i r/q}, as in boundary-point.ts.
 *
 * Bound: alongside each double-double orbit a running bound E of its
 * rounding error is kept (each double-double operation errs by at most
 * U = 2^-100 times the magnitudes it combines; Hida, Li and Bailey 2000 give
 * a few units of 2^-104). The last Newton step h and E carried through the
 * (double) inverse Jacobian bound the distance to the solution, to first
 * order: err = 4 (|h| + |J^-1| E). The first-order bound holds when the
 * step is far below the component's size, which is checked. A coordinate is
 * printed only when c - err, c and c + err give the same digits; otherwise,
 * and wherever a walk, a parent or a period check fails, null is returned
 * and the caller runs the BigInt path (nucleus.ts, boundary-point.ts).
 */
import { fixedScale, fromNumber, pow10 } from '../precise/fixed.js';
import { solveDouble, type Attachment } from './boundary-point.js';
import { formatReal, type ComplexDecimal } from './nucleus.js';
import { ddAdd, ddMulInto, ddSqrInto } from './double-double.js';
import { nucleusDD as censusNucleusDD, nucleusDouble as censusNucleusDouble, sizeTerms, type SizeTerms } from './fast-nucleus.js';

/** The period-k nucleus near c by the census's deflated Newton in doubles, or null. */
function nucleusDouble(k: number, c: C): C | null {
  const r = censusNucleusDouble(k, c.re, c.im);
  return r.ok ? { re: r.reHi, im: r.imHi } : null;
}
import { sizeEstimateOfOrbit, type SizeEstimateScaled } from './size-estimate.js';

/** A complex double-double: re hi, re lo, im hi, im lo. */
export type DDComplex = [number, number, number, number];

/** Relative rounding error allowed per double-double operation (generous: 2^-100). */
const U = 2 ** -100;
/**
 * Newton gives up when the running bound of an orbit's rounding error passes
 * this: the orbit then has too few good digits for the first-order bound.
 * What decides a row is the error in c (err below 1e-6 of the size, then the
 * printing test); the cap only stops hopeless runs early. (At 1e-20, as
 * before December 2026, 653 period-18 nuclei near |c| = 1 with |D| ~ 2e7 went
 * to BigInt although their bound in c was 5e-28.)
 */
const ORBIT_ERROR_CAP = 1e-10;
/** Walk steps, as boundary-point.ts. */
const WALK_STEPS = 16;
/** Walk steps in double-double (halved where Newton fails, as the double walk). */
const DD_WALK_STEPS = 8;

const FORMAT_BITS = 320n;
const FORMAT_SCALE = fixedScale(Number(FORMAT_BITS));
const FORMAT_MASK = FORMAT_SCALE.one - 1n;
const FORMAT_HALF = FORMAT_SCALE.one >> 1n;

/**
 * hi + lo (each a double) printed to `digits` after the point, or null when
 * c - err and c + err print differently: their signs differ, or a rounding
 * boundary (a half unit of the last digit) lies within err of c.
 */
export function formatDD(hi: number, lo: number, err: number, digits: number): string | null {
  if (hi === 0 && lo === 0 && err === 0) return '0';
  const n = toFixed320(hi) + toFixed320(lo);
  const e = toFixed320(err) + 1n;
  const a = n < 0n ? -n : n;
  if (a <= e) return null;
  // the digits are round(a 10^digits / 2^bits): a boundary lies within err when the remainder is within err 10^digits of one half
  const p10 = pow10(digits);
  const scaled = a * p10;
  const r = scaled & FORMAT_MASK;
  const d = r > FORMAT_HALF ? r - FORMAT_HALF : FORMAT_HALF - r;
  if (d <= e * p10 + 1n) return null;
  // no boundary within reach: the digits are the quotient, rounded up past one half (toDecimal's value, by a shift)
  const q = (scaled >> FORMAT_BITS) + (r > FORMAT_HALF ? 1n : 0n);
  if (q === 0n || digits < 1) return formatReal(n, FORMAT_SCALE, digits);
  const t = q.toString().padStart(digits + 1, '0');
  return `${n < 0n ? '-' : ''}${t.slice(0, t.length - digits)}.${t.slice(t.length - digits)}`;
}

/** x 2^320 as a BigInt: exactly by BigInt() when that is an integer (|x| above about 2^-268), else by fromNumber (the same value, rounded). */
function toFixed320(x: number): bigint {
  const y = x * 2 ** 320;
  return Number.isInteger(y) ? BigInt(y) : fromNumber(x, FORMAT_SCALE);
}

function formatComplexDD(c: DDComplex, err: number, digits: number, realExact: boolean): ComplexDecimal | null {
  const re = formatDD(c[0], c[1], err, digits);
  const im = realExact && c[2] === 0 && c[3] === 0 ? '0' : formatDD(c[2], c[3], err, digits);
  return re === null || im === null ? null : { re, im };
}

const T = new Float64Array(8);

/** z <- z^2 + c in double-double (z, c as DDComplex arrays). */
function sqrAdd(z: Float64Array, c: ArrayLike<number>): void {
  ddSqrInto(T, 0, z[0]!, z[1]!);
  ddSqrInto(T, 2, z[2]!, z[3]!);
  ddMulInto(z, 2, z[0]!, z[1]!, z[2]!, z[3]!);
  z[2] = 2 * z[2]!;
  z[3] = 2 * z[3]!;
  ddAdd(z, 2, c[2]!, c[3]!);
  z[0] = T[0]!;
  z[1] = T[1]!;
  ddAdd(z, 0, -T[2]!, -T[3]!);
  ddAdd(z, 0, c[0]!, c[1]!);
}

/** d <- 2 z d in double-double. */
function twiceMul(d: Float64Array, z: Float64Array): void {
  ddMulInto(T, 0, z[0]!, z[1]!, d[0]!, d[1]!);
  ddMulInto(T, 2, z[2]!, z[3]!, d[2]!, d[3]!);
  ddMulInto(T, 4, z[0]!, z[1]!, d[2]!, d[3]!);
  ddMulInto(T, 6, z[2]!, z[3]!, d[0]!, d[1]!);
  ddAdd(T, 0, -T[2]!, -T[3]!);
  ddAdd(T, 4, T[6]!, T[7]!);
  d[0] = 2 * T[0]!;
  d[1] = 2 * T[1]!;
  d[2] = 2 * T[4]!;
  d[3] = 2 * T[5]!;
}

/**
 * The nucleus of exact period p near `start` in double-double, with its
 * error bound; null when Newton does not settle, moves further than
 * `reach`, or lands on a point of lower period.
 */
export function nucleusDD(period: number, start: DDComplex, reach: number): { c: DDComplex; err: number } | null {
  const c = Float64Array.from(start);
  const z = new Float64Array(4);
  let prev = Infinity;
  for (let step = 0; step < 12; step += 1) {
    z.fill(0);
    let dr = 0;
    let di = 0;
    let e = 0;
    const cm = Math.abs(c[0]!) + Math.abs(c[2]!);
    for (let k = 1; k <= period; k += 1) {
      const zr = z[0]!;
      const zi = z[2]!;
      const ndr = 2 * (zr * dr - zi * di) + 1;
      di = 2 * (zr * di + zi * dr);
      dr = ndr;
      const zm = Math.abs(zr) + Math.abs(zi);
      sqrAdd(z, c);
      e = (2 * zm + e) * e + U * (2 * zm * zm + cm + Math.abs(z[0]!) + Math.abs(z[2]!));
      if (!(e < ORBIT_ERROR_CAP)) return null;
      if (k < period && period % k === 0 && Math.hypot(z[0]!, z[2]!) < 1e-12) return null;
    }
    const d2 = dr * dr + di * di;
    if (!(d2 > 0)) return null;
    const fr = z[0]! + z[1]!;
    const fi = z[2]! + z[3]!;
    const hr = (fr * dr + fi * di) / d2;
    const hi = (fi * dr - fr * di) / d2;
    ddAdd(c, 0, -hr, 0);
    ddAdd(c, 2, -hi, 0);
    const h = Math.hypot(hr, hi);
    const bound = e / Math.sqrt(d2);
    if (h <= 4 * bound + 1e-40 || (step >= 2 && h >= prev / 4)) {
      if (!(Math.hypot(c[0]! - start[0], c[2]! - start[2]) <= reach)) return null;
      return { c: [c[0]!, c[1]!, c[2]!, c[3]!], err: 4 * (h + bound) };
    }
    prev = h;
  }
  return null;
}

/** The nucleus of exact period p at `digits`, from a double-double start, or null (see the file comment). */
export function fastNucleus(period: number, start: DDComplex, size: number, real: boolean, digits: number): { decimal: ComplexDecimal; c: DDComplex } | null {
  const r = nucleusDD(period, real ? [start[0], start[1], 0, 0] : start, 1e-6 * size);
  if (r === null || !(r.err < 1e-6 * size)) return null;
  const decimal = formatComplexDD(r.c, r.err, digits, real);
  return decimal === null ? null : { decimal, c: r.c };
}

/** log2 of the size estimate in doubles (docs/methods.md C4; the recurrence of sizeTerms), NaN when it degenerates. */
function log2SizeDouble(period: number, cr: number, ci: number): number {
  if (!sizeTerms(period, cr, ci, terms)) return NaN;
  return -(Math.log2(Math.hypot(terms.br, terms.bi)) + 2 * Math.log2(Math.hypot(terms.lr, terms.li)));
}

const terms: SizeTerms = { br: 0, bi: 0, lr: 0, li: 0 };

type C = { re: number; im: number };

/** The walk of boundary-point.ts in doubles from the nucleus to multiplier reach * t; false where a step fails (the caller falls back). */
function walkDouble(period: number, nucleus: C, t: C, reach: number): { w: C; b: C } | null {
  const w = { re: 0, im: 0 };
  const b = { ...nucleus };
  let done = 0;
  let step = reach / WALK_STEPS;
  while (done < reach) {
    const f = Math.min(reach, done + step);
    const wTry = { ...w };
    const bTry = { ...b };
    if (solveDouble(period, wTry, bTry, { re: t.re * f, im: t.im * f }, 60)) {
      Object.assign(w, wTry);
      Object.assign(b, bTry);
      done = f;
    } else {
      step /= 2;
      if (step < reach / (WALK_STEPS * 2 ** 10)) return null;
    }
  }
  return { w, b };
}

/** e^{2 pi i num/den} in double-double: the double value polished by Newton on u^den = 1. */
function unitRootDD(num: number, den: number): DDComplex {
  const a = (2 * Math.PI * num) / den;
  const u = Float64Array.of(Math.cos(a), 0, Math.sin(a), 0);
  const pw = new Float64Array(4);
  const s = new Float64Array(4);
  for (let it = 0; it < 2; it += 1) {
    pw.set([1, 0, 0, 0]);
    for (let k = 1; k < den; k += 1) {
      // pw <- pw u
      ddMulInto(s, 0, pw[0]!, pw[1]!, u[0]!, u[1]!);
      ddMulInto(T, 0, pw[2]!, pw[3]!, u[2]!, u[3]!);
      ddAdd(s, 0, -T[0]!, -T[1]!);
      ddMulInto(s, 2, pw[0]!, pw[1]!, u[2]!, u[3]!);
      ddMulInto(T, 0, pw[2]!, pw[3]!, u[0]!, u[1]!);
      ddAdd(s, 2, T[0]!, T[1]!);
      pw.set(s);
    }
    // u^den - 1 = pw u - 1, then step = (pw u - 1) / (den pw) in doubles (it is tiny)
    ddMulInto(s, 0, pw[0]!, pw[1]!, u[0]!, u[1]!);
    ddMulInto(T, 0, pw[2]!, pw[3]!, u[2]!, u[3]!);
    ddAdd(s, 0, -T[0]!, -T[1]!);
    ddAdd(s, 0, -1, 0);
    ddMulInto(s, 2, pw[0]!, pw[1]!, u[2]!, u[3]!);
    ddMulInto(T, 0, pw[2]!, pw[3]!, u[0]!, u[1]!);
    ddAdd(s, 2, T[0]!, T[1]!);
    const rr = s[0]! + s[1]!;
    const ri = s[2]! + s[3]!;
    const pr = den * pw[0]!;
    const pi = den * pw[2]!;
    const m = pr * pr + pi * pi;
    ddAdd(u, 0, -(rr * pr + ri * pi) / m, 0);
    ddAdd(u, 2, -(ri * pr - rr * pi) / m, 0);
  }
  return [u[0]!, u[1]!, u[2]!, u[3]!];
}

/**
 * Newton on (F^p(w,b) - w, D_z F^p(w,b) - t) with the residuals in
 * double-double and the Jacobian in doubles, updating w and b in place.
 * Stops when the step in b is below `tol`, or at the rounding floor (the
 * step below 4 times the rounding bound, or no longer shrinking); returns
 * the error bound of b (docs/methods.md C7), or null.
 */
function newtonDD(period: number, w: Float64Array, b: Float64Array, t: DDComplex, tol: number, maxSteps: number): number | null {
  const z = new Float64Array(4);
  const dz = new Float64Array(4);
  let prev = Infinity;
  for (let step = 0; step < maxSteps; step += 1) {
    z.set(w);
    dz.set([1, 0, 0, 0]);
    let dcr = 0,
      dci = 0,
      dzzr = 0,
      dzzi = 0,
      dczr = 0,
      dczi = 0;
    let ez = 0;
    let ed = 0;
    const bm = Math.abs(b[0]!) + Math.abs(b[2]!);
    for (let k = 0; k < period; k += 1) {
      const zr = z[0]!,
        zi = z[2]!,
        dzr = dz[0]!,
        dzi = dz[2]!;
      const ndczr = 2 * (zr * dczr - zi * dczi + dcr * dzr - dci * dzi);
      const ndczi = 2 * (zr * dczi + zi * dczr + dcr * dzi + dci * dzr);
      const ndzzr = 2 * (zr * dzzr - zi * dzzi + dzr * dzr - dzi * dzi);
      const ndzzi = 2 * (zr * dzzi + zi * dzzr + 2 * dzr * dzi);
      const ndcr = 2 * (zr * dcr - zi * dci) + 1;
      const ndci = 2 * (zr * dci + zi * dcr);
      dczr = ndczr;
      dczi = ndczi;
      dzzr = ndzzr;
      dzzi = ndzzi;
      dcr = ndcr;
      dci = ndci;
      // |re| + |im| bounds the modulus from above (cheaper than hypot; the bound stays a bound)
      const zm = Math.abs(zr) + Math.abs(zi);
      const dm = Math.abs(dzr) + Math.abs(dzi);
      ed = 2 * (zm * ed + dm * ez + ez * ed) + U * 4 * zm * dm;
      twiceMul(dz, z);
      sqrAdd(z, b);
      ez = (2 * zm + ez) * ez + U * (2 * zm * zm + bm + Math.abs(z[0]!) + Math.abs(z[2]!));
      if (!(ez < ORBIT_ERROR_CAP && ed < 1e-4 && zm < 1e4)) return null;
    }
    ddAdd(z, 0, -w[0]!, -w[1]!);
    ddAdd(z, 2, -w[2]!, -w[3]!);
    ddAdd(dz, 0, -t[0], -t[1]);
    ddAdd(dz, 2, -t[2], -t[3]);
    const f1r = z[0]! + z[1]!,
      f1i = z[2]! + z[3]!;
    const f2r = dz[0]! + dz[1]!,
      f2i = dz[2]! + dz[3]!;
    const dzr = f2r + t[0],
      dzi = f2i + t[2];
    const mr = dzr - 1,
      mi = dzi;
    const detr = mr * dczr - mi * dczi - (dcr * dzzr - dci * dzzi);
    const deti = mr * dczi + mi * dczr - (dcr * dzzi + dci * dzzr);
    const d2 = detr * detr + deti * deti;
    if (!(d2 > 0) || !Number.isFinite(d2)) return null;
    const nbr = mr * f2r - mi * f2i - (dzzr * f1r - dzzi * f1i);
    const nbi = mr * f2i + mi * f2r - (dzzr * f1i + dzzi * f1r);
    const nwr = dczr * f1r - dczi * f1i - (dcr * f2r - dci * f2i);
    const nwi = dczr * f1i + dczi * f1r - (dcr * f2i + dci * f2r);
    const dbr = (nbr * detr + nbi * deti) / d2,
      dbi = (nbi * detr - nbr * deti) / d2;
    const dwr = (nwr * detr + nwi * deti) / d2,
      dwi = (nwi * detr - nwr * deti) / d2;
    if (!Number.isFinite(dbr + dbi + dwr + dwi)) return null;
    ddAdd(b, 0, -dbr, 0);
    ddAdd(b, 2, -dbi, 0);
    ddAdd(w, 0, -dwr, 0);
    ddAdd(w, 2, -dwi, 0);
    const h = Math.hypot(dbr, dbi);
    // E through the inverse Jacobian's b row: (|dz - 1| (ed + |t| U) + |dzz| ez) / |det|
    const bound = (Math.hypot(mr, mi) * (ed + U) + Math.hypot(dzzr, dzzi) * ez) / Math.sqrt(d2);
    const hw = Math.hypot(dwr, dwi);
    if ((h <= tol && hw <= 1e6 * tol) || (h <= 4 * bound + 1e-40 && hw <= 1e-26) || (step >= 2 && h >= prev / 4 && h < 1e-24)) return 4 * (h + bound);
    prev = h;
  }
  return null;
}

/** The walk in double-double from the nucleus to multiplier reach * t, for components too small for doubles; (w, b) at the end, or null. */
function walkDD(period: number, nucleus: DDComplex, t: C, reach: number, size: number): { w: C; b: C; wd: Float64Array; bd: Float64Array } | null {
  const w = new Float64Array(4);
  const b = Float64Array.from(nucleus);
  const wTry = new Float64Array(4);
  const bTry = new Float64Array(4);
  let done = 0;
  let step = reach / DD_WALK_STEPS;
  while (done < reach) {
    const f = Math.min(reach, done + step);
    wTry.set(w);
    bTry.set(b);
    if (newtonDD(period, wTry, bTry, [t.re * f, 0, t.im * f, 0], 1e-8 * size, 60) !== null) {
      w.set(wTry);
      b.set(bTry);
      done = f;
    } else {
      step /= 2;
      if (step < reach / (WALK_STEPS * 2 ** 10)) return null;
    }
  }
  return { w: { re: w[0]! + w[1]!, im: w[2]! + w[3]! }, b: { re: b[0]! + b[1]!, im: b[2]! + b[3]! }, wd: w, bd: b };
}

/**
 * Near a root (b, with w on the p-cycle): the parent's period k and the
 * internal angle r/q, as boundary-point.ts findParent does in BigInt; null
 * for a primitive component.
 */
function findParentDouble(period: number, w: C, b: C): { k: number; r: number; q: number } | null {
  for (let k = 1; k < period; k += 1) {
    if (period % k !== 0) continue;
    const q = period / k;
    let ur = w.re;
    let ui = w.im;
    let mr = 1;
    let mi = 0;
    let ok = false;
    for (let it = 0; it < 60; it += 1) {
      let zr = ur;
      let zi = ui;
      let dr = 1;
      let di = 0;
      for (let j = 0; j < k; j += 1) {
        const ndr = 2 * (zr * dr - zi * di);
        di = 2 * (zr * di + zi * dr);
        dr = ndr;
        const nzr = zr * zr - zi * zi + b.re;
        zi = 2 * zr * zi + b.im;
        zr = nzr;
      }
      mr = dr;
      mi = di;
      const er = dr - 1;
      const m = er * er + di * di;
      if (!(m > 0)) break;
      const fr = zr - ur;
      const fi = zi - ui;
      const sr = (fr * er + fi * di) / m;
      const si = (fi * er - fr * di) / m;
      if (!Number.isFinite(sr + si)) break;
      ur -= sr;
      ui -= si;
      if (Math.max(Math.abs(sr), Math.abs(si)) <= 1e-13) {
        ok = true;
        break;
      }
    }
    if (!ok) continue;
    if (Math.abs(Math.hypot(mr, mi) - 1) > 0.05) continue;
    let r = Math.round((Math.atan2(mi, mr) / (2 * Math.PI)) * q);
    r = ((r % q) + q) % q;
    if (r === 0 || gcd(r, q) !== 1) continue;
    const expected = (2 * Math.PI * r) / q;
    if (Math.hypot(mr - Math.cos(expected), mi - Math.sin(expected)) > 0.1) continue;
    return { k, r, q };
  }
  return null;
}

function gcd(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}

/** Components at least 1e-9 across are walked in doubles (as boundary-point.ts), down to 1e-18 in double-double; smaller ones go to BigInt. */
const DOUBLE_WALK_DIGITS = 9;
const DD_WALK_DIGITS = 18;

/**
 * The root and, for a satellite, the parent of the component of `period`
 * with this double-double nucleus, at `digits`; null where the fast path
 * cannot vouch for the digits (the caller then runs componentRoot).
 */
export function fastRoot(
  period: number,
  nucleus: DDComplex,
  digits: number,
  expected?: { k: number; r: number; q: number } | null,
): { root: ComplexDecimal; parent: Attachment | null } | null {
  const c = { re: nucleus[0] + nucleus[1], im: nucleus[2] + nucleus[3] };
  if (expected === null) {
    const direct = primitiveRoot(period, nucleus, digits);
    if (direct !== null) return direct;
  }
  const log2size = log2SizeDouble(period, c.re, c.im);
  if (expected !== undefined && expected !== null) {
    const direct = satelliteRoot(period, nucleus, digits, expected, 2 ** log2size);
    if (direct !== null) return direct;
  }
  const walk = walkTo(period, nucleus, { re: 1, im: 0 }, 0.999, log2size);
  if (walk === null) return null;
  const found = expected === undefined ? findParentDouble(period, walk.w, walk.b) : expected;
  const size = 2 ** log2size;
  if (found !== null) {
    const pd = nucleusDouble(found.k, walk.b);
    if (pd === null) return null;
    const pn = fastNucleus(found.k, [pd.re, 0, pd.im, 0], found.k === 1 ? 1 : 2 ** log2SizeDouble(found.k, pd.re, pd.im), c.im === 0 && pd.im === 0, digits);
    if (pn === null) return null;
    const pc = { re: pn.c[0] + pn.c[1], im: pn.c[2] + pn.c[3] };
    const plog = found.k === 1 ? 0 : log2SizeDouble(found.k, pc.re, pc.im);
    // e^{i pi} = -1 exactly (sin(pi) in doubles is 1.2e-16, which would take a real root off the axis)
    const a = (2 * Math.PI * found.r) / found.q;
    const t: DDComplex = found.q === 2 ? [-1, 0, 0, 0] : unitRootDD(found.r, found.q);
    const pw = walkTo(found.k, pn.c, found.q === 2 ? { re: -1, im: 0 } : { re: Math.cos(a), im: Math.sin(a) }, 1, plog);
    if (pw === null) return null;
    const err = newtonDD(found.k, pw.wd, pw.bd, t, 0, 20);
    if (err === null || !(err < 1e-6 * 2 ** plog)) return null;
    if (!rootNearNucleus(pw.bd, nucleus, size)) return null;
    const root = formatComplexDD(ddOf(pw.bd), err, digits, c.im === 0 && pc.im === 0 && found.q === 2);
    if (root === null) return null;
    return { root, parent: { period: found.k, nucleus: pn.decimal, num: found.r, den: found.q } };
  }
  // the root's system is singular at t = 1 only for satellites; a primitive root is regular
  const err = newtonDD(period, walk.wd, walk.bd, [1, 0, 0, 0], 0, 60);
  if (err === null || !(err < 1e-6 * size) || !rootNearNucleus(walk.bd, nucleus, size)) return null;
  const root = formatComplexDD(ddOf(walk.bd), err, digits, c.im === 0);
  return root === null ? null : { root, parent: null };
}

/**
 * A root belongs to the component when it lies between 1/64 and 8 times the
 * size estimate from the nucleus. Measured over the listings of periods 16
 * and 18 (every row whose walk stayed on its component): primitive roots lie
 * 0.25 |s| from the nucleus (median; the affine copy of the cardioid puts the
 * cusp at s/4), at most 4 |s|; satellite roots 0.5 |s| (median), at most
 * 0.5 |s| for the rows whose attachment agreed with the angles. Walks that
 * jumped to a neighbour's root were 5e4 to 1e7 |s| away.
 */
function rootNearNucleus(b: Float64Array, nucleus: DDComplex, size: number): boolean {
  const dr = b[0]! - nucleus[0] + (b[1]! - nucleus[1]);
  const di = b[2]! - nucleus[2] + (b[3]! - nucleus[3]);
  const d = Math.hypot(dr, di);
  return d >= size / 64 && d <= 8 * size;
}

/**
 * The root of a satellite without either walk (docs/methods.md C7): the
 * parent's nucleus P by deflated Newton of period k from the satellite's
 * nucleus; in the parent's renormalised coordinates (primitiveRoot) the root
 * is the cardioid's point C = mu/2 - mu^2/4 with fixed point Z = mu/2,
 * mu = e^(2 pi i r/q), so Newton on the parent's system at t = mu starts at
 * b = P + s_P C, w = mu / (2 lambda_P). Null when Newton fails or the root is
 * not near the satellite's nucleus; the caller then walks.
 */
function satelliteRoot(
  period: number,
  nucleus: DDComplex,
  digits: number,
  found: { k: number; r: number; q: number },
  size: number,
): { root: ComplexDecimal; parent: Attachment } | null {
  const cr = nucleus[0] + nucleus[1];
  const ci = nucleus[2] + nucleus[3];
  const pd = found.k === 1 ? { re: 0, im: 0 } : nucleusDouble(found.k, { re: cr, im: ci });
  if (pd === null) return null;
  // a double nucleus of a small parent near the tip (period 12 at -1.99915, about 1e-9 across) is off by more than
  // fastNucleus lets Newton move (1e-6 of the size): the census's double-double Newton brings it in first
  const psize = found.k === 1 ? 1 : 2 ** log2SizeDouble(found.k, pd.re, pd.im);
  let start: DDComplex = [pd.re, 0, pd.im, 0];
  if (found.k > 1) {
    const dd = censusNucleusDD(found.k, { reHi: pd.re, reLo: 0, imHi: pd.im, imLo: 0 });
    if (dd.ok) start = [dd.reHi, dd.reLo, dd.imHi, dd.imLo];
  }
  // a real parent comes out of Newton with an imaginary part of rounding size: on the axis within 1e-9 of its size it is
  // real (a component so near the axis and off it would overlap its own mirror image), and is started there
  if (Math.abs(start[2] + start[3]) <= 1e-9 * psize) start = [start[0], start[1], 0, 0];
  const pn = fastNucleus(found.k, start, psize, ci === 0 && pd.im === 0, digits);
  if (pn === null) return null;
  const pcr = pn.c[0] + pn.c[1];
  const pci = pn.c[2] + pn.c[3];
  const a = (2 * Math.PI * found.r) / found.q;
  // e^{i pi} = -1 exactly (sin(pi) in doubles is 1.2e-16, which would take a real root off the axis)
  const mr = found.q === 2 ? -1 : Math.cos(a);
  const mi = found.q === 2 ? 0 : Math.sin(a);
  const t: DDComplex = found.q === 2 ? [-1, 0, 0, 0] : unitRootDD(found.r, found.q);
  // the cardioid's point C = mu/2 - mu^2/4 with its fixed point Z = mu/2
  const solved = solveRenormalised(found.k, pn.c, { re: mr / 2 - (mr * mr - mi * mi) / 4, im: mi / 2 - (2 * mr * mi) / 4 }, { re: mr / 2, im: mi / 2 }, t);
  if (solved === null || !rootNearNucleus(solved.b, nucleus, size)) return null;
  const root = formatComplexDD(ddOf(solved.b), solved.err, digits, ci === 0 && pci === 0 && found.q === 2);
  if (root === null) return null;
  return { root, parent: { period: found.k, nucleus: pn.decimal, num: found.r, den: found.q } };
}

/**
 * The root of a primitive component without the walk (docs/methods.md C7):
 * near its nucleus c0 the p-th iterate is, to first order, the quadratic map
 * in the renormalised coordinates Z = lambda z, C = lambda^2 beta (c - c0)
 * (lambda = lambda_(p-1), beta = sum 1/lambda_k: the terms of the Hunt-Ott
 * size estimate s = 1 / (beta lambda^2), docs/methods.md C4), whose cardioid
 * has its cusp at C = 1/4 with the fixed point Z = 1/2. So Newton on
 * (F^p(w,b) - w, D_z F^p(w,b) - 1) starts at b = c0 + s/4, w = 1/(2 lambda):
 * in doubles and polished in double-double for components of 1e-9 and more,
 * in double-double from the start below that. Null when Newton fails or the
 * root is not near the nucleus (rootNearNucleus); the caller then walks.
 */
function primitiveRoot(period: number, nucleus: DDComplex, digits: number): { root: ComplexDecimal; parent: null } | null {
  const ci = nucleus[2] + nucleus[3];
  const solved = solveRenormalised(period, nucleus, { re: 0.25, im: 0 }, { re: 0.5, im: 0 }, [1, 0, 0, 0]);
  if (solved === null || !rootNearNucleus(solved.b, nucleus, solved.size)) return null;
  const root = formatComplexDD(ddOf(solved.b), solved.err, digits, ci === 0);
  return root === null ? null : { root, parent: null };
}

/**
 * Newton on (F^k(w,b) - w, D_z F^k(w,b) - t) from the point of renormalised
 * coordinates (C, Z) of the period-k component with this nucleus c0: with the
 * size-estimate terms lambda, beta and s = 1 / (beta lambda^2) (docs/methods.md
 * C4, C7), b = c0 + s C and w = Z / lambda. In doubles first for components of
 * 1e-9 and more, then in double-double; (w, b), the error bound of b and the
 * component's size |s|, or null.
 */
function solveRenormalised(k: number, c0: DDComplex, C: C, Z: C, t: DDComplex): { b: Float64Array; err: number; size: number } | null {
  if (!sizeTerms(k, c0[0] + c0[1], c0[2] + c0[3], terms)) return null;
  const { br, bi, lr, li } = terms;
  // beta lambda^2, then s = 1 / that
  const l2r = lr * lr - li * li;
  const l2i = 2 * lr * li;
  const qr = br * l2r - bi * l2i;
  const qi = br * l2i + bi * l2r;
  const qm = qr * qr + qi * qi;
  const sr = qr / qm;
  const si = -qi / qm;
  const size = Math.hypot(sr, si);
  const lm = lr * lr + li * li;
  if (!(size > 0 && Number.isFinite(size) && lm > 0 && Number.isFinite(lm))) return null;
  const wd = Float64Array.of((Z.re * lr + Z.im * li) / lm, 0, (Z.im * lr - Z.re * li) / lm, 0);
  const bd = Float64Array.from(c0);
  ddAdd(bd, 0, sr * C.re - si * C.im, 0);
  ddAdd(bd, 2, sr * C.im + si * C.re, 0);
  if (size >= 1e-9) {
    const w = { re: wd[0]!, im: wd[2]! };
    const b = { re: bd[0]! + bd[1]!, im: bd[2]! + bd[3]! };
    if (!solveDouble(k, w, b, { re: t[0] + t[1], im: t[2] + t[3] }, 40)) return null;
    wd.set([w.re, 0, w.im, 0]);
    bd.set([b.re, 0, b.im, 0]);
  }
  const err = newtonDD(k, wd, bd, t, 0, 60);
  if (err === null || !(err < 1e-6 * size)) return null;
  return { b: bd, err, size };
}

function ddOf(a: Float64Array): DDComplex {
  return [a[0]!, a[1]!, a[2]!, a[3]!];
}

/** The walk from the nucleus to reach * t: in doubles for components of 1e-9 and more, in double-double down to 1e-18, else null. */
function walkTo(period: number, nucleus: DDComplex, t: C, reach: number, log2size: number): { w: C; b: C; wd: Float64Array; bd: Float64Array } | null {
  if (!Number.isFinite(log2size)) return null;
  const depth = Math.ceil(-log2size / Math.log2(10));
  if (depth > DD_WALK_DIGITS) return null;
  if (depth > DOUBLE_WALK_DIGITS) return walkDD(period, nucleus, t, reach, 2 ** log2size);
  const r = walkDouble(period, { re: nucleus[0] + nucleus[1], im: nucleus[2] + nucleus[3] }, t, reach);
  return r === null ? null : { ...r, wd: Float64Array.of(r.w.re, 0, r.w.im, 0), bd: Float64Array.of(r.b.re, 0, r.b.im, 0) };
}

/**
 * Size, orientation and shape of the component with this double-double
 * nucleus (docs/methods.md C4): the orbit z_1 .. z_(p-1) in double-double,
 * rounded to doubles, through size-estimate.ts's recurrences; null where
 * those leave the plain-double range (the caller runs the BigInt path). The
 * orbit starts from the double-double nucleus, which is closer to the true
 * one than the printed digits the BigInt path starts from.
 */
export function fastSize(period: number, nucleus: DDComplex): SizeEstimateScaled | null {
  const n = Math.max(0, period - 1);
  if (orbitScratch.length < 2 * n) orbitScratch = new Float64Array(2 * n);
  const z = Float64Array.from(nucleus);
  for (let k = 1; k < period; k += 1) {
    orbitScratch[2 * k - 2] = z[0]! + z[1]!;
    orbitScratch[2 * k - 1] = z[2]! + z[3]!;
    sqrAdd(z, nucleus);
  }
  return sizeEstimateOfOrbit(period, orbitScratch);
}

let orbitScratch = new Float64Array(0);
