/**
 * The period palette: categorical colours for the periods of attracting cycles
 * inside the set, chosen by the rule in build-period-palette.ts and read from
 * the table it built (period-palette-table.ts). Periods above
 * PERIOD_PALETTE_SIZE reuse the table cyclically:
 * colour(p) = colour(((p - 1) mod N) + 1).
 */
import { linearToHex, type Vec3 } from './oklab.js';
import { PERIOD_PALETTE_SIZE } from './period-palette-size.js';
import { PERIOD_PALETTE_LAB, PERIOD_PALETTE_LINEAR } from './period-palette-table.js';

export { PERIOD_GREYSCALE_DISTINCT, PERIOD_LIGHTNESS_MAX, PERIOD_LIGHTNESS_MIN, PERIOD_PALETTE_SIZE } from './period-palette-size.js';
export { periodsAdjacent } from './build-period-palette.js';

const TABLE = { lab: PERIOD_PALETTE_LAB, linear: PERIOD_PALETTE_LINEAR };

/** Index into the table for period p >= 1 (cycling beyond the table). */
function slot(p: number): number {
  return (p - 1) % PERIOD_PALETTE_SIZE;
}

/** The OKLab colour of period p (p >= 1), written into out. */
export function periodOklab<T extends Vec3>(p: number, out: T): T {
  const s = 3 * slot(p);
  out[0] = TABLE.lab[s]!;
  out[1] = TABLE.lab[s + 1]!;
  out[2] = TABLE.lab[s + 2]!;
  return out;
}

/** The linear-light sRGB colour of period p (p >= 1), written into out. */
export function periodLinear<T extends Vec3>(p: number, out: T): T {
  const s = 3 * slot(p);
  out[0] = TABLE.linear[s]!;
  out[1] = TABLE.linear[s + 1]!;
  out[2] = TABLE.linear[s + 2]!;
  return out;
}

/** periodLinear into out[o .. o + 2] of a Float64Array (the shading loop's monomorphic form; same values). */
export function periodLinearAt(p: number, out: Float64Array, o: number): void {
  const s = 3 * slot(p);
  out[o] = TABLE.linear[s]!;
  out[o + 1] = TABLE.linear[s + 1]!;
  out[o + 2] = TABLE.linear[s + 2]!;
}

/** The colour of period p as '#rrggbb' (sRGB, 8 bits), for legends and metadata. */
export function periodHex(p: number): string {
  const s = 3 * slot(p);
  return linearToHex(TABLE.linear[s]!, TABLE.linear[s + 1]!, TABLE.linear[s + 2]!);
}
