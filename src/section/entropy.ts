/**
 * Topological entropy of a unimodal map from its kneading sequence, by the
 * Milnor-Thurston kneading determinant (J. Milnor, W. Thurston, "On iterated
 * maps of the interval", LNM 1342 (1988) 465-563; docs/methods.md E10).
 *
 * With the itinerary k_1 k_2 ... of the critical value (L left of the
 * maximum: increasing, sign +1; R right: decreasing, -1; C at it: 0) and
 * theta_0 = 1, theta_n = e(k_1) ... e(k_n), the kneading determinant is
 * D(t) = sum_n theta_n t^n, and h = log(1/s) with s the smallest zero of D
 * in (0, 1); h = 0 when D has none there.
 *
 * Two cases. When the itinerary is eventually periodic (the critical orbit
 * settles on an attracting cycle, or lands on a cycle exactly, as at r = 4)
 * D is rational, D = A(t) + theta_m t^m B(t) / (1 - sigma t^p), and its
 * zeros in (0, 1) are those of the polynomial A(t)(1 - sigma t^p) + theta_m
 * t^m B(t): exact, so entropy 0 below the Feigenbaum point (its zeros are
 * roots of unity). Otherwise D is truncated after the n symbols that the
 * precision fixes, which resolves zeros only up to s_max = exp(-18.4 / n)
 * (t^n below 1e-8): smaller entropies are reported as 0 with that bound.
 */
import { Decimal } from 'decimal.js';
import type { UnimodalFamily } from './unimodal-family.js';

export interface KneadingOrbit {
  /** The symbols of x_1, x_2, ...: L, R, or C (x_n is the critical point, as far as the precision tells). */
  readonly symbols: string;
  /** True when the orbit hit the critical point (a superstable parameter): the sequence ends with C. */
  readonly hitsCritical: boolean;
}

/**
 * The itinerary of the critical value at parameter r, in decimal arithmetic
 * of `digits` significant digits, for as long as the accumulated error (the
 * derivative along the orbit times the rounding) leaves every symbol
 * certain, and at most `maxSymbols`.
 */
export function kneadingOrbit(family: UnimodalFamily, r: string, digits: number, maxSymbols: number): KneadingOrbit {
  const D = Decimal.clone({ precision: digits });
  const rr = new D(r);
  const c = new D(family.critical);
  let x = new D(family.critical);
  let err = 0;
  const ulp = 10 ** -(digits - 2);
  let symbols = '';
  for (let n = 0; n < maxSymbols; n++) {
    const xd = x.toNumber();
    err = Math.abs(family.dfdx(xd, rr.toNumber())) * err + ulp;
    x = family.value(x, rr, D);
    const gap = x.minus(c).toNumber();
    if (Math.abs(gap) <= err) {
      // Within the rounding of the critical point: C when the error is still tiny (a superstable orbit), else unknown.
      if (err < 1e-12) return { symbols: `${symbols}C`, hitsCritical: true };
      break;
    }
    if (err > 1e-3) break;
    symbols += gap > 0 ? 'R' : 'L';
  }
  return { symbols, hitsCritical: false };
}

/** theta_0 .. theta_n from the symbols (theta_0 = 1). */
export function thetas(symbols: string): Int8Array {
  const th = new Int8Array(symbols.length + 1);
  th[0] = 1;
  for (let i = 0; i < symbols.length; i++) {
    const ch = symbols[i]!;
    th[i + 1] = ch === 'C' ? 0 : ch === 'R' ? -th[i]! : th[i]!;
  }
  return th;
}

/** The smallest eventual period p and preperiod m of the symbols: the last 2/3 (at least 3p symbols) repeat with period p. */
export function eventualPeriod(symbols: string): { preperiod: number; period: number } | undefined {
  const n = symbols.length;
  for (let p = 1; 3 * p <= n; p++) {
    const from = Math.min(n - 3 * p, Math.floor(n / 3));
    let ok = true;
    for (let k = from; k + p < n; k++) {
      if (symbols[k] !== symbols[k + p]) {
        ok = false;
        break;
      }
    }
    if (!ok) continue;
    let m = from;
    while (m > 0 && symbols[m - 1] === symbols[m - 1 + p]) m--;
    return { preperiod: m, period: p };
  }
  return undefined;
}

