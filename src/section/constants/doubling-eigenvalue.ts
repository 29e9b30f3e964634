/**
 * Feigenbaum's delta: the eigenvalue outside the unit circle of the doubling
 * operator linearised at the fixed point g, with alpha held fixed
 * (docs/methods.md E9; Briggs 1991):
 * T h(x) = (1/s) [h(g(s x)) + g'(g(s x)) h(s x)], s = g(1) = -1/alpha,
 * on the even functions h(x) = sum_j b_j T_j(2|x|^Z - 1) collocated at x = 0
 * and the fixed point's own points: the pencil M b = lambda B b.
 *
 * The pencil also has the eigenvalue 1 (the rescalings lambda g(x/lambda) are
 * fixed points for the same alpha), and for orders Z >= 4 spurious
 * eigenvalues that the truncation makes and that move as the number of terms
 * grows. So delta is found at low precision by inverse iteration from a scan
 * of shifts, at two truncations, and kept only where both agree; then it is
 * refined like the fixed point, by chord Newton on the bordered system
 * (M - lambda B) b = 0, b_m = 1: its Jacobian factorised at LU_BITS, its
 * residual evaluated at full precision as series values, so no matrix is
 * ever held at full precision.
 */
import { luFactor, luSolve } from './fixed-lu.js';
import { collocationPoints, collocationTriples, exactFixed, fixedToNumber, LU_BITS, rescaleAll, type FixedPointSolution, type NewtonStep } from './fixed-point.js';
import { seriesAt, seriesValue } from './even-series.js';

/** The pencil (M, B) at `bits`, rows for x = 0 then the collocation points. */
export function doublingPencil(sol: FixedPointSolution, bits: number): { m: bigint[][]; b: bigint[][] } {
  const c = rescaleAll(sol.coefficients, sol.bits, bits);
  const n = c.length;
  const shift = BigInt(bits);
  let s = 0n;
  for (const v of c) s += v;
  const xs = [0, ...collocationPoints(sol.order, n - 1)].map((x) => exactFixed(x, bits));
  const m: bigint[][] = [];
  const b: bigint[][] = [];
  for (const t of collocationTriples(c, s, xs, sol.order, bits)) {
    b.push(t.x.basis.slice());
    m.push(t.gu.basis.map((phi, j) => ((phi + ((t.gu.slope * t.u.basis[j]!) >> shift)) << shift) / s));
  }
  return { m, b };
}

function matVec(a: readonly bigint[][], v: readonly bigint[], shift: bigint): bigint[] {
  return a.map((row) => {
    let acc = 0n;
    for (let j = 0; j < v.length; j++) acc += row[j]! * v[j]!;
    return acc >> shift;
  });
}

/** Inverse iteration for the pencil at shift sigma: the eigenvalue it settles on, or undefined. */
export function inverseIteration(m: readonly bigint[][], b: readonly bigint[][], sigma: number, bits: number, steps = 60): { value: number; vector: bigint[] } | undefined {
  const shift = BigInt(bits);
  const sig = exactFixed(sigma, bits);
  const a = m.map((row, i) => row.map((v, j) => v - ((sig * b[i]![j]!) >> shift)));
  let lu;
  try {
    lu = luFactor(a, bits);
  } catch {
    return undefined;
  }
  let v = m.map((_, i) => (i === 0 ? 1n << shift : 1n << (shift - BigInt((i % 7) + 1))));
  let last = NaN;
  for (let k = 0; k < steps; k++) {
    const w = luSolve(lu, matVec(b, v, shift));
    let big = 0;
    for (let i = 1; i < w.length; i++) if ((w[i]! < 0n ? -w[i]! : w[i]!) > (w[big]! < 0n ? -w[big]! : w[big]!)) big = i;
    if (w[big] === 0n) return undefined;
    const value = sigma + fixedToNumber(v[big]!, bits) / fixedToNumber(w[big]!, bits);
    v = w.map((x) => (x << shift) / w[big]!);
    if (Math.abs(value - last) < 1e-13 * Math.abs(value)) return { value, vector: v };
    last = value;
  }
  return undefined;
}

/** Shifts of the low-precision scan: 1.6 to 20 by halves (delta grows with the order but stays below 20 for Z <= 16). */
function shifts(): number[] {
  const out: number[] = [];
  for (let s = 1.6; s <= 20; s += 0.5) out.push(s);
  return out;
}

/** Distinct eigenvalues (relative 1e-9) reached from the scan. */
function scan(sol: FixedPointSolution, bits: number): number[] {
  const { m, b } = doublingPencil(sol, bits);
  const found: number[] = [];
  for (const sigma of shifts()) {
    const r = inverseIteration(m, b, sigma, bits);
    if (r !== undefined && r.value > 1.2 && !found.some((f) => Math.abs(f - r.value) < 1e-9 * r.value)) found.push(r.value);
  }
  return found;
}

/**
 * The eigenvalue delta at double precision, from two low-precision fixed
 * points (fewer and more terms): the largest eigenvalue above 1 found in
 * both within 1e-6 (each truncation good to about 12 digits).
 */
