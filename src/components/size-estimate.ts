/**
 * Size, orientation and shape of a hyperbolic component from its nucleus.
 *
 * Size (docs/methods.md C4): z = 0, lambda = 1, beta = 1; for k = 1..p-1:
 * z <- z^2 + c, lambda <- 2 z lambda, beta <- beta + 1/lambda; s = 1/(beta lambda^2).
 * |s| is the scale, arg s the rotation. Sources: B. Hunt & E. Ott, J. Phys. A
 * 30 (1997) 7067-7076; mathr.co.uk/web/m-size-estimate.html and the mathr
 * blog 2016-12-24 "Deriving the size estimate".
 *
 * Shape (docs/methods.md C4): s' = -(D_cc/(2 D_c) + D_cz/D_z) / (D_c D_z) from
 * the derivatives of F^p at the nucleus; |s'| < |s' - 1| means cardioid-like,
 * otherwise disk-like. Source: V. Dolotin & A. Morozov (2008) eq. 5.8;
 * mathr.co.uk/web/m-shape-estimate.html.
 *
 * The orbit runs in BigInt fixed point (at the precision the nucleus string
 * carries, at least 128 bits); lambda, beta and the derivatives are doubles
 * with a separate binary exponent, so periods in the thousands neither
 * overflow nor underflow. `size` is a double and underflows to 0 below
 * ~1e-308: use `log10Size` for deeper components.
 */
import { bitsForDigits, fixedScale, fromDecimal, toNumber } from '../precise/fixed.js';
import type { ComplexDecimal } from './nucleus.js';

export interface SizeEstimate {
  size: number;
  orientation: number;
  shape: 'cardioid' | 'disk';
}

/** size estimate modulus, argument (radians) and shape at the nucleus. */
export function sizeEstimate(period: number, nucleus: ComplexDecimal): SizeEstimate {
  const r = sizeEstimateScaled(period, nucleus);
  return { size: r.size, orientation: r.orientation, shape: r.shape };
}

export interface SizeEstimateScaled extends SizeEstimate {
  /** log10 of |s|, finite even where `size` underflows. */
  log10Size: number;
  /** |s'| of the shape estimate (0 cardioid, 1 circle). */
  shapeValue: { re: number; im: number };
}

/** A complex double times 2^e. */
type X = [number, number, number];

function norm(a: X): X {
  const m = Math.max(Math.abs(a[0]), Math.abs(a[1]));
  if (m === 0 || !Number.isFinite(m)) return m === 0 ? [0, 0, 0] : a;
  const e = Math.floor(Math.log2(m));
  return [a[0] * 2 ** -e, a[1] * 2 ** -e, a[2] + e];
}
function xmul(a: X, b: X): X {
  return norm([a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0], a[2] + b[2]]);
}
function xadd(a: X, b: X): X {
  if (a[0] === 0 && a[1] === 0) return b;
  if (b[0] === 0 && b[1] === 0) return a;
  const e = Math.max(a[2], b[2]);
  const fa = 2 ** Math.max(-1100, a[2] - e);
  const fb = 2 ** Math.max(-1100, b[2] - e);
  return norm([a[0] * fa + b[0] * fb, a[1] * fa + b[1] * fb, e]);
}
function xdiv(a: X, b: X): X {
  const m = b[0] * b[0] + b[1] * b[1];
  return norm([(a[0] * b[0] + a[1] * b[1]) / m, (a[1] * b[0] - a[0] * b[1]) / m, a[2] - b[2]]);
}
function xscale(a: X, k: number): X {
  return norm([a[0] * k, a[1] * k, a[2]]);
}
function xlog2abs(a: X): number {
  return Math.log2(Math.hypot(a[0], a[1])) + a[2];
}
function xarg(a: X): number {
  return Math.atan2(a[1], a[0]);
}

/** sizeEstimate with log10 of the size and the shape value. */
export function sizeEstimateScaled(period: number, nucleus: ComplexDecimal): SizeEstimateScaled {
  return sizeEstimatePlain(period, nucleus) ?? sizeEstimateX(period, nucleus);
}

/** Magnitudes the plain-double recurrences stay within (else the scaled ones run). */
const PLAIN_MAX = 1e250;
const PLAIN_MIN = 1e-250;

function inRange(re: number, im: number): boolean {
  const m = Math.abs(re) + Math.abs(im);
  return m === 0 || (m < PLAIN_MAX && m > PLAIN_MIN);
}

/**
 * The same recurrences in plain doubles while every magnitude stays within
 * 1e-250..1e250: scaling by powers of two commutes exactly with rounding away
 * from overflow and subnormals, so the result is bit for bit that of the
 * scaled version (the final formulas run in the scaled form); null outside.
 */
function sizeEstimatePlain(period: number, nucleus: ComplexDecimal): SizeEstimateScaled | null {
  const digits = Math.max(nucleus.re.length, nucleus.im.length);
  const s = fixedScale(Math.max(128, bitsForDigits(digits, 32)));
  const cr = fromDecimal(nucleus.re, s, 'nucleus');
  const ci = fromDecimal(nucleus.im, s, 'nucleus');
  const orbit = new Float64Array(2 * Math.max(0, period - 1));
  let zr = cr;
  let zi = ci;
  for (let k = 1; k < period; k += 1) {
    orbit[2 * k - 2] = toNumber(zr, s);
    orbit[2 * k - 1] = toNumber(zi, s);
    const nzr = ((zr * zr - zi * zi) >> s.shift) + cr;
    zi = ((zr * zi) >> (s.shift - 1n)) + ci;
    zr = nzr;
  }
  return sizeEstimateOfOrbit(period, orbit);
}