function horner(coeffs: ArrayLike<number>, t: number): number {
  let v = 0;
  for (let i = coeffs.length - 1; i >= 0; i--) v = v * t + coeffs[i]!;
  return v;
}

/** The smallest zero of the polynomial in (0, sMax), by a scan of 4096 steps and bisection; undefined if none. */
export function smallestZero(coeffs: ArrayLike<number>, sMax: number): number | undefined {
  const steps = 4096;
  let a = 0;
  let fa = horner(coeffs, 0);
  for (let k = 1; k <= steps; k++) {
    const b = (sMax * k) / steps;
    const fb = horner(coeffs, b);
    if (fa === 0) return a > 0 ? a : undefined;
    if (fb === 0) return b;
    if (Math.sign(fb) !== Math.sign(fa)) {
      let lo = a;
      let hi = b;
      for (let i = 0; i < 80; i++) {
        const mid = (lo + hi) / 2;
        if (Math.sign(horner(coeffs, mid)) === Math.sign(fa)) lo = mid;
        else hi = mid;
      }
      return (lo + hi) / 2;
    }
    a = b;
    fa = fb;
  }
  return undefined;
}

export interface EntropyResult {
  /** log(1/s), or 0. */
  readonly entropy: number;
  /** How D was formed: 'finite' (the orbit hits C), 'periodic' (exact rational D), 'truncated'. */
  readonly method: 'finite' | 'periodic' | 'truncated';
  /** For 'truncated' with no zero found: entropy is below this bound; otherwise 0. */
  readonly below: number;
  readonly symbols: number;
  /** (preperiod, period) of the itinerary when periodic. */
  readonly period?: { preperiod: number; period: number };
}

/**
 * Divides out every factor (1 - t) of an integer polynomial (zeros at t = 1
 * are roots of unity, no entropy, and in doubles they would make sign noise
 * just below 1): while the coefficients sum to 0, q_k = sum_{j <= k} c_j.
 */
export function withoutUnitRoot(coeffs: ArrayLike<number>): Float64Array {
  let c = Float64Array.from(coeffs);
  while (c.length > 1 && c.reduce((a, b) => a + b, 0) === 0) {
    const q = new Float64Array(c.length - 1);
    let acc = 0;
    for (let k = 0; k < q.length; k++) q[k] = acc += c[k]!;
    c = q;
  }
  return c;
}

/** Entropy from an itinerary of the critical value (docs/methods.md E10). */
export function kneadingEntropy(orbit: KneadingOrbit): EntropyResult {
  const th = thetas(orbit.symbols);
  const n = orbit.symbols.length;
  const done = (s: number | undefined, method: EntropyResult['method'], below: number, extra: Partial<EntropyResult> = {}): EntropyResult => ({
    entropy: s === undefined ? 0 : -Math.log(s),
    method,
    below: s === undefined ? below : 0,
    symbols: n,
    ...extra,
  });
  // The exact forms, with their zeros at t = 1 divided out, are scanned up to just below 1.
  const EDGE = 1 - 2 ** -30;
  if (orbit.hitsCritical) return done(smallestZero(withoutUnitRoot(th), EDGE), 'finite', 0);
  const per = eventualPeriod(orbit.symbols);
  if (per !== undefined) {
    // theta_{m+k} for k < p and sigma = theta_{m+p} / theta_m (theta never 0 here).
    const { preperiod: m, period: p } = per;
    const sigma = th[m + p]! * th[m]!;
    const poly = new Float64Array(m + p + 1);
    for (let k = 0; k < m; k++) {
      poly[k] += th[k]!;
      poly[k + p] -= sigma * th[k]!;
    }
    for (let k = 0; k < p; k++) poly[m + k] += th[m + k]!;
    return done(smallestZero(withoutUnitRoot(poly), EDGE), 'periodic', 0, { period: per });
  }
  const sMax = Math.exp(-18.4 / Math.max(1, n));
  return done(smallestZero(th, sMax), 'truncated', -Math.log(sMax));
}
