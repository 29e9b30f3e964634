/**
 * Renders a sheet whose output is a figure: a .pdf or .svg, or a .png or
 * .tif with annotations. The plate is rendered as a PNG under a temporary
 * name (16 bits a channel for PDF, the sheet's depth otherwise), then the
 * figure model (src/figure/) is laid out around it and written by
 * figure-output.ts (PDF, SVG, or the page rasterised for PNG and TIFF), with
 * the sheet in its metadata. Julia figures: render-julia-figure.ts.
 */
import { rm } from 'node:fs/promises';
import path from 'node:path';
import { releaseTemp, tempPathFor } from '../io/temp-path.js';
import { writeFileAtomic } from '../io/write-file-atomic.js';
import { figureFont } from '../figure/figure-font.js';
import { figureModel } from '../figure/figure-model.js';
import { layoutFigure } from '../figure/layout-figure.js';
import type { Sheet } from '../view/sheet.js';
import { doubleGrid, fitsDouble, type View } from '../view/view.js';
import type { FigureCurve } from '../figure/figure-model.js';
import { parameterRay, type ParameterRay } from '../figure/parameter-rays.js';
import { outlinesInView, type ComponentOutline } from '../figure/component-outlines.js';
import os from 'node:os';
import { raysOfPeriod } from '../figure/rays-of-period.js';
import { equipotentialsInView } from '../figure/equipotentials.js';
import { MAX_RAYS } from '../view/sheet.js';
import { periodMarks, type PeriodMark } from '../figure/period-marks.js';
import { plateMetadata, refuseDirectory, renderSheet, type PlateSummary, type RenderSheetOptions } from './render-sheet.js';
import { Received, UserError } from '../check/user-error.js';
import { internalRaysInView, type FigureInternalRay } from '../figure/internal-rays.js';
import { presentPeriods } from '../colour/legend.js';
import { besidePlateName, pinPixels, toPlatePixels as toPixels, writeFigureOutput, type FigureSummary } from './figure-output.js';

/** A ray drawn: landing from Newton (decimal strings), and how far (in pixels) the traced part ended from it. */
export interface RaySummary {
  angle: string;
  kind: string;
  preperiod: number;
  period: number;
  landing: { re: string; im: string };
  tracedEnd: { re: string; im: string };
  tracedEndPixels: number;
  tracedDepth: number;
  landsInView: boolean;
}

/** The rays and outlines of the sheet, computed in c, with their polylines in plate pixels. */
async function traceCurves(
  sheet: Sheet,
  view: View,
  workers: number,
): Promise<{ rays: ParameterRay[]; outlines: ComponentOutline[]; internal: FigureInternalRay[]; levels: number[]; curves: FigureCurve[] }> {
  const spec = sheet.figure!;
  if (spec.rays.length === 0 && spec.raysOf === 0 && spec.outlines === 0 && spec.equipotentials === 0 && spec.internalRays === null)
    return { rays: [], outlines: [], internal: [], levels: [], curves: [] };
  const grid = doubleGrid(view);
  const field =
    spec.rays.length > 0
      ? 'figure.rays'
      : spec.raysOf > 0
        ? 'figure.raysOf'
        : spec.outlines > 0
          ? 'figure.outlines'
          : spec.internalRays !== null
            ? 'figure.internalRays'
            : 'figure.equipotentials';
  if (!fitsDouble(grid))
    throw new UserError(
      field,
      `a view that doubles resolve (${field === 'figure.outlines' || field === 'figure.internalRays' ? 'components are followed' : field === 'figure.equipotentials' ? 'equipotentials are followed' : 'rays are traced'} in double precision)`,
      `span ${sheet.view.span}`,
    );
  const { levels, curves: levelPoints } = spec.equipotentials > 0 ? equipotentialsInView(spec.equipotentials, grid, 'figure.equipotentials') : { levels: [], curves: [] };
  const levelCurves: FigureCurve[] = levelPoints.map((points) => ({ kind: 'equipotential', label: '', points: toPixels(grid, points) }));
  const rays = spec.rays.map((a, i) => parameterRay(a, `figure.rays[${i}]`, grid.spacing));
  if (spec.raysOf > 0) {
    const given = new Set(spec.rays);
    for (const a of await raysOfPeriod(spec.raysOf, grid, workers, MAX_RAYS - spec.rays.length)) if (!given.has(a)) rays.push(parameterRay(a, 'figure.raysOf', grid.spacing));
  }
  const outlines = spec.outlines > 0 ? await outlinesInView(spec.outlines, grid, workers) : [];
  const internal = spec.internalRays === null ? [] : await internalRaysInView(spec.internalRays.period, spec.internalRays.angles, grid, workers);
  const curves: FigureCurve[] = [
    ...levelCurves,
    ...outlines.map((o) => ({ kind: 'outline', label: '', points: toPixels(grid, o.points) })),
    ...internal.map((r) => ({ kind: 'internal-ray', label: '', points: toPixels(grid, r.points) })),
    ...rays.map((r) => ({ kind: 'ray', label: r.angle, points: toPixels(grid, r.points) })),
  ];
  return { rays, outlines, internal, levels, curves };
}

