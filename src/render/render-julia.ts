/**
 * Renders a checked Julia sheet to its files through the plate pipeline
 * (writePlate: same sinks, sidecar and same-sheet-same-bytes rule): finds the
 * cycle once from the critical orbit, builds the trap and the marks, and
 * hands the job to the workers with its `julia` part set.
 */
import os from 'node:os';
import { findJuliaCycle, type JuliaCycle } from '../dynamic/julia-cycle.js';
import { fixedPoints } from '../dynamic/fixed-points.js';
import { juliaTrap } from '../dynamic/julia-trap.js';
import { DEFAULT_ESCAPE_RADIUS } from '../plane/sample-parameters.js';
import { juliaMarks } from './julia-marks.js';
import type { PlateJob } from './plate-job.js';
import { DEFAULT_TILE_SIZE } from './render-plate.js';
import { cardioidPoint, juliaRenderRecord, type JuliaSheet } from '../view/julia-sheet.js';
import { resolveIterations } from '../view/sheet.js';
import { doubleGrid, fitsDouble } from '../view/view.js';
import { log2Decimal } from '../plane/deep/plan.js';
import { computeJuliaReference } from '../precise/julia-reference-orbit.js';
import { referenceBits } from '../precise/reference-orbit.js';
import type { JuliaReferences } from '../dynamic/sample-julia-deep.js';
import { writePlate, type PlateSummary, type RenderSheetOptions } from './render-sheet.js';
import { UserError } from '../check/user-error.js';
import { toolVersion } from '../io/tool-version.js';

/** The metadata JSON stored in a Julia plate: tool, version and the sheet that fixes its pixels. */
export function juliaMetadata(sheet: JuliaSheet, iterations: number, arithmetic: 'double' | 'deep' = 'double', bits = 53): string {
  return JSON.stringify({ tool: 'quadatlas', version: toolVersion(), kind: 'julia', arithmetic, referenceBits: bits, iterations, sheet: juliaRenderRecord(sheet, toolVersion()) });
}

/** Deep spans below 2^-960 would need floatexp offsets. */
const MIN_DEEP_LOG2_SPAN = -960;

/** The two reference orbits of a deep Julia plate: the view centre's and the critical point's, at the view's precision. */
export function juliaReferences(sheet: JuliaSheet, bits: number, iterations: number): JuliaReferences {
  const centre = computeJuliaReference({ re: sheet.view.re, im: sheet.view.im }, sheet.c, bits, iterations, DEFAULT_ESCAPE_RADIUS);
  const critical = computeJuliaReference({ re: '0', im: '0' }, sheet.c, bits, iterations, DEFAULT_ESCAPE_RADIUS);
  return { centreRe: centre.re, centreIm: centre.im, criticalRe: critical.re, criticalIm: critical.im };
}

/** The cycle of a sheet's c: known exactly for a cardioid angle, else found from the critical orbit. */
export function sheetCycle(sheet: JuliaSheet): JuliaCycle {
  const cRe = Number(sheet.c.re),
    cIm = Number(sheet.c.im);
  if (sheet.cardioidAngle === 'golden') {
    const p = cardioidPoint(0, 0);
    return findJuliaCycle(cRe, cIm, { siegel: { wRe: p.mRe / 2, wIm: p.mIm / 2, name: 'golden mean (sqrt 5 - 1)/2' } });
  }
  if (sheet.cardioidAngle !== null) {
    const [s, q] = sheet.cardioidAngle.split('/').map(Number) as [number, number];
    const p = cardioidPoint(s, q);
    return findJuliaCycle(cRe, cIm, { parabolic: { wRe: p.mRe / 2, wIm: p.mIm / 2, s, q } });
  }
  return findJuliaCycle(cRe, cIm);
}

/** The cycle as reported in --json and the sidecar. */
export function cycleRecord(cycle: JuliaCycle): Record<string, unknown> {
  return {
    kind: cycle.kind,
    period: cycle.period,
    classes: cycle.basinPeriod,
    points: cycle.pointsRe.map((re, j) => ({ re, im: cycle.pointsIm[j]! })),
    multiplier: { re: cycle.multiplierRe, im: cycle.multiplierIm, abs: Math.hypot(cycle.multiplierRe, cycle.multiplierIm) },
    ...(cycle.rotation === null ? {} : { rotation: `${cycle.rotation.s}/${cycle.rotation.q}` }),
    ...(cycle.kind === 'attracting' ? { trapRadius: cycle.trapRadius } : {}),
    ...(cycle.petals === null ? {} : { petals: { count: cycle.basinPeriod, fatouRadius: cycle.petals.fatouRadius, leading: { re: cycle.petals.aRe, im: cycle.petals.aIm } } }),
    note: cycle.note,
  };
}

