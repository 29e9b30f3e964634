/**
 * The Feigenbaum-Cvitanovic fixed point of period doubling for a maximum of
 * order Z: g(x) = -alpha g(g(-x/alpha)), g(0) = 1, g even and a function of
 * |x|^Z (docs/methods.md E9;
 * Lanford 1982, Briggs 1991). With s = g(1) = -1/alpha the equation reads
 * s g(x) = g(g(s x)); we collocate it at x_i with
 * x_i^Z = (1 + cos(pi (2i - 1) / (2M))), i = 1..M, M = N - 1, and add
 * g(0) = 1, for the N Chebyshev coefficients of g in y = |x|^Z
 * (even-series.ts).
 *
 * Newton is a chord iteration: the Jacobian is factorised at LU_BITS only,
 * the residual is evaluated at the full precision, and each step gains
 * about LU_BITS bits less the log of the condition number (a solve at lower
 * precision refined by full-precision residuals). The right-hand side is
 * read at the lower scale, which makes the solve return the correction at
 * the full one (fixed-lu.ts). Tried first and dropped: a ladder of
 * precisions doubling up to the full one with a factorisation per rung;
 * BigInt products of a few hundred bits cost mostly their overhead, so
 * every rung cost about as much as the top one, and 300 digits took 2.4x as
 * long.
 */
import { luFactor, luSolve } from './fixed-lu.js';
import { seriesAt, seriesValue, type SeriesPoint } from './even-series.js';

export interface FixedPointSolution {
  readonly order: number;
  readonly terms: number;
  readonly bits: number;
  /** Chebyshev coefficients of g in 2|x|^Z - 1, at `bits`. */
  readonly coefficients: readonly bigint[];
  /** g(1) = -1/alpha, at `bits`. */
  readonly g1: bigint;
}

/** One Newton step, for progress reports. */
export interface NewtonStep {
  readonly stage: 'fixed point' | 'eigenvalue';
  readonly bits: number;
  readonly terms: number;
  /** log2 of the largest correction of this step (-Infinity for zero). */
  readonly correctionLog2: number;
}

/** The collocation points x_i (as doubles, then exact at any scale): x_i^Z = (1 + cos(pi (2i-1)/(2M)))/2. */
export function collocationPoints(order: number, count: number): number[] {
  const xs: number[] = [];
  for (let i = 1; i <= count; i++) xs.push(Math.pow((1 + Math.cos((Math.PI * (2 * i - 1)) / (2 * count))) / 2, 1 / order));
  return xs;
}

/** A double as fixed point at `bits` (exact: a double is a dyadic rational; bits >= 60 keeps every point's bits). */
export function exactFixed(x: number, bits: number): bigint {
  if (x === 0) return 0n;
  const e = Math.floor(Math.log2(Math.abs(x))) - 52;
  const m = BigInt(Math.round(x / 2 ** e));
  const k = e + bits;
  return k >= 0 ? m << BigInt(k) : m >> BigInt(-k);
}

export function rescaleAll(c: readonly bigint[], from: number, to: number): bigint[] {
  if (to >= from) return c.map((v) => v << BigInt(to - from));
  const d = BigInt(from - to);
  return c.map((v) => v >> d);
}

function sum(c: readonly bigint[]): bigint {
  let s = 0n;
  for (const v of c) s += v;
  return s;
}

/** The three evaluations at collocation point x: g(x), g(u) with u = s x, and g(g(u)). */
interface Triple {
  readonly x: SeriesPoint;
  readonly u: SeriesPoint;
  readonly gu: SeriesPoint;
  readonly xv: bigint;
}

function triples(c: readonly bigint[], s: bigint, xs: readonly bigint[], order: number, bits: number): Triple[] {
  const shift = BigInt(bits);
  return xs.map((xv) => {
    const x = seriesAt(xv, c, order, bits);
    const u = seriesAt((s * xv) >> shift, c, order, bits);
    const gu = seriesAt(u.value, c, order, bits);
    return { x, u, gu, xv };
  });
}

