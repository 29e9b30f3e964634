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
 * refined up the same ladder of precisions as the fixed point, by chord
 * Newton on the bordered system (M - lambda B) b = 0, b_m = 1.
 */
import { luFactor, luSolve } from './fixed-lu.js';
import { collocationPoints, collocationTriples, exactFixed, ladder, rescaleAll, type FixedPointSolution, type LadderStep } from './fixed-point.js';

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

function toDouble(n: bigint, bits: number): number {
  const len = n < 0n ? (-n).toString(2).length : n.toString(2).length;
  const drop = Math.max(0, len - 60);
  return Number(n >> BigInt(drop)) * 2 ** (drop - bits);
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
  let v = m.map((_, i) => (i === 0 ? 1n << shift : 1n << (shift - BigInt(i % 7 + 1))));
  let last = NaN;
  for (let k = 0; k < steps; k++) {
    const w = luSolve(lu, matVec(b, v, shift));
    let big = 0;
    for (let i = 1; i < w.length; i++) if ((w[i]! < 0n ? -w[i]! : w[i]!) > (w[big]! < 0n ? -w[big]! : w[big]!)) big = i;
    if (w[big] === 0n) return undefined;
    const value = sigma + toDouble(v[big]!, bits) / toDouble(w[big]!, bits);
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
  if (common.length === 0) throw Object.assign(new Error(`order ${lower.order}: no eigenvalue of the doubling operator is stable between ${lower.terms} and ${upper.terms} terms`), { name: 'NoConvergenceError' });
  return Math.max(...common);
}

/**
 * delta at the fixed point's precision, from the double estimate: inverse
 * iteration at the lowest rung, then chord Newton on the bordered system up
 * the ladder.
 */
export function refineDelta(sol: FixedPointSolution, estimate: number, baseBits: number, step?: (s: LadderStep) => void): bigint {
  const n = sol.terms;
  const rungs = ladder(sol.bits, baseBits);
  const b0 = rungs[0]!;
  const low = doublingPencil(sol, b0);
  const first = inverseIteration(low.m, low.b, estimate, b0, 200);
  if (first === undefined) throw Object.assign(new Error(`order ${sol.order}: inverse iteration at ${estimate} did not settle`), { name: 'NoConvergenceError' });
  // normalise on the largest component m (it is 1 there already)
  let big = 0;
  for (let i = 0; i < n; i++) if ((first.vector[i]! < 0n ? -first.vector[i]! : first.vector[i]!) === 1n << BigInt(b0)) big = i;
  let vec = first.vector;
  let lambda = exactFixed(first.value, b0);
  let from = b0;
  let lowPencil = low;
  for (let r = 0; r < rungs.length; r++) {
    const bits = rungs[r]!;
    const shift = BigInt(bits);
    vec = rescaleAll(vec, from, bits);
    lambda = rescaleAll([lambda], from, bits)[0]!;
    from = bits;
    const pencil = r === 0 ? low : doublingPencil(sol, bits);
    // chord Jacobian at the rung below: [M - lambda B, -B v; e_m, 0]
    const jb = r === 0 ? bits : rungs[r - 1]!;
    const jshift = BigInt(jb);
    const vj = rescaleAll(vec, bits, jb);
    const lj = rescaleAll([lambda], bits, jb)[0]!;
    const bv = matVec(lowPencil.b, vj, jshift);
    const jac = lowPencil.m.map((row, i) => [...row.map((v, j) => v - ((lj * lowPencil.b[i]![j]!) >> jshift)), -bv[i]!]);
    jac.push(Array.from({ length: n + 1 }, (_, j) => (j === big ? 1n << jshift : 0n)));
    const lu = luFactor(jac, jb);
    for (let k = 0; k < (r === 0 ? 30 : 8); k++) {
      const mv = matVec(pencil.m, vec, shift);
      const bvh = matVec(pencil.b, vec, shift);
      const f = mv.map((x, i) => x - ((lambda * bvh[i]!) >> shift));
      f.push(vec[big]! - (1n << shift));
      const d = luSolve(lu, f);
      for (let i = 0; i < n; i++) vec[i] = vec[i]! - d[i]!;
      lambda -= d[n]!;
      let worst = 0n;
      for (const x of d) if ((x < 0n ? -x : x) > worst) worst = x < 0n ? -x : x;
      step?.({ stage: 'eigenvalue', bits, terms: n, correctionLog2: worst === 0n ? -Infinity : worst.toString(2).length - bits });
      if (worst < 1n << 40n) break;
    }
    lowPencil = pencil;
  }
  return lambda;
}
