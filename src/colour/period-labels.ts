/**
 * Period labels for a plate: a dot on each chosen nucleus and its period
 * above it, in the legend's font (DejaVu Sans outlines filled by area
 * coverage, fill-coverage.ts) at the legend's print size, ink on a light
 * halo so the number reads on any colour. Each label is a small sprite
 * (the Legend shape: rectangle in plate pixels + premultiplied linear RGBA),
 * composited tile by tile with paintLegendRect, so labels never depend on
 * the tiling.
 */
import { fillCoverage } from './fill-coverage.js';
import { legendScale, type Legend, type LegendFont } from './legend.js';
import { hexToLinear } from './oklab.js';

/** A nucleus in plate pixel coordinates (continuous; pixel (i, j) spans [i, i+1) x [j, j+1)). */
export interface LabelPoint {
  readonly x: number;
  readonly y: number;
  readonly period: number;
}

const INK = '#1c1c1c';
const HALO = '#f3f0e8';
const HALO_ALPHA = 0.85;
/** Cap height of the number, dot size and gap between dot and number, in cells (`legendScale` pixels). */
const CAP = 7;
const DOT = 2;
const GAP = 1;

/** Height of a label in pixels at this dpi (number, gap, dot, halo). */
export function labelHeightPixels(dpi: number): number {
  return (CAP + GAP + DOT + 2) * legendScale(dpi);
}

function sprite(point: LabelPoint, scale: number, ink: ArrayLike<number>, halo: ArrayLike<number>, font: LegendFont): Legend {
  const text = String(point.period);
  const size = (CAP * scale) / font.capHeight;
  const tw = font.width(text, size);
  // one cell of halo on every side
  const m = scale;
  const width = Math.ceil(Math.max(tw, DOT * scale)) + 2 * m;
  const height = (CAP + GAP + DOT) * scale + 2 * m;
  const d = DOT * scale;
  const dotX = Math.floor((width - d) / 2);
  const dotY = m + (CAP + GAP) * scale;
  // The dot's centre sits on the nucleus.
  const x = Math.round(point.x - (dotX + d / 2));
  const y = Math.round(point.y - (dotY + d / 2));
  const cover = fillCoverage(font.contours(text, size, (width - tw) / 2, m + CAP * scale, 0.05), width, height, new Float64Array(width * height));
  for (let j = dotY; j < dotY + d; j++) for (let i = dotX; i < dotX + d; i++) cover[j * width + i] = 1;
  // halo: the ink's coverage spread by m pixels (a square neighbourhood), under the ink
  const spread = new Float64Array(width * height);
  for (let j = 0; j < height; j++)
    for (let i = 0; i < width; i++) {
      let v = 0;
      for (let jj = Math.max(0, j - m); jj <= Math.min(height - 1, j + m); jj++)
        for (let ii = Math.max(0, i - m); ii <= Math.min(width - 1, i + m); ii++) v = Math.max(v, cover[jj * width + ii]!);
      spread[j * width + i] = v;
    }
  const rgba = new Float64Array(width * height * 4);
  for (let k = 0; k < width * height; k++) {
    const h = HALO_ALPHA * spread[k]!;
    // ink alpha as the legend lays it (legend.ts: an sRGB-like edge in linear light)
    const a = 1 - (1 - cover[k]!) ** 2.2;
    for (let ch = 0; ch < 3; ch++) rgba[4 * k + ch] = a * ink[ch]! + (1 - a) * h * halo[ch]!;
    rgba[4 * k + 3] = a + (1 - a) * h;
  }
  return { x, y, width, height, scale, rgba };
}

/**
 * Lays out labels for the given points (in the order given, which sets
 * priority): a label that would overlap one already placed, or leave the
 * plate, is dropped.
 */
export function layoutPeriodLabels(points: readonly LabelPoint[], dpi: number, plateWidth: number, plateHeight: number, font: LegendFont): Legend[] {
  const scale = legendScale(dpi);
  const ink = hexToLinear(INK, new Float64Array(3));
  const halo = hexToLinear(HALO, new Float64Array(3));
  const placed: Legend[] = [];
  for (const p of points) {
    const s = sprite(p, scale, ink, halo, font);
    if (s.x < 0 || s.y < 0 || s.x + s.width > plateWidth || s.y + s.height > plateHeight) continue;
    const clash = placed.some((q) => s.x < q.x + q.width && q.x < s.x + s.width && s.y < q.y + q.height && q.y < s.y + s.height);
    if (!clash) placed.push(s);
  }
  return placed;
}
