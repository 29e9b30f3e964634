/**
 * What fixes every byte of a pyramid, and the plate job of each level.
 *
 * A pyramid's spec is the sheet's render record (renderRecord: view, pixels,
 * iterations, samples, colouring) plus the tile size, format and JPEG
 * quality. It is written once into the output folder as pyramid.json, so a
 * resumed run, a shard, `--finish` and a queue worker on another machine all
 * work from the same record.
 *
 * Each level is rendered at its own scale (not downsampled from the level
 * below): level s is the base view with pixels s times as wide, i.e. the
 * same centre and span over a grid of W / s x H / s pixels, sampled with the
 * same adaptive supersampling as a plate. So every tile of every level is a
 * pure function of the spec and its coordinates (no tile waits for another,
 * memory does not grow with the base size, shards need no order), and every
 * level is a properly filtered image of the view, not a filtered image of a
 * filtered image. The alternative, averaging 2 x 2 base pixels in linear
 * light, costs no kernel time for the coarse levels (they are a third of the
 * base's pixels) but makes each coarse tile wait for four finished finer
 * tiles and read them back; see docs/pyramids.md for the measured difference.
 */
import { parseSheet, type Sheet } from '../view/sheet.js';
import type { PyramidSpec } from '../view/pyramid-spec.js';
import { doubleGrid, type DoubleGrid } from '../view/view.js';
import type { PlateJob } from './plate-job.js';
import { sheetArithmetic, sheetIterations, sheetJob, type IterationChoice, type SheetArithmetic } from './sheet-job.js';
import { planPyramid, type PyramidPlan } from '../view/pyramid-plan.js';

/** Everything a renderer needs, derived once from a spec. */
export interface PyramidSetup {
  readonly spec: PyramidSpec;
  readonly sheet: Sheet;
  readonly plan: PyramidPlan;
  readonly baseGrid: DoubleGrid;
  /** Arithmetic for every level, decided at the base (the finest level); deep levels share its precision. */
  readonly arithmetic: SheetArithmetic;
  /**
   * The iteration limit of every level, found once from the base sheet (for
   * `auto` of a deep view by the probe of the base view, methods B9), so
   * that every process working on the spec agrees; computed on first use.
   */
  readonly iterations: () => IterationChoice;
}

export function pyramidSetup(spec: PyramidSpec): PyramidSetup {
  const sheet = parseSheet(spec.sheet, 'pyramid');
  const view = { centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, width: sheet.width, height: sheet.height, rotation: sheet.view.rotation };
  const arithmetic = sheetArithmetic(sheet);
  let choice: IterationChoice | undefined;
  const iterations = (): IterationChoice => (choice ??= sheetIterations(sheet, arithmetic));
  return { spec, sheet, plan: planPyramid(sheet.width, sheet.height, spec.tileSize), baseGrid: doubleGrid(view), arithmetic, iterations };
}

/**
 * The plate job of the level with scale factor `scale`: the base grid with
 * spacing s times larger and a width and height of W / s and H / s (not
 * rounded: pixel (i, j) of the level is centred on base coordinate
 * (s (i + 1/2), s (j + 1/2)), and the last column or row may reach past the
 * base image's edge, as IIIF's region arithmetic implies).
 */
export function levelJob(setup: PyramidSetup, scale: number): PlateJob {
  const { sheet, baseGrid } = setup;
  const grid: DoubleGrid = { ...baseGrid, spacing: baseGrid.spacing * scale, width: baseGrid.width / scale, height: baseGrid.height / scale };
  // Deep levels: the same reference and precision as the base, the level's own pixel geometry.
  // The probe's reference orbit is continued once and shared by the levels (extending a complete orbit does nothing).
  const choice = setup.iterations();
  return sheetJob(sheet, grid, choice.iterations, setup.arithmetic, { depth: 8, withData: false }, choice.builder).job;
}
