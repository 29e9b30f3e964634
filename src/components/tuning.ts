/**
 * Douady-Hubbard tuning by external angles (docs/methods.md D6): the copy of
 * component INNER inside component OUTER has the angles of INNER with every
 * binary digit 0 replaced by the period-p word of OUTER's lower angle and
 * every 1 by the word of its upper angle; its period is p times INNER's.
 * Source: A. Douady, "Algorithms for computing angles in the Mandelbrot set",
 * in Chaotic Dynamics and Fractals (Academic Press, 1986) 155-168 [memory].
 *
 * Components are named by their angle pair (`1/3,2/3`, checked against
 * Lavaurs' pairing, D2) or by an internal address (`1-2`, D3; the component
 * of that address with the lowest angle, as `locate --address` takes it).
 */
import { UserError } from '../check/user-error.js';
import { angleOrbit, angleText, overMersenne, parseAngle } from './external-angle.js';
import type { Angle } from './external-angle.js';
import { addressOfAngle, addressText } from './internal-address.js';
import { lavaursSweep } from './lavaurs-sweep.js';
import { mersenneAngle } from './component-info.js';
import { periodicNumerators } from './periodic-angles.js';

/** Longest period of a named component (Lavaurs' sweep pairs its angles). */
export const MAX_NAMED_PERIOD = 20;

/** A component by its period and the two angles landing at its root (numerators over 2^p - 1). */
export interface NamedComponent {
  readonly period: number;
  /** Lower and upper angle numerators over 2^period - 1 (0 and 1 for the main cardioid). */
  readonly lo: bigint;
  readonly hi: bigint;
  /** How many components share the address (1 for an angle pair). */
  readonly sharing: number;
}

/** The Lavaurs partner of numerator n of exact period p, or null when n has no partner (p = 1). */
function partner(n: number, p: number): number | null {
  const s = lavaursSweep(p);
  for (let i = 0; i < s.lo.length; i += 1) {
    if (s.lo[i] === n) return s.hi[i]!;
    if (s.hi[i] === n) return s.lo[i]!;
  }
  return null;
}

/** Parses a component name: `a/b,c/d` (an angle pair of one root) or an internal address `1-3-6`. */
export function parseComponent(text: string, field: string): NamedComponent {
  const t = typeof text === 'string' ? text.trim() : '';
  if (t.includes('/')) {
    const parts = t.split(',');
    if (parts.length !== 2) throw new UserError(field, 'a component as an angle pair such as 1/3,2/3 or an internal address such as 1-2', text);
    const a = parseAngle(parts[0]!, field);
    const b = parseAngle(parts[1]!, field);
    const oa = angleOrbit(a);
    const ob = angleOrbit(b);
    if (oa.preperiod !== 0 || ob.preperiod !== 0 || oa.period !== ob.period || a.num === 0n) {
      throw new UserError(field, 'two periodic angles of the same period (an odd denominator), such as 1/3,2/3', text);
    }
    const p = oa.period;
    if (p > MAX_NAMED_PERIOD) throw new UserError(field, `an angle pair of period at most ${MAX_NAMED_PERIOD}`, text);
    const [lo, hi] = a.num * b.den < b.num * a.den ? [a, b] : [b, a];
    const nlo = overMersenne(lo, p);
    const nhi = overMersenne(hi, p);
    if (partner(Number(nlo), p) !== Number(nhi)) {
      throw new UserError(field, `two angles that land together at the root of one component (Lavaurs' pairing of period ${p})`, text);
    }
    return { period: p, lo: nlo, hi: nhi, sharing: 1 };
  }
  const parts = t.split(/->|-|→/).map((s) => s.trim());
  const nums = parts.map((s) => (/^\d+$/.test(s) ? Number(s) : Number.NaN));
  const ok = nums.length >= 1 && nums[0] === 1 && nums.every((n, i) => Number.isInteger(n) && (i === 0 || n > nums[i - 1]!));
  if (!ok) throw new UserError(field, 'a component as an angle pair such as 1/3,2/3 or an internal address such as 1-2 (starting at 1, strictly increasing)', text);
  const p = nums[nums.length - 1]!;
  if (p > MAX_NAMED_PERIOD) throw new UserError(field, `an internal address ending at a period of at most ${MAX_NAMED_PERIOD}`, text);
  if (p === 1) return { period: 1, lo: 0n, hi: 1n, sharing: 1 };
  const want = addressText(nums);
  const den = 2 ** p - 1;
  const matches = Array.from(periodicNumerators(p, false)).filter((n) => addressText(addressOfAngle(mersenneAngle(n, p), p)) === want);
  if (matches.length === 0) throw new UserError(field, 'an internal address that some component has', want);
  const lo = matches[0]!;
  const hi = partner(lo, p);
  if (hi === null || hi < lo || hi > den) throw new UserError(field, 'an internal address whose lowest angle is the lower angle of its component', want);
  return { period: p, lo: BigInt(lo), hi: BigInt(hi), sharing: Math.max(1, Math.round(matches.length / 2)) };
}

/** The p-digit binary word of numerator n over 2^p - 1. */
function word(n: bigint, p: number): string {
  return n.toString(2).padStart(p, '0');
}

/** The tuned component: INNER's words with 0 -> OUTER's lower word, 1 -> its upper word. */
export function tune(outer: NamedComponent, inner: NamedComponent): { period: number; lo: Angle; hi: Angle; words: [string, string] } {
  const w0 = word(outer.lo, outer.period);
  const w1 = word(outer.hi, outer.period);
  const sub = (n: bigint): string => Array.from(word(n, inner.period), (d) => (d === '0' ? w0 : w1)).join('');
  const lo = sub(inner.lo);
  const hi = sub(inner.hi);
  const period = outer.period * inner.period;
  const den = (1n << BigInt(period)) - 1n;
  const reduce = (w: string): Angle => {
    const n = BigInt(`0b${w}`);
    if (n === 0n) return { num: 0n, den: 1n };
    let a = n;
    let b = den;
    while (b !== 0n) [a, b] = [b, a % b];
    return { num: n / a, den: den / a };
  };
  return { period, lo: reduce(lo), hi: reduce(hi), words: [lo, hi] };
}

/** "lo,hi" text of a named component's angles. */
export function componentName(c: NamedComponent): string {
  if (c.period === 1) return '1';
  return `${angleText(mersenneAngle(Number(c.lo), c.period))},${angleText(mersenneAngle(Number(c.hi), c.period))}`;
}
