/**
 * Renders a sheet whose output is a figure: a .pdf or .svg, or a .png or
 * .tif with annotations. The plate is rendered as a PNG under a temporary
 * name (16 bits a channel for PDF, the sheet's depth otherwise), then the
 * figure model (src/figure/) is laid out around it and written: PDF by
 * pdfkit, SVG with the PNG inlined as a data URL up to SVG_INLINE_LIMIT
 * bytes (`NAME-plate.png` beside it above that), PNG and TIFF as the page
 * rasterised at the plate's dpi with the plate copied in pixel for pixel
 * (figure/write-figure-raster.ts) and written by the io/ sinks with the
 * sheet in their metadata.
 */
import { readFile, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import { svgWithMetadata } from '../io/embed-metadata.js';
import { releaseTemp, tempPathFor } from '../io/temp-path.js';
import { writeFileAtomic } from '../io/write-file-atomic.js';
import { figureFont } from '../figure/figure-font.js';
import { figureModel } from '../figure/figure-model.js';
import { layoutFigure } from '../figure/layout-figure.js';
import { figurePdf } from '../figure/write-figure-pdf.js';
import { figureSvg } from '../figure/write-figure-svg.js';
import type { Sheet } from '../view/sheet.js';
import { doubleGrid, fitsDouble, type DoubleGrid, type View } from '../view/view.js';
import type { FigureCurve } from '../figure/figure-model.js';
import { parameterRay, type ParameterRay } from '../figure/parameter-rays.js';
import { outlinesInView, type ComponentOutline } from '../figure/component-outlines.js';
import os from 'node:os';
import { raysOfPeriod } from '../figure/rays-of-period.js';
import { equipotential, equipotentialLevel, largestPotential, MAX_CURVE_STEPS } from '../figure/equipotentials.js';
import { MAX_RAYS } from '../view/sheet.js';
import { periodMarks, type PeriodMark } from '../figure/period-marks.js';
import { plateMetadata, refuseDirectory, renderSheet, type PlateSummary, type RenderSheetOptions } from './render-sheet.js';
import { Received, UserError } from '../check/user-error.js';
import { toolVersion } from '../io/tool-version.js';
import { Decimal } from 'decimal.js';
import { internalRaysInView, type FigureInternalRay } from '../figure/internal-rays.js';
import { presentPeriods } from '../colour/legend.js';
import { MAX_RASTER_FIGURE_PIXELS, rasterFigure, rasterPlacement } from '../figure/write-figure-raster.js';
import { openPngSink } from '../io/png-sink.js';
import { openTiffSink } from '../io/tiff-sink.js';

/**
 * Largest PNG (bytes) an SVG figure carries inside itself as a data URL:
 * 4 MiB is 5.6 MB of base64. librsvg (used by sharp and many viewers)
 * refuses an attribute over 10 MB unless told to parse huge files; measured
 * with a 7.6 MB plate.
 */
export const SVG_INLINE_LIMIT = 4 * 1024 * 1024;

export interface FigureSummary {
  readonly format: 'pdf' | 'svg' | 'png' | 'tif';
  /** PNG and TIFF figures: the page's size in pixels and where the plate's top left pixel sits on it; else null. */
  readonly raster: { width: number; height: number; plateX: number; plateY: number } | null;
  /** The plate's rectangle on the page, in points from the top left. */
  readonly plate: { x: number; y: number; width: number; height: number };
  readonly page: { width: number; height: number };
  readonly axes: { re: { title: string; ticks: Array<{ value: string; label: string }> }; im: { title: string; ticks: Array<{ value: string; label: string }> } } | null;
  readonly scaleBar: { length: string; label: string; pixels: number } | null;
  /** The periods the legend beside the frame lists ([] without one). */
  readonly legend: number[];
  /** The PNG beside an SVG too large to inline, else null. */
  readonly image: string | null;
}

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

/** Plate pixel coordinates of c values (re, im, ...): the inverse of pixelToC (view.ts), for any rotation. */
function toPixels(grid: DoubleGrid, c: Float64Array): Float64Array {
  const pts = new Float64Array(c.length);
  for (let i = 0; i < c.length; i += 2) {
    const u = c[i]! - grid.centerRe;
    const v = c[i + 1]! - grid.centerIm;
    pts[i] = grid.width / 2 + (u * grid.cos + v * grid.sin) / grid.spacing;
    pts[i + 1] = grid.height / 2 - (-u * grid.sin + v * grid.cos) / grid.spacing;
  }
  return pts;
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
  const levels: number[] = [];
  const levelCurves: FigureCurve[] = [];
  if (spec.equipotentials > 0) {
    const g0 = largestPotential(grid, 100_000);
    if (!(g0 > 0)) throw new UserError('figure.equipotentials', 'a view with points outside the set', new Received(`no escaping point on the frame of the view`));
    for (let k = 0; k < spec.equipotentials; k += 1) {
      const g = g0 / 2 ** k;
      if (equipotentialLevel(g).steps > MAX_CURVE_STEPS) {
        throw new UserError(
          'figure.equipotentials',
          `at most ${k} levels in this view (level G_0 / 2^k takes about 2^(k+7) Newton steps; the limit is ${MAX_CURVE_STEPS})`,
          spec.equipotentials,
        );
      }
      const curve = equipotential(g, grid.spacing / 4);
      if (curve === null) throw new UserError('figure.equipotentials', 'levels whose curve Newton follows in double precision', new Received(`G = ${g}`));
      levels.push(g);
      levelCurves.push({ kind: 'equipotential', label: '', points: toPixels(grid, curve) });
    }
  }
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

/**
 * Plate pixel coordinates of a point given in decimal strings, from the
 * exact decimal offsets to the view's centre (so marks sit right at any
 * depth); the inverse of pixelToC (view.ts).
 */
function pinPixels(view: View, re: string, im: string): { x: number; y: number } {
  const D = Decimal.clone({ precision: Math.max(view.centerRe.length, view.centerIm.length, re.length, im.length, view.span.length) + 30 });
  const spacing = new D(view.span).div(view.width);
  const u = new D(re).minus(view.centerRe).div(spacing);
  const v = new D(im).minus(view.centerIm).div(spacing);
  const a = (view.rotation * Math.PI) / 180;
  const [cos, sin] = view.rotation === 0 ? [1, 0] : [Math.cos(a), Math.sin(a)];
  const un = u.toNumber();
  const vn = v.toNumber();
  return { x: view.width / 2 + (un * cos + vn * sin), y: view.height / 2 - (-un * sin + vn * cos) };
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
  const format: FigureSummary['format'] = pdf ? 'pdf' : /\.svg$/i.test(file) ? 'svg' : /\.tiff?$/i.test(file) ? 'tif' : 'png';
  const besideName = file.replace(/\.(pdf|svg|png|tiff?)$/i, '-plate.png');
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
    const png = await readFile(rasterFile);
    const legendPeriods = sheet.colour.legend === 'beside' ? presentPeriods(summary.periods, sheet.colour) : [];
    const model = figureModel(view, sheet.dpi, { axes: spec.axes, caption: spec.caption, scaleBar: spec.scaleBar, legendPeriods }, curves, marks, points);
    const font = figureFont();
    const scene = layoutFigure(model, sheet.dpi, font);
    const metadata = plateMetadata(sheet, { arithmetic: summary.arithmetic, bits: Number(summary.precision['referenceBits'] ?? 53), iterations: summary.iterations });
    let image: string | null = null;
    let page: { width: number; height: number; plateX: number; plateY: number } | null = null;
    if (pdf) {
      await writeFileAtomic(file, await figurePdf(scene, png, font, { title: sheet.title, creator: `quadatlas ${toolVersion()}`, metadata }));
      await rm(rasterFile, { force: true });
    } else if (format === 'png' || format === 'tif') {
      const place = rasterPlacement(scene, sheet.dpi, sheet.width, sheet.height);
      if (place.width * place.height > MAX_RASTER_FIGURE_PIXELS) {
        throw new UserError(
          'output.file',
          `a .pdf or .svg figure for a page over ${MAX_RASTER_FIGURE_PIXELS} pixels (annotations are rasterised in one piece)`,
          new Received(`${place.width}x${place.height} pixels`),
        );
      }
      const raster = await rasterFigure(scene, png, sheet.dpi, font);
      page = { width: raster.width, height: raster.height, plateX: raster.plateX, plateY: raster.plateY };
      const spec = { width: raster.width, height: raster.height, depth: sheet.depth, channels: 3 as const, dpi: sheet.dpi, metadata, software: `quadatlas ${toolVersion()}` };
      const sink = format === 'tif' ? await openTiffSink(file, spec) : await openPngSink(file, spec);
      try {
        const rowSamples = raster.width * 3;
        const band = Math.max(1, Math.floor(4_000_000 / rowSamples));
        for (let y = 0; y < raster.height; y += band) {
          const rows = Math.min(band, raster.height - y);
          await sink.writeRows(raster.pixels.subarray(y * rowSamples, (y + rows) * rowSamples), rows);
        }
        await sink.finish();
      } catch (err) {
        await sink.abort();
        throw err;
      }
      await rm(rasterFile, { force: true });
    } else {
      let href: string;
      if (png.length <= SVG_INLINE_LIMIT) {
        href = `data:image/png;base64,${png.toString('base64')}`;
        await rm(rasterFile, { force: true });
      } else {
        href = path.basename(besideName);
        image = path.resolve(besideName);
      }
      // the plate first: an SVG never points at a PNG that is not there
      if (image !== null) await rename(rasterFile, besideName);
      await writeFileAtomic(file, svgWithMetadata(figureSvg(scene, href, font, sheet.title), metadata));
    }
    releaseTemp(rasterFile);
    const round = (v: number): number => Math.round(v * 1000) / 1000;
    const figure: FigureSummary = {
      format,
      raster: page,
      plate: { x: round(scene.plate.x), y: round(scene.plate.y), width: round(scene.plate.width), height: round(scene.plate.height) },
      page: { width: round(scene.width), height: round(scene.height) },
      axes:
        model.axes === null
          ? null
          : {
              re: { title: model.axes.re.title, ticks: model.axes.re.ticks.map((t) => ({ value: t.value, label: t.label })) },
              im: { title: model.axes.im.title, ticks: model.axes.im.ticks.map((t) => ({ value: t.value, label: t.label })) },
            },
      scaleBar: model.scaleBar === null ? null : { length: model.scaleBar.length, label: model.scaleBar.label, pixels: round(model.scaleBar.pixels) },
      legend: model.legend.map((e) => e.period),
      image,
    };
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
