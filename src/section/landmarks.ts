/**
 * Marks for the real-slice plots: the period-doubling points of the cascade
 * (levels 1..6) and the periodic windows of period 3..maxPeriod (onset to
 * end), at modest precision (16 digits: the marks are drawn, not printed).
 */
import type { UnimodalFamily } from './unimodal-family.js';

export interface Landmarks {
  /** Period-doubling points of the cascade (family parameter). */
  doublings: { at: number; label: string }[];
  /** Periodic windows (onset to end, family parameter). */
  windows: { from: number; to: number; superstable: number; period: number; label: string }[];
}

export async function landmarks(family: UnimodalFamily, maxPeriod: number): Promise<Landmarks> {
  const { computeCascade } = await import('./cascade.js');
  const { familySolver } = await import('./cascade-solver.js');
  const cascade = computeCascade(familySolver(family, 16), 6, 16);
  const doublings = cascade.levels.filter((l) => l.doubling !== undefined).map((l) => ({ at: l.doubling!.toNumber(), label: `${l.period / 2}->${l.period}` }));
  const windows: Landmarks['windows'] = [];
  if (family.maximumOrder === 2 && maxPeriod >= 3) {
    const { findWindows } = await import('./windows.js');
    for (const w of findWindows(family, maxPeriod, 16).windows) {
      if (w.satellite || w.period < 3) continue;
      windows.push({ from: w.onset.toNumber(), to: w.end.toNumber(), superstable: w.superstable.toNumber(), period: w.period, label: `p${w.period} ${w.word}` });
    }
  }
  return { doublings, windows };
}
