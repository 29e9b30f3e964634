/**
 * Renders a Julia sheet whose output is a figure (.pdf or .svg, or .png /
 * .tif with figure fields): the annotations are computed in z first (the
 * equipotentials of G_c, figure/julia-equipotentials.ts; the dynamic rays,
 * the critical orbit, the cycle and the fixed points, julia-marks.ts; the
 * sheet's labelled points), the Julia plate is rendered without its raster
 * marks into a temporary PNG (render-julia.ts), and the figure model, with
 * axes titled Re z and Im z, is laid out around it and written by
 * figure-output.ts, the sheet in its metadata so `--again` draws it again.
 */
import { rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import { releaseTemp, tempPathFor } from '../io/temp-path.js';
import { writeFileAtomic } from '../io/write-file-atomic.js';
import { figureFont } from '../figure/figure-font.js';
import { figureModel, type FigureCurve, type FigurePoint } from '../figure/figure-model.js';
import { layoutFigure } from '../figure/layout-figure.js';
import { equipotentialsInView } from '../figure/equipotentials.js';
import { juliaLevelMap, juliaPotentialAt } from '../figure/julia-equipotentials.js';
import type { JuliaSheet } from '../view/julia-sheet.js';
import { doubleGrid, fitsDouble, type View } from '../view/view.js';
import { UserError } from '../check/user-error.js';
import { refuseDirectory, type PlateSummary, type RenderSheetOptions } from './render-sheet.js';
import { juliaMetadata, renderJuliaSheet, sheetCycle } from './render-julia.js';
import { JULIA_MARK_COLOURS, juliaMarkPoints } from './julia-marks.js';
import { besidePlateName, figureFormat, pinPixels, toPlatePixels, writeFigureOutput, type FigureSummary } from './figure-output.js';

/** Radii (points) of the vector marks: fixed points, orbit points, cycle rings. */
const FIXED_POINT_PT = 2;
const ORBIT_POINT_PT = 1.1;
const CYCLE_RING_PT = 3;

export interface JuliaFigureSummary extends PlateSummary {
  readonly figure: FigureSummary;
  readonly equipotentials: Array<{ potential: number }>;
  readonly marks: Array<{ re: string; im: string; label: string; inView: boolean; labelled: boolean }>;
}

export async function renderJuliaFigure(sheet: JuliaSheet, options: RenderSheetOptions = {}): Promise<JuliaFigureSummary> {
  const spec = sheet.figure;
  if (spec === null) throw new Error('renderJuliaFigure: the sheet has no figure');
  const file = sheet.output.file;
  const format = figureFormat(file);
  for (const f of [file, besidePlateName(file), ...(sheet.output.sidecar ? [`${file}.json`] : [])]) await refuseDirectory(f, 'output.file');
  const view: View = { centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, width: sheet.width, height: sheet.height, rotation: sheet.view.rotation };
  const grid = doubleGrid(view);
  const cRe = Number(sheet.c.re);
  const cIm = Number(sheet.c.im);

  // Curves first: a level Newton cannot follow is refused before the plate is rendered.
  let levels: number[] = [];
  const curves: FigureCurve[] = [];
  if (spec.equipotentials > 0) {
    if (!fitsDouble(grid)) throw new UserError('figure.equipotentials', 'a view that doubles resolve (equipotentials are followed in double precision)', `span ${sheet.view.span}`);
    // Below the critical point's potential a level of a disconnected Julia set is no longer one curve; near it the curve
    // pinches at z = 0, where Newton loses its way: levels are kept above twice that potential.
    const critical = juliaPotentialAt(0, 0, cRe, cIm, 100_000);
    const traced = equipotentialsInView(spec.equipotentials, grid, 'figure.equipotentials', {
      map: juliaLevelMap(cRe, cIm),
      potential: (re, im, limit) => juliaPotentialAt(re, im, cRe, cIm, limit),
      ...(critical > 0 ? { floor: { level: 2 * critical, why: `c is outside the set: levels must lie above 2 G_c(0) = ${2 * critical}, where the curve is one loop` } } : {}),
    });
    levels = traced.levels;
    for (const points of traced.curves) curves.push({ kind: 'equipotential', label: '', points: toPlatePixels(grid, points) });
  }
  const at = juliaMarkPoints(sheet.marks, cRe, cIm, sheetCycle(sheet));
  for (const ray of at.rays) curves.push({ kind: 'ray', label: ray.angle, points: toPlatePixels(grid, ray.points) });
  if (at.orbit !== null && at.orbit.length >= 4) curves.push({ kind: 'orbit', label: '', points: toPlatePixels(grid, at.orbit) });
  // The sheet's labelled points first (their labels are placed before all others), then the fixed points, the cycle, the orbit.
  const points: FigurePoint[] = spec.marks.map((m) => ({ label: m.label, ...pinPixels(view, m.re, m.im) }));
  const pixel = (re: number, im: number): { x: number; y: number } => {
    const p = toPlatePixels(grid, [re, im]);
    return { x: p[0]!, y: p[1]! };
  };
  if (at.fixedPoints !== null) {
    points.push({ label: '\u03b1', ...pixel(...at.fixedPoints.alpha), shape: 'disc', fill: JULIA_MARK_COLOURS.alpha, radius: FIXED_POINT_PT });
    points.push({ label: '\u03b2', ...pixel(...at.fixedPoints.beta), shape: 'disc', fill: JULIA_MARK_COLOURS.beta, radius: FIXED_POINT_PT });
  }
  if (at.cycle !== null) for (let j = 0; j + 1 < at.cycle.length; j += 2) points.push({ label: '', ...pixel(at.cycle[j]!, at.cycle[j + 1]!), radius: CYCLE_RING_PT });
  if (at.orbit !== null) {
    for (let j = 0; j + 1 < at.orbit.length; j += 2)
      points.push({ label: '', ...pixel(at.orbit[j]!, at.orbit[j + 1]!), shape: 'disc', fill: JULIA_MARK_COLOURS.orbit, radius: ORBIT_POINT_PT });
  }

  const rasterFile = tempPathFor(besidePlateName(file));
  // The marks are vector annotations here, not strokes in the plate's pixels; a legend beside is not drawn on Julia figures.
  const raster: JuliaSheet = {
    ...sheet,
    depth: format === 'pdf' ? 16 : sheet.depth,
    colour: sheet.colour.legend === 'beside' ? { ...sheet.colour, legend: 'none' } : sheet.colour,
    output: { file: rasterFile, data: sheet.output.data, sidecar: false },
    figure: null,
    marks: { orbit: 0, cycle: false, fixedPoints: false, rays: [] },
  };
  try {
    const summary = await renderJuliaSheet(raster, { ...options, label: options.label ?? path.basename(file), workers: options.workers ?? os.availableParallelism() });
    const model = figureModel(view, sheet.dpi, { axes: spec.axes, caption: spec.caption, scaleBar: spec.scaleBar, variable: 'z' }, curves, [], points);
    const font = figureFont();
    const scene = layoutFigure(model, sheet.dpi, font);
    const metadata = juliaMetadata(sheet, summary.iterations, summary.arithmetic, Number(summary.precision['referenceBits'] ?? 53));
    const figure = await writeFigureOutput({ file, rasterFile, model, scene, font, dpi: sheet.dpi, depth: sheet.depth, title: sheet.title, metadata });
    releaseTemp(rasterFile);
    const files = [path.resolve(file), ...(figure.image === null ? [] : [figure.image]), ...summary.files.filter((f) => f !== summary.file)];
    const julia = { ...(summary.julia ?? {}), marks: at.record };
    const result: JuliaFigureSummary = {
      ...summary,
      file: path.resolve(file),
      files,
      julia,
      figure,
      equipotentials: levels.map((g) => ({ potential: g })),
      marks: spec.marks.map((m, i) => {
        const drawn = scene.drawnPoints.find((d) => d.index === i);
        return { re: m.re, im: m.im, label: m.label, inView: drawn !== undefined, labelled: drawn?.labelled ?? false };
      }),
    };
    if (sheet.output.sidecar) {
      const sidecar = `${file}.json`;
      await writeFileAtomic(sidecar, `${JSON.stringify({ metadata: JSON.parse(metadata) as unknown, summary: result }, null, 2)}\n`);
      files.push(path.resolve(sidecar));
    }
    return result;
  } catch (err) {
    await rm(rasterFile, { force: true });
    releaseTemp(rasterFile);
    throw err;
  }
}