/**
 * The plain-double recurrences from the orbit z_1 .. z_(p-1) rounded to
 * doubles (re, im interleaved; z_1 = c), or null where a magnitude leaves
 * 1e-250..1e250. The listing's fast path (fast-row.ts) passes the orbit of
 * its double-double nucleus; sizeEstimatePlain the BigInt one.
 */
export function sizeEstimateOfOrbit(period: number, orbit: Float64Array): SizeEstimateScaled | null {
  let lr = 1,
    li = 0,
    br = 1,
    bi = 0,
    dcr = 1,
    dci = 0,
    dzr = 1,
    dzi = 0,
    dccr = 0,
    dcci = 0,
    dczr = 0,
    dczi = 0;
  for (let k = 1; k < period; k += 1) {
    const xr = orbit[2 * k - 2]!;
    const xi = orbit[2 * k - 1]!;
    if (!inRange(xr, xi)) return null;
    const z2r = xr * 2,
      z2i = xi * 2;
    // dcc <- 2 (z dcc + dc^2); dcz <- 2 (z dcz + dc dz); dc <- 2 z dc + 1; dz <- 2 z dz (as the X forms, term by term)
    const ndccr = (xr * dccr - xi * dcci + (dcr * dcr - dci * dci)) * 2;
    const ndcci = (xr * dcci + xi * dccr + (dcr * dci + dci * dcr)) * 2;
    const ndczr = (xr * dczr - xi * dczi + (dcr * dzr - dci * dzi)) * 2;
    const ndczi = (xr * dczi + xi * dczr + (dcr * dzi + dci * dzr)) * 2;
    const ndcr = z2r * dcr - z2i * dci + 1;
    const ndci = z2r * dci + z2i * dcr;
    const ndzr = z2r * dzr - z2i * dzi;
    const ndzi = z2r * dzi + z2i * dzr;
    dccr = ndccr;
    dcci = ndcci;
    dczr = ndczr;
    dczi = ndczi;
    dcr = ndcr;
    dci = ndci;
    dzr = ndzr;
    dzi = ndzi;
    const nlr = z2r * lr - z2i * li;
    li = z2r * li + z2i * lr;
    lr = nlr;
    const m = lr * lr + li * li;
    br += lr / m;
    bi += -li / m;
    if (!inRange(dccr, dcci) || !inRange(dczr, dczi) || !inRange(dcr, dci) || !inRange(dzr, dzi) || !inRange(lr, li) || !inRange(br, bi) || !inRange(m, 0)) return null;
  }
  return finish(period, norm([lr, li, 0]), norm([br, bi, 0]), norm([dcr, dci, 0]), norm([dzr, dzi, 0]), norm([dccr, dcci, 0]), norm([dczr, dczi, 0]));
}

function sizeEstimateX(period: number, nucleus: ComplexDecimal): SizeEstimateScaled {
  const digits = Math.max(nucleus.re.length, nucleus.im.length);
  const s = fixedScale(Math.max(128, bitsForDigits(digits, 32)));
  const cr = fromDecimal(nucleus.re, s, 'nucleus');
  const ci = fromDecimal(nucleus.im, s, 'nucleus');
  const one: X = [1, 0, 0];
  // size: lambda, beta
  let lambda: X = one;
  let beta: X = one;
  // shape: derivatives started at z = c, D_c = 1, D_z = 1, D_cc = D_cz = 0
  let dc: X = one;
  let dz: X = one;
  let dcc: X = [0, 0, 0];
  let dcz: X = [0, 0, 0];
  let zr = cr;
  let zi = ci;
  let xr = toNumber(zr, s);
  let xi = toNumber(zi, s);
  for (let k = 1; k < period; k += 1) {
    // shape derivatives at the current z (z_k), then step z
    const z: X = norm([xr, xi, 0]);
    const z2 = xscale(z, 2);
    dcc = xscale(xadd(xmul(z, dcc), xmul(dc, dc)), 2);
    dcz = xscale(xadd(xmul(z, dcz), xmul(dc, dz)), 2);
    dc = xadd(xmul(z2, dc), one);
    dz = xmul(z2, dz);
    // size: lambda <- 2 z_k lambda, beta += 1/lambda (z_k for k = 1..p-1)
    lambda = xmul(z2, lambda);
    beta = xadd(beta, xdiv(one, lambda));
    const nzr = ((zr * zr - zi * zi) >> s.shift) + cr;
    zi = ((zr * zi) >> (s.shift - 1n)) + ci;
    zr = nzr;
    xr = toNumber(zr, s);
    xi = toNumber(zi, s);
  }
  return finish(period, lambda, beta, dc, dz, dcc, dcz);
}

function finish(period: number, lambda: X, beta: X, dc: X, dz: X, dcc: X, dcz: X): SizeEstimateScaled {
  const one: X = [1, 0, 0];
  const sz = xdiv(one, xmul(beta, xmul(lambda, lambda)));
  const log2 = xlog2abs(sz);
  // shape: s' = -(dcc / (2 dc) + dcz / dz) / (dc dz)
  let shapeValue = { re: 0, im: 0 };
  let shape: 'cardioid' | 'disk' = 'cardioid';
  if (period > 1) {
    const sp = xscale(xdiv(xadd(xdiv(dcc, xscale(dc, 2)), xdiv(dcz, dz)), xmul(dc, dz)), -1);
    const f = 2 ** Math.max(-1100, Math.min(1000, sp[2]));
    shapeValue = { re: sp[0] * f, im: sp[1] * f };
    shape = Math.hypot(shapeValue.re, shapeValue.im) < Math.hypot(shapeValue.re - 1, shapeValue.im) ? 'cardioid' : 'disk';
  }
  return {
    size: 2 ** log2,
    orientation: xarg(sz),
    shape,
    log10Size: log2 * Math.log10(2),
    shapeValue,
  };
}