/** A Julia sheet's plate job, with what the summary records about it. */
export interface PreparedJuliaJob {
  readonly job: PlateJob;
  readonly arithmetic: 'double' | 'deep';
  readonly bits: number;
  readonly iterations: number;
  readonly referenceSeconds: number;
  readonly deep: JuliaReferences | undefined;
  /** The summary's `julia` record: c, the cycle, the fixed points, the marks. */
  readonly julia: Record<string, unknown>;
}

/** Builds the plate job of a checked Julia sheet (written once for `julia` and the survey page's inset). */
export function juliaSheetJob(sheet: JuliaSheet): PreparedJuliaJob {
  const view = { centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, width: sheet.width, height: sheet.height, rotation: sheet.view.rotation };
  const grid = doubleGrid(view);
  const iterations = resolveIterations(sheet);
  const arithmetic = sheet.arithmetic === 'auto' ? (fitsDouble(grid) ? 'double' : 'deep') : sheet.arithmetic;
  if (arithmetic === 'double' && !fitsDouble(grid)) {
    process.stderr.write('quadatlas: note: doubles cannot resolve this view; the plate is forced to double arithmetic and will be wrong\n');
  }
  if (arithmetic === 'deep' && !(log2Decimal(sheet.view.span, 'view.span') > MIN_DEEP_LOG2_SPAN)) {
    throw new UserError('view.span', 'a deep Julia span of at least 1e-290 (offsets are doubles; the floatexp path of the c-plane is not used here yet)', sheet.view.span);
  }
  const bits = arithmetic === 'deep' ? referenceBits(sheet.view.span, sheet.width) : 53;
  const deepStarted = process.hrtime.bigint();
  const deep = arithmetic === 'deep' ? juliaReferences(sheet, bits, iterations) : undefined;
  const referenceSeconds = Number(process.hrtime.bigint() - deepStarted) / 1e9;
  const cRe = Number(sheet.c.re),
    cIm = Number(sheet.c.im);
  const cycle = sheetCycle(sheet);
  const trap = juliaTrap(cycle, cRe, cIm, DEFAULT_ESCAPE_RADIUS);
  const marks = juliaMarks(sheet.marks, grid, sheet.dpi, cRe, cIm, cycle);
  const job: PlateJob = {
    grid,
    iterations,
    escapeRadius: DEFAULT_ESCAPE_RADIUS,
    periodTolerance: 0,
    samples: sheet.samples,
    depth: sheet.depth,
    colour: sheet.colour,
    dpi: sheet.dpi,
    withData: sheet.output.data !== null,
    labels: [],
    julia: { cRe, cIm, trap, basin: sheet.basin, strokes: marks.strokes, ...(deep === undefined ? {} : { deep }) },
  };
  const f = fixedPoints(cRe, cIm);
  const julia = {
    c: { ...sheet.c },
    ...(sheet.cardioidAngle === null ? {} : { cardioidAngle: sheet.cardioidAngle }),
    cycle: cycleRecord(cycle),
    fixedPoints: { alpha: { re: f.alphaRe, im: f.alphaIm }, beta: { re: f.betaRe, im: f.betaIm } },
    marks: marks.record,
  };
  return { job, arithmetic, bits, iterations, referenceSeconds, deep, julia };
}

export async function renderJuliaSheet(sheet: JuliaSheet, options: RenderSheetOptions = {}): Promise<PlateSummary> {
  const started = process.hrtime.bigint();
  const { job, arithmetic, bits, iterations, referenceSeconds, deep, julia } = juliaSheetJob(sheet);
  return writePlate(sheet, job, {
    started,
    workers: options.workers ?? os.availableParallelism(),
    tileSize: options.tileSize ?? DEFAULT_TILE_SIZE,
    metadata: juliaMetadata(sheet, iterations, arithmetic, bits),
    arithmetic,
    precision:
      arithmetic === 'deep'
        ? {
            referenceBits: bits,
            referenceSeconds: Math.round(referenceSeconds * 1000) / 1000,
            references: { centre: deep!.centreRe.length - 1, critical: deep!.criticalRe.length - 1 },
          }
        : { referenceBits: 53 },
    iterations,
    julia,
    ...(options.label === undefined ? {} : { label: options.label }),
  });
}
