import type { ColourSettings, LegendCorner } from './colour-settings.js';
import { hexToLinear } from './oklab.js';
import { fillCoverage } from './fill-coverage.js';
import { periodHex, periodLinear } from './period-palette.js';

/**
 * The period legend: one swatch per period present in the view with its
 * number, under a title line. The layout is a grid of cells, `scale` pixels
 * each, an integer chosen from the plate's dpi so the capitals (CAP cells
 * tall) stand about LEGEND_CAP_MM in print. The text is the figures' font
 * (DejaVu Sans, figure/figure-font.ts, handed in as a LegendFont by the
 * caller): its outlines are filled into the legend's pixels by area coverage
 * (fill-coverage.ts), so no rasteriser and no font of the machine is
 * involved, and the same sheet gives the same bytes everywhere.
 *
 * Coordinates are plate pixels, y down (design.md). The image is linear-light
 * RGBA, premultiplied by alpha, so compositing is one multiply-add per channel
 * in linear light (Porter & Duff, "Compositing digital images", SIGGRAPH 1984:
 * the "over" operator).
 */
export const LEGEND_CAP_MM = 2.5;
/**
 * k: a period is present in the view, and listed, when at least this many
 * pixels (their centre samples, as counted in a plate's `periods` histogram)
 * are interior with that period. Four pixels are the smallest spot that reads
 * as a patch of colour rather than a speck.
 */
export const LEGEND_MIN_PIXELS = 4;
export const LEGEND_TITLE = 'Interior period';

/** The text face of the legend: advances, outlines as polygons, cap height per unit of size (figure-font.ts's FigureFont is one). */
export interface LegendFont {
  width(text: string, size: number): number;
  contours(text: string, size: number, x: number, y: number, tolerance: number): number[][];
  /** The outline of `text` as SVG path data, baseline from (x, y), y down. */
  outline(text: string, size: number, x: number, y: number): string;
  readonly capHeight: number;
}

// Layout in cells (one cell = `scale` pixels).
const PAD = 4;
/** Cap height of the text in cells. */
const CAP = 7;
const SWATCH = 7;
const SWATCH_GAP = 2;
const COLUMN_GAP = 5;
const ROW_H = CAP + 4;
const TITLE_GAP = 5;
/** Outline curves are cut into chords within this many pixels of them. */
const FLATNESS = 0.05;

/** The font size (pixels) whose capitals are CAP cells tall at this scale. */
const fontSize = (font: LegendFont, scale: number): number => (CAP * scale) / font.capHeight;
/** Width in cells of `text` at this scale (rounded up). */
const textCells = (font: LegendFont, text: string, scale: number): number => Math.ceil(font.width(text, fontSize(font, scale)) / scale);
/** Width in cells of a number of `digits` digits (at least two, so short legends keep their look; DejaVu digits share one advance). */
const numberW = (font: LegendFont, digits: number, scale: number): number => textCells(font, '0'.repeat(Math.max(2, digits)), scale);

const PANEL_HEX = '#f3f0e8';
const PANEL_ALPHA = 0.9;
const INK_HEX = '#1c1c1c';
/** Plate margin around an inset legend, in mm (at most 5% of the plate side). */
const MARGIN_MM = 4;

/** A legend laid out on a plate: rectangle in plate pixels and its image. */
export interface Legend {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
  /** Pixels per font cell. */
  readonly scale: number;
  /** width * height * 4: linear-light R, G, B premultiplied by A, then A. */
  readonly rgba: Float64Array;
}

/** The integer scale that gives a cap height near LEGEND_CAP_MM at this dpi (>= 1). */
export function legendScale(dpi: number): number {
  const capPixels = (LEGEND_CAP_MM / 25.4) * dpi;
  return Math.max(1, Math.round(capPixels / CAP));
}

/** Columns and rows of swatches for n periods: at least 4 columns (title width), at most 8 rows per column. */
function grid(n: number): { cols: number; rows: number } {
  const cols = Math.min(n, Math.max(4, Math.ceil(n / 8)));
  return { cols, rows: Math.ceil(n / cols) };
}

/**
 * The periods a legend lists, from a plate's histogram (period -> interior
 * pixels): those with at least LEGEND_MIN_PIXELS pixels; when more than
 * settings.legendPeriods qualify, the legendPeriods with the most pixels (ties
 * to the lower period). Returned in increasing order of period.
 */
