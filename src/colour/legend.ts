import type { ColourSettings, LegendCorner } from './colour-settings.js';
import { hexToLinear } from './oklab.js';
import { FONT_CHARACTERS, GLYPH_H, GLYPH_W, glyph, textCells } from './bitmap-font.js';
import { periodHex, periodLinear } from './period-palette.js';

/**
 * The period legend: one swatch per period present in the view with its
 * number, under a title line, drawn with a small bitmap font of our own (5 x 7 cells
 * per glyph, one blank column between glyphs). The font is scaled by an
 * integer factor chosen from the plate's dpi so the cap height is about
 * LEGEND_CAP_MM in print; integer scaling keeps every stroke a whole number of
 * pixels, so the text is sharp without antialiasing.
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
export const LEGEND_TITLE = 'INTERIOR PERIOD';

/** Glyphs the font can draw. */
export const LEGEND_FONT_CHARACTERS = FONT_CHARACTERS;

// Layout in font cells (one cell = `scale` pixels).
const PAD = 4;
const SWATCH = 7;
const SWATCH_GAP = 2;
/** Width in cells of a number of `digits` digits (at least two, so short legends keep their old look). */
const numberW = (digits: number): number => Math.max(2, digits) * (GLYPH_W + 1) - 1;
const COLUMN_GAP = 5;
const ROW_H = GLYPH_H + 4;
const TITLE_GAP = 5;
const entryW = (digits: number): number => SWATCH + SWATCH_GAP + numberW(digits);

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
  return Math.max(1, Math.round(capPixels / GLYPH_H));
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

/** Legend size in cells for n periods whose longest number has `digits` digits. */
function sizeCells(n: number, digits: number): { w: number; h: number } {
  const { cols, rows } = grid(n);
  const entries = cols * entryW(digits) + (cols - 1) * COLUMN_GAP;
  return {
    w: 2 * PAD + Math.max(textCells(LEGEND_TITLE), entries),
    h: 2 * PAD + GLYPH_H + TITLE_GAP + rows * ROW_H - (ROW_H - GLYPH_H),
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
 * legendPeriods entries with numbers of up to `maxDigits` digits at the
 * unreduced scale (layoutLegend only ever steps the scale down, and anchors
 * the legend at the same corner and margin). Null unless the legend is inset.
 */
export function legendBounds(settings: ColourSettings, plateWidth: number, plateHeight: number, dpi: number, maxDigits: number): PixelRect | null {
  if (settings.legend !== 'inset') return null;
  const scale = legendScale(dpi);
  const margin = marginPixels(plateWidth, plateHeight, dpi);
  let w = 0;
  let h = 0;
  for (let n = 1; n <= settings.legendPeriods; n++) {
    const c = sizeCells(n, Math.max(2, maxDigits));
    w = Math.max(w, c.w * scale);
    h = Math.max(h, c.h * scale);
  }
  const width = Math.min(plateWidth, w + margin);
  const height = Math.min(plateHeight, h + margin);
  const left = settings.legendCorner === 'top-left' || settings.legendCorner === 'bottom-left';
  const top = settings.legendCorner === 'top-left' || settings.legendCorner === 'top-right';
  return { x: left ? 0 : plateWidth - width, y: top ? 0 : plateHeight - height, width, height };
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
export function layoutLegend(settings: ColourSettings, plateWidth: number, plateHeight: number, dpi: number, periods: readonly number[]): Legend | null {
  if (settings.legend !== 'inset' || periods.length === 0) return null;
  const n = periods.length;
  const digits = Math.max(...periods.map((p) => String(p).length));
  const cells = sizeCells(n, digits);
  const margin = marginPixels(plateWidth, plateHeight, dpi);
  let scale = legendScale(dpi);
  while (scale > 1 && (cells.w * scale + 2 * margin > plateWidth || cells.h * scale + 2 * margin > plateHeight)) scale--;
  const width = cells.w * scale;
  const height = cells.h * scale;
  const { x, y } = corner(settings.legendCorner, plateWidth, plateHeight, width, height, margin);
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
  const text = (s: string, cx: number, cy: number): void => {
    for (let g = 0; g < s.length; g++) {
      const rows = glyph(s[g]!);
      for (let r = 0; r < GLYPH_H; r++)
        for (let col = 0; col < GLYPH_W; col++) if (rows[r]![col] === '#') fill((cx + g * (GLYPH_W + 1) + col) * scale, (cy + r) * scale, scale, scale, ink);
    }
  };

  text(LEGEND_TITLE, PAD, PAD);
  const { rows } = grid(n);
  const colour = [0, 0, 0];
  const ew = entryW(digits);
  const nw = numberW(digits);
  for (let e = 0; e < n; e++) {
    const p = periods[e]!;
    const col = Math.floor(e / rows);
    const row = e % rows;
    const cx = PAD + col * (ew + COLUMN_GAP);
    const cy = PAD + GLYPH_H + TITLE_GAP + row * ROW_H;
    // A one-pixel ink frame keeps pale swatches visible against the panel.
    fill(cx * scale, cy * scale, SWATCH * scale, SWATCH * scale, ink);
    fill(cx * scale + 1, cy * scale + 1, SWATCH * scale - 2, SWATCH * scale - 2, periodLinear(p, colour));
    const label = String(p);
    text(label, cx + SWATCH + SWATCH_GAP + (nw - textCells(label)), cy);
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
 * with its swatch, number and sRGB hex colour. Deterministic text (fixed
 * layout, no dates).
 */
export function legendSvg(periods: readonly number[]): string {
  const n = periods.length;
  const rowH = 22;
  const top = 44;
  const width = 240;
  const height = top + Math.max(1, n) * rowH + 12;
  const lines: string[] = [
    '<?xml version="1.0" encoding="UTF-8"?>',
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}">`,
    `  <rect x="0" y="0" width="${width}" height="${height}" fill="${PANEL_HEX}"/>`,
    `  <text x="12" y="26" font-family="sans-serif" font-size="15" font-weight="bold" fill="${INK_HEX}">${escapeXml('Interior period')}</text>`,
  ];
  if (n === 0) lines.push(`  <text x="12" y="${top + 13}" font-family="sans-serif" font-size="13" fill="${INK_HEX}">no interior period in view</text>`);
  for (let e = 0; e < n; e++) {
    const p = periods[e]!;
    const y = top + e * rowH;
    const hex = periodHex(p);
    lines.push(
      `  <g id="period-${p}">`,
      `    <rect x="12" y="${y}" width="16" height="16" fill="${hex}" stroke="${INK_HEX}" stroke-width="1"/>`,
      `    <text x="58" y="${y + 13}" font-family="sans-serif" font-size="13" text-anchor="end" fill="${INK_HEX}">${p}</text>`,
      `    <text x="72" y="${y + 13}" font-family="monospace" font-size="13" fill="${INK_HEX}">${hex}</text>`,
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
