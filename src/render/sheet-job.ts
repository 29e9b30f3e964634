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
import { PROBE_RULE, probeDeepLimit, type ProbeLevel } from '../plane/deep/probe-limit.js';
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
  /** 'given' (the sheet's number), 'depth' (auto from the span) or 'probe' (auto from a probe of the view, methods B9). */
  readonly rule: 'given' | 'depth' | 'probe';
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
 * The iteration limit of a sheet: its number when given; for `auto`, a deep
 * view probes itself (plane/deep/probe-limit.ts) under the depth rule as a
 * ceiling, a double view keeps the depth rule (autoIterations).
 */
export function sheetIterations(sheet: Sheet, arith: SheetArithmetic): IterationChoice {
  if (sheet.iterations !== 'auto') return { iterations: sheet.iterations, rule: 'given', probeSeconds: 0 };
  const ceiling = autoIterations(sheet.view.span);
  if (arith.arithmetic !== 'deep') return { iterations: ceiling, rule: 'depth', probeSeconds: 0 };
  const t0 = performance.now();
  const probe = probeDeepLimit(
    { re: sheet.view.re, im: sheet.view.im, span: sheet.view.span, rotation: sheet.view.rotation, width: sheet.width, height: sheet.height },
    arith.bits,
    arith.plan.unitExponent,
    DEFAULT_ESCAPE_RADIUS,
    sheet.skip,
    sheet.reference ?? undefined,
    ceiling,
  );
  const r = PROBE_RULE;
  return {
    iterations: probe.limit,
    rule: 'probe',
    probe: {
      rule: `limits ${r.start} x 2^k on a ${r.side}-pixel probe of the view until at most ${r.tolerance} of its pixels are decided over one doubling (and some are decided); then ${r.margin} x that limit, at most the depth rule`,
      grid: `${probe.width}x${probe.height}`,
      stop: probe.stop,
      ceiling,
      levels: probe.levels,
    },
    probeSeconds: (performance.now() - t0) / 1000,
    builder: probe.builder,
  };
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
