import { hypot2 } from '../plane/hypot2.js';
import type { SampleSet } from '../plane/sample-set.js';
import type { ColourSettings } from './colour-settings.js';
import { gradientPosition, gradientStopsOklab, stopsLinear } from './exterior-gradients.js';
import { customGradientLinear, prepareGradient } from './gradient-stops.js';
import { hexToLinear } from './oklab.js';
import { periodLinearAt } from './period-palette.js';

/**
 * The fraction of a sample's own colour kept at distance `delta` pixels from
 * the boundary, for edge width k pixels: tanh(delta / k) (docs/methods.md F2, after
 * Chéritat, "Techniques for computer generated pictures in complex dynamics",
 * and Quilez, "distance rendering for fractals"). 0 on the boundary, rising
 * monotonically to 1; k = 0 turns shading off. A clamp(delta / k, 0, 1) ramp
 * was tried and dropped: its kink at delta = k shows as a faint contour line
 * parallel to every filament. A non-finite distance (NaN, where the estimate
 * could not be computed) leaves the colour alone.
 */
export function edgeKeep(distance: number, pixelSpacing: number, k: number): number {
  if (k <= 0 || !(distance >= 0) || distance === Infinity) return 1;
  const x = distance / pixelSpacing / k;
  // tanh rounds to exactly 1 from x = 22 on (fdlibm's s_tanh.c, which V8 ports, returns 1 there without evaluating).
  return x >= TANH_ONE ? 1 : Math.tanh(x);
}

/** From here on tanh(x) is 1 in doubles: 1 - tanh(22) < 2 e^-44 < 2^-60, far below half an ulp of 1 (2^-54). */
const TANH_ONE = 22;

/**
 * Colours samples offset .. offset + count - 1 of a SampleSet into linear-light
 * sRGB, three values per sample at out[3 i .. 3 i + 2] for i in 0..count-1.
 *
 * - Escaped (period 0): the exterior gradient (the custom `gradient` when the
 *   settings carry one, else the named `exterior`) at gradientPosition(mu), then
 *   blended toward `edgeColour` near the boundary by edgeKeep(exterior
 *   distance) with width `edge`. Direction: with the default black ink, a
 *   smaller distance gives a darker sample.
 * - Interior (period p > 0): the period colour (or `interiorColour` for
 *   `solid`), scaled by the multiplier factors of the interior style, then
 *   blended toward `edgeColour` by edgeKeep(interior distance) with width
 *   `interiorEdge`.
 * - Undecided (period -1): `undecidedColour`.
 *
 * All blending is in linear light (docs/methods.md F3), so averaging sub-samples
 * afterwards is physically meaningful. Pure and deterministic: the same inputs
 * give the same doubles (see oklab.ts on the transcendental functions); each
 * sample is coloured exactly once, in the worker, through this one path.
 */
export function shadeSamples(samples: SampleSet, offset: number, count: number, pixelSpacing: number, settings: ColourSettings, out: Float64Array): void {
  const ink = hexToLinear(settings.edgeColour, new Float64Array(3));
  const solid = hexToLinear(settings.interiorColour, new Float64Array(3));
  const undecided = hexToLinear(settings.undecidedColour, new Float64Array(3));
  const c = new Float64Array(3);
  const custom = settings.gradient === undefined ? null : prepareGradient(settings.gradient);
  const { exterior, countScale, cycle, edge, interiorEdge } = settings;
  // The named gradient's stops, read here once; stopsLinear is gradientLinear's arithmetic on them.
  const stops = gradientStopsOklab(exterior);
  const gradientOffset = settings.offset;
  const style = settings.interior;
  const useDepth = style === 'period-depth' || style === 'period-depth-angle';
  const useAngle = style === 'period-angle' || style === 'period-depth-angle';
  const { period, smooth, distance, mulRe, mulIm } = samples;
  const inkR = ink[0]!,
    inkG = ink[1]!,
    inkB = ink[2]!;

  // Each colour is written to out[o..o+2] first and blended toward the ink there: the same
  // operations as blending a scratch colour, without the copy.
  for (let i = 0; i < count; i++) {
    const k = offset + i;
    const p = period[k]!;
    const o = 3 * i;
    let keep = 1;
    if (p === 0) {
      const t = gradientPosition(smooth[k]!, countScale, cycle, gradientOffset);
      if (custom === null) stopsLinear(stops, t, out, o);
      else {
        customGradientLinear(custom, t, c);
        out[o] = c[0]!;
        out[o + 1] = c[1]!;
        out[o + 2] = c[2]!;
      }
      keep = edgeKeep(distance[k]!, pixelSpacing, edge);
    } else if (p > 0) {
      if (style === 'solid') {
        out[o] = solid[0]!;
        out[o + 1] = solid[1]!;
        out[o + 2] = solid[2]!;
      } else periodLinearAt(p, out, o);
      if (useDepth || useAngle) {
        let factor = 1;
        if (useDepth) {
          const m = hypot2(mulRe[k]!, mulIm[k]!);
          factor *= 0.4 + 0.6 * (m < 1 ? m : 1);
        }
        if (useAngle) {
          let a = Math.atan2(mulIm[k]!, mulRe[k]!) / (2 * Math.PI);
          if (a < 0) a += 1;
          factor *= 0.7 + 0.3 * a;
        }
        out[o] = out[o]! * factor;
        out[o + 1] = out[o + 1]! * factor;
        out[o + 2] = out[o + 2]! * factor;
      }
      keep = edgeKeep(distance[k]!, pixelSpacing, interiorEdge);
    } else {
      out[o] = undecided[0]!;
      out[o + 1] = undecided[1]!;
      out[o + 2] = undecided[2]!;
    }
    if (keep !== 1) {
      out[o] = inkR + (out[o]! - inkR) * keep;
      out[o + 1] = inkG + (out[o + 1]! - inkG) * keep;
      out[o + 2] = inkB + (out[o + 2]! - inkB) * keep;
    }
  }
}