/** Residual E: g(0) - 1, then s g(x_i) - g(g(s x_i)). */
function residual(c: readonly bigint[], xs: readonly bigint[], order: number, bits: number): bigint[] {
  const shift = BigInt(bits);
  const one = 1n << shift;
  const s = sum(c);
  let g0 = 0n;
  c.forEach((v, k) => (g0 += k % 2 === 0 ? v : -v));
  const e = [g0 - one];
  for (const xv of xs) {
    const gx = seriesValue(xv, c, order, bits);
    const gu = seriesValue((s * xv) >> shift, c, order, bits);
    e.push(((s * gx) >> shift) - seriesValue(gu, c, order, bits));
  }
  return e;
}

function jacobian(c: readonly bigint[], xs: readonly bigint[], order: number, bits: number): bigint[][] {
  const n = c.length;
  const shift = BigInt(bits);
  const one = 1n << shift;
  const s = sum(c);
  const rows: bigint[][] = [Array.from({ length: n }, (_, j) => (j % 2 === 0 ? one : -one))];
  for (const t of triples(c, s, xs, order, bits)) {
    const row = new Array<bigint>(n);
    const dudc = (t.u.slope * t.xv) >> shift; // d g(u)/d s
    for (let j = 0; j < n; j++) {
      const inner = t.u.basis[j]! + dudc;
      row[j] = ((t.x.basis[j]! * s + t.x.value * one - t.gu.slope * inner) >> shift) - t.gu.basis[j]!;
    }
    rows.push(row);
  }
  return rows;
}

function maxAbs(v: readonly bigint[]): bigint {
  let m = 0n;
  for (const x of v) {
    const a = x < 0n ? -x : x;
    if (a > m) m = a;
  }
  return m;
}

function log2Of(n: bigint, bits: number): number {
  if (n === 0n) return -Infinity;
  return n.toString(2).length - bits;
}

/** Newton (chord) iterations at `bits` with the Jacobian factorised at `jacobianBits` from c, until the correction is below 2^-(bits - 40). */
function chordNewton(c: bigint[], xs: readonly number[], order: number, bits: number, jacobianBits: number, maxSteps: number, step?: (s: NewtonStep) => void): bigint[] {
  const xsHigh = xs.map((x) => exactFixed(x, bits));
  let lu = luFactor(
    jacobian(
      rescaleAll(c, bits, jacobianBits),
      xs.map((x) => exactFixed(x, jacobianBits)),
      order,
      jacobianBits,
    ),
    jacobianBits,
  );
  let previous = -1n;
  for (let k = 0; k < maxSteps; k++) {
    const e = residual(c, xsHigh, order, bits);
    const d = luSolve(lu, e);
    for (let j = 0; j < c.length; j++) c[j] = c[j]! - d[j]!;
    const m = maxAbs(d);
    step?.({ stage: 'fixed point', bits, terms: c.length, correctionLog2: log2Of(m, bits) });
    if (m < 1n << 40n) return c;
    // A chord that stopped contracting (a stale Jacobian): factorise again where we are.
    if (previous >= 0n && m > previous / 4n)
      lu = luFactor(
        jacobian(
          rescaleAll(c, bits, jacobianBits),
          xs.map((x) => exactFixed(x, jacobianBits)),
          order,
          jacobianBits,
        ),
        jacobianBits,
      );
    previous = m;
  }
  throw Object.assign(new Error(`fixed point of order ${order} with ${c.length} terms: Newton did not settle at ${bits} bits`), { name: 'NoConvergenceError' });
}

/** A first g: g(y) = 1 - a y with g(1) = 1 - a = -(1 - 1/Z) 0.8, the rough size of -1/alpha (Z = 2: -0.4). */
function startingSeries(order: number, bits: number): bigint[] {
  const a = 1 + 0.8 * (1 - 1 / order);
  // 1 - a y = (1 - a/2) - (a/2) t
  return [exactFixed(1 - a / 2, bits), exactFixed(-a / 2, bits)];
}

/** The number of terms reached by continuation at low precision before the full truncation. */
export const CONTINUATION_TERMS = 14;
export const BASE_BITS = 128;

/**
 * The low-precision solution for `terms` coefficients by continuation in
 * the number of terms (2, 3, ... terms), each solved by full Newton.
 */
