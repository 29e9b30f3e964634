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
 * Newton runs up a ladder of precisions, each about twice the one below, so
 * that almost all steps are cheap; at each rung the residual is evaluated
 * at the rung's precision while the Jacobian is factorised at the rung
 * below (a chord step: the correction is small, so a Jacobian good to
 * half the digits still doubles them). The right-hand side is read at the
 * lower scale, which makes the solve return the correction at the upper
 * one (fixed-lu.ts).
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

/** One step of the ladder, for progress reports. */
export interface LadderStep {
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

/** Precisions of the ladder, lowest first: each rung about half the next, above `base`. */
export function ladder(bits: number, base: number): number[] {
  const rungs = [bits];
  while (rungs[rungs.length - 1]! > 2 * base) rungs.push(Math.ceil(rungs[rungs.length - 1]! / 2) + 32);
  return rungs.reverse();
}

/** Newton (chord) iterations at `bits` with the Jacobian factorised at `jacobianBits` from c, until the correction is below 2^-(bits - 40). */
function newtonRung(c: bigint[], xs: readonly number[], order: number, bits: number, jacobianBits: number, maxSteps: number, step?: (s: LadderStep) => void): bigint[] {
  const xsHigh = xs.map((x) => exactFixed(x, bits));
  const xsLow = xs.map((x) => exactFixed(x, jacobianBits));
  const lu = luFactor(jacobian(rescaleAll(c, bits, jacobianBits), xsLow, order, jacobianBits), jacobianBits);
  for (let k = 0; k < maxSteps; k++) {
    const e = residual(c, xsHigh, order, bits);
    const d = luSolve(lu, e);
    for (let j = 0; j < c.length; j++) c[j] = c[j]! - d[j]!;
    const m = maxAbs(d);
    step?.({ stage: 'fixed point', bits, terms: c.length, correctionLog2: log2Of(m, bits) });
    if (m < 1n << 40n) break;
  }
  return c;
}

/** A first g: g(y) = 1 - a y with g(1) = 1 - a = -(1 - 1/Z) 0.8, the rough size of -1/alpha (Z = 2: -0.4). */
function startingSeries(order: number, bits: number): bigint[] {
  const a = 1 + 0.8 * (1 - 1 / order);
  // 1 - a y = (1 - a/2) - (a/2) t
  return [exactFixed(1 - a / 2, bits), exactFixed(-a / 2, bits)];
}

/** The number of terms reached by continuation at low precision before the ladder starts. */
export const CONTINUATION_TERMS = 14;
export const BASE_BITS = 128;

/**
 * The low-precision solution for `terms` coefficients by continuation in
 * the number of terms (2, 3, ... terms), each solved by full Newton.
 */
export function continuation(order: number, terms: number, bits: number = BASE_BITS): bigint[][] {
  const found: bigint[][] = [];
  let c = startingSeries(order, bits);
  for (let n = 2; n <= terms; n++) {
    while (c.length < n) c.push(0n);
    const xs = collocationPoints(order, n - 1);
    for (let k = 0; k < 40; k++) {
      const before = c.slice();
      newtonRung(c, xs, order, bits, bits, 1);
      const m = maxAbs(c.map((v, j) => v - before[j]!));
      if (m < 1n << 40n) break;
      if (k === 39) throw Object.assign(new Error(`fixed point of order ${order}: Newton did not settle at ${n} terms`), { name: 'NoConvergenceError' });
    }
    found.push(c.slice());
  }
  return found;
}

/** The fixed point with `terms` Chebyshev coefficients at `bits` fractional bits. */
export function solveFixedPoint(order: number, terms: number, bits: number, step?: (s: LadderStep) => void): FixedPointSolution {
  const start = continuation(order, Math.min(terms, CONTINUATION_TERMS));
  let c = start[start.length - 1]!.slice();
  while (c.length < terms) c.push(0n);
  const xs = collocationPoints(order, terms - 1);
  const rungs = ladder(bits, BASE_BITS);
  let from = BASE_BITS;
  for (let r = 0; r < rungs.length; r++) {
    const b = rungs[r]!;
    c = rescaleAll(c, from, b);
    from = b;
    const jb = r === 0 ? b : rungs[r - 1]!;
    newtonRung(c, xs, order, b, jb, r === 0 ? 40 : 8, step);
  }
  return { order, terms, bits, coefficients: c, g1: sum(c) };
}

/** max |s g(x) - g(g(s x))| over the given points, as a double (for checks at points off the collocation set). */
export function fixedPointDefect(sol: FixedPointSolution, points: readonly number[]): number {
  const { coefficients: c, order, bits, g1 } = sol;
  const shift = BigInt(bits);
  let worst = 0;
  for (const p of points) {
    const x = exactFixed(p, bits);
    const gx = seriesValue(x, c, order, bits);
    const gu = seriesValue((g1 * x) >> shift, c, order, bits);
    const e = ((g1 * gx) >> shift) - seriesValue(gu, c, order, bits);
    const a = e < 0n ? -e : e;
    const l = a === 0n ? -Infinity : Math.log2(Number(a.toString(2).length > 60 ? a >> BigInt(a.toString(2).length - 60) : a)) + Math.max(0, a.toString(2).length - 60) - bits;
    worst = Math.max(worst, l === -Infinity ? 0 : 2 ** l);
  }
  return worst;
}

export { triples as collocationTriples };
