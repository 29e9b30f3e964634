/**
 * Writes a laid-out figure to its file, for plates of either plane: PDF by
 * pdfkit, SVG with the plate's PNG inlined as a data URL up to
 * SVG_INLINE_LIMIT bytes (`NAME-plate.png` beside it above that), PNG and
 * TIFF as the page rasterised at the plate's dpi with the plate copied in
 * pixel for pixel (figure/write-figure-raster.ts), written by the io/ sinks
 * with the sheet in their metadata. Also builds the summary's `figure`
 * record and the Julia and c-plane figures' shared pieces: the pixel
 * position of a decimal point and the pixel polyline of double points.
 */
import { readFile, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import { Decimal } from 'decimal.js';
import { svgWithMetadata } from '../io/embed-metadata.js';
import { writeFileAtomic } from '../io/write-file-atomic.js';
import { openPngSink } from '../io/png-sink.js';
import { openTiffSink } from '../io/tiff-sink.js';
import { toolVersion } from '../io/tool-version.js';
import type { FigureFont } from '../figure/figure-font.js';
import type { FigureModel } from '../figure/figure-model.js';
import type { FigureScene } from '../figure/figure-scene.js';
import { figurePdf } from '../figure/write-figure-pdf.js';
import { figureSvg } from '../figure/write-figure-svg.js';
import { MAX_RASTER_FIGURE_PIXELS, rasterFigure, rasterPlacement } from '../figure/write-figure-raster.js';
import { Received, UserError } from '../check/user-error.js';
import type { DoubleGrid, View } from '../view/view.js';

/**
 * Largest PNG (bytes) an SVG figure carries inside itself as a data URL:
 * 4 MiB is 5.6 MB of base64. librsvg (used by sharp and many viewers)
 * refuses an attribute over 10 MB unless told to parse huge files; measured
 * with a 7.6 MB plate.
 */
export const SVG_INLINE_LIMIT = 4 * 1024 * 1024;

export type FigureFormat = 'pdf' | 'svg' | 'png' | 'tif';

export interface FigureSummary {
  readonly format: FigureFormat;
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

/** The figure format an output name asks for. */
export function figureFormat(file: string): FigureFormat {
  return /\.pdf$/i.test(file) ? 'pdf' : /\.svg$/i.test(file) ? 'svg' : /\.tiff?$/i.test(file) ? 'tif' : 'png';
}

/** The name of the plate's PNG beside an SVG figure too large to inline it. */
export function besidePlateName(file: string): string {
  return file.replace(/\.(pdf|svg|png|tiff?)$/i, '-plate.png');
}

export interface FigureOutput {
  readonly file: string;
  /** The plate rendered as a PNG under a temporary name; removed (or renamed beside an SVG) here. */
  readonly rasterFile: string;
  readonly model: FigureModel;
  readonly scene: FigureScene;
  readonly font: FigureFont;
  readonly dpi: number;
  /** Bits a channel of a PNG or TIFF figure. */
  readonly depth: 8 | 16;
  readonly title: string;
  /** The metadata JSON (the sheet) every format carries. */
  readonly metadata: string;
}

/** Writes the figure in the format its name asks for; returns the summary's figure record. */
export async function writeFigureOutput(o: FigureOutput): Promise<FigureSummary> {
  const { file, rasterFile, scene, font, dpi } = o;
  const format = figureFormat(file);
  const besideName = besidePlateName(file);
  const png = await readFile(rasterFile);
  let image: string | null = null;
  let page: { width: number; height: number; plateX: number; plateY: number } | null = null;
  if (format === 'pdf') {
    await writeFileAtomic(file, await figurePdf(scene, png, font, { title: o.title, creator: `quadatlas ${toolVersion()}`, metadata: o.metadata }));
    await rm(rasterFile, { force: true });
  } else if (format === 'png' || format === 'tif') {
    const place = rasterPlacement(scene, dpi, o.model.view.width, o.model.view.height);
    if (place.width * place.height > MAX_RASTER_FIGURE_PIXELS) {
      throw new UserError(
        'output.file',
        `a .pdf or .svg figure for a page over ${MAX_RASTER_FIGURE_PIXELS} pixels (annotations are rasterised in one piece)`,
        new Received(`${place.width}x${place.height} pixels`),
      );
    }
    const raster = await rasterFigure(scene, png, dpi, font);
    page = { width: raster.width, height: raster.height, plateX: raster.plateX, plateY: raster.plateY };
    const spec = { width: raster.width, height: raster.height, depth: o.depth, channels: 3 as const, dpi, metadata: o.metadata, software: `quadatlas ${toolVersion()}` };
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
    await writeFileAtomic(file, svgWithMetadata(figureSvg(scene, href, font, o.title), o.metadata));
  }
  const round = (v: number): number => Math.round(v * 1000) / 1000;
  const { model } = o;
  return {
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
}

/** Plate pixel coordinates of points (re, im, ...) in doubles: the inverse of pixelToC (view.ts), for any rotation. */
export function toPlatePixels(grid: DoubleGrid, points: ArrayLike<number>): Float64Array {
  const pts = new Float64Array(points.length);
  for (let i = 0; i + 1 < points.length; i += 2) {
    const u = points[i]! - grid.centerRe;
    const v = points[i + 1]! - grid.centerIm;
    pts[i] = grid.width / 2 + (u * grid.cos + v * grid.sin) / grid.spacing;
    pts[i + 1] = grid.height / 2 - (-u * grid.sin + v * grid.cos) / grid.spacing;
  }
  return pts;
}

/**
 * Plate pixel coordinates of a point given in decimal strings, from the
 * exact decimal offsets to the view's centre (so marks sit right at any
 * depth); the inverse of pixelToC (view.ts).
 */
export function pinPixels(view: View, re: string, im: string): { x: number; y: number } {
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
