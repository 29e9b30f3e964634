/**
 * Nuclei of all components with period in a range that lie in a box and are
 * at least a given size: for labelling plates. Built on the census (so
 * periods up to about 16 in seconds).
 */
import { census } from './census.js';
import { sizeEstimate } from './size-estimate.js';

export interface BoxedNucleus {
  period: number;
  re: number;
  im: number;
  /** |size estimate| and its argument (radians). */
  size: number;
  orientation: number;
  shape: 'cardioid' | 'disk';
}

export interface Box {
  re0: number;
  im0: number;
  re1: number;
  im1: number;
}

/** Components of period minPeriod..maxPeriod with nucleus in the box and size >= minSize, by period then real part. */
export async function componentsInBox(periods: { min: number; max: number }, box: Box, minSize: number, options: { workers?: number } = {}): Promise<BoxedNucleus[]> {
  const out: BoxedNucleus[] = [];
  const [r0, r1] = [Math.min(box.re0, box.re1), Math.max(box.re0, box.re1)];
  const [i0, i1] = [Math.min(box.im0, box.im1), Math.max(box.im0, box.im1)];
  for (let p = periods.min; p <= periods.max; p += 1) {
    const found = await census(p, options.workers === undefined ? {} : { workers: options.workers });
    const inBox: BoxedNucleus[] = [];
    for (const c of found.components) {
      const re = c.reHi + c.reLo;
      const im = c.imHi + c.imLo;
      if (re < r0 || re > r1 || im < i0 || im > i1 || c.size < minSize) continue;
      const s = sizeEstimate(p, { re: String(re), im: String(im) });
      inBox.push({ period: p, re, im, size: s.size, orientation: s.orientation, shape: s.shape });
    }
    inBox.sort((a, b) => a.re - b.re || a.im - b.im);
    out.push(...inBox);
  }
  return out;
}
