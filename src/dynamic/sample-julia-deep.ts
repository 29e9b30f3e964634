import { smoothCount } from '../plane/smooth-count.js';
import { PERIOD_ESCAPED, PERIOD_UNDECIDED } from '../plane/sample-set.js';
import { fatouReal, sectorOf } from './parabolic-petals.js';
import type { JuliaSampleSet, JuliaSettings, JuliaTrap } from './sample-julia.js';

/** The two reference orbits of a deep Julia plate, rounded to doubles (src/precise/julia-reference-orbit.ts). */
export interface JuliaReferences {
  /** The orbit of the view centre, Z_0 = centre. */
  readonly centreRe: Float64Array;
  readonly centreIm: Float64Array;
  /** The critical orbit, C_0 = 0. */
  readonly criticalRe: Float64Array;
  readonly criticalIm: Float64Array;
}

/**
 * The dynamical-plane kernel of sample-julia.ts by perturbation, for views
 * doubles cannot resolve (docs/methods.md B1, with z in place of c): a sample at
 * z = Z_0 + delta carries only its offset from a reference orbit,
 *   delta_{n+1} = 2 Z_m delta_n + delta_n^2      (c is fixed: no c term),
 * and its derivative in full, d_{n+1} = 2 (Z_m + delta_n) d_n, d_0 = 1
 * (docs/methods.md B8: the derivative of the full orbit needs no reference
 * derivative). The reference starts at the view centre; the first time the
 * full value w = Z_m + delta is smaller than delta (or the reference ends),
 * the sample rebases onto the critical orbit C (C_0 = 0): delta <- w, m <- 0,
 * and it rebases onto C_0 again whenever |C_m + delta| < |delta| (Zhuoran's
 * rebasing, docs/methods.md B3; the critical orbit plays the role Z_0 = 0 plays in
 * the parameter plane, since it starts where rebased values are small).
 * Escape, the trap and the distance estimate use the full value w, so the
 * results mean what they mean in sample-julia.ts.
 *
 * Offsets come in (dr[k], di[k]) in z units (doubles hold them to spans far
 * below 1e-30; floatexp is not needed above about 1e-300).
 */
export function sampleJuliaDeep(
  dr: Float64Array,
  di: Float64Array,
  count: number,
  settings: JuliaSettings,
  trap: JuliaTrap,
  refs: JuliaReferences,
  out: JuliaSampleSet,
): JuliaSampleSet {
  const { maxIterations } = settings;
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
  for (let k = 0; k < count; k++) {
    let refRe = refs.centreRe,
      refIm = refs.centreIm;
    let last = refRe.length - 1;
    let m = 0;
    let x = dr[k]!,
      y = di[k]!,
      dx = 1,
      dy = 0;
    let n = 0;
    let state = PERIOD_UNDECIDED;
    let cls = -1;
    let time = maxIterations;
    let wr = 0,
      wi = 0;
    for (;;) {
      const zr = refRe[m]!,
        zi = refIm[m]!;
      wr = zr + x;
      wi = zi + y;
      const w2 = wr * wr + wi * wi;
      if (w2 > R2) {
        state = PERIOD_ESCAPED;
        break;
      }
      const ux = wr - w0r,
        uy = wi - w0i;
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
          const t = P * (re - petals.fatouRadius);
          time = n - (t < P ? t : P);
          break;
        }
      }
      if (n === maxIterations) {
        if (trap.kind === 'siegel') {
          // Deep views of a Siegel disk: interior by non-escape (no recurrence rings at this depth).
          state = 1;
          cls = 0;
          time = 0;
        }
        break;
      }
      if (w2 < x * x + y * y || m === last) {
        // Rebase onto the critical orbit: C_0 = 0, so the new offset is the full value.
        refRe = refs.criticalRe;
        refIm = refs.criticalIm;
        last = refRe.length - 1;
        m = 0;
        x = wr;
        y = wi;
      }
      const Zr = refRe[m]!,
        Zi = refIm[m]!;
      const t = 2 * (wr * dx - wi * dy);
      dy = 2 * (wr * dy + wi * dx);
      dx = t;
      const nx = 2 * (Zr * x - Zi * y) + x * x - y * y;
      y = 2 * (Zr * y + Zi * x) + 2 * x * y;
      x = nx;
      m++;
      n++;
    }
    out.period[k] = state;
    out.basin[k] = cls;
    out.mulRe[k] = 0;
    out.mulIm[k] = 0;
    if (state === PERIOD_ESCAPED) {
      const mod2 = wr * wr + wi * wi;
      const d = Math.hypot(dx, dy);
      out.smooth[k] = smoothCount(n, wr, wi, logR);
      const b = d < Infinity ? (Math.sqrt(mod2) * Math.log(mod2)) / d : 0;
      out.distance[k] = b >= 0 ? b : 0;
    } else {
      out.smooth[k] = time;
      out.distance[k] = NaN;
    }
  }
  return out;
}
