/**
 * Sheet to plate job, written once: the arithmetic a sheet's view needs
 * (double or deep, and the reference precision), and the PlateJob of a grid
 * of that view. Plates (render-sheet.ts) use the sheet's own grid; pyramid
 * levels (pyramid-job.ts) use the base grid scaled, with the base's
 * arithmetic and precision.
 */
import type { Legend, PixelRect } from '../colour/legend.js';
import { deepPlan, type DeepPlan } from '../plane/deep/plan.js';
import { DEFAULT_ESCAPE_RADIUS } from '../plane/sample-parameters.js';
import { referenceBits } from '../precise/reference-orbit.js';
import type { Sheet } from '../view/sheet.js';
import type { DoubleGrid } from '../view/view.js';
import { prepareDeepJob, type DeepMemory } from '../plane/deep/job.js';
import { probeDeepLimit } from '../plane/deep/probe-limit.js';
import { PROBE_RULE, probeSize, raiseLimit, type ProbeLevel, type ProbeOutcome } from '../plane/probe-rule.js';
import { sampleParameters } from '../plane/sample-parameters.js';
import { createSampleSet, PERIOD_UNDECIDED } from '../plane/sample-set.js';
import { doubleGrid, pixelsToC } from '../view/view.js';
import type { ReferenceBuilder } from '../precise/reference-orbit.js';
import { autoIterations } from '../view/sheet.js';
import type { PlateJob } from './plate-job.js';

/** Periodicity tolerance in z units from the pixel spacing (docs/methods.md A4: tie it to the spacing). */
export function periodTolerance(spacing: number): number {
  return Math.min(1e-6, Math.max(spacing * 1e-3, 1e-15));
}

/** The arithmetic of a sheet's view: the sheet's choice, or the deep plan's for `auto`, with the reference bits. */
export interface SheetArithmetic {
  readonly arithmetic: 'double' | 'deep';
  readonly plan: DeepPlan;
  /** Reference-orbit bits for the deep arithmetic; 0 for doubles. */
  readonly bits: number;
}

export function sheetArithmetic(sheet: Sheet): SheetArithmetic {
  const plan = deepPlan({ re: sheet.view.re, im: sheet.view.im }, sheet.view.span, sheet.width);
  const arithmetic = sheet.arithmetic === 'auto' ? plan.arithmetic : sheet.arithmetic;
  const bits = arithmetic === 'deep' ? (plan.bits > 0 ? plan.bits : referenceBits(sheet.view.span, sheet.width)) : 0;
  return { arithmetic, plan, bits };
}

/** How a sheet's iteration limit was found, for the metadata and the summary. */
export interface IterationChoice {
  readonly iterations: number;
  /** 'given' (the sheet's number) or 'probe' (auto from a probe of the view, methods B9). */
  readonly rule: 'given' | 'probe';
  /** The probe's record (deterministic: the same sheet gives the same record). */
  readonly probe?: {
    readonly rule: string;
    readonly grid: string;
    readonly stop: 'stable' | 'ceiling';
    readonly ceiling: number;
    readonly levels: ProbeLevel[];
  };
  readonly probeSeconds: number;
  /** The probe's reference orbit, continued by the plate's job (never serialised). */
  readonly builder?: ReferenceBuilder;
}

/**
 * The iteration limit of a sheet: its number when given; for `auto`, a probe
 * of the view (methods B9) with the depth rule (autoIterations) as its
 * ceiling: the deep kernel around the sheet's reference for a deep view
 * (plane/deep/probe-limit.ts, whose reference orbit the plate's job
 * continues), the double kernel for a double view.
 */
export function sheetIterations(sheet: Sheet, arith: SheetArithmetic): IterationChoice {
  if (sheet.iterations !== 'auto') return { iterations: sheet.iterations, rule: 'given', probeSeconds: 0 };
  const ceiling = autoIterations(sheet.view.span);
  const t0 = performance.now();
  let outcome: ProbeOutcome & { readonly width: number; readonly height: number };
  let builder: ReferenceBuilder | undefined;
  if (arith.arithmetic === 'deep') {
    const probe = probeDeepLimit(
      { re: sheet.view.re, im: sheet.view.im, span: sheet.view.span, rotation: sheet.view.rotation, width: sheet.width, height: sheet.height },
      arith.bits,
      arith.plan.unitExponent,
      DEFAULT_ESCAPE_RADIUS,
      sheet.skip,
      sheet.reference ?? undefined,
      ceiling,
    );
    outcome = probe;
    builder = probe.builder;
  } else {
    outcome = probeDoubleLimit(sheet, ceiling);
  }
  const r = PROBE_RULE;
  return {
    iterations: outcome.limit,
    rule: 'probe',
    probe: {
      rule: `limits ${r.start} x 2^k on a probe of the view at most ${r.side} pixels a side, until some probe pixel is decided and at most ${r.tolerance} of them are decided over one doubling; then ${r.margin} x that limit, at most the depth rule`,
      grid: `${outcome.width}x${outcome.height}`,
      stop: outcome.stop,
      ceiling,
      levels: outcome.levels,
    },
    probeSeconds: (performance.now() - t0) / 1000,
    ...(builder === undefined ? {} : { builder }),
  };
}

