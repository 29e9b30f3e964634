import { attractingCycle, createCycleResult, reduceCyclePeriod } from './attracting-cycle.js';
import type { CycleResult } from './attracting-cycle.js';
import { closedFormCycle } from './closed-form-cycle.js';
import { LOOP_CYCLE, LOOP_ESCAPED, LOOP_MAXED, createLoopOut, escapeLoop } from './escape-loop.js';
import type { EscapeLoop, LoopOut } from './escape-loop.js';
import { exteriorDistanceFromLog } from './exterior-distance.js';
import { interiorDistance } from './interior-distance.js';
import { PERIOD_ESCAPED, PERIOD_UNDECIDED } from './sample-set.js';
import type { EscapeSettings, SampleSet } from './sample-set.js';
import { smoothCountFromLog } from './smooth-count.js';

/**
 * Default escape radius R = 2^16. docs/methods.md A1/A2: R >= 2^8, larger is more
 * accurate (forum rule of thumb: 10^4 gives about 2 digits of the distance
 * estimate, 10^6 about 3). Each squaring of R costs about one iteration more
 * per escaped sample, so 2^16 (4 more than R = 2) buys a smooth count whose
 * band seams are below 2^-32 relative and a distance estimate close to the
 * Green-function limit, for little time. R^2 = 2^32 is far from overflow.
 */
export const DEFAULT_ESCAPE_RADIUS = 65536;

/**
 * Largest escape radius the kernels accept: an escaped |z_n| is at most
 * R^2 + 2, and its square must stay finite (R^4 = 2^1020 < 2^1024), or the
 * smooth count and distance become infinite. Validators should require
 * 2 <= escapeRadius <= MAX_ESCAPE_RADIUS.
 */
export const MAX_ESCAPE_RADIUS = 2 ** 255;

/** Failed cycle confirmations per sample before periodicity checking is switched off for it. */
const MAX_CONFIRM_ATTEMPTS = 8;
/** Each failed confirmation divides the squared tolerance by this (tolerance by 16). */
const TIGHTEN2 = 256;
/** A proper divisor d of a failed candidate q gets Newton only if |F^d(z) - z| <= this * (|F^q(z) - z| + tolerance). */
const DIVISOR_SLACK = 1e3;

/** Where a sample's orbit stands while sampleParameters finishes it. */
interface OrbitState {
  x: number;
  y: number;
  n: number;
  status: number;
  cycle: number;
}

/**
 * Reusable buffers for sampleParameters: pass one in (sized for the largest
 * batch) to keep the hot path free of allocation.
 */
export interface SampleScratch {
  readonly capacity: number;
  readonly index: Int32Array;
  readonly cr: Float64Array;
  readonly ci: Float64Array;
  readonly loop: LoopOut;
  readonly cycle: CycleResult;
  readonly temp: CycleResult;
  readonly orbit: OrbitState;
}

/** Allocates scratch for batches of up to `capacity` samples. */
export function createSampleScratch(capacity: number): SampleScratch {
  return {
    capacity,
    index: new Int32Array(capacity),
    cr: new Float64Array(capacity),
    ci: new Float64Array(capacity),
    loop: createLoopOut(capacity),
    cycle: createCycleResult(),
    temp: createCycleResult(),
    orbit: { x: 0, y: 0, n: 0, status: 0, cycle: 0 },
  };
}

