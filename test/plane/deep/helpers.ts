/**
 * Shared helpers for the deep-kernel tests: exact pixel offsets and direct
 * arbitrary-precision iteration with decimal.js (the independent reference).
 */
import { Decimal } from 'decimal.js';

export type Dec = InstanceType<typeof Decimal>;

/** A decimal.js constructor at `digits` significant digits and unlimited exponent range. */
export function decimalAt(digits: number): typeof Decimal {
  return Decimal.clone({ precision: digits, minE: -9e15, maxE: 9e15 });
}

/** The exact value of a double as a Decimal (new Decimal(x) would use the shortest string). */
export function exactDouble(D: typeof Decimal, x: number): Dec {
  if (x === 0) return new D(0);
  let e = 0;
  let a = x;
  while (!Number.isInteger(a)) {
    a *= 2;
    e -= 1;
  }
  return new D(BigInt(a).toString()).times(new D(2).pow(e));
}

/**
 * Escape count of 0 under z -> z^2 + c iterated in decimal.js: the first n
 * with |z_n|^2 > R^2, or -1 if none up to maxIterations.
 */
export function decimalEscapeCount(D: typeof Decimal, cr: Dec, ci: Dec, maxIterations: number, escapeRadius: number): number {
  return decimalEscape(D, cr, ci, maxIterations, escapeRadius).n;
}

/**
 * Escape count n (or -1) and the smooth count mu = n - log2(ln|z_n| / ln R)
 * (docs/methods.md A1) from decimal.js iteration; mu is NaN when not escaped.
 */
export function decimalEscape(D: typeof Decimal, cr: Dec, ci: Dec, maxIterations: number, escapeRadius: number): { n: number; mu: number } {
  return decimalEscapeDistance(D, cr, ci, maxIterations, escapeRadius, false);
}

/**
 * As decimalEscape, and with `withDistance` also the exterior distance
 * estimate b = 2|z_n| ln|z_n| / |dz_n/dc| (docs/methods.md A2, derivative updated
 * before z) as a Decimal (undefined when not asked or not escaped).
 */
export function decimalEscapeDistance(
  D: typeof Decimal,
  cr: Dec,
  ci: Dec,
  maxIterations: number,
  escapeRadius: number,
  withDistance: boolean,
): { n: number; mu: number; distance?: Dec } {
  let x = new D(0);
  let y = new D(0);
  let dx = new D(0);
  let dy = new D(0);
  const r2 = escapeRadius * escapeRadius;
  for (let n = 1; n <= maxIterations; n++) {
    if (withDistance) {
      const ndx = x.times(dx).minus(y.times(dy)).times(2).plus(1);
      dy = x.times(dy).plus(y.times(dx)).times(2);
      dx = ndx;
    }
    const x2 = x.times(x);
    const y2 = y.times(y);
    const nx = x2.minus(y2).plus(cr);
    y = x.times(y).times(2).plus(ci);
    x = nx;
    // cheap magnitude test first: the leading digits are enough to compare with R^2
    const n2 = x.times(x).plus(y.times(y));
    if (n2.gt(r2)) {
      const mu = n - Math.log2(n2.ln().div(2).toNumber() / Math.log(escapeRadius));
      if (!withDistance) return { n, mu };
      const distance = n2
        .sqrt()
        .times(n2.ln())
        .div(dx.times(dx).plus(dy.times(dy)).sqrt());
      return { n, mu, distance };
    }
  }
  return { n: -1, mu: NaN };
}

/**
 * Offsets (tile units 2^unitExponent) of the cell centres of a size x size
 * grid of width `span` centred at view - reference (both Decimals):
 * pixel (i, j) is at x = (i + 0.5)/size - 0.5, y = 0.5 - (j + 0.5)/size
 * (j grows downwards, imaginary part upwards), row-major.
 */
export function gridOffsets(D: typeof Decimal, viewMinusRefRe: Dec, viewMinusRefIm: Dec, span: Dec, size: number, unitExponent: number): { re: Float64Array; im: Float64Array } {
  const re = new Float64Array(size * size);
  const im = new Float64Array(size * size);
  const unit = new D(2).pow(unitExponent);
  for (let j = 0; j < size; j++) {
    for (let i = 0; i < size; i++) {
      const x = viewMinusRefRe.plus(span.times((i + 0.5) / size - 0.5));
      const y = viewMinusRefIm.plus(span.times(0.5 - (j + 0.5) / size));
      re[j * size + i] = x.div(unit).toNumber();
      im[j * size + i] = y.div(unit).toNumber();
    }
  }
  return { re, im };
}

/**
 * The atom-domain period at c: the n in 1..maxIterations with the smallest
 * |z_n| (iterated in decimal.js), stopping at escape.
 */
