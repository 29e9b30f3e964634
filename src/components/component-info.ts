/**
 * Everything the tool reports about one component: nucleus, root, parent and
 * internal angle, size, orientation, shape, external angles of the root and
 * internal address.
 */
import { componentRoot } from './boundary-point.js';
import type { Attachment } from './boundary-point.js';
import { census } from './census.js';
import type { CensusComponent } from './census.js';
import type { Angle } from './external-angle.js';
import { addressOfAngle } from './internal-address.js';
import type { ComplexDecimal } from './nucleus.js';
import { sizeEstimateScaled, type SizeEstimateScaled } from './size-estimate.js';

export interface ComponentInfo {
  period: number;
  nucleus: ComplexDecimal;
  root: ComplexDecimal;
  parent: Attachment | null;
  /** |size estimate| (0 when below the double range; see log10Size). */
  size: number;
  log10Size: number;
  /** arg of the size estimate, radians. */
  orientation: number;
  shape: 'cardioid' | 'disk';
  /** External angles of the root, lower first (one for the main cardioid); null when not computed. */
  angles: Angle[] | null;
  /** Internal address (from the kneading sequence of the lower angle); null when angles are unknown. */
  address: number[] | null;
}

/** Periods up to which a single component's angles are found by a census of its period. */
export const ANGLE_CENSUS_LIMIT = 12;

/** Reduced angle n/(2^p - 1). */
export function mersenneAngle(n: number, period: number): Angle {
  if (period <= 52) {
    // n and 2^p - 1 are exact doubles: Euclid in doubles, the same fraction
    const d = 2 ** period - 1;
    if (n === 0) return { num: 0n, den: 1n };
    let a = n;
    let b = d;
    while (b !== 0) [a, b] = [b, a % b];
    return { num: BigInt(n / a), den: BigInt(d / a) };
  }
  let num = BigInt(n);
  let den = (1n << BigInt(period)) - 1n;
  if (num === 0n) return { num: 0n, den: 1n };
  let a = num;
  let b = den;
  while (b !== 0n) [a, b] = [b, a % b];
  num /= a;
  den /= a;
  return { num, den };
}

/**
 * Completes the description of the component of `period` with this nucleus
 * (already at `digits` digits). Angles: given, or taken from a census of the
 * period when period <= ANGLE_CENSUS_LIMIT (the census nucleus nearest to
 * this one), otherwise left null. `known`: the root and parent, already found
 * (the listing's fast path, fast-row.ts).
 */
export async function componentInfo(
  period: number,
  nucleus: ComplexDecimal,
  digits: number,
  angles?: Angle[],
  known?: { root: ComplexDecimal; parent: Attachment | null },
  knownSize?: SizeEstimateScaled | null,
): Promise<ComponentInfo> {
  const { root, parent } = known ?? componentRoot(period, nucleus, digits);
  const size = knownSize ?? sizeEstimateScaled(period, nucleus);
  let found: Angle[] | null = angles ?? null;
  if (found === null && period <= ANGLE_CENSUS_LIMIT) {
    const c = nearestCensus((await census(period)).components, Number(nucleus.re), Number(nucleus.im));
    if (c !== null) found = c.angles.map((n) => mersenneAngle(n, period));
  }
  const first = found?.[0];
  return {
    period,
    nucleus,
    root,
    parent,
    size: size.size,
    log10Size: size.log10Size,
    orientation: size.orientation,
    shape: size.shape,
    angles: found,
    address: first === undefined ? null : period === 1 ? [1] : addressOfAngle(first, period),
  };
}

/** The census component whose nucleus lies within 1e-3 of its size of (re, im), or null. */
export function nearestCensus(components: readonly CensusComponent[], re: number, im: number): CensusComponent | null {
  let best: CensusComponent | null = null;
  let bestD = Infinity;
  for (const c of components) {
    const d = Math.hypot(c.reHi - re, c.imHi - im);
    if (d < bestD) {
      bestD = d;
      best = c;
    }
  }
  return best !== null && bestD <= Math.max(1e-3 * best.size, 1e-15) ? best : null;
}
