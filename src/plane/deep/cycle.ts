/**
 * Confirming an interior candidate: Newton on F^p(w) = w by perturbation
 * (docs/methods.md A5) with |multiplier| < 1, and the exact period of the
 * cycle found.
 */
import type { BlaTable } from './bla-table.js';
import { exponentOf, ldexp } from '../../precise/floatexp.js';
import { run } from './step-loop.js';
import { type DeepSettings, type DeepStats, EV_ESCAPED, FI, FK, FR, type Orbit, PE, PI, PR, diffScaled, startState, type DeepWork } from './state.js';

const NEWTON_STEPS = 24;
/**
 * Relative Newton step at which w counts as converged. With skipping, F^p is
 * evaluated with relative error about eps per skip (2^-40 ~ 1e-12), so the
 * steps stall near 1e-12; 1e-9 still leaves the multiplier good to ~1e-9.
 */
const NEWTON_TOLERANCE = 1e-12;
const NEWTON_TOLERANCE_SKIPPING = 1e-9;

/**
 * Newton on F^p(w, c) = w by perturbation from w0 = (r, i) 2^k (docs/methods.md
 * A5). On success writes w (r, i, k) and the multiplier (re, im) into
 * `res` = [wr, wi, wk, mulRe, mulIm] and returns true (|multiplier| < 1).
 */
export function confirmCycle(
  o: Orbit,
  bla: BlaTable | null,
  work: DeepWork,
  p: number,
  w0r: number,
  w0i: number,
  w0k: number,
  dlr: number,
  dli: number,
  settings: DeepSettings,
  stats: DeepStats,
  res: Float64Array,
): boolean {
  const R2 = settings.escapeRadius * settings.escapeRadius;
  const U = settings.unitExponent;
  let wr = w0r,
    wi = w0i,
    wk = w0k;
  const scratch = work.state;
  const d = work.gap;
  let converged = false;
  let lr = 0,
    li = 0;
  for (let it = 0; it < NEWTON_STEPS; it++) {
    startState(scratch, wr, wi, wk, dlr, dli, U);
    const ev = run(o, bla, scratch, p, false, R2, U, stats);
    stats.newtonIterations += p;
    if (ev === EV_ESCAPED) return false;
    // multiplier D_z F^p = P 2^PE
    lr = ldexp(scratch[PR]!, scratch[PE]!);
    li = ldexp(scratch[PI]!, scratch[PE]!);
    // residual F^p(w) - w
    diffScaled(scratch[FR]!, scratch[FI]!, scratch[FK]!, wr, wi, wk, d);
    const gr = lr - 1,
      gi = li;
    const g2 = gr * gr + gi * gi;
    if (!(g2 > 0) || !Number.isFinite(g2)) return false;
    // step = residual / (D_z - 1), in units of 2^d[2]
    const sr = (d[0]! * gr + d[1]! * gi) / g2;
    const si = (d[1]! * gr - d[0]! * gi) / g2;
    diffScaled(wr, wi, wk, sr, si, d[2]!, d);
    const dk = d[2]!;
    wr = d[0]!;
    wi = d[1]!;
    wk = dk;
    const aw = Math.abs(wr) + Math.abs(wi);
    if (aw !== 0) {
      const e = exponentOf(aw);
      wr = ldexp(wr, -e);
      wi = ldexp(wi, -e);
      wk += e;
    }
    if (sr === 0 && si === 0) {
      converged = true;
      break;
    }
    const wn = Math.hypot(wr, wi);
    const stepExp = exponentOf(Math.hypot(sr, si)) + dk;
    // relative step small, or w so close to 0 that nothing at this depth resolves it
    const rel = wn === 0 ? Infinity : (Math.hypot(sr, si) / wn) * 2 ** Math.max(-1000, Math.min(1000, dk - wk));
    if (!Number.isFinite(rel) && wn !== 0) return false;
    if (rel <= (bla === null ? NEWTON_TOLERANCE : NEWTON_TOLERANCE_SKIPPING) || ((wn === 0 || wk < U - 1100) && stepExp < U - 1100)) {
      converged = true;
      break;
    }
  }
  if (!converged) return false;
  // multiplier at the converged point
  startState(scratch, wr, wi, wk, dlr, dli, U);
  if (run(o, bla, scratch, p, false, R2, U, stats) === EV_ESCAPED) return false;
  stats.newtonIterations += p;
  lr = ldexp(scratch[PR]!, scratch[PE]!);
  li = ldexp(scratch[PI]!, scratch[PE]!);
  if (!(lr * lr + li * li < 1)) return false;
  res[0] = wr;
  res[1] = wi;
  res[2] = wk;
  res[3] = lr;
  res[4] = li;
  return true;
}

/**
 * The exact period of the attracting cycle through w = (r, i) 2^k found for
 * period p: the least divisor d of p with F^d(w) = w to 1e-6 relative.
 * A quadratic polynomial has at most one attracting cycle (Fatou), so
 * the exact period divides p.
 */
export function exactPeriod(
  o: Orbit,
  bla: BlaTable | null,
  work: DeepWork,
  p: number,
  wr: number,
  wi: number,
  wk: number,
  dlr: number,
  dli: number,
  settings: DeepSettings,
  stats: DeepStats,
  res: Float64Array,
): number {
  const R2 = settings.escapeRadius * settings.escapeRadius;
  const U = settings.unitExponent;
  const scratch = work.state;
  const d = work.gap;
  for (let q = 1; q < p; q++) {
    if (p % q !== 0) continue;
    startState(scratch, wr, wi, wk, dlr, dli, U);
    if (run(o, bla, scratch, q, false, R2, U, stats) === EV_ESCAPED) continue;
    stats.newtonIterations += q;
    diffScaled(scratch[FR]!, scratch[FI]!, scratch[FK]!, wr, wi, wk, d);
    const err = Math.hypot(d[0]!, d[1]!) * 2 ** Math.max(-1000, Math.min(1000, d[2]! - wk));
    if (err <= 1e-6 * Math.hypot(wr, wi)) {
      res[3] = ldexp(scratch[PR]!, scratch[PE]!);
      res[4] = ldexp(scratch[PI]!, scratch[PE]!);
      return q;
    }
  }
  return p;
}
