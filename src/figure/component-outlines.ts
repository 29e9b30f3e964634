/**
 * The outlines of every component of one period in a view, for figures:
 * nuclei from the census (components-in-box.ts), each boundary walked at
 * multipliers e^{2 pi i j/n} (component-outline.ts, docs/methods.md C3), closed
 * through the root (componentRoot, which handles a satellite's singular
 * root). Points per outline follow the component's size in pixels, so the
 * polyline is smooth at print size.
 */
import { componentRoot } from '../components/boundary-point.js';
import { componentOutline } from '../components/component-outline.js';
import { componentsInBox } from '../components/components-in-box.js';
import { Received, UserError } from '../check/user-error.js';
import { pixelToC, type DoubleGrid } from '../view/view.js';

/** Components smaller than this many pixels (size estimate) are not outlined. */
export const OUTLINE_MIN_PIXELS = 3;

export interface ComponentOutline {
  readonly period: number;
  readonly nucleus: { readonly re: number; readonly im: number };
  /** The closed boundary in c (re, im, ...), starting and ending at the root. */
  readonly points: Float64Array;
}

/** The c-range of a view's corners (for any rotation). */
export function viewBox(grid: DoubleGrid): { re0: number; re1: number; im0: number; im1: number } {
  const corners = [
    [0, 0],
    [grid.width, 0],
    [0, grid.height],
    [grid.width, grid.height],
  ].map(([x, y]) => pixelToC(grid, x!, y!, new Float64Array(2)));
  return {
    re0: Math.min(...corners.map((c) => c[0]!)),
    re1: Math.max(...corners.map((c) => c[0]!)),
    im0: Math.min(...corners.map((c) => c[1]!)),
    im1: Math.max(...corners.map((c) => c[1]!)),
  };
}

export async function outlinesInView(period: number, grid: DoubleGrid, workers: number): Promise<ComponentOutline[]> {
  const box = viewBox(grid);
  const nuclei = await componentsInBox({ min: period, max: period }, box, OUTLINE_MIN_PIXELS * grid.spacing, { workers });
  if (nuclei.length === 0)
    throw new UserError('figure.outlines', `a period with a component in view at least ${OUTLINE_MIN_PIXELS} pixels across`, new Received(`period ${period} (none in view)`));
  return nuclei.map((n) => {
    const count = Math.min(4096, Math.max(96, Math.ceil((8 * n.size) / grid.spacing)));
    const curve = componentOutline(period, n.re, n.im, count);
    if (curve === null)
      throw new UserError('figure.outlines', 'components whose boundary Newton follows in double precision', new Received(`period ${period}, nucleus ${n.re} ${n.im}`));
    const root = componentRoot(period, { re: String(n.re), im: String(n.im) }, 20).root;
    const points = new Float64Array(curve.length + 4);
    points[0] = Number(root.re);
    points[1] = Number(root.im);
    points.set(curve, 2);
    points[curve.length + 2] = points[0];
    points[curve.length + 3] = points[1];
    return { period, nucleus: { re: n.re, im: n.im }, points };
  });
}