export function atomPeriod(D: typeof Decimal, cr: Dec, ci: Dec, maxIterations: number): number {
  let x = new D(0);
  let y = new D(0);
  let best = Infinity;
  let period = 0;
  for (let n = 1; n <= maxIterations; n++) {
    const nx = x.times(x).minus(y.times(y)).plus(cr);
    y = x.times(y).times(2).plus(ci);
    x = nx;
    const m = x.times(x).plus(y.times(y));
    if (m.gt(1e6)) break;
    const lm = m.isZero() ? -Infinity : Math.log10(Number(m.toExponential(3).split('e')[0])) + Number(m.toExponential(3).split('e')[1]);
    if (lm < best) {
      best = lm;
      period = n;
    }
  }
  return period;
}

/**
 * Newton's method for a nucleus of period p (z_p(c) = 0, dz_{n+1}/dc =
 * 2 z_n dz_n/dc + 1; docs/methods.md C), in decimal.js from the guess.
 */
export function decimalNucleus(D: typeof Decimal, period: number, gr: Dec, gi: Dec, steps = 60): { re: Dec; im: Dec } {
  let cr = gr;
  let ci = gi;
  for (let s = 0; s < steps; s++) {
    let x = new D(0),
      y = new D(0),
      dx = new D(0),
      dy = new D(0);
    for (let n = 0; n < period; n++) {
      const ndx = x.times(dx).minus(y.times(dy)).times(2).plus(1);
      dy = x.times(dy).plus(y.times(dx)).times(2);
      dx = ndx;
      const nx = x.times(x).minus(y.times(y)).plus(cr);
      y = x.times(y).times(2).plus(ci);
      x = nx;
    }
    const den = dx.times(dx).plus(dy.times(dy));
    const sr = x.times(dx).plus(y.times(dy)).div(den);
    const si = y.times(dx).minus(x.times(dy)).div(den);
    cr = cr.minus(sr);
    ci = ci.minus(si);
    const size = sr.abs().plus(si.abs());
    if (size.isZero() || size.lt(new D(10).pow(-D.precision + 5))) break;
  }
  return { re: cr, im: ci };
}

/**
 * Multiplier of the p-cycle through the point near 0 at c, by Newton on
 * F^p(w) = w in decimal.js from w = 0 (docs/methods.md A5): at most `steps`
 * steps, stopping once a step is below 10^-stopDigits.
 */
export function decimalMultiplier(D: typeof Decimal, cr: Dec, ci: Dec, p: number, steps: number, stopDigits: number): [number, number] {
  let wr = new D(0),
    wi = new D(0);
  let lr = new D(0),
    li = new D(0);
  for (let s = 0; s < steps; s++) {
    let x = wr,
      y = wi,
      dr = new D(1),
      di = new D(0);
    for (let n = 0; n < p; n++) {
      const ndr = x.times(dr).minus(y.times(di)).times(2);
      di = x.times(di).plus(y.times(dr)).times(2);
      dr = ndr;
      const nx = x.times(x).minus(y.times(y)).plus(cr);
      y = x.times(y).times(2).plus(ci);
      x = nx;
    }
    lr = dr;
    li = di;
    // w <- w - (F(w) - w) / (D - 1)
    const fr = x.minus(wr),
      fi = y.minus(wi);
    const gr = dr.minus(1),
      gi = di;
    const g2 = gr.times(gr).plus(gi.times(gi));
    const sr = fr.times(gr).plus(fi.times(gi)).div(g2);
    const si = fi.times(gr).minus(fr.times(gi)).div(g2);
    wr = wr.minus(sr);
    wi = wi.minus(si);
    if (sr.abs().plus(si.abs()).lt(new D(10).pow(-stopDigits))) break;
  }
  return [lr.toNumber(), li.toNumber()];
}

/**
 * |z_p(c) / (dz_p/dc)(c)| in decimal.js: the size of one Newton step for a
 * nucleus of period p at c (docs/methods.md C2); tiny when c is a nucleus.
 */
export function decimalNucleusStep(D: typeof Decimal, re: string, im: string, period: number): Dec {
  let x = new D(0),
    y = new D(0),
    dx = new D(0),
    dy = new D(0);
  for (let n = 0; n < period; n++) {
    const ndx = x.times(dx).minus(y.times(dy)).times(2).plus(1);
    dy = x.times(dy).plus(y.times(dx)).times(2);
    dx = ndx;
    const nx = x.times(x).minus(y.times(y)).plus(re);
    y = x.times(y).times(2).plus(im);
    x = nx;
  }
  return x
    .times(x)
    .plus(y.times(y))
    .div(dx.times(dx).plus(dy.times(dy)))
    .sqrt();
}
