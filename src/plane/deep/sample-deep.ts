/**
 * The deep kernel: per-pixel perturbation around a reference orbit, with
 * rebasing, bilinear-approximation skips, rescaled iterations for tiny
 * deltas, exterior distance, and interior period detection confirmed by
 * the multiplier. Fills the same SampleSet as the shallow kernel, with the
 * same meanings, so deep plates colour like shallow ones.
 *
 * Methods (docs/methods.md):
 * - B1 perturbation, z_{n+1} = 2 Z_m z_n + z_n^2 + c (math.stackexchange
 *   q/939270; mathr.co.uk/web/deep-zoom.html section 2).
 * - B3 rebasing (Zhuoran, fractalforums.org t/4360; mathr deep-zoom 2.1):
 *   after a step, if |Z_m + z| < |z| or m = M, set z <- Z_m + z, m <- 0.
 *   No glitch detection and no second reference are needed.
 * - B5 bilinear approximation, see bla-table.ts.
 * - B6b rescaled iterations (fractalwiki.org/wiki/Rescaled_iterations): while
 *   |z| < 2^-500, z = 2^k w with w a double near 1, c = 2^k d, and the step
 *   is w <- 2 Z w + 2^k w^2 + d. Chosen over floatexp (B6a) for the hot loop
 *   because it stays in plain doubles and needs no renormalisation per
 *   operation; it only renormalises when w leaves [2^-64, 2^64]. The only
 *   full-range values are the rare reference iterates below 2^-500, which
 *   the reference orbit keeps as floatexp.
 * - B8 derivative for distance estimation: G_{n+1} = 2 (Z_m + z_n) G_n + u,
 *   with G = u dz/dc, the derivative with respect to the offset in tile
 *   units u = 2^unitExponent; rebasing leaves it unchanged, a skip applies
 *   G <- A G + B.
 * - A1 smooth count and A2 exterior distance b = 2|z| ln|z| / |dz/dc| from
 *   the full escaped value, exactly as the shallow kernel (smooth-count.ts,
 *   exterior-distance.ts); b is written in tile units (c units when
 *   unitExponent = 0).
 * - A4/A5 interior: candidate periods from atom domains (the iteration n at
 *   which |Z_m + z_n|^2 at least halves), checked at doubling intervals
 *   (arm at n_min + 2^t p, test one period later: the product of 2 (Z + z)
 *   over that period must be below 1), and confirmed by Newton on
 *   F^p(w) = w (itself run by perturbation, with skips) with
 *   |multiplier| < 1 (mathr "Practical interior distance rendering";
 *   "Interior coordinates"). Brent's saved-value test on full values was
 *   dropped: at depth the full values of neighbouring pixels agree to far
 *   more digits than a double holds, so its tolerance cannot be tied to the
 *   pixel spacing; the atom-domain candidate needs no tolerance.
 * - A6 interior distance along one period by perturbation (in tile units);
 *   below U = -900 with the derivatives carried as (re, im, exponent).
 *
 * How a plate uses it (all inputs are plain data; a worker receives them by
 * postMessage / structured clone, or once as SharedArrayBuffer copies):
 * 1. once per plate, on the main thread: bits = referenceBits(span, pixels);
 *    orbit = computeReferenceOrbit(reference, bits, maxIterations, { escapeRadius,
 *    period? }) (a nucleus in view gives a periodic reference, else the view
 *    centre); choose U (0 while the span is above ~1e-290, else about
 *    floor(log2(span)) - 10); geometry: origin = referenceOffset(orbit,
 *    pixel (0, 0) centre, U), steps = pixel spacing / 2^U (deep-offsets.ts);
 *    deltaMax = the plate's largest |offset| component (corners);
 *    table = buildBlaTable(orbit, U, deltaMax) (or null to switch skipping off).
 *    Share with shareReferenceOrbit / shareBlaTable.
 * 2. per tile, in a worker: fillDeepOffsets(geometry, x0, y0, w, h, dcRe, dcIm);
 *    sampleDeep(orbit, table, dcRe, dcIm, w * h, settings, out, stats).
 * Because orbit, table, U and geometry are per plate and each pixel's result
 * depends only on them and its own offset, output bytes do not depend on
 * tiling or worker count (tested).
 *
 * Data shapes: ReferenceOrbit = { centreRe, centreIm: string; bits, length,
 * escapeRadius, period: number; escaped: boolean; re, im: Float64Array(M+1);
 * tinyIndex: Int32Array, tinyRe, tinyIm: Float64Array, tinyExp: Int32Array }.
 * BlaTable = { levels, dense, epsilon, unitExponent: number; offsets,
 * counts, bExp, skip, minAt: Int32Array; aRe, aIm, bRe, bIm, bTileRe,
 * bTileIm, radius2, logRadius, minNorm: Float64Array } (84 bytes an entry:
 * about 2M for an orbit of length M, or M log2 M with every start, see
 * bla-table.ts). DeepSettings below.
 */
