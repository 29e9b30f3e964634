/**
 * Period labels for figures: the nuclei of periods 1..maxPeriod in view
 * (from the census, components-in-box.ts) whose component is large enough
 * to hold a label, as marks in plate pixels; the layout sets each in the
 * figure font where it covers no curve and no other label. The size test is
 * the raster labels' (render-sheet.ts): the size estimate |s| is about twice
 * a disk's radius (docs/methods.md C4), so |s| / 2 >= the label's height.
 */
import { componentsInBox } from '../components/components-in-box.js';
import type { DoubleGrid } from '../view/view.js';
import { viewBox } from './component-outlines.js';
import type { FigureMark } from './figure-model.js';
import { LABEL_PT } from './layout-figure.js';
import { figureFont } from './figure-font.js';

export interface PeriodMark extends FigureMark {
  readonly period: number;
  readonly re: number;
  readonly im: number;
}

export async function periodMarks(maxPeriod: number, grid: DoubleGrid, dpi: number, workers: number): Promise<PeriodMark[]> {
  // the label's box: capitals plus 1.2 pt of backing above and below (layout-figure.ts)
  const labelPixels = ((figureFont().capHeight * LABEL_PT + 2.4) / 72) * dpi;
  const nuclei = await componentsInBox({ min: 1, max: maxPeriod }, viewBox(grid), 2 * labelPixels * grid.spacing, { workers });
  return nuclei.map((n) => {
    const u = n.re - grid.centerRe;
    const v = n.im - grid.centerIm;
    const x = grid.width / 2 + (u * grid.cos + v * grid.sin) / grid.spacing;
    const y = grid.height / 2 - (-u * grid.sin + v * grid.cos) / grid.spacing;
    return { kind: 'period', label: String(n.period), x, y, period: n.period, re: n.re, im: n.im };
  });
}
