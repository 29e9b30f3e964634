/**
 * Ticks of one axis of a plate (Re c across, Im c up), at round values from
 * d3-scale's `ticks` (steps of 1, 2 or 5 times a power of ten).
 *
 * Two forms, chosen by how many digits a plain label would need:
 * - plain: the label is the value of c itself ("−0.75");
 * - offset, for deep views: the axis title states the centre and a power of
 *   ten, "Re c = −0.7453 + x × 1e−12", and the labels are x. The centre is
 *   the view's decimal string as written, so c = centre + x · 10^e exactly.
 * Positions come from the exact decimal geometry (view.ts conventions: the
 * left edge of the image is centre − span/2, rows grow downwards, Im c
 * upwards), so a tick sits where the plate's pixel grid puts that value.
 * Minus signs are U+2212, as in d3-format's default locale.
 */
import { Decimal } from 'decimal.js';
import { scaleLinear } from 'd3-scale';

/** Most significant digits a plain label may carry before the axis switches to offsets. */
export const PLAIN_DIGITS = 7;

export interface Tick {
  /** The exact value of the coordinate at this tick, a decimal string. */
  readonly value: string;
  /** The printed label (plain: the value; offset form: x). */
  readonly label: string;
  /** Continuous pixel coordinate along the axis from the image's left (Re) or top (Im) edge. */
  readonly at: number;
}

export interface AxisTicks {
  /** "Re c" or "Im c", or the offset form's "Re c = centre + x × 1eE". */
  readonly title: string;
  /** Offset form: the centre (decimal string) and the exponent e; null for plain labels. */
  readonly offset: { readonly centre: string; readonly exponent: number } | null;
  readonly ticks: readonly Tick[];
}

/** A decimal string with a U+2212 minus and no negative zero. */
export function printDecimal(d: Decimal, decimals: number): string {
  const text = d.toFixed(decimals);
  const zero = /^-?0(\.0*)?$/.test(text);
  return zero ? text.replace('-', '') : text.replace('-', '\u2212');
}

function decimalsFor(step: number): number {
  return Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
}

/** The power of ten an offset axis of this extent is written in: the half extent is 1 to 10 units. */
export function offsetExponentFor(extent: string): number {
  return Math.floor(new Decimal(extent).div(2).log(10).toNumber() + 1e-9);
}

/**
 * Ticks along an axis through `centre` of length `extent` (both decimal
 * strings, c units) drawn over `pixels` pixels; `count` is d3's hint.
 * `name` is "Re c" or "Im c"; `upwards` makes pixel coordinates grow
 * against the value (the Im axis). `offsetExponent` fixes the power of ten
 * of the offset form (both axes of a plate share the wider one's).
 */
export function axisTicks(name: string, centre: string, extent: string, pixels: number, count: number, upwards: boolean, offsetExponent?: number): AxisTicks {
  // Enough digits for the centre as written and a dozen below the span.
  const D = Decimal.clone({ precision: centre.length + Math.max(0, -new Decimal(extent).e) + 30 });
  const c0 = new D(centre);
  const half = new D(extent).div(2);
  const lo = c0.minus(half);
  const hi = c0.plus(half);
  const place = (v: Decimal): number => (upwards ? hi.minus(v) : v.minus(lo)).div(extent).times(pixels).toNumber();
  const plainValues = scaleLinear().domain([lo.toNumber(), hi.toNumber()]).ticks(count);
  const plainStep = plainValues.length > 1 ? plainValues[1]! - plainValues[0]! : half.toNumber();
  const plainDecimals = decimalsFor(plainStep);
  const magnitude = D.max(lo.abs(), hi.abs());
  const intDigits = magnitude.lt(1) ? 1 : magnitude.floor().toFixed(0).length;
  if (plainDecimals + intDigits <= PLAIN_DIGITS) {
    const ticks = plainValues.map((t) => {
      const v = new D(t).toDecimalPlaces(plainDecimals);
      return { value: v.toFixed(plainDecimals), label: printDecimal(v, plainDecimals), at: place(v) };
    });
    return { title: name, offset: null, ticks: ticks.filter((t) => t.at >= 0 && t.at <= pixels) };
  }
  const exponent = offsetExponent ?? offsetExponentFor(extent);
  const unit = new D(10).pow(exponent);
  const xs = scaleLinear()
    .domain([half.neg().div(unit).toNumber(), half.div(unit).toNumber()])
    .ticks(count);
  const step = xs.length > 1 ? xs[1]! - xs[0]! : 1;
  const decimals = decimalsFor(step);
  const ticks = xs.map((t) => {
    const x = new D(t).toDecimalPlaces(decimals);
    const v = c0.plus(x.times(unit));
    return { value: v.toFixed(), label: printDecimal(x, decimals), at: place(v) };
  });
  const centreText = printDecimal(c0, Math.max(0, c0.decimalPlaces()));
  const title = `${name} = ${centreText} + x \u00d7 1e${exponent < 0 ? '\u2212' : ''}${Math.abs(exponent)}`;
  return { title, offset: { centre, exponent }, ticks: ticks.filter((t) => t.at >= 0 && t.at <= pixels) };
}