/**
 * Everything the plate needs per parameter c = (cr[k], ci[k]), k < count,
 * written into `out` (field meanings in sample-set.ts):
 *
 * 1. closed-form interior (docs/methods.md A3): main cardioid -> period 1,
 *    period-2 disk -> period 2, multiplier in closed form, interior distance
 *    by A6 from the closed-form cycle point (the same formula the iterated
 *    path uses), smooth = 0 (no iteration was needed);
 * 2. the rest go through `loop` in one batch (escape time with Brent
 *    periodicity checking, tolerance settings.periodTolerance, methods A4);
 * 3. escaped: smooth count mu (A1) and exterior distance (A2, derivative in a
 *    second pass over the same n iterations);
 * 4. cycle suspected with candidate q: confirmed by A5 (Newton on F^q(w) = w
 *    from the current z, then |D_z F^q(w)| < 1; if q fails, its proper
 *    divisors whose F^d(z) is near z are tried), then reduced to the exact
 *    period (smallest divisor with an attracting fixed point). On success:
 *    period, multiplier, interior distance (A6), smooth = n at the hit. On
 *    failure the sample is resumed from where it stopped with the tolerance
 *    divided by 16 (after 8 failures, without periodicity checking) until it
 *    escapes, a cycle is confirmed or the limit is reached;
 * 5. at the limit: period -1 (undecided), smooth = maxIterations,
 *    distance NaN.
 *
 * Multipliers are 0 and distance is as above for non-interior samples. The
 * loop receives escapeRadius^2 and periodTolerance^2. The result for a
 * sample depends on its c and the settings only, never on the batch.
 *
 * Settings are trusted (validate at the boundary): maxIterations an integer
 * >= 1, 2 <= escapeRadius <= MAX_ESCAPE_RADIUS, periodTolerance >= 0 (0
 * switches periodicity checking off, so interior samples outside the
 * closed-form components end undecided). `scratch` is used when its capacity
 * is at least `count`, otherwise a fresh one is allocated for this call.
 * Returns `out`.
 */
export function sampleParameters(
  cr: Float64Array,
  ci: Float64Array,
  count: number,
  settings: EscapeSettings,
  out: SampleSet,
  loop: EscapeLoop = escapeLoop,
  scratch?: SampleScratch,
): SampleSet {
  const s = scratch !== undefined && scratch.capacity >= count ? scratch : createSampleScratch(count);
  const { maxIterations, escapeRadius, periodTolerance } = settings;
  const escapeRadius2 = escapeRadius * escapeRadius;
  const tolerance2 = periodTolerance * periodTolerance;
  const logR = Math.log(escapeRadius);
  const cycle = s.cycle;

  let m = 0;
  for (let k = 0; k < count; k++) {
    const a = cr[k]!,
      b = ci[k]!;
    const p = closedFormCycle(a, b, cycle);
    if (p > 0) {
      writeInterior(out, k, p, cycle, interiorDistance(a, b, cycle.wRe, cycle.wIm, p), 0);
    } else {
      s.index[m] = k;
      s.cr[m] = a;
      s.ci[m] = b;
      m++;
    }
  }
  if (m === 0) return out;

  const lo = s.loop;
  loop(s.cr, s.ci, m, maxIterations, escapeRadius2, tolerance2, lo);

  const orbit = s.orbit;
  for (let j = 0; j < m; j++) {
    const k = s.index[j]!;
    const a = s.cr[j]!,
      b = s.ci[j]!;
    orbit.x = lo.zRe[j]!;
    orbit.y = lo.zIm[j]!;
    orbit.n = lo.iterations[j]!;
    orbit.status = lo.status[j]!;
    orbit.cycle = lo.cycle[j]!;
    let tol2 = tolerance2;
    let attempts = 0;
    while (orbit.status === LOOP_CYCLE) {
      const p = confirmCycle(a, b, orbit, tol2, s);
      if (p > 0) break;
      attempts++;
      tol2 = attempts < MAX_CONFIRM_ATTEMPTS ? tol2 / TIGHTEN2 : 0;
      resumeOrbit(a, b, maxIterations, escapeRadius2, tol2, orbit);
    }
    if (orbit.status === LOOP_ESCAPED) {
      out.period[k] = PERIOD_ESCAPED;
      const mod2 = orbit.x * orbit.x + orbit.y * orbit.y;
      const logMod2 = Math.log(mod2);
      out.smooth[k] = smoothCountFromLog(orbit.n, logMod2, logR);
      out.distance[k] = exteriorDistanceFromLog(a, b, orbit.n, mod2, logMod2);
      out.mulRe[k] = 0;
      out.mulIm[k] = 0;
    } else if (orbit.status === LOOP_CYCLE) {
      const p = orbit.cycle;
      writeInterior(out, k, p, cycle, interiorDistance(a, b, cycle.wRe, cycle.wIm, p), orbit.n);
    } else {
      out.period[k] = PERIOD_UNDECIDED;
      out.smooth[k] = maxIterations;
      out.distance[k] = NaN;
      out.mulRe[k] = 0;
      out.mulIm[k] = 0;
    }
  }
  return out;
}

