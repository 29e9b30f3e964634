/**
 * Nucleus Newton in double and double-double precision, with the
 * lower-period roots deflated, for the census (many components, modest
 * periods). The high-precision path for one component is findNucleus in
 * nucleus.ts.
 *
 * Method (docs/methods.md C2): Newton on G(c) = F^p(0,c) / prod_{q | p, q < p} F^q(0,c),
 * whose step is 1 / (D_c F^p / F^p - sum_q D_c F^q / F^q); the recurrence
 * D_c <- 2 z D_c + 1 runs beside z. Sources: mathr.co.uk/web/m-nucleus.html;
 * C. Heiland-Allen, "Newton's method for periodic points" (mathr blog,
 * 2018-11-17). Deflation keeps a start near a satellite's root from sliding
 * into the parent's nucleus, which is also a root of F^p.
 */
import { ddAdd, ddComplexSquareAdd } from './double-double.js';

/** A census nucleus: c = (reHi + reLo) + i (imHi + imLo); size is the Hunt-Ott size estimate modulus. */
export interface FastNucleus {
  ok: boolean;
  reHi: number;
  reLo: number;
  imHi: number;
  imLo: number;
  size: number;
}

/** The sums of the size estimate at c (docs/methods.md C4): beta = sum of 1/lambda_k and lambda = lambda_p, in double. */
export interface SizeTerms {
  br: number;
  bi: number;
  lr: number;
  li: number;
}

/**
 * The recurrence of the size estimate (docs/methods.md C4, Hunt & Ott 1997)
 * in double, into `out`; returns false when some |lambda_k|^2 was 0 or not
 * finite (the sums are then not to be trusted).
 */
export function sizeTerms(period: number, cr: number, ci: number, out: SizeTerms): boolean {
  let zr = 0;
  let zi = 0;
  let lr = 1;
  let li = 0;
  let br = 1;
  let bi = 0;
  let ok = true;
  for (let k = 1; k < period; k += 1) {
    const nzr = zr * zr - zi * zi + cr;
    zi = 2 * zr * zi + ci;
    zr = nzr;
    const nlr = 2 * (zr * lr - zi * li);
    li = 2 * (zr * li + zi * lr);
    lr = nlr;
    const m = lr * lr + li * li;
    if (!(m > 0) || !Number.isFinite(m)) ok = false;
    br += lr / m;
    bi -= li / m;
  }
  out.br = br;
  out.bi = bi;
  out.lr = lr;
  out.li = li;
  return ok;
}

const terms: SizeTerms = { br: 0, bi: 0, lr: 0, li: 0 };

/** |s| of the size estimate at c (docs/methods.md C4, Hunt & Ott 1997), in double. */
export function sizeModulusDouble(period: number, cr: number, ci: number): number {
  sizeTerms(period, cr, ci, terms);
  const { br, bi, lr, li } = terms;
  return 1 / (Math.hypot(br, bi) * (lr * lr + li * li));
}

/** Newton (deflated) for the period-p nucleus from c in double precision. */
export function nucleusDouble(period: number, cr: number, ci: number): FastNucleus {
  let last = Infinity;
  for (let it = 0; it < 64; it += 1) {
    let zr = 0;
    let zi = 0;
    let dr = 0;
    let di = 0;
    let sr = 0;
    let si = 0;
    for (let k = 1; k <= period; k += 1) {
      const ndr = 2 * (zr * dr - zi * di) + 1;
      di = 2 * (zr * di + zi * dr);
      dr = ndr;
      const nzr = zr * zr - zi * zi + cr;
      zi = 2 * zr * zi + ci;
      zr = nzr;
      if (k < period && period % k === 0) {
        const m = zr * zr + zi * zi;
        sr += (dr * zr + di * zi) / m;
        si += (di * zr - dr * zi) / m;
      }
      if (!(zr * zr + zi * zi < 1e100)) return fail(cr, ci);
    }
    const m = zr * zr + zi * zi;
    if (m === 0) return done(period, cr, 0, ci, 0);
    const lr = (dr * zr + di * zi) / m - sr;
    const li = (di * zr - dr * zi) / m - si;
    const lm = lr * lr + li * li;
    const hr = lr / lm;
    const hi = -li / lm;
    if (!Number.isFinite(hr) || !Number.isFinite(hi)) return fail(cr, ci);
    cr -= hr;
    ci -= hi;
    const st = Math.hypot(hr, hi);
    if (st < 4e-16 * Math.hypot(cr, ci)) return done(period, cr, 0, ci, 0);
    if (st >= last && st < 1e-6 * sizeModulusDouble(period, cr, ci)) return done(period, cr, 0, ci, 0);
    last = st;
  }
  return fail(cr, ci);
}

/** Newton (deflated) for the period-p nucleus from c in double-double precision. */
export function nucleusDD(period: number, c0: { reHi: number; reLo: number; imHi: number; imLo: number }): FastNucleus {
  const c = Float64Array.of(c0.reHi, c0.reLo, c0.imHi, c0.imLo);
  const z = new Float64Array(4);
  const t = new Float64Array(4);
  let last = Infinity;
  for (let it = 0; it < 80; it += 1) {
    z.fill(0);
    let dr = 0;
    let di = 0;
    let sr = 0;
    let si = 0;
    for (let k = 1; k <= period; k += 1) {
      const zr0 = z[0]!;
      const zi0 = z[2]!;
      const ndr = 2 * (zr0 * dr - zi0 * di) + 1;
      di = 2 * (zr0 * di + zi0 * dr);
      dr = ndr;
      ddComplexSquareAdd(z, c, t);
      const zr = z[0]!;
      const zi = z[2]!;
      if (k < period && period % k === 0) {
        const m = zr * zr + zi * zi;
        sr += (dr * zr + di * zi) / m;
        si += (di * zr - dr * zi) / m;
      }
      if (!(zr * zr + zi * zi < 1e100)) return failDD(c);
    }
    const zr = z[0]!;
    const zi = z[2]!;
    const m = zr * zr + zi * zi;
    if (m === 0) return doneDD(period, c);
    const lr = (dr * zr + di * zi) / m - sr;
    const li = (di * zr - dr * zi) / m - si;
    const lm = lr * lr + li * li;
    const hr = lr / lm;
    const hi = -li / lm;
    if (!Number.isFinite(hr) || !Number.isFinite(hi)) return failDD(c);
    ddAdd(c, 0, -hr, 0);
    ddAdd(c, 2, -hi, 0);
    const st = Math.hypot(hr, hi);
    if (st < 1e-30 * Math.hypot(c[0]!, c[2]!)) return doneDD(period, c);
    if (st >= last && st < 1e-8 * sizeModulusDouble(period, c[0]!, c[2]!)) return doneDD(period, c);
    last = st;
  }
  return failDD(c);
}

function fail(cr: number, ci: number): FastNucleus {
  return { ok: false, reHi: cr, reLo: 0, imHi: ci, imLo: 0, size: 0 };
}
function done(period: number, rh: number, rl: number, ih: number, il: number): FastNucleus {
  return { ok: true, reHi: rh, reLo: rl, imHi: ih, imLo: il, size: sizeModulusDouble(period, rh, ih) };
}
function failDD(c: Float64Array): FastNucleus {
  return { ok: false, reHi: c[0]!, reLo: c[1]!, imHi: c[2]!, imLo: c[3]!, size: 0 };
}
function doneDD(period: number, c: Float64Array): FastNucleus {
  return done(period, c[0]!, c[1]!, c[2]!, c[3]!);
}
