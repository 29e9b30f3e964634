/**
 * Which periodic window of the logistic family holds a real c: the window
 * of smallest width (the innermost, e.g. a period-6 window inside the
 * period-3 one) among those of period <= maxPeriod whose onset..end range
 * contains c (docs/methods.md E4; windows from ./windows.ts). Returns undefined
 * when c lies in none, e.g. in the chaotic band outside every listed window.
 */
import { cToR } from './conjugacy.js';
import { logistic } from './families/index.js';
import { findWindows, type PeriodicWindow } from './windows.js';

export function windowOf(c: string, maxPeriod: number, digits = 20): PeriodicWindow | undefined {
  const { windows, D } = findWindows(logistic, maxPeriod, digits);
  const r = new D(cToR(c, digits + 8));
  let best: PeriodicWindow | undefined;
  for (const w of windows) {
    if (w.period === 1) continue;
    if (r.gte(w.onset) && r.lte(w.end) && (best === undefined || w.end.minus(w.onset).lt(best.end.minus(best.onset)))) best = w;
  }
  return best;
}
