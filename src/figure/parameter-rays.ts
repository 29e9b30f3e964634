/**
 * Parameter rays for figures: each external angle p/q traced inward as a
 * polyline (trace-ray.ts, docs/methods.md D4) until it is within half a pixel
 * of its landing point, found by Newton rather than by any formula, and
 * finished by the (sub-pixel) segment to it:
 * - a periodic angle of period n lands at the root of a period-n component
 *   (Douady-Hubbard; docs/methods.md D). The root comes from the nucleus,
 *   which Newton finds from the ray's end at depth min(2n, n + 14) as the
 *   census does (land-rays.ts), then from the nucleus by componentRoot
 *   (boundary-point.ts). Near a parabolic root the ray closes in only like
 *   1/depth (1/3 is 0.064 from c = -3/4 at depth 50), so the trace goes on
 *   one sub-step per level past RAY_DRAW_DEPTH (traceRayToward) until it is
 *   close: about 2500 levels for a pixel of 0.0025;
 * - a preperiodic angle lands at a Misiurewicz point; there the ray closes in
 *   geometrically (1/6 is 1e-6 from c = i at depth 20), and Newton on the
 *   preperiodic equation (misiurewicz.ts) from the traced end gives it.
 */
import { angleOrbit, parseAngle } from '../components/external-angle.js';
import { componentRoot } from '../components/boundary-point.js';
import { nucleusDouble } from '../components/fast-nucleus.js';
import { findMisiurewicz } from '../components/misiurewicz.js';
import type { ComplexDecimal } from '../components/nucleus.js';
import { traceRayDouble, traceRayToward } from '../components/trace-ray.js';
import { Received, UserError } from '../check/user-error.js';

/** Levels traced at RAY_SHARPNESS sub-steps for the drawn polyline; past them one sub-step per level (traceRayToward). */
export const RAY_DRAW_DEPTH = 50;
/** The traced part ends within this many pixels of the landing point (when the trace gets there within RAY_MAX_DEPTH levels). */
export const RAY_CLOSE_PIXELS = 0.5;
/** At most this many levels in all: 1/3 reaches half a pixel of 0.0015 at depth 4190 in 0.2 s; 2^14 levels take about 2.5 s. */
export const RAY_MAX_DEPTH = 2 ** 14;
/** Sub-steps per level (trace-ray.ts sharpness): 8 gives a smooth polyline at print sizes. */
export const RAY_SHARPNESS = 8;
/** Decimal digits of the reported landing points. */
export const LANDING_DIGITS = 20;

export interface ParameterRay {
  /** The angle as written in the sheet, e.g. "1/7". */
  readonly angle: string;
  /** 'root' for a periodic angle (lands at a component's root), 'misiurewicz' for a preperiodic one. */
  readonly kind: 'root' | 'misiurewicz';
  readonly preperiod: number;
  readonly period: number;
  /** The landing point from Newton, decimal strings. */
  readonly landing: ComplexDecimal;
  /** The end of the traced part (before the joining segment), in doubles. */
  readonly tracedEnd: { readonly re: number; readonly im: number };
  /** Levels traced, and why the trace stopped: 'close' (within RAY_CLOSE_PIXELS of the landing), 'stalled' (Newton stopped converging) or 'depth' (RAY_MAX_DEPTH). */
  readonly tracedDepth: number;
  readonly stop: 'close' | 'stalled' | 'depth';
  /** The traced polyline in c (re, im, ...), from the circle of radius RAY_RADIUS inwards, then the landing point; past RAY_DRAW_DEPTH, points a quarter pixel apart. */
  readonly points: Float64Array;
}

/**
 * Traces and lands the ray of angle `text` (p/q, 0 <= p < q < 2^52) for a
 * figure whose pixels are `pixel` wide in c; `field` names it in errors.
 */
export function parameterRay(text: string, field: string, pixel: number): ParameterRay {
  const angle = parseAngle(text, field);
  const { preperiod, period } = angleOrbit(angle);
  const num = Number(angle.num);
  const den = Number(angle.den);
  const broke = (): UserError => new UserError(field, 'an angle whose ray the double-precision trace follows', new Received(`${text} (the trace broke off)`));
  let landing: ComplexDecimal;
  if (preperiod === 0) {
    const start = traceRayDouble(num, den, Math.min(2 * period, period + 14), RAY_SHARPNESS);
    const nucleus = start.ok ? nucleusDouble(period, start.reHi, start.imHi) : null;
    if (nucleus === null || !nucleus.ok) throw new UserError(field, 'a periodic angle whose component Newton finds', new Received(`${text} (period ${period}: no nucleus)`));
    landing = componentRoot(period, { re: String(nucleus.reHi), im: String(nucleus.imHi) }, LANDING_DIGITS).root;
  } else {
    const end = traceRayDouble(num, den, RAY_DRAW_DEPTH, RAY_SHARPNESS);
    if (!end.ok) throw broke();
    landing = findMisiurewicz(preperiod, period, end, LANDING_DIGITS);
  }
  const path: number[] = [];
  const target = { re: Number(landing.re), im: Number(landing.im) };
  const end = traceRayToward(num, den, RAY_DRAW_DEPTH, RAY_SHARPNESS, target, RAY_CLOSE_PIXELS * pixel, RAY_MAX_DEPTH, path, pixel / 4);
  if (end.stop === 'broken') throw broke();
  path.push(target.re, target.im);
  return {
    angle: text,
    kind: preperiod === 0 ? 'root' : 'misiurewicz',
    preperiod,
    period,
    landing,
    tracedEnd: { re: end.re, im: end.im },
    tracedDepth: end.depth,
    stop: end.stop,
    points: Float64Array.from(path),
  };
}
