/**
 * A point w of a cycle of F^p(., c) (F(z) = z^2 + c) and its multiplier
 * D_z F^p(w, c). `converged` says Newton settled on a fixed point of F^p;
 * `ok` says in addition that the cycle attracts (|multiplier| < 1).
 */
export interface CycleResult {
  wRe: number;
  wIm: number;
  mulRe: number;
  mulIm: number;
  converged: boolean;
  ok: boolean;
}

/** A zeroed CycleResult, to be reused as the `out` of attractingCycle. */
export function createCycleResult(): CycleResult {
  return { wRe: 0, wIm: 0, mulRe: 0, mulIm: 0, converged: false, ok: false };
}

/** Newton steps before giving up; convergence is quadratic, so 10-20 is typical. */
const MAX_NEWTON_STEPS = 64;
/** Relative Newton step at which w counts as converged. */
const STEP_TOLERANCE = 1e-13;
/**
 * Orbit points beyond |z| = 8 cannot lie on a cycle of any c with |c| <= 2
 * (the filled Julia set lies in |z| <= 2 there); bail out before overflow.
 */
const ORBIT_BOUND2 = 64;

/**
 * Derivative-based attracting-cycle test (docs/methods.md A5; C. Heiland-Allen,
 * mathr blog "Practical interior distance rendering", and mathr.co.uk/web
 * "Interior coordinates"): solve F^p(w, c) = w by Newton from the guess,
 * w <- w - (F^p(w) - w) / (D_z F^p(w) - 1); the cycle through w attracts iff
 * |D_z F^p(w, c)| < 1, and that derivative is the multiplier (interior
 * coordinate). The multiplier is evaluated at the returned w (one evaluation
 * after the last step). Writes into `out` and returns it; `period` is the
 * period asked for, not necessarily the exact period (see reduceCyclePeriod).
 */
export function attractingCycle(cRe: number, cIm: number, period: number, guessRe: number, guessIm: number, out: CycleResult = createCycleResult()): CycleResult {
  let wr = guessRe,
    wi = guessIm;
  let settled = false;
  out.converged = false;
  out.ok = false;
  for (let step = 0; step <= MAX_NEWTON_STEPS; step++) {
    let zr = wr,
      zi = wi,
      dr = 1,
      di = 0;
    let bounded = true;
    for (let j = 0; j < period; j++) {
      const t = 2 * (zr * dr - zi * di);
      di = 2 * (zr * di + zi * dr);
      dr = t;
      const u = zr * zr - zi * zi + cRe;
      zi = 2 * zr * zi + cIm;
      zr = u;
      if (!(zr * zr + zi * zi <= ORBIT_BOUND2)) {
        bounded = false;
        break;
      }
    }
    if (!bounded) break;
    if (settled) {
      out.wRe = wr;
      out.wIm = wi;
      out.mulRe = dr;
      out.mulIm = di;
      out.converged = true;
      out.ok = dr * dr + di * di < 1;
      return out;
    }
    const fr = zr - wr,
      fi = zi - wi;
    const gr = dr - 1,
      gi = di;
    const den = gr * gr + gi * gi;
    if (!(den > 0)) break;
    const sr = (fr * gr + fi * gi) / den;
    const si = (fi * gr - fr * gi) / den;
    wr -= sr;
    wi -= si;
    if (sr * sr + si * si <= STEP_TOLERANCE * STEP_TOLERANCE * (1 + wr * wr + wi * wi)) settled = true;
  }
  out.wRe = wr;
  out.wIm = wi;
  out.mulRe = 0;
  out.mulIm = 0;
  return out;
}

/** Relative closeness |F^d(w) - w| below which a divisor d is worth a Newton check. */
const DIVISOR_FILTER = 1e-6;

/**
 * The exact period of an attracting cycle found by attractingCycle for
 * `period`: the smallest divisor d of `period` whose F^d also has an
 * attracting fixed point near w. Since a quadratic polynomial has at most one
 * attracting cycle (Fatou: it attracts the critical point 0), any attracting
 * fixed point of F^d is that cycle, so its exact period divides d. Divisors
 * with |F^d(w) - w| > 1e-6 (1 + |w|) are skipped without Newton. When a
 * smaller period is found, `cycle` is overwritten with the F^d result (its
 * multiplier is D_z F^d); returns the exact period. `temp` is scratch.
 */
export function reduceCyclePeriod(cRe: number, cIm: number, period: number, cycle: CycleResult, temp: CycleResult = createCycleResult()): number {
  const wr = cycle.wRe,
    wi = cycle.wIm;
  const limit2 = DIVISOR_FILTER * DIVISOR_FILTER * (1 + wr * wr + wi * wi);
  let zr = wr,
    zi = wi;
  for (let d = 1; d < period; d++) {
    const u = zr * zr - zi * zi + cRe;
    zi = 2 * zr * zi + cIm;
    zr = u;
    if (period % d !== 0) continue;
    const er = zr - wr,
      ei = zi - wi;
    if (!(er * er + ei * ei <= limit2)) continue;
    attractingCycle(cRe, cIm, d, wr, wi, temp);
    if (temp.ok) {
      cycle.wRe = temp.wRe;
      cycle.wIm = temp.wIm;
      cycle.mulRe = temp.mulRe;
      cycle.mulIm = temp.mulIm;
      cycle.converged = true;
      cycle.ok = true;
      return d;
    }
  }
  return period;
}
