import { smoothCount } from '../plane/smooth-count.js';
import { PERIOD_ESCAPED, PERIOD_UNDECIDED, type SampleSet } from '../plane/sample-set.js';
import { fatouReal, sectorOf, type ParabolicPetals } from './parabolic-petals.js';

/**
 * The per-plate data the Julia kernel needs about the interior: plain data,
 * built once from a JuliaCycle (julia-cycle.ts) and sent to the workers.
 */
export interface JuliaTrap {
  readonly kind: 'attracting' | 'parabolic' | 'siegel' | 'none';
  /** Number of interior classes (p, or k q for a parabolic cycle). */
  readonly basinPeriod: number;
  readonly w0Re: number;
  readonly w0Im: number;
  /** Attracting: trap disk radius about w_0 and the contraction of f^p on it. */
  readonly trapRadius: number;
  readonly trapContraction: number;
  /** Parabolic: the petals at w_0 and the number of f-steps of one return (k q). */
  readonly petals: ParabolicPetals | null;
  /** Added to every class so that the critical point lies in class 0. */
  readonly classOffset: number;
}

/**
 * A SampleSet for the dynamical plane (fields as in src/plane/sample-set.ts,
 * read with z for c) plus `basin[k]`: the class j of an interior sample, the
 * cycle point (or petal) w_j with f^{m P}(z) -> w_j as m grows (P = the
 * number of classes); -1 for samples that are not interior. For interior
 * samples `period` holds P, `smooth` the attraction time, `distance` NaN and
 * the multipliers 0.
 */
export interface JuliaSampleSet extends SampleSet {
  readonly basin: Int32Array;
}

/** Attraction-time units per unit of mean distance to alpha on a Siegel disk (sets the spacing of its rings). */
export const SIEGEL_SCALE = 60;

export interface JuliaSettings {
  readonly cRe: number;
  readonly cIm: number;
  readonly maxIterations: number;
  readonly escapeRadius: number;
}

/**
 * Samples z = (zr[k], zi[k]), k < count, of the dynamical plane of c into
 * `out`: one orbit per sample with the z-derivative z'_{n+1} = 2 z_n z'_n,
 * z'_0 = 1, updated before z.
 *
 * - Escaped at step n (|z_n| > R): smooth count mu = n - log2(ln|z_n| / ln R)
 *   (docs/methods.md A1) and the distance estimate b = 2 |z_n| ln|z_n| / |z'_n| in
 *   z units (the dynamical-plane form of A2: G(z) / |grad G| with the Green
 *   function of the filled Julia set; Milnor, Dynamics in One Complex
 *   Variable, App. G). b = 0 when z' overflowed (the pixel touches the set).
 * - Entered the trap at step n (attracting: |z_n - w_0| < r; parabolic: z_n
 *   in a petal at w_0, petal index j): interior, class (j - n + offset) mod P
 *   (j = 0 for the attracting trap), since z_{n + m} then tends to the cycle
 *   point (petal) of index j + m. The attraction time is n, smoothed: for the
 *   attracting trap n - p ln(r / |u|) / ln(1 / kappa) clamped to [n - p, n]
 *   (kappa the contraction on the trap circle), for a petal
 *   n - kq (Re W - R) clamped likewise (W advances by about 1 per return).
 * - Siegel (`trap.kind` 'siegel'): a sample that has not escaped by
 *   maxIterations is interior (class 0), and its time is SIEGEL_SCALE times
 *   the mean of |z_n - w_0| over the second half of its orbit: on the disk
 *   the orbit runs round one invariant curve of the rotation, so this mean
 *   is constant on each curve and the shading draws them as rings; orbits
 *   of preimages of the disk end on such a curve too.
 * - Neither by maxIterations: undecided (period -1, smooth = maxIterations).
 *
 * Pure: a sample's result depends on its z, c, the trap and the settings only.
 */
