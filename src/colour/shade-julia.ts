import type { JuliaSampleSet } from '../dynamic/sample-julia.js';
import type { ColourSettings } from './colour-settings.js';
import { gradientLinear, gradientPosition } from './exterior-gradients.js';
import { hexToLinear } from './oklab.js';
import { periodLinear } from './period-palette.js';
import { shadeSamples } from './shade-samples.js';

/** How interior (basin) samples of a Julia plate are coloured. */
export type BasinStyle = 'point' | 'time' | 'point-time';
export const BASIN_STYLES: readonly BasinStyle[] = ['point', 'time', 'point-time'];

/** Attraction-time bands per unit of ln(1 + time / P) in the `point-time` style. */
const TIME_BANDS = 1.6;

/**
 * Colours samples of the dynamical plane into linear-light sRGB (3 values a
 * sample), like shadeSamples for the exterior and undecided samples (the same
 * gradient, edge shading from the distance estimate and undecided colour).
 * Interior samples are coloured by their class j (the cycle point w_j they
 * are attracted to under f^P) with the categorical period palette read as a
 * palette of classes (class j takes the colour of "period" j + 1), and by
 * the attraction time tau:
 * - `point`: the flat class colour;
 * - `time`: the exterior gradient at tau (a single colour field over all classes);
 * - `point-time`: the class colour, darkened in soft bands of
 *   ln(1 + tau / P) so the level sets of the attraction time show.
 * Colour style `solid` gives every interior sample `interiorColour`.
 */
export function shadeJuliaSamples(
  samples: JuliaSampleSet,
  offset: number,
  count: number,
  pixelSpacing: number,
  settings: ColourSettings,
  style: BasinStyle,
  basinPeriod: number,
  out: Float64Array,
): void {
  shadeSamples(samples, offset, count, pixelSpacing, settings, out);
  const solid = settings.interior === 'solid' ? hexToLinear(settings.interiorColour, new Float64Array(3)) : null;
  const c = new Float64Array(3);
  const P = Math.max(1, basinPeriod);
  for (let i = 0; i < count; i++) {
    const k = offset + i;
    const j = samples.basin[k]!;
    if (samples.period[k]! <= 0 || j < 0) continue;
    const tau = samples.smooth[k]! > 0 ? samples.smooth[k]! : 0;
    if (solid !== null) c.set(solid);
    else if (style === 'time') gradientLinear(settings.exterior, gradientPosition(tau, settings.countScale, settings.cycle, settings.offset), c);
    else {
      periodLinear(j + 1, c);
      if (style === 'point-time') {
        const u = Math.log1p(tau / P) * TIME_BANDS;
        const f = 0.62 + 0.38 * (0.5 + 0.5 * Math.cos(2 * Math.PI * u));
        c[0] = c[0]! * f;
        c[1] = c[1]! * f;
        c[2] = c[2]! * f;
      }
    }
    out[3 * i] = c[0]!;
    out[3 * i + 1] = c[1]!;
    out[3 * i + 2] = c[2]!;
  }
}