export function continuation(order: number, terms: number, bits: number = BASE_BITS): bigint[][] {
  const found: bigint[][] = [];
  let last = startingSeries(order, bits);
  for (let n = 2; n <= terms; n++) {
    const c = last.slice();
    while (c.length < n) c.push(0n);
    const settled = dampedNewton(c, collocationPoints(order, n - 1), order, bits);
    if (settled !== undefined) {
      last = settled;
      found.push(settled.slice());
    } else if (n === terms) throw Object.assign(new Error(`fixed point of order ${order}: Newton did not settle at ${n} terms`), { name: 'NoConvergenceError' });
    // Otherwise skip n: at some orders one truncation lies far from its neighbours (order 5 at 6 terms); the next starts from the last good one.
  }
  return found;
}

/** Full Newton with step halving until the residual shrinks; the solution, or undefined when it does not settle in 60 steps. */
function dampedNewton(start: bigint[], xs: readonly number[], order: number, bits: number): bigint[] | undefined {
  let c = start;
  const xf = xs.map((x) => exactFixed(x, bits));
  for (let k = 0; k < 60; k++) {
    const e = residual(c, xf, order, bits);
    let d: bigint[];
    try {
      d = luSolve(luFactor(jacobian(c, xf, order, bits), bits), e);
    } catch {
      return undefined;
    }
    if (maxAbs(d) < 1n << 40n) return c.map((v, j) => v - d[j]!);
    const before = maxAbs(e);
    let trial = c;
    for (let h = 0n; h < 20n; h++) {
      trial = c.map((v, j) => v - (d[j]! >> h));
      if (maxAbs(residual(trial, xf, order, bits)) < before) break;
    }
    c = trial;
  }
  return undefined;
}

/**
 * Bits of the factorised Jacobians: each chord step gains about this many
 * bits less the log of the condition number, so a 1000-digit fixed point
 * needs about 15 cheap steps instead of a factorisation per doubling.
 */
export const LU_BITS = 256;

/**
 * The fixed point with `terms` Chebyshev coefficients at `bits` fractional
 * bits: continuation to CONTINUATION_TERMS terms at 128 bits, then chord
 * Newton with the Jacobian factorised at LU_BITS, first from the padded
 * start until the solution is good to LU_BITS, then once more there and
 * with residuals at the full precision until the correction vanishes.
 */
export function solveFixedPoint(order: number, terms: number, bits: number, step?: (s: NewtonStep) => void): FixedPointSolution {
  const start = continuation(order, Math.min(terms, CONTINUATION_TERMS));
  const c0 = start[start.length - 1]!.slice();
  while (c0.length < terms) c0.push(0n);
  const xs = collocationPoints(order, terms - 1);
  const q = Math.min(bits, LU_BITS);
  let c = chordNewton(rescaleAll(c0, BASE_BITS, q), xs, order, q, q, 200, step);
  if (q < bits) c = chordNewton(rescaleAll(c, q, bits), xs, order, bits, q, 400, step);
  return { order, terms, bits, coefficients: c, g1: sum(c) };
}

/** A fixed-point BigInt n * 2^-bits as the nearest double or so (the top 60 bits kept; no overflow at any scale). */
export function fixedToNumber(n: bigint, bits: number): number {
  const len = (n < 0n ? -n : n).toString(2).length;
  const drop = Math.max(0, len - 60);
  return Number(n >> BigInt(drop)) * 2 ** (drop - bits);
}

/** max |s g(x) - g(g(s x))| over the given points, as a double (for checks at points off the collocation set). */
export function fixedPointDefect(sol: FixedPointSolution, points: readonly number[]): number {
  const { coefficients: c, order, bits, g1 } = sol;
  const shift = BigInt(bits);
  let worst = 0;
  for (const p of points) {
    const x = exactFixed(p, bits);
    const gu = seriesValue((g1 * x) >> shift, c, order, bits);
    const e = ((g1 * seriesValue(x, c, order, bits)) >> shift) - seriesValue(gu, c, order, bits);
    worst = Math.max(worst, Math.abs(fixedToNumber(e, bits)));
  }
  return worst;
}

export { triples as collocationTriples };