export function sampleJulia(zr: Float64Array, zi: Float64Array, count: number, settings: JuliaSettings, trap: JuliaTrap, out: JuliaSampleSet): JuliaSampleSet {
  const { cRe, cIm, maxIterations } = settings;
  const R2 = settings.escapeRadius * settings.escapeRadius;
  const logR = Math.log(settings.escapeRadius);
  const P = trap.basinPeriod;
  const w0r = trap.w0Re,
    w0i = trap.w0Im;
  const attracting = trap.kind === 'attracting';
  const petals = trap.kind === 'parabolic' ? trap.petals : null;
  const trap2 = attracting ? trap.trapRadius * trap.trapRadius : 0;
  const logContract = attracting ? Math.log(1 / Math.max(trap.trapContraction, 1e-300)) : 1;
  const petal2 = petals !== null ? petals.petalRadius * petals.petalRadius : 0;
  const q = petals !== null ? petals.q : 1;
  const returnSteps = petals !== null ? P : 1;
  const siegel = trap.kind === 'siegel';
  const half = Math.floor(maxIterations / 2);
  for (let k = 0; k < count; k++) {
    let x = zr[k]!,
      y = zi[k]!,
      dx = 1,
      dy = 0;
    let n = 0;
    let state = PERIOD_UNDECIDED;
    let cls = -1;
    let time = maxIterations;
    let recurrence = 0;
    for (;;) {
      const x2 = x * x,
        y2 = y * y;
      if (x2 + y2 > R2) {
        state = PERIOD_ESCAPED;
        break;
      }
      const ux = x - w0r,
        uy = y - w0i;
      const u2 = ux * ux + uy * uy;
      if (u2 < trap2) {
        state = P;
        cls = (((trap.classOffset - n) % P) + P) % P;
        const t = (P * Math.log(trap.trapRadius / Math.sqrt(u2))) / logContract;
        time = n - (t < P ? (t > 0 ? t : 0) : P);
        break;
      }
      if (u2 < petal2 && petals !== null) {
        const re = fatouReal(ux, uy, petals.aRe, petals.aIm, q);
        if (re > petals.fatouRadius) {
          const j = petals.sectorPetal[sectorOf(ux, uy, petals.direction0, q)]!;
          state = P;
          cls = (((j + trap.classOffset - n) % P) + P) % P;
          const t = returnSteps * (re - petals.fatouRadius);
          time = n - (t < returnSteps ? t : returnSteps);
          break;
        }
      }
      if (siegel && n >= half) recurrence += Math.sqrt(u2);
      if (n === maxIterations) {
        if (siegel) {
          state = 1;
          cls = 0;
          time = (SIEGEL_SCALE * recurrence) / (maxIterations - half + 1);
        }
        break;
      }
      const t = 2 * (x * dx - y * dy);
      dy = 2 * (x * dy + y * dx);
      dx = t;
      y = 2 * x * y + cIm;
      x = x2 - y2 + cRe;
      n++;
    }
    out.period[k] = state;
    out.basin[k] = cls;
    out.mulRe[k] = 0;
    out.mulIm[k] = 0;
    if (state === PERIOD_ESCAPED) {
      const mod2 = x * x + y * y;
      const d = Math.hypot(dx, dy);
      out.smooth[k] = smoothCount(n, x, y, logR);
      const b = d < Infinity ? (Math.sqrt(mod2) * Math.log(mod2)) / d : 0;
      out.distance[k] = b >= 0 ? b : 0;
    } else {
      out.smooth[k] = time;
      out.distance[k] = NaN;
    }
  }
  return out;
}

/** Allocates a JuliaSampleSet for `count` samples. */
export function createJuliaSampleSet(count: number): JuliaSampleSet {
  return {
    period: new Int32Array(count),
    smooth: new Float64Array(count),
    distance: new Float64Array(count),
    mulRe: new Float64Array(count),
    mulIm: new Float64Array(count),
    basin: new Int32Array(count),
  };
}