export async function renderFigure(
  sheet: Sheet,
  options: RenderSheetOptions = {},
): Promise<
  PlateSummary & {
    figure: FigureSummary;
    rays: RaySummary[];
    outlines: Array<{ period: number; nucleus: { re: number; im: number }; points: number }>;
    labels: Array<{ period: number; c: { re: number; im: number } }>;
    equipotentials: Array<{ potential: number }>;
  }
> {
  const spec = sheet.figure;
  if (spec === null) throw new Error('renderFigure: the sheet has no figure');
  const file = sheet.output.file;
  const pdf = /\.pdf$/i.test(file);
  const besideName = besidePlateName(file);
  for (const f of [file, besideName, ...(sheet.output.sidecar ? [`${file}.json`] : [])]) await refuseDirectory(f, 'output.file');
  const rasterFile = tempPathFor(besideName);
  // Period labels are set in the figure font over the plate, not drawn into its pixels.
  // A legend beside is set in the figure font beside the frame, not written as a file of its own.
  const raster: Sheet = {
    ...sheet,
    depth: pdf ? 16 : sheet.depth,
    labels: 0,
    colour: sheet.colour.legend === 'beside' ? { ...sheet.colour, legend: 'none' } : sheet.colour,
    output: { file: rasterFile, data: sheet.output.data, sidecar: false },
    figure: null,
  };
  const view: View = { centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, width: sheet.width, height: sheet.height, rotation: sheet.view.rotation };
  // Rays first: an angle Newton cannot land is refused before the plate is rendered.
  const { rays, outlines, internal, levels, curves } = await traceCurves(sheet, view, options.workers ?? os.availableParallelism());
  const points = spec.marks.map((m) => ({ label: m.label, ...pinPixels(view, m.re, m.im) }));
  const rayCurves = curves.filter((c) => c.kind === 'ray');
  let marks: PeriodMark[] = [];
  if (sheet.labels > 0) {
    const grid = doubleGrid(view);
    if (!fitsDouble(grid)) throw new UserError('labels', '0 for a deep view (labels are placed from nuclei located in double precision)', sheet.labels);
    marks = await periodMarks(sheet.labels, grid, sheet.dpi, options.workers ?? os.availableParallelism());
  }
  try {
    const summary = await renderSheet(raster, { ...options, label: options.label ?? path.basename(file) });
    const legendPeriods = sheet.colour.legend === 'beside' ? presentPeriods(summary.periods, sheet.colour) : [];
    const model = figureModel(view, sheet.dpi, { axes: spec.axes, caption: spec.caption, scaleBar: spec.scaleBar, legendPeriods }, curves, marks, points);
    const font = figureFont();
    const scene = layoutFigure(model, sheet.dpi, font);
    const metadata = plateMetadata(sheet, { arithmetic: summary.arithmetic, bits: Number(summary.precision['referenceBits'] ?? 53), iterations: summary.iterations });
    const figure = await writeFigureOutput({ file, rasterFile, model, scene, font, dpi: sheet.dpi, depth: sheet.depth, title: sheet.title, metadata });
    const image = figure.image;
    releaseTemp(rasterFile);
    const raySummaries: RaySummary[] = rays.map((r, i) => {
      const pts = rayCurves[i]!.points;
      const n = pts.length;
      // the traced end is the second-to-last point, the landing the last
      const px = Math.hypot(pts[n - 4]! - pts[n - 2]!, pts[n - 3]! - pts[n - 1]!);
      const lx = pts[n - 2]!;
      const ly = pts[n - 1]!;
      return {
        angle: r.angle,
        kind: r.kind,
        preperiod: r.preperiod,
        period: r.period,
        landing: { re: r.landing.re, im: r.landing.im },
        tracedEnd: { re: String(r.tracedEnd.re), im: String(r.tracedEnd.im) },
        tracedEndPixels: Math.round(px * 1000) / 1000,
        tracedDepth: r.tracedDepth,
        landsInView: lx >= 0 && lx <= sheet.width && ly >= 0 && ly <= sheet.height,
      };
    });
    const files = [path.resolve(file), ...(image === null ? [] : [image]), ...summary.files.filter((f) => f !== summary.file)];
    const result = {
      ...summary,
      file: path.resolve(file),
      files,
      figure,
      rays: raySummaries,
      equipotentials: levels.map((g) => ({ potential: g })),
      labels: scene.drawnMarks.map((m) => ({ period: marks[m]!.period, c: { re: marks[m]!.re, im: marks[m]!.im } })),
      outlines: outlines.map((o) => ({ period: o.period, nucleus: o.nucleus, points: o.points.length / 2 })),
      internalRays: internal.map((r) => ({ period: r.period, nucleus: r.nucleus, angle: r.angle, end: { re: r.end.re, im: r.end.im }, points: r.points.length / 2 })),
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