import type { ReferenceOrbit } from '../../precise/reference-orbit.js';
import { ldexp } from '../../precise/floatexp.js';
import type { BlaTable } from './bla-table.js';
import type { SampleSet } from '../sample-set.js';
import { PERIOD_ESCAPED, PERIOD_UNDECIDED } from '../sample-set.js';
import { smoothCount } from '../smooth-count.js';
import { outsideMainCardioid } from '../closed-form-cycle.js';
import { confirmCycle, exactPeriod } from './cycle.js';
import { interiorDistanceDeep, interiorDistanceScaled } from './interior-distance.js';
import { run } from './step-loop.js';
import {
  type DeepSettings,
  type DeepStats,
  EV_ESCAPED,
  EV_NEWMIN,
  EV_STOP,
  FI,
  FK,
  FR,
  GI,
  GR,
  N,
  PE,
  PI,
  PR,
  STATE,
  diffScaled,
  makeOrbit,
  startState,
  createDeepWork,
} from './state.js';

export { createDeepStats, type DeepSettings, type DeepStats } from './state.js';

/** Margin of the cardioid test (closed-form-cycle.ts): far above the rounding of c ~ 1 and of the polynomial. */
const FIXED_POINT_MARGIN = 2 ** -30;

/**
 * Samples `count` parameters c = C + (dcRe[k] + i dcIm[k]) 2^U around the
 * reference C of `reference`, writing slot k of `out` with the meanings of
 * sample-set.ts (distance in units of 2^U). `bla` may be null (no skipping);
 * a table must have been built for the same orbit and unitExponent and for
 * offsets at least as large as these (a different unit is a RangeError).
 * Adds to `stats`. Pure: no I/O, no module state; the result depends only
 * on the arguments.
 */
