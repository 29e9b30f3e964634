import { hypot2 } from './hypot2.js';

/**
 * Interior distance estimate (docs/methods.md A6; Wikipedia "Plotting algorithms
 * for the Mandelbrot set", interior distance estimation; Wikibooks
 * "Fractals/Iterations in the complex plane/demm"; C. Heiland-Allen, mathr
 * blog "Practical interior distance rendering"). From a point w of the
 * attracting p-cycle of z -> z^2 + c, accumulate over p steps (z updated
 * last), starting at z = w, D_z = 1, D_c = D_zz = D_cz = 0:
 *
 *   D_cz <- 2 (z D_cz + D_c D_z);  D_zz <- 2 (z D_zz + D_z^2);
 *   D_c <- 2 z D_c + 1;  D_z <- 2 z D_z;  z <- z^2 + c
 *
 * then b = (1 - |D_z|^2) / |D_cz + D_zz D_c / (1 - D_z)|, in c units
 * (claimed b/4 <= dist(c, boundary) <= b). At c = -1 (p = 2) b = 0.25, the
 * radius of the period-2 disk [checked in docs/methods.md]. Returns NaN if the
 * denominator vanishes or w is not on an attracting cycle.
 */
export function interiorDistance(cRe: number, cIm: number, wRe: number, wIm: number, period: number): number {
  let zr = wRe,
    zi = wIm;
  let dzr = 1,
    dzi = 0,
    dcr = 0,
    dci = 0,
    dzzr = 0,
    dzzi = 0,
    dczr = 0,
    dczi = 0;
  for (let j = 0; j < period; j++) {
    const czr = 2 * (zr * dczr - zi * dczi + (dcr * dzr - dci * dzi));
    const czi = 2 * (zr * dczi + zi * dczr + (dcr * dzi + dci * dzr));
    const zzr = 2 * (zr * dzzr - zi * dzzi + (dzr * dzr - dzi * dzi));
    const zzi = 2 * (zr * dzzi + zi * dzzr + 2 * dzr * dzi);
    const cr = 2 * (zr * dcr - zi * dci) + 1;
    const ci = 2 * (zr * dci + zi * dcr);
    const nzr = 2 * (zr * dzr - zi * dzi);
    const nzi = 2 * (zr * dzi + zi * dzr);
    const u = zr * zr - zi * zi + cRe;
    zi = 2 * zr * zi + cIm;
    zr = u;
    dczr = czr;
    dczi = czi;
    dzzr = zzr;
    dzzi = zzi;
    dcr = cr;
    dci = ci;
    dzr = nzr;
    dzi = nzi;
  }
  const mod2 = dzr * dzr + dzi * dzi;
  if (!(mod2 < 1)) return NaN;
  // q = D_zz D_c / (1 - D_z)
  const pr = dzzr * dcr - dzzi * dci,
    pi = dzzr * dci + dzzi * dcr;
  const gr = 1 - dzr,
    gi = -dzi;
  const g2 = gr * gr + gi * gi;
  const qr = (pr * gr + pi * gi) / g2,
    qi = (pi * gr - pr * gi) / g2;
  const den = hypot2(dczr + qr, dczi + qi);
  return den > 0 ? (1 - mod2) / den : NaN;
}
