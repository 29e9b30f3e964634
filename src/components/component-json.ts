/**
 * One component as plain JSON-able data (for `components`, `locate`, `probe`
 * and the survey page), and its size as text.
 */
import type { ComponentInfo } from './component-info.js';
import { angleText } from './external-angle.js';
import { addressText } from './internal-address.js';

/**
 * A double quantity printed with an exponent's worth of meaning (size,
 * distance, multiplier, radius) to D significant digits, at most the 17 a
 * double holds (docs/cli.md: digits).
 */
export function significant(x: number, digits: number): string {
  return x.toPrecision(Math.min(17, Math.max(1, digits)));
}

/** Size as text: a double to D significant digits, or m e x where it underflows the double range. */
export function sizeText(info: { size: number; log10Size: number }, digits = 6): string {
  if (info.size > 0) return significant(info.size, digits);
  const e = Math.floor(info.log10Size);
  return `${(10 ** (info.log10Size - e)).toFixed(Math.min(14, Math.max(0, digits - 1)))}e${e}`;
}

/** Size in JSON: a number where it is a double, a decimal string below the double range. */
function sizeJson(info: { size: number; log10Size: number }): number | string {
  return info.size > 0 ? info.size : sizeText(info, 6);
}

/** One component as plain JSON-able data. */
export function componentJson(info: ComponentInfo): Record<string, unknown> {
  return {
    period: info.period,
    nucleus: info.nucleus,
    root: info.root,
    size: sizeJson(info),
    orientationDegrees: Number(((info.orientation * 180) / Math.PI).toFixed(6)),
    shape: info.shape,
    parent: info.parent === null ? null : { period: info.parent.period, nucleus: info.parent.nucleus, internalAngle: `${info.parent.num}/${info.parent.den}` },
    externalAngles: info.angles === null ? null : info.angles.map(angleText),
    internalAddress: info.address === null ? null : addressText(info.address),
  };
}

/** One component as aligned "key  value" lines. */
export function componentLines(info: ComponentInfo, digits = 6): string[] {
  const j = componentJson(info);
  const parent =
    info.parent === null
      ? '-'
      : `period ${info.parent.period} at internal angle ${info.parent.num}/${info.parent.den} (nucleus ${info.parent.nucleus.re}, ${info.parent.nucleus.im})`;
  return [
    `period            ${info.period}`,
    `nucleus           ${info.nucleus.re}, ${info.nucleus.im}`,
    `root              ${info.root.re}, ${info.root.im}`,
    `size              ${sizeText(info, digits)}`,
    `orientation       ${String(j['orientationDegrees'])} degrees`,
    `shape             ${info.shape}`,
    `parent            ${parent}`,
    `external angles   ${info.angles === null ? `not computed (period above 12; use --angle)` : info.angles.map(angleText).join(', ')}`,
    `internal address  ${info.address === null ? '-' : addressText(info.address)}`,
  ];
}

/** The listing's columns, in order (CSV header, Parquet and JSON names). */
export const LISTING_HEADER = [
  'period',
  'nucleus_re',
  'nucleus_im',
  'root_re',
  'root_im',
  'size',
  'orientation_deg',
  'shape',
  'parent_period',
  'internal_angle',
  'angle_lo',
  'angle_hi',
  'address',
] as const;

/** The orientation in degrees as componentJson gives it (6 places, trailing zeros dropped, -0 as 0), as text. */
function orientationText(radians: number): string {
  const t = ((radians * 180) / Math.PI).toFixed(6);
  if (t.indexOf('.') < 0) return t;
  const trimmed = t.replace(/\.?0+$/, '');
  return trimmed === '-0' ? '0' : trimmed;
}

/** One row's cells as the CSV prints them, in LISTING_HEADER's order (componentJson's values, without building it). */
export function listingRow(r: ComponentInfo): string[] {
  const angles = r.angles;
  return [
    String(r.period),
    r.nucleus.re,
    r.nucleus.im,
    r.root.re,
    r.root.im,
    String(sizeJson(r)),
    orientationText(r.orientation),
    r.shape,
    r.parent === null ? '' : String(r.parent.period),
    r.parent === null ? '' : `${r.parent.num}/${r.parent.den}`,
    angles === null || angles[0] === undefined ? '' : angleText(angles[0]),
    angles === null || angles[1] === undefined ? '' : angleText(angles[1]),
    r.address === null ? '' : addressText(r.address),
  ];
}
