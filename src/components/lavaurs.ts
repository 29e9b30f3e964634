/**
 * Lavaurs' algorithm: the pairs of period-p external angles that land
 * together at component roots, without numerics (docs/methods.md D2).
 * For p = 2, 3, ... in order: list the exact-period-p angles ascending; pair
 * the smallest unpaired angle a with the smallest unpaired b > a whose chord
 * crosses no chord drawn earlier (all periods); repeat.
 * Source: P. Lavaurs, C. R. Acad. Sci. Paris 303 (1986) 143-146 (docs/methods.md D2).
 * Quadratic in the number of angles: meant for periods up to about 12.
 */
import { periodicNumerators } from './periodic-angles.js';

/** A pair of angles as numerators over 2^p - 1. */
export interface AnglePair {
  readonly period: number;
  readonly lo: number;
  readonly hi: number;
}

/** Lavaurs pairs for every period 2..maxPeriod. */
export function lavaursPairs(maxPeriod: number): AnglePair[] {
  const chords: Array<[number, number]> = [];
  const pairs: AnglePair[] = [];
  for (let p = 2; p <= maxPeriod; p += 1) {
    const den = 2 ** p - 1;
    const nums = Array.from(periodicNumerators(p, false));
    const used = new Set<number>();
    for (let i = 0; i < nums.length; i += 1) {
      const a = nums[i]!;
      if (used.has(a)) continue;
      for (let j = i + 1; j < nums.length; j += 1) {
        const b = nums[j]!;
        if (used.has(b)) continue;
        const x = a / den;
        const y = b / den;
        if (chords.every(([u, v]) => !crosses(x, y, u, v))) {
          used.add(a);
          used.add(b);
          chords.push([x, y]);
          pairs.push({ period: p, lo: a, hi: b });
          break;
        }
      }
    }
  }
  return pairs;
}

function crosses(a: number, b: number, u: number, v: number): boolean {
  const inU = u > a && u < b;
  const inV = v > a && v < b;
  return inU !== inV;
}
