/**
 * Period labels for a plate: a dot on each chosen nucleus and its period
 * above it, in our bitmap font at the legend's print size, ink on a light
 * halo so the number reads on any colour. Each label is a small sprite
 * (the Legend shape: rectangle in plate pixels + premultiplied linear RGBA),
 * composited tile by tile with paintLegendRect, so labels never depend on
 * the tiling.
 */
import { GLYPH_H, GLYPH_W, glyph, textCells } from './bitmap-font.js';
import { legendScale, type Legend } from './legend.js';
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
/** Dot size and gap between dot and number, in font cells. */
const DOT = 2;
const GAP = 1;

/** Height of a label in pixels at this dpi (number, gap, dot, halo). */
export function labelHeightPixels(dpi: number): number {
  return (GLYPH_H + GAP + DOT + 2) * legendScale(dpi);
}

function sprite(point: LabelPoint, scale: number, ink: ArrayLike<number>, halo: ArrayLike<number>): Legend {
  const text = String(point.period);
  const cellsW = Math.max(textCells(text), DOT) + 2;
  const cellsH = GLYPH_H + GAP + DOT + 2;
  const width = cellsW * scale;
  const height = cellsH * scale;
  // The dot's centre sits on the nucleus.
  const dotX = Math.floor((cellsW - DOT) / 2);
  const x = Math.round(point.x - (dotX + DOT / 2) * scale);
  const y = Math.round(point.y - (cellsH - 1 - DOT / 2) * scale);
  const rgba = new Float64Array(width * height * 4);
  const ink01 = new Uint8Array(cellsW * cellsH);
  const textX = Math.floor((cellsW - textCells(text)) / 2);
  for (let g = 0; g < text.length; g++) {
    const rows = glyph(text[g]!);
    for (let r = 0; r < GLYPH_H; r++) for (let c = 0; c < GLYPH_W; c++) if (rows[r]![c] === '#') ink01[(1 + r) * cellsW + textX + g * (GLYPH_W + 1) + c] = 1;
  }
  for (let r = 0; r < DOT; r++) for (let c = 0; c < DOT; c++) ink01[(1 + GLYPH_H + GAP + r) * cellsW + dotX + c] = 1;
  for (let cy = 0; cy < cellsH; cy++) {
    for (let cx = 0; cx < cellsW; cx++) {
      let near = false;
      for (let dy = -1; dy <= 1 && !near; dy++)
        for (let dx = -1; dx <= 1; dx++) {
          const yy = cy + dy;
          const xx = cx + dx;
          if (yy >= 0 && yy < cellsH && xx >= 0 && xx < cellsW && ink01[yy * cellsW + xx] === 1) {
            near = true;
            break;
          }
        }
      if (!near) continue;
      const on = ink01[cy * cellsW + cx] === 1;
      const colour = on ? ink : halo;
      const alpha = on ? 1 : HALO_ALPHA;
      for (let j = cy * scale; j < (cy + 1) * scale; j++)
        for (let i = cx * scale; i < (cx + 1) * scale; i++) {
          const k = 4 * (j * width + i);
          rgba[k] = colour[0]! * alpha;
          rgba[k + 1] = colour[1]! * alpha;
          rgba[k + 2] = colour[2]! * alpha;
          rgba[k + 3] = alpha;
        }
    }
  }
  return { x, y, width, height, scale, rgba };
}

/**
 * Lays out labels for the given points (in the order given, which sets
 * priority): a label that would overlap one already placed, or leave the
 * plate, is dropped.
 */
export function layoutPeriodLabels(points: readonly LabelPoint[], dpi: number, plateWidth: number, plateHeight: number): Legend[] {
  const scale = legendScale(dpi);
  const ink = hexToLinear(INK, new Float64Array(3));
  const halo = hexToLinear(HALO, new Float64Array(3));
  const placed: Legend[] = [];
  for (const p of points) {
    const s = sprite(p, scale, ink, halo);
    if (s.x < 0 || s.y < 0 || s.x + s.width > plateWidth || s.y + s.height > plateHeight) continue;
    const clash = placed.some((q) => s.x < q.x + q.width && q.x < s.x + s.width && s.y < q.y + q.height && q.y < s.y + s.height);
    if (!clash) placed.push(s);
  }
  return placed;
}
