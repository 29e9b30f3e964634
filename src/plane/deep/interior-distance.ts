/**
 * The interior distance estimate (docs/methods.md A6) along one period of
 * the attracting cycle, by perturbation: in plain doubles while the tile unit
 * allows, else with the derivatives carried as (re, im, exponent).
 */
import { exponentOf, ldexp } from '../../precise/floatexp.js';
import { run } from './step-loop.js';
import { type DeepSettings, type DeepStats, EV_ESCAPED, FI, FK, FR, type Orbit, startState, type DeepWork } from './state.js';

/**
 * Interior distance estimate (docs/methods.md A6) along one period from the
 * cycle point w = (r, i) 2^k by plain perturbation, in tile units; NaN when
 * the values leave the double range (very deep tiles).
 */
export function interiorDistanceDeep(o: Orbit, p: number, wr: number, wi: number, wk: number, dlr: number, dli: number, U: number): number {
  if (U < -900 || wk < -900) return NaN;
  const u = ldexp(1, U);
  const cr = dlr * u,
    ci = dli * u;
  let zr = ldexp(wr, wk),
    zi = ldexp(wi, wk);
  let m = 0;
  let dzr = 1,
    dzi = 0,
    dcr = 0,
    dci = 0,
    dzzr = 0,
    dzzi = 0,
    dczr = 0,
    dczi = 0;
  const re = o.re,
    im = o.im;
  for (let j = 0; j < p; j++) {
    const xr = re[m]! + zr,
      xi = im[m]! + zi; // full value
    const czr = 2 * (xr * dczr - xi * dczi + (dcr * dzr - dci * dzi));
    const czi = 2 * (xr * dczi + xi * dczr + (dcr * dzi + dci * dzr));
    const zzr = 2 * (xr * dzzr - xi * dzzi + (dzr * dzr - dzi * dzi));
    const zzi = 2 * (xr * dzzi + xi * dzzr + 2 * dzr * dzi);
    const ncr = 2 * (xr * dcr - xi * dci) + u;
    const nci = 2 * (xr * dci + xi * dcr);
    const nzr = 2 * (xr * dzr - xi * dzi);
    const nzi = 2 * (xr * dzi + xi * dzr);
    dczr = czr;
    dczi = czi;
    dzzr = zzr;
    dzzi = zzi;
    dcr = ncr;
    dci = nci;
    dzr = nzr;
    dzi = nzi;
    const Zr = re[m]!,
      Zi = im[m]!;
    const tr = 2 * (Zr * zr - Zi * zi) + (zr * zr - zi * zi) + cr;
    zi = 2 * (Zr * zi + Zi * zr) + 2 * zr * zi + ci;
    zr = tr;
    m += 1;
    const fr = re[m]! + zr,
      fi = im[m]! + zi;
    if (fr * fr + fi * fi < zr * zr + zi * zi || m === o.M) {
      zr = fr;
      zi = fi;
      m = 0;
    }
  }
  const mod2 = dzr * dzr + dzi * dzi;
  if (!(mod2 < 1)) return NaN;
  const pr = dzzr * dcr - dzzi * dci,
    pi = dzzr * dci + dzzi * dcr;
  const gr = 1 - dzr,
    gi = -dzi;
  const g2 = gr * gr + gi * gi;
  const qr = (pr * gr + pi * gi) / g2,
    qi = (pi * gr - pr * gi) / g2;
  const den = Math.hypot(dczr + qr, dczi + qi);
  const b = (1 - mod2) / den;
  return Number.isFinite(b) && b > 0 ? b : NaN;
}

/** out = (a 2^ae) (b 2^be) + (c 2^ce) (d 2^de) as (re, im, exp), normalised. */
function mulAdd(
  ar: number,
  ai: number,
  ae: number,
  br: number,
  bi: number,
  be: number,
  cr: number,
  ci: number,
  ce: number,
  dr: number,
  di: number,
  de: number,
  out: Float64Array,
): void {
  let xr = ar * br - ai * bi,
    xi = ar * bi + ai * br;
  let yr = cr * dr - ci * di,
    yi = cr * di + ci * dr;
  const xe = ae + be,
    ye = ce + de;
  const xz = xr === 0 && xi === 0,
    yz = yr === 0 && yi === 0;
  let e: number;
  if (xz && yz) {
    out[0] = 0;
    out[1] = 0;
    out[2] = 0;
    return;
  } else if (yz || (!xz && xe >= ye)) {
    e = xe;
    yr = ldexp(yr, ye - xe);
    yi = ldexp(yi, ye - xe);
  } else {
    e = ye;
    xr = ldexp(xr, xe - ye);
    xi = ldexp(xi, xe - ye);
  }
  let r = xr + yr,
    i = xi + yi;
  const big = Math.max(Math.abs(r), Math.abs(i));
  if (big !== 0) {
    const k = exponentOf(big);
    r = ldexp(r, -k);
    i = ldexp(i, -k);
    e += k;
  }
  out[0] = r;
  out[1] = i;
  out[2] = e;
}