/**
 * The probe of a double view: pixel centres of the probe grid (the view at
 * most PROBE_RULE.side pixels a side) sampled by the JS escape loop with the
 * plate's escape radius and periodicity tolerance (tied to the plate's own
 * spacing, as the plate's tiles use it).
 */
function probeDoubleLimit(sheet: Sheet, ceiling: number): ProbeOutcome & { readonly width: number; readonly height: number } {
  const size = probeSize(sheet.width, sheet.height, PROBE_RULE.side);
  const view = { centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, rotation: sheet.view.rotation };
  const grid = doubleGrid({ ...view, width: size.width, height: size.height });
  const plateSpacing = doubleGrid({ ...view, width: sheet.width, height: sheet.height }).spacing;
  const count = size.width * size.height;
  const xs = new Float64Array(count);
  const ys = new Float64Array(count);
  for (let j = 0; j < size.height; j++) {
    for (let i = 0; i < size.width; i++) {
      xs[j * size.width + i] = i + 0.5;
      ys[j * size.width + i] = j + 0.5;
    }
  }
  const cr = new Float64Array(count);
  const ci = new Float64Array(count);
  pixelsToC(grid, xs, ys, count, cr, ci);
  const out = createSampleSet(count);
  const tolerance = periodTolerance(plateSpacing);
  const outcome = raiseLimit(count, ceiling, (limit) => {
    sampleParameters(cr, ci, count, { maxIterations: limit, escapeRadius: DEFAULT_ESCAPE_RADIUS, periodTolerance: tolerance }, out);
    let undecided = 0;
    for (let k = 0; k < count; k++) if (out.period[k] === PERIOD_UNDECIDED) undecided += 1;
    return undecided;
  });
  return { ...outcome, ...size };
}

/** What differs between a plate's job and a pyramid level's. */
export interface JobExtras {
  readonly depth: 8 | 16;
  readonly withData: boolean;
  readonly legendBounds?: PixelRect;
  readonly labels?: Legend[];
}

/** A plate job over `grid` and the seconds spent on the deep reference orbit and table (0 for doubles). */
export interface PreparedJob {
  readonly job: PlateJob;
  readonly referenceSeconds: number;
  readonly tableSeconds: number;
  /** Deep arithmetic: what the reference orbit and the table hold. */
  readonly memory?: DeepMemory;
}

export function sheetJob(sheet: Sheet, grid: DoubleGrid, iterations: number, arith: SheetArithmetic, extras: JobExtras, builder?: ReferenceBuilder): PreparedJob {
  let job: PlateJob = {
    ...(extras.legendBounds === undefined ? {} : { legendBounds: extras.legendBounds }),
    grid,
    iterations,
    escapeRadius: DEFAULT_ESCAPE_RADIUS,
    periodTolerance: periodTolerance(grid.spacing),
    samples: sheet.samples,
    depth: extras.depth,
    colour: sheet.colour,
    dpi: sheet.dpi,
    withData: extras.withData,
    ...(extras.labels === undefined ? {} : { labels: extras.labels }),
  };
  if (arith.arithmetic !== 'deep') return { job, referenceSeconds: 0, tableSeconds: 0 };
  // The grid's own pixel geometry (a pyramid level's may be fractional), the sheet's reference and precision.
  const prepared = prepareDeepJob(
    { re: sheet.view.re, im: sheet.view.im, span: sheet.view.span, rotation: sheet.view.rotation, width: grid.width, height: grid.height },
    arith.bits,
    arith.plan.unitExponent,
    iterations,
    DEFAULT_ESCAPE_RADIUS,
    sheet.skip,
    sheet.reference ?? undefined,
    builder,
  );
  job = { ...job, deep: prepared.job };
  return { job, referenceSeconds: prepared.referenceSeconds, tableSeconds: prepared.tableSeconds, memory: prepared.memory };
}