export function sampleDeep(
  reference: ReferenceOrbit,
  bla: BlaTable | null,
  dcRe: Float64Array,
  dcIm: Float64Array,
  count: number,
  settings: DeepSettings,
  out: SampleSet,
  stats: DeepStats,
): SampleSet {
  if (bla !== null && bla.unitExponent !== settings.unitExponent) {
    throw new RangeError(`sampleDeep: table built for unit 2^${bla.unitExponent}, settings use 2^${settings.unitExponent}`);
  }
  const o = makeOrbit(reference);
  const maxIterations = settings.maxIterations;
  const R2 = settings.escapeRadius * settings.escapeRadius;
  const logR = Math.log(settings.escapeRadius);
  const U = settings.unitExponent;
  const interior = settings.interior ?? true;
  const budget = settings.newtonBudget ?? 8;
  const st = new Float64Array(STATE);
  const work = createDeepWork();
  const res = new Float64Array(5);
  const d = new Float64Array(3);
  const { period, smooth, distance, mulRe, mulIm } = out;
  // c = C + offset in doubles, for the cardioid test only (C = Z_1)
  const unit = ldexp(1, U);
  const cRe = reference.length >= 1 ? reference.re[1]! : 0,
    cIm = reference.length >= 1 ? reference.im[1]! : 0;
  for (let idx = 0; idx < count; idx++) {
    const dlr = dcRe[idx]!,
      dli = dcIm[idx]!;
    // The first iterate is always a new minimum, so 1 is every pixel's first
    // candidate; outside the main cardioid (A3) no fixed point attracts and
    // its test, which cuts the first skip, is left out.
    const noFixedPoint = outsideMainCardioid(cRe + dlr * unit, cIm + dli * unit, FIXED_POINT_MARGIN);
    startState(st, 0, 0, 0, dlr, dli, U);
    // Checks come in pairs: arm (save the full value, reset the product) and,
    // one candidate period later, test. Arms sit at the first iteration a
    // step or skip reaches at or after n_min + 2^t p (doubling, as in Brent's
    // method), so skips are capped only where a test must land.
    let candidate = 0;
    let minAt = 0;
    let doubling = 1;
    let armed = false;
    let nextCheck = Infinity;
    let savedR = 0,
      savedI = 0,
      savedK = 0;
    let newtonLeft = budget;
    let result = PERIOD_UNDECIDED;
    period[idx] = PERIOD_UNDECIDED;
    smooth[idx] = maxIterations;
    distance[idx] = NaN;
    mulRe[idx] = 0;
    mulIm[idx] = 0;
    for (;;) {
      // only a test needs to land exactly one period after its arm; an arm
      // waits for the first step or skip that ends at or past its point
      const ev = armed
        ? run(o, bla, st, Math.min(maxIterations, nextCheck), interior, R2, U, stats)
        : st[N]! >= nextCheck
          ? EV_STOP
          : run(o, bla, st, maxIterations, interior, R2, U, stats, nextCheck);
      if (ev === EV_ESCAPED) {
        const fr = st[FR]!,
          fi = st[FI]!;
        period[idx] = PERIOD_ESCAPED;
        smooth[idx] = smoothCount(st[N]!, fr, fi, logR);
        const mod2 = fr * fr + fi * fi;
        const g = Math.hypot(st[GR]!, st[GI]!);
        distance[idx] = g < Infinity ? (Math.sqrt(mod2) * Math.log(mod2)) / g : 0;
        result = PERIOD_ESCAPED;
        break;
      }
      if (ev === EV_STOP && st[N]! >= maxIterations) break;
      if (ev === EV_NEWMIN) {
        candidate = st[N]!;
        minAt = st[N]!;
        doubling = 1;
        armed = false; // arm right here
        if (candidate === 1 && noFixedPoint) {
          nextCheck = Infinity;
          continue;
        }
      } else if (armed) {
        // test: one candidate period after the arm
        const lr = ldexp(st[PR]!, st[PE]!),
          li = ldexp(st[PI]!, st[PE]!);
        diffScaled(st[FR]!, st[FI]!, st[FK]!, savedR, savedI, savedK, d);
        const gap = Math.hypot(d[0]!, d[1]!) * 2 ** Math.max(-1000, Math.min(1000, d[2]! - savedK));
        // Gate for Newton: the orbit contracted over the last period. The
        // return gap is not required to be small: Newton's basin is wide, and
        // slowly converging orbits (|multiplier| near 1) would wait too long.
        if (lr * lr + li * li < 1 && gap < Infinity && newtonLeft > 0) {
          newtonLeft -= 1;
          if (confirmCycle(o, bla, work, candidate, st[FR]!, st[FI]!, st[FK]!, dlr, dli, settings, stats, res)) {
            const p = exactPeriod(o, bla, work, candidate, res[0]!, res[1]!, res[2]!, dlr, dli, settings, stats, res);
            period[idx] = p;
            smooth[idx] = st[N]!;
            mulRe[idx] = res[3]!;
            mulIm[idx] = res[4]!;
            distance[idx] =
              U < -900
                ? interiorDistanceScaled(o, work, p, res[0]!, res[1]!, res[2]!, dlr, dli, settings, stats)
                : interiorDistanceDeep(o, p, res[0]!, res[1]!, res[2]!, dlr, dli, U);
            result = p;
            break;
          }
        }
        armed = false;
        doubling *= 2;
        nextCheck = minAt + doubling * candidate;
        continue;
      }
      // arm
      savedR = st[FR]!;
      savedI = st[FI]!;
      savedK = st[FK]!;
      st[PR] = 1;
      st[PI] = 0;
      st[PE] = 0;
      armed = true;
      nextCheck = st[N]! + candidate;
    }
    if (result === PERIOD_UNDECIDED) {
      period[idx] = PERIOD_UNDECIDED;
      smooth[idx] = maxIterations;
    }
  }
  return out;
}