export function presentPeriods(histogram: Readonly<Record<number, number>>, settings: Pick<ColourSettings, 'legendPeriods'>): number[] {
  const present = Object.entries(histogram)
    .map(([p, n]) => [Number(p), n] as const)
    .filter(([p, n]) => p > 0 && n >= LEGEND_MIN_PIXELS);
  present.sort((a, b) => b[1] - a[1] || a[0] - b[0]);
  return present
    .slice(0, settings.legendPeriods)
    .map(([p]) => p)
    .sort((a, b) => a - b);
}

/** Periods 1..n, for a legend drawn without a histogram (the pyramid viewer page). */
export function firstPeriods(n: number): number[] {
  return Array.from({ length: n }, (_, i) => i + 1);
}

/** Legend size in cells for n periods whose numbers take `numberCells` cells, under a title of `titleCells`. */
function sizeCells(n: number, numberCells: number, titleCells: number): { w: number; h: number } {
  const { cols, rows } = grid(n);
  const entries = cols * (SWATCH + SWATCH_GAP + numberCells) + (cols - 1) * COLUMN_GAP;
  return {
    w: 2 * PAD + Math.max(titleCells, entries),
    h: 2 * PAD + CAP + TITLE_GAP + rows * ROW_H - (ROW_H - CAP),
  };
}

function corner(c: LegendCorner, pw: number, ph: number, w: number, h: number, margin: number): { x: number; y: number } {
  const left = c === 'top-left' || c === 'bottom-left';
  const top = c === 'top-left' || c === 'top-right';
  return {
    x: Math.max(0, left ? margin : pw - margin - w),
    y: Math.max(0, top ? margin : ph - margin - h),
  };
}

function marginPixels(plateWidth: number, plateHeight: number, dpi: number): number {
  return Math.min(Math.round((MARGIN_MM / 25.4) * dpi), Math.floor(0.05 * Math.min(plateWidth, plateHeight)));
}