/**
 * Interior distance estimate (docs/methods.md A6) in full range, for tiles whose
 * unit is below the double range: the pixel is single-stepped by the same
 * perturbation loop (rescaled where tiny) and the four derivatives carried
 * as (re, im, exponent). Slower than interiorDistanceDeep (a call and a few
 * power-of-two scalings per step), so only used below U = -900.
 */
export function interiorDistanceScaled(
  o: Orbit,
  work: DeepWork,
  p: number,
  wr: number,
  wi: number,
  wk: number,
  dlr: number,
  dli: number,
  settings: DeepSettings,
  stats: DeepStats,
): number {
  const U = settings.unitExponent;
  const R2 = settings.escapeRadius * settings.escapeRadius;
  const scratch = work.state;
  startState(scratch, wr, wi, wk, dlr, dli, U);
  // derivatives as (re, im, exp): D_z = 1, D_zz = D_c = D_cz = 0 (c units)
  const { dz, dzz, dc, dcz, t, t2 } = work;
  dz.set([1, 0, 0]);
  dzz.fill(0);
  dc.fill(0);
  dcz.fill(0);
  for (let j = 0; j < p; j++) {
    // 2 z at the current point
    const zr = 2 * scratch[FR]!,
      zi = 2 * scratch[FI]!,
      ze = scratch[FK]!;
    // D_cz <- 2 z D_cz + 2 D_c D_z
    mulAdd(zr, zi, ze, dcz[0]!, dcz[1]!, dcz[2]!, 2 * dc[0]!, 2 * dc[1]!, dc[2]!, dz[0]!, dz[1]!, dz[2]!, t);
    // D_zz <- 2 z D_zz + 2 D_z^2
    mulAdd(zr, zi, ze, dzz[0]!, dzz[1]!, dzz[2]!, 2 * dz[0]!, 2 * dz[1]!, dz[2]!, dz[0]!, dz[1]!, dz[2]!, t2);
    dcz.set(t);
    dzz.set(t2);
    // D_c <- 2 z D_c + 1
    mulAdd(zr, zi, ze, dc[0]!, dc[1]!, dc[2]!, 1, 0, 0, 1, 0, 0, t);
    dc.set(t);
    // D_z <- 2 z D_z
    mulAdd(zr, zi, ze, dz[0]!, dz[1]!, dz[2]!, 0, 0, 0, 0, 0, 0, t);
    dz.set(t);
    if (run(o, null, scratch, j + 1, false, R2, U, stats) === EV_ESCAPED) return NaN;
  }
  stats.newtonIterations += p;
  const lr = ldexp(dz[0]!, dz[2]!),
    li = ldexp(dz[1]!, dz[2]!);
  const mod2 = lr * lr + li * li;
  if (!(mod2 < 1)) return NaN;
  // Y = D_cz + D_zz D_c / (1 - D_z)
  const gr = 1 - lr,
    gi = -li,
    g2 = gr * gr + gi * gi;
  mulAdd(dzz[0]!, dzz[1]!, dzz[2]!, dc[0]!, dc[1]!, dc[2]!, 0, 0, 0, 0, 0, 0, t);
  const qr = (t[0]! * gr + t[1]! * gi) / g2,
    qi = (t[1]! * gr - t[0]! * gi) / g2;
  mulAdd(qr, qi, t[2]!, 1, 0, 0, dcz[0]!, dcz[1]!, dcz[2]!, 1, 0, 0, t2);
  const y = Math.hypot(t2[0]!, t2[1]!);
  // b = (1 - |D_z|^2) / |Y| in c units; in tile units divide by 2^U
  const b = ldexp((1 - mod2) / y, -t2[2]! - U);
  return Number.isFinite(b) && b > 0 ? b : NaN;
}