function writeInterior(out: SampleSet, k: number, period: number, cycle: CycleResult, distance: number, smooth: number): void {
  out.period[k] = period;
  out.smooth[k] = smooth;
  out.distance[k] = distance;
  out.mulRe[k] = cycle.mulRe;
  out.mulIm[k] = cycle.mulIm;
}

/**
 * A5 confirmation of a suspected cycle at orbit.(x, y) with candidate
 * orbit.cycle. On success leaves the cycle in s.cycle, sets orbit.cycle to
 * the exact period and returns it; returns 0 on failure.
 */
function confirmCycle(a: number, b: number, orbit: OrbitState, tol2: number, s: SampleScratch): number {
  const q = orbit.cycle;
  const cycle = s.cycle;
  attractingCycle(a, b, q, orbit.x, orbit.y, cycle);
  let found = cycle.ok ? q : 0;
  if (found === 0 && q > 1) {
    // |F^d(z) - z| for the proper divisors, and |F^q(z) - z| as the yardstick.
    let zr = orbit.x,
      zi = orbit.y;
    for (let d = 1; d <= q; d++) {
      const u = zr * zr - zi * zi + a;
      zi = 2 * zr * zi + b;
      zr = u;
    }
    const er = zr - orbit.x,
      ei = zi - orbit.y;
    const limit = DIVISOR_SLACK * (Math.sqrt(er * er + ei * ei) + Math.sqrt(tol2));
    const limit2 = limit * limit;
    zr = orbit.x;
    zi = orbit.y;
    for (let d = 1; d < q && found === 0; d++) {
      const u = zr * zr - zi * zi + a;
      zi = 2 * zr * zi + b;
      zr = u;
      if (q % d !== 0) continue;
      const fr = zr - orbit.x,
        fi = zi - orbit.y;
      if (!(fr * fr + fi * fi <= limit2)) continue;
      attractingCycle(a, b, d, orbit.x, orbit.y, cycle);
      if (cycle.ok) found = d;
    }
  }
  if (found === 0) return 0;
  const p = reduceCyclePeriod(a, b, found, cycle, s.temp);
  orbit.cycle = p;
  return p;
}

/**
 * Continues one orbit from orbit.(x, y, n) with the same arithmetic as the
 * escape loop and a fresh Brent window (saved = current z, window lengths
 * 1, 2, 4, ...); tol2 = 0 switches periodicity checking off.
 */
function resumeOrbit(a: number, b: number, maxIterations: number, escapeRadius2: number, tol2: number, orbit: OrbitState): void {
  let x = orbit.x,
    y = orbit.y,
    n = orbit.n;
  let x2 = x * x,
    y2 = y * y;
  let sx = x,
    sy = y,
    saved = n,
    span = 1,
    next = n + 1,
    found = 0;
  const checking = tol2 > 0;
  while (n < maxIterations && x2 + y2 <= escapeRadius2) {
    y = 2 * x * y + b;
    x = x2 - y2 + a;
    x2 = x * x;
    y2 = y * y;
    n++;
    if (checking) {
      const ex = x - sx,
        ey = y - sy;
      if (ex * ex + ey * ey < tol2) {
        found = n - saved;
        break;
      }
      if (n === next) {
        sx = x;
        sy = y;
        saved = n;
        span *= 2;
        next = n + span;
      }
    }
  }
  orbit.x = x;
  orbit.y = y;
  orbit.n = n;
  orbit.status = x2 + y2 > escapeRadius2 ? LOOP_ESCAPED : found > 0 ? LOOP_CYCLE : LOOP_MAXED;
  orbit.cycle = found;
}
