/**
 * Lavaurs' pairing of the period-p external angles in linear time per period,
 * for the census (periods up to 20 and beyond, where the quadratic
 * lavaursPairs in lavaurs.ts is too slow).
 *
 * Method (docs/methods.md D2): P. Lavaurs, C. R. Acad. Sci. Paris 303 (1986)
 * 143-146. The chords of periods below p are disjoint, so they cut the disk
 * into regions (gaps). Lavaurs' rule "pair the smallest unpaired angle a with
 * the smallest unpaired b > a whose chord crosses no earlier chord" then pairs
 * the period-p angles of each gap consecutively, in the order met when going
 * round the circle from angle 0: a chord to any other b would separate an
 * unpaired angle of the gap from its own partner, or cross a lower chord.
 * One sweep per period with a stack of open chords finds the gaps; the tests
 * check the result against lavaursPairs for small periods.
 */
import { periodicNumerators } from './periodic-angles.js';

/** The period-p pairs as numerators over 2^p - 1: lo[i] < hi[i], ascending in lo. */
export interface LavaursSweep {
  readonly period: number;
  readonly lo: Float64Array;
  readonly hi: Float64Array;
}

/** Lavaurs pairs of exact period `period` (2 <= period <= 26), found by sweeping periods 2..period. */
export function lavaursSweep(period: number): LavaursSweep {
  // Endpoints of all chords drawn so far, ascending: value, numerator, denominator, +1 open / -1 close.
  let val = new Float64Array(0);
  let num = new Float64Array(0);
  let den = new Float64Array(0);
  let kind = new Int8Array(0);
  let lo = new Float64Array(0);
  let hi = new Float64Array(0);
  for (let d = 2; d <= period; d += 1) {
    const dd = 2 ** d - 1;
    const angles = periodicNumerators(d, false);
    const m = angles.length;
    const partner = new Float64Array(m);
    // Sweep: merge the chord endpoints with this period's angles; each open chord pushes a gap.
    const pending: number[] = [-1];
    let j = 0;
    for (let i = 0; i < m; i += 1) {
      const a = angles[i]!;
      const v = a / dd;
      while (j < val.length && before(num[j]!, den[j]!, val[j]!, a, dd, v)) {
        if (kind[j]! > 0) pending.push(-1);
        else pending.pop();
        j += 1;
      }
      const top = pending.length - 1;
      const w = pending[top]!;
      if (w < 0) pending[top] = i;
      else {
        partner[w] = i;
        partner[i] = w;
        pending[top] = -1;
      }
    }
    // New endpoint list: merge the old one with this period's angles (open at lo, close at hi).
    const n = val.length + m;
    const val2 = new Float64Array(n);
    const num2 = new Float64Array(n);
    const den2 = new Float64Array(n);
    const kind2 = new Int8Array(n);
    let a = 0;
    let b = 0;
    for (let k = 0; k < n; k += 1) {
      const takeOld = b >= m || (a < val.length && before(num[a]!, den[a]!, val[a]!, angles[b]!, dd, angles[b]! / dd));
      if (takeOld) {
        val2[k] = val[a]!;
        num2[k] = num[a]!;
        den2[k] = den[a]!;
        kind2[k] = kind[a]!;
        a += 1;
      } else {
        val2[k] = angles[b]! / dd;
        num2[k] = angles[b]!;
        den2[k] = dd;
        kind2[k] = partner[b]! > b ? 1 : -1;
        b += 1;
      }
    }
    val = val2;
    num = num2;
    den = den2;
    kind = kind2;
    if (d === period) {
      lo = new Float64Array(m / 2);
      hi = new Float64Array(m / 2);
      let k = 0;
      for (let i = 0; i < m; i += 1) {
        if (partner[i]! > i) {
          lo[k] = angles[i]!;
          hi[k] = angles[partner[i]!]!;
          k += 1;
        }
      }
    }
  }
  return { period, lo, hi };
}

/** n1/d1 < n2/d2 for angles of different exact periods (never equal), exactly: cross products in doubles while below 2^53. */
function before(n1: number, d1: number, v1: number, n2: number, d2: number, v2: number): boolean {
  if (Math.abs(v1 - v2) > 1e-9) return v1 < v2;
  if (d1 * d2 < 2 ** 53) return n1 * d2 < n2 * d1;
  return BigInt(n1) * BigInt(d2) < BigInt(n2) * BigInt(d1);
}