export function deltaEstimate(lower: FixedPointSolution, upper: FixedPointSolution): number {
  const a = scan(lower, lower.bits);
  const b = scan(upper, upper.bits);
  const common = a.filter((x) => b.some((y) => Math.abs(x - y) < 1e-6 * x));
  if (common.length === 0)
    throw Object.assign(new Error(`order ${lower.order}: no eigenvalue of the doubling operator is stable between ${lower.terms} and ${upper.terms} terms`), {
      name: 'NoConvergenceError',
    });
  return Math.max(...common);
}

/** Bordered chord Jacobian [M - lambda B, -B v; e_m, 0] at `bits`, factorised. */
function borderedLu(pencil: { m: bigint[][]; b: bigint[][] }, vec: readonly bigint[], lambda: bigint, big: number, bits: number) {
  const shift = BigInt(bits);
  const n = vec.length;
  const bv = matVec(pencil.b, vec, shift);
  const jac = pencil.m.map((row, i) => [...row.map((v, j) => v - ((lambda * pencil.b[i]![j]!) >> shift)), -bv[i]!]);
  jac.push(Array.from({ length: n + 1 }, (_, j) => (j === big ? 1n << shift : 0n)));
  return luFactor(jac, bits);
}

/**
 * The residual (M - lambda B) v, v_m - 1 at `bits` without the matrices: with
 * h = sum_j v_j T_j, (M v)_i = (1/s)[h(g(u_i)) + g'(g(u_i)) h(u_i)] and
 * (B v)_i = h(x_i), from the points evaluated once.
 */
interface EigenPoints {
  readonly x: bigint[];
  readonly u: bigint[];
  readonly gu: bigint[];
  readonly slope: bigint[];
  readonly s: bigint;
}

function eigenPoints(sol: FixedPointSolution, bits: number): EigenPoints {
  const c = rescaleAll(sol.coefficients, sol.bits, bits);
  const shift = BigInt(bits);
  let s = 0n;
  for (const v of c) s += v;
  const x = [0, ...collocationPoints(sol.order, c.length - 1)].map((p) => exactFixed(p, bits));
  const u = x.map((v) => (s * v) >> shift);
  const gu = u.map((v) => seriesValue(v, c, sol.order, bits));
  const slope = gu.map((v) => seriesAt(v, c, sol.order, bits).slope);
  return { x, u, gu, slope, s };
}

function eigenResidual(p: EigenPoints, vec: readonly bigint[], lambda: bigint, big: number, order: number, bits: number): bigint[] {
  const shift = BigInt(bits);
  const f = p.x.map((x, i) => {
    const mv = ((seriesValue(p.gu[i]!, vec, order, bits) + ((p.slope[i]! * seriesValue(p.u[i]!, vec, order, bits)) >> shift)) << shift) / p.s;
    return mv - ((lambda * seriesValue(x, vec, order, bits)) >> shift);
  });
  f.push(vec[big]! - (1n << shift));
  return f;
}

/**
 * delta at the fixed point's precision, from the double estimate: inverse
 * iteration at 128 bits, then chord Newton on the bordered system with its
 * Jacobian factorised at LU_BITS (once from the inverse iteration's pair,
 * once more when that is good to LU_BITS) and residuals at full precision.
 */
export function refineDelta(sol: FixedPointSolution, estimate: number, baseBits: number, step?: (s: NewtonStep) => void): bigint {
  const n = sol.terms;
  const low = doublingPencil(sol, baseBits);
  const first = inverseIteration(low.m, low.b, estimate, baseBits, 200);
  if (first === undefined) throw Object.assign(new Error(`order ${sol.order}: inverse iteration at ${estimate} did not settle`), { name: 'NoConvergenceError' });
  const unit = 1n << BigInt(baseBits);
  const big = first.vector.findIndex((v) => v === unit);
  const q = Math.min(sol.bits, LU_BITS);
  let vec = rescaleAll(first.vector, baseBits, q);
  let lambda = exactFixed(first.value, q);
  const chord = (bits: number, lu: ReturnType<typeof luFactor>, points: EigenPoints, maxSteps: number): void => {
    for (let k = 0; k < maxSteps; k++) {
      const d = luSolve(lu, eigenResidual(points, vec, lambda, big, sol.order, bits));
      for (let i = 0; i < n; i++) vec[i] = vec[i]! - d[i]!;
      lambda -= d[n]!;
      let worst = 0n;
      for (const x of d) if ((x < 0n ? -x : x) > worst) worst = x < 0n ? -x : x;
      step?.({ stage: 'eigenvalue', bits, terms: n, correctionLog2: worst === 0n ? -Infinity : worst.toString(2).length - bits });
      if (worst < 1n << 40n) return;
    }
    throw Object.assign(new Error(`order ${sol.order}: the eigenvalue delta did not settle at ${bits} bits`), { name: 'NoConvergenceError' });
  };
  const pencil = doublingPencil(sol, q);
  const pointsQ = eigenPoints(sol, q);
  chord(q, borderedLu(pencil, vec, lambda, big, q), pointsQ, 200);
  if (q < sol.bits) {
    const lu = borderedLu(pencil, vec, lambda, big, q);
    vec = rescaleAll(vec, q, sol.bits);
    lambda = rescaleAll([lambda], q, sol.bits)[0]!;
    // The correction comes back at the full scale: the right-hand side at sol.bits read by an LU at q (fixed-lu.ts).
    chord(sol.bits, lu, eigenPoints(sol, sol.bits), 400);
  }
  return lambda;
}
