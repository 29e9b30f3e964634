/**
 * Orbits x_0, x_1 = f(x_0), ... of a unimodal family in double precision, and
 * what they do: land on a cycle at once, settle on an attracting cycle, or
 * show no period up to a limit (then the Lyapunov exponent says how fast
 * nearby orbits separate, docs/methods.md E6).
 */
import type { UnimodalFamily } from './unimodal-family.js';

/** x_0 .. x_n (n + 1 values). */
export function orbit(family: UnimodalFamily, r: number, x0: number, n: number): Float64Array {
  const out = new Float64Array(n + 1);
  let x = x0;
  out[0] = x;
  for (let k = 1; k <= n; k++) {
    x = family.f(x, r);
    out[k] = x;
  }
  return out;
}

export interface OrbitClass {
  /**
   * `on-cycle`: x_0 itself lies on a cycle (f^p(x_0) = x_0 to rounding), attracting or not;
   * `cycle`: after the transient the orbit settles on an attracting cycle (p = 1: a fixed point);
   * `none`: no period up to maxPeriod was found.
   */
  readonly kind: 'on-cycle' | 'cycle' | 'none';
  readonly period: number;
  /** The cycle's points, starting at the one the orbit reaches first after the transient (or x_0). */
  readonly cycle: readonly number[];
  /** (f^p)'(x) = product of f'(x_i) over the cycle. */
  readonly multiplier: number;
  readonly stability: 'attracting' | 'indifferent' | 'repelling' | null;
  /** Lyapunov estimate (1/N) sum ln|f'(x_n)| over N steps after the transient. */
  readonly lyapunov: number;
  /** Steps averaged for the Lyapunov estimate. */
  readonly lyapunovSteps: number;
}

export interface ClassifySettings {
  readonly transient: number;
  readonly maxPeriod: number;
  readonly lyapunovSteps: number;
}

export const DEFAULT_CLASSIFY: ClassifySettings = { transient: 10_000, maxPeriod: 256, lyapunovSteps: 100_000 };

const LOG_FLOOR = Math.log(1e-300);
/** |f^p(x) - x| below this (relative to the state scale) is a return. */
const RETURN_TOLERANCE = 1e-9;
/** Multipliers within this of 1 in modulus are called indifferent (slow convergence near a bifurcation). */
const INDIFFERENT = 1e-6;

function iterate(family: UnimodalFamily, r: number, x: number, p: number): number {
  for (let k = 0; k < p; k++) x = family.f(x, r);
  return x;
}

/** Real Newton on f^p(x) = x from a guess; returns the refined point (the guess if Newton wanders off). */
function refineCycle(family: UnimodalFamily, r: number, guess: number, p: number): number {
  let x = guess;
  for (let step = 0; step < 50; step++) {
    let y = x,
      d = 1;
    for (let k = 0; k < p; k++) {
      d *= family.dfdx(y, r);
      y = family.f(y, r);
    }
    const g = y - x,
      dg = d - 1;
    if (!(Math.abs(dg) > 0)) break;
    const next = x - g / dg;
    if (!Number.isFinite(next) || Math.abs(next - guess) > 1e-3 * (1 + Math.abs(guess))) return guess;
    if (next === x) break;
    x = next;
  }
  return x;
}

function cycleOf(family: UnimodalFamily, r: number, x: number, p: number): { points: number[]; multiplier: number } {
  const points: number[] = [];
  let m = 1;
  for (let k = 0; k < p; k++) {
    points.push(x);
    m *= family.dfdx(x, r);
    x = family.f(x, r);
  }
  return { points, multiplier: m };
}

function stabilityOf(m: number): 'attracting' | 'indifferent' | 'repelling' {
  const a = Math.abs(m);
  return a < 1 - INDIFFERENT ? 'attracting' : a > 1 + INDIFFERENT ? 'repelling' : 'indifferent';
}

/** Classifies the orbit of x0 under f(., r) (see OrbitClass). Pure. */
export function classifyOrbit(family: UnimodalFamily, r: number, x0: number, settings: ClassifySettings = DEFAULT_CLASSIFY): OrbitClass {
  const scale = Math.max(1, Math.abs(family.stateRange[0]), Math.abs(family.stateRange[1]));
  const tol = RETURN_TOLERANCE * scale;
  // Lyapunov estimate from the orbit after the transient.
  let x = iterate(family, r, x0, settings.transient);
  const settled = x;
  let acc = 0;
  for (let k = 0; k < settings.lyapunovSteps; k++) {
    const d = Math.abs(family.dfdx(x, r));
    acc += d > 0 ? Math.max(Math.log(d), LOG_FLOOR) : LOG_FLOOR;
    x = family.f(x, r);
  }
  const lyapunov = acc / settings.lyapunovSteps;
  const base = { lyapunov, lyapunovSteps: settings.lyapunovSteps };
  // 1. x_0 on a cycle (a repelling one is left after a few dozen steps in doubles, so look at the start).
  let y = x0;
  for (let p = 1; p <= settings.maxPeriod; p++) {
    y = family.f(y, r);
    if (Math.abs(y - x0) <= tol) {
      const c = cycleOf(family, r, refineCycle(family, r, x0, p), p);
      if (stabilityOf(c.multiplier) !== 'attracting')
        return { kind: 'on-cycle', period: p, cycle: c.points, multiplier: c.multiplier, stability: stabilityOf(c.multiplier), ...base };
      break;
    }
  }
  // 2. An attracting cycle reached after the transient.
  y = settled;
  for (let p = 1; p <= settings.maxPeriod; p++) {
    y = family.f(y, r);
    if (Math.abs(y - settled) <= tol) {
      const c = cycleOf(family, r, refineCycle(family, r, settled, p), p);
      return { kind: 'cycle', period: p, cycle: c.points, multiplier: c.multiplier, stability: stabilityOf(c.multiplier), ...base };
    }
  }
  return { kind: 'none', period: 0, cycle: [], multiplier: 0, stability: null, ...base };
}
