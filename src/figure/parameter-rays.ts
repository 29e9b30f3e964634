/**
 * Parameter rays for figures: each external angle p/q traced inward as a
 * polyline (trace-ray.ts, docs/methods.md D4) and finished at its landing point,
 * found by Newton rather than by any formula:
 * - a periodic angle of period n lands at the root of a period-n component
 *   (Douady-Hubbard; docs/methods.md D). Near a parabolic root the ray closes in
 *   only like 1/depth (measured: 1/3 is 0.38 from c = -3/4 at depth 10, 0.064
 *   at depth 50, and doubles end near depth 60), so the polyline is finished
 *   by a segment to the root. The root comes from the nucleus, which Newton
 *   finds from the ray's end at depth min(2n, n + 14) as the census does
 *   (land-rays.ts), then from the nucleus by componentRoot (boundary-point.ts);
 * - a preperiodic angle lands at a Misiurewicz point; there the ray closes in
 *   geometrically (1/6 is 1e-6 from c = i at depth 20), and Newton on the
 *   preperiodic equation (misiurewicz.ts) from the traced end gives it.
 */
import { angleOrbit, parseAngle } from '../components/external-angle.js';
import { componentRoot } from '../components/boundary-point.js';
import { nucleusDouble } from '../components/fast-nucleus.js';
import { findMisiurewicz } from '../components/misiurewicz.js';
import type { ComplexDecimal } from '../components/nucleus.js';
import { traceRayDouble } from '../components/trace-ray.js';
import { Received, UserError } from '../check/user-error.js';

/** Levels traced for the drawn polyline: deep enough to come close, shallow enough that R^(2^-depth) - 1 is still well above the double ulp. */
export const RAY_DRAW_DEPTH = 50;
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
  /** The traced polyline in c (re, im, ...), from the circle of radius RAY_RADIUS inwards, then the landing point. */
  readonly points: Float64Array;
}

/** Traces and lands the ray of angle `text` (p/q, 0 <= p < q < 2^52); `field` names it in errors. */
export function parameterRay(text: string, field: string): ParameterRay {
  const angle = parseAngle(text, field);
  const { preperiod, period } = angleOrbit(angle);
  const num = Number(angle.num);
  const den = Number(angle.den);
  const path: number[] = [];
  const end = traceRayDouble(num, den, RAY_DRAW_DEPTH, RAY_SHARPNESS, path);
  if (!end.ok) throw new UserError(field, 'an angle whose ray the double-precision trace follows', new Received(`${text} (the trace broke off)`));
  let landing: ComplexDecimal;
  if (preperiod === 0) {
    const start = traceRayDouble(num, den, Math.min(2 * period, period + 14), RAY_SHARPNESS);
    const nucleus = start.ok ? nucleusDouble(period, start.reHi, start.imHi) : null;
    if (nucleus === null || !nucleus.ok) throw new UserError(field, 'a periodic angle whose component Newton finds', new Received(`${text} (period ${period}: no nucleus)`));
    landing = componentRoot(period, { re: String(nucleus.reHi), im: String(nucleus.imHi) }, LANDING_DIGITS).root;
  } else {
    landing = findMisiurewicz(preperiod, period, end, LANDING_DIGITS);
  }
  path.push(Number(landing.re), Number(landing.im));
  return { angle: text, kind: preperiod === 0 ? 'root' : 'misiurewicz', preperiod, period, landing, tracedEnd: { re: end.reHi, im: end.imHi }, points: Float64Array.from(path) };
}
