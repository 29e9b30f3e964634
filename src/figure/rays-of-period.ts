/**
 * The external angles of the roots of every period-p component in a view
 * (`--rays-of P`): from the census of the period (components/census.ts),
 * which pairs each component with the two angles landing at its root
 * (Lavaurs; docs/methods.md D2), one for the main cardioid. A component counts as
 * in view when its nucleus is, and it is at least OUTLINE_MIN_PIXELS across.
 */
import { census } from '../components/census.js';
import { angleText } from '../components/external-angle.js';
import { mersenneAngle } from '../components/component-info.js';
import { Received, UserError } from '../check/user-error.js';
import type { DoubleGrid } from '../view/view.js';
import { OUTLINE_MIN_PIXELS, viewBox } from './component-outlines.js';

export async function raysOfPeriod(period: number, grid: DoubleGrid, workers: number, most: number): Promise<string[]> {
  const box = viewBox(grid);
  const found = await census(period, { workers });
  const inView = found.components
    .filter((c) => {
      const re = c.reHi + c.reLo;
      const im = c.imHi + c.imLo;
      return re >= box.re0 && re <= box.re1 && im >= box.im0 && im <= box.im1 && c.size >= OUTLINE_MIN_PIXELS * grid.spacing;
    })
    .sort((a, b) => a.reHi - b.reHi || a.imHi - b.imHi);
  if (inView.length === 0)
    throw new UserError('figure.raysOf', `a period with a component in view at least ${OUTLINE_MIN_PIXELS} pixels across`, new Received(`period ${period} (none in view)`));
  const angles = inView.flatMap((c) => c.angles.map((n) => angleText(mersenneAngle(n, period))));
  if (angles.length > most) throw new UserError('figure.raysOf', `a period with at most ${most} rays in view`, new Received(`period ${period} (${angles.length} rays)`));
  return angles;
}