/** A rectangle in plate pixels. */
export interface PixelRect {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

/**
 * The rectangle an inset legend can cover before the periods present are
 * known: the corner-anchored box that holds the largest layout of 1 ..
 * legendPeriods entries with numbers of up to `maxDigits` digits at any
 * scale from legendScale(dpi) down to 1 (layoutLegend only ever steps the
 * scale down, and anchors the legend at the same corner and margin; text
 * widths round up to whole cells, so a smaller scale is checked too). Null
 * unless the legend is inset.
 */
export function legendBounds(settings: ColourSettings, plateWidth: number, plateHeight: number, dpi: number, maxDigits: number, font: LegendFont): PixelRect | null {
  if (settings.legend !== 'inset') return null;
  const margin = marginPixels(plateWidth, plateHeight, dpi);
  let w = 0;
  let h = 0;
  for (let scale = legendScale(dpi); scale >= 1; scale--) {
    const title = textCells(font, LEGEND_TITLE, scale);
    // wider numbers only widen the entries
    const numbers = numberW(font, maxDigits, scale);
    for (let n = 1; n <= settings.legendPeriods; n++) {
      {
        const c = sizeCells(n, numbers, title);
        w = Math.max(w, c.w * scale);
        h = Math.max(h, c.h * scale);
      }
    }
  }
  const width = Math.min(plateWidth, w + margin);
  const height = Math.min(plateHeight, h + margin);
  const left = settings.legendCorner === 'top-left' || settings.legendCorner === 'bottom-left';
  const top = settings.legendCorner === 'top-left' || settings.legendCorner === 'top-right';
  return { x: left ? 0 : plateWidth - width, y: top ? 0 : plateHeight - height, width, height };
}

/**
 * Where layoutLegend puts the legend and at what scale, without drawing it:
 * the rectangle in plate pixels and the pixels per cell; null when there is
 * no inset legend.
 */
export function legendPlacement(
  settings: ColourSettings,
  plateWidth: number,
  plateHeight: number,
  dpi: number,
  periods: readonly number[],
  font: LegendFont,
): (PixelRect & { readonly scale: number }) | null {
  if (settings.legend !== 'inset' || periods.length === 0) return null;
  const n = periods.length;
  const digits = Math.max(...periods.map((p) => String(p).length));
  const margin = marginPixels(plateWidth, plateHeight, dpi);
  let scale = legendScale(dpi);
  const cellsAt = (k: number): { w: number; h: number } => sizeCells(n, numberW(font, digits, k), textCells(font, LEGEND_TITLE, k));
  let cells = cellsAt(scale);
  while (scale > 1 && (cells.w * scale + 2 * margin > plateWidth || cells.h * scale + 2 * margin > plateHeight)) {
    scale--;
    cells = cellsAt(scale);
  }
  const width = cells.w * scale;
  const height = cells.h * scale;
  const { x, y } = corner(settings.legendCorner, plateWidth, plateHeight, width, height, margin);
  return { x, y, width, height, scale };
}

/**
 * Lays out and draws the inset legend for a plate of plateWidth x plateHeight
 * pixels printed at `dpi`, listing `periods` (presentPeriods of the plate's
 * histogram). Returns null unless settings.legend is 'inset' and at least
 * one period is listed.
 * The scale starts from legendScale(dpi) and steps down until the legend
 * fits inside the plate with its margin; at scale 1 a legend larger than the
 * plate is placed at the corner and clipped by paintLegendRows.
 */
export function layoutLegend(settings: ColourSettings, plateWidth: number, plateHeight: number, dpi: number, periods: readonly number[], font: LegendFont): Legend | null {
  const at = legendPlacement(settings, plateWidth, plateHeight, dpi, periods, font);
  if (at === null) return null;
  const { x, y, width, height, scale } = at;
  const n = periods.length;
  const digits = Math.max(...periods.map((p) => String(p).length));
  const rgba = new Float64Array(width * height * 4);

  const panel = hexToLinear(PANEL_HEX, new Float64Array(3));
  const ink = hexToLinear(INK_HEX, new Float64Array(3));
  for (let k = 0; k < width * height; k++) {
    rgba[4 * k] = panel[0]! * PANEL_ALPHA;
    rgba[4 * k + 1] = panel[1]! * PANEL_ALPHA;
    rgba[4 * k + 2] = panel[2]! * PANEL_ALPHA;
    rgba[4 * k + 3] = PANEL_ALPHA;
  }
  /** Fills cell-aligned rectangle (cx, cy, cw, ch) in cells with an opaque colour. */
  const fill = (px: number, py: number, pw: number, ph: number, c: ArrayLike<number>): void => {
    for (let j = py; j < py + ph; j++)
      for (let i = px; i < px + pw; i++) {
        const k = 4 * (j * width + i);
        rgba[k] = c[0]!;
        rgba[k + 1] = c[1]!;
        rgba[k + 2] = c[2]!;
        rgba[k + 3] = 1;
      }
  };
  // text: every string's outline, its capitals' top at cell row cy, filled by coverage and laid over the panel
  const size = fontSize(font, scale);
  const polygons: number[][] = [];
  const text = (s: string, px: number, cy: number): void => void polygons.push(...font.contours(s, size, px, (cy + CAP) * scale, FLATNESS));
  text(LEGEND_TITLE, PAD * scale, PAD);
  const { rows } = grid(n);
  const nw = numberW(font, digits, scale);
  const ew = SWATCH + SWATCH_GAP + nw;
  const place = (e: number): { cx: number; cy: number } => ({ cx: PAD + Math.floor(e / rows) * (ew + COLUMN_GAP), cy: PAD + CAP + TITLE_GAP + (e % rows) * ROW_H });
  for (let e = 0; e < n; e++) {
    const { cx, cy } = place(e);
    const label = String(periods[e]!);
    // numbers right-aligned in their column
    text(label, (cx + ew) * scale - font.width(label, size), cy);
  }
  const cover = fillCoverage(polygons, width, height, new Float64Array(width * height));
  for (let k = 0; k < width * height; k++) {
    if (cover[k] === 0) continue;
    // Coverage blended in linear light makes dark text on a light panel look thin and grey; 1 - (1 - a)^2.2
    // gives the edge pixels the lightness a blend of sRGB values would (dark ink, light panel; sRGB's gamma ~2.2).
    const a = 1 - (1 - cover[k]!) ** 2.2;
    for (let ch = 0; ch < 3; ch++) rgba[4 * k + ch] = a * ink[ch]! + (1 - a) * rgba[4 * k + ch]!;
    rgba[4 * k + 3] = a + (1 - a) * rgba[4 * k + 3]!;
  }
  const colour = [0, 0, 0];
  for (let e = 0; e < n; e++) {
    const { cx, cy } = place(e);
    // A one-pixel ink frame keeps pale swatches visible against the panel.
    fill(cx * scale, cy * scale, SWATCH * scale, SWATCH * scale, ink);
    fill(cx * scale + 1, cy * scale + 1, SWATCH * scale - 2, SWATCH * scale - 2, periodLinear(periods[e]!, colour));
  }
  return { x, y, width, height, scale, rgba };
}

/**
 * Composites the legend ("over", premultiplied, linear light) onto plate rows
 * y0 .. y0 + rowCount - 1, held in linearRows as rowCount * width * 3 values
 * (width = plate width). Touches only pixels inside the legend's rectangle
 * (clipped to the plate), so painting band by band equals painting at once.
 */
export function paintLegendRows(legend: Legend, y0: number, rowCount: number, width: number, linearRows: Float64Array): void {
  paintLegendRect(legend, 0, y0, width, rowCount, linearRows);
}

function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/**
 * The legend as a standalone SVG file (for the 'beside' placement): a title,
 * then one row per listed period (presentPeriods of the plate's histogram)
 * with its swatch, number and sRGB hex colour. Text as the font's outlines,
 * each carrying its string in aria-label (no reader's fonts involved).
 * Deterministic text (fixed layout, no dates).
 */
export function legendSvg(periods: readonly number[], font: LegendFont): string {
  const n = periods.length;
  const rowH = 22;
  const top = 44;
  const width = 240;
  const height = top + Math.max(1, n) * rowH + 12;
  const text = (s: string, x: number, y: number, size: number, anchor: 'start' | 'end'): string =>
    `<path role="img" aria-label="${escapeXml(s)}" fill="${INK_HEX}" d="${font.outline(s, size, anchor === 'end' ? x - font.width(s, size) : x, y)}"/>`;
  const lines: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`,
    `  <rect x="0" y="0" width="${width}" height="${height}" fill="${PANEL_HEX}"/>`,
    `  ${text('Interior period', 12, 26, 15, 'start')}`,
  ];
  if (n === 0) lines.push(`  ${text('no interior period in view', 12, top + 13, 13, 'start')}`);
  for (let e = 0; e < n; e++) {
    const p = periods[e]!;
    const y = top + e * rowH;
    const hex = periodHex(p);
    lines.push(
      `  <g id="period-${p}">`,
      `    <rect x="12" y="${y}" width="16" height="16" fill="${hex}" stroke="${INK_HEX}" stroke-width="1"/>`,
      `    ${text(String(p), 58, y + 13, 13, 'end')}`,
      `    ${text(hex, 72, y + 13, 13, 'start')}`,
      '  </g>',
    );
  }
  lines.push('</svg>', '');
  return lines.join('\n');
}

/**
 * Composites the legend onto a rectangle of the plate: pixels x0 .. x0 + w - 1
 * of rows y0 .. y0 + h - 1, held in `linear` as h * w * 3 values (a tile).
 * paintLegendRows is this with x0 = 0 and w = plate width, so a tile painted
 * here equals the same pixels painted band by band. Touches only pixels inside
 * the legend's rectangle.
 */
export function paintLegendRect(legend: Legend, x0: number, y0: number, w: number, h: number, linear: Float64Array): void {
  const ya = Math.max(y0, legend.y);
  const yb = Math.min(y0 + h, legend.y + legend.height);
  const xa = Math.max(x0, legend.x);
  const xb = Math.min(x0 + w, legend.x + legend.width);
  const src = legend.rgba;
  for (let y = ya; y < yb; y++) {
    for (let x = xa; x < xb; x++) {
      const s = 4 * ((y - legend.y) * legend.width + (x - legend.x));
      const d = 3 * ((y - y0) * w + (x - x0));
      const keep = 1 - src[s + 3]!;
      linear[d] = src[s]! + keep * linear[d]!;
      linear[d + 1] = src[s + 1]! + keep * linear[d + 1]!;
      linear[d + 2] = src[s + 2]! + keep * linear[d + 2]!;
    }
  }
}
