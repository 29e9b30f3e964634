/**
 * The internal rays of a figure: for every component of one period whose
 * nucleus is in view (from the census, components-in-box.ts) and which is
 * at least OUTLINE_MIN_PIXELS across, the rays at the given internal angles
 * (internal-ray.ts, docs/methods.md C3), with points enough for the component's
 * size in pixels.
 */
import { componentsInBox } from '../components/components-in-box.js';
import { internalRay } from '../components/internal-ray.js';
import type { ComplexDecimal } from '../components/nucleus.js';
import { Received, UserError } from '../check/user-error.js';
import type { DoubleGrid } from '../view/view.js';
import { OUTLINE_MIN_PIXELS, viewBox } from './component-outlines.js';

export interface FigureInternalRay {
  readonly period: number;
  readonly nucleus: { readonly re: number; readonly im: number };
  /** As written: "0" or p/q. */
  readonly angle: string;
  readonly end: ComplexDecimal;
  /** c values (re, im, ...) from the nucleus to the end. */
  readonly points: Float64Array;
}

export async function internalRaysInView(period: number, angles: readonly string[], grid: DoubleGrid, workers: number): Promise<FigureInternalRay[]> {
  const nuclei = await componentsInBox({ min: period, max: period }, viewBox(grid), OUTLINE_MIN_PIXELS * grid.spacing, { workers });
  if (nuclei.length === 0)
    throw new UserError(
      'figure.internalRays.period',
      `a period with a component in view at least ${OUTLINE_MIN_PIXELS} pixels across`,
      new Received(`period ${period} (none in view)`),
    );
  const out: FigureInternalRay[] = [];
  for (const n of nuclei) {
    const steps = Math.min(1024, Math.max(32, Math.ceil((4 * n.size) / grid.spacing)));
    for (const angle of angles) {
      const [num, den] = angle === '0' ? [0, 1] : (angle.split('/').map(Number) as [number, number]);
      const ray = internalRay(period, n.re, n.im, { num, den }, steps);
      if (ray === null)
        throw new UserError('figure.internalRays', 'rays Newton follows in double precision', new Received(`period ${period}, nucleus ${n.re} ${n.im}, angle ${angle}`));
      out.push({ period, nucleus: { re: n.re, im: n.im }, angle, end: ray.end, points: ray.points });
    }
  }
  return out;
}
