/**
 * The iteration limit `auto` of a deep view, found from the view itself
 * (docs/methods.md B9): a low-resolution probe of the same view is sampled
 * by the deep kernel at limits L = 1024, 2048, 4096, ... and stops at the
 * first L where some probe pixel is decided (escaped or interior) and at most
 * `tolerance` more probe pixels were decided than at L / 2: the fraction of
 * undecided probe pixels has stopped changing (plane/probe-rule.ts). The
 * plate's limit is then `margin` L (2 L), never above the ceiling (the
 * caller's depth rule, kept as a bound on the probe's own cost for views
 * where nothing is decided).
 *
 * The probe is part of the render, not of the machine: it runs once on the
 * main thread before any tile, over a fixed grid derived from the view, so
 * the limit (and the plate's bytes) depend only on the sheet.
 *
 * Cost follows the pixels: the reference orbit is extended in chunks as the
 * probe raises L (extendReferenceOrbit), stops where the reference escapes
 * or closes its cycle, and the plate's job continues the same builder to the
 * chosen limit instead of the depth rule's (7 665 010 iterations at a span of
 * 1e-1000, where every pixel of the view near c = i escapes by iteration
 * ~2700).
 *
 * Alternatives considered: extending the orbit on demand from the workers as
 * their pixels reach its end was dropped: the orbit is BigInt work on the
 * main thread, the workers share one read-only copy, and a worker waiting on
 * the main thread would tie a tile's time to the schedule. With the probe's
 * limit the orbit is computed to at most 2 L, which is the bound stated in
 * `--json` (precision.memory).
 */
import { buildBlaTable } from './bla-table.js';
import { checkNucleus, deepFrame, startViewReference, type DeepReference, type DeepView } from './job.js';
import { fillDeepOffsets } from './offsets.js';
import { createDeepStats, sampleDeep } from './sample-deep.js';
import { createSampleSet, PERIOD_UNDECIDED } from '../sample-set.js';
import { PROBE_RULE, probeSize, raiseLimit, type ProbeOutcome, type ProbeRule } from '../probe-rule.js';
import { extendReferenceOrbit, orbitSnapshot, type ReferenceBuilder } from '../../precise/reference-orbit.js';

export interface ProbeResult extends ProbeOutcome {
  readonly width: number;
  readonly height: number;
  /** The reference orbit as far as the probe computed it (continued by the plate's job). */
  readonly builder: ReferenceBuilder;
}

/**
 * Runs the probe of {@link PROBE_RULE} for a deep view and returns the limit,
 * the passes, and the reference orbit computed so far. `ceiling` >= 1.
 */
export function probeDeepLimit(
  view: DeepView,
  bits: number,
  unitExponent: number,
  escapeRadius: number,
  skip: boolean,
  reference: DeepReference,
  ceiling: number,
  rule: ProbeRule = PROBE_RULE,
): ProbeResult {
  const size = probeSize(view.width, view.height, rule.side);
  const count = size.width * size.height;
  const builder = startViewReference(view, bits, escapeRadius, reference);
  const centre = reference ?? { re: view.re, im: view.im };
  // The table is valid over the whole plate (and its apron), which holds the probe's pixel centres.
  const plateDelta = deepFrame(view, centre, bits, unitExponent).deltaMax;
  const probe = deepFrame({ ...view, width: size.width, height: size.height }, centre, bits, unitExponent);
  const dcRe = new Float64Array(count);
  const dcIm = new Float64Array(count);
  fillDeepOffsets(probe.geometry, 0, 0, size.width, size.height, dcRe, dcIm);
  const out = createSampleSet(count);
  const stats = createDeepStats();
  const outcome = raiseLimit(
    count,
    ceiling,
    (limit) => {
      checkNucleus(extendReferenceOrbit(builder, limit));
      const orbit = orbitSnapshot(builder);
      const bla = skip ? buildBlaTable(orbit, unitExponent, plateDelta) : null;
      sampleDeep(orbit, bla, dcRe, dcIm, count, { maxIterations: limit, escapeRadius, unitExponent }, out, stats);
      let undecided = 0;
      for (let k = 0; k < count; k++) if (out.period[k] === PERIOD_UNDECIDED) undecided += 1;
      return undecided;
    },
    rule,
  );
  return { ...outcome, ...size, builder };
}
