import { createSampleSet } from '../plane/sample-set.js';
import { DEFAULT_COLOUR_SETTINGS, type ColourSettings, type InteriorStyle } from './colour-settings.js';
import { gradientLinear, type ExteriorGradientName } from './exterior-gradients.js';
import { customGradientLinear, prepareGradient, type GradientStop } from './gradient-stops.js';
import { firstPeriods, layoutLegend, type LegendFont } from './legend.js';
import { linearToSrgb } from './oklab.js';
import { shadeSamples } from './shade-samples.js';

/**
 * Swatches for `quadatlas palettes`: small RGBA images (8 bits, sRGB, opaque)
 * of each exterior gradient, each interior style and the period palette,
 * drawn through the same colour functions the renderer uses. Text, where
 * there is any, is the legend's (DejaVu outlines filled by coverage), so
 * no system font is involved and the bytes are the same on every machine.
 */
export interface Swatch {
  readonly width: number;
  readonly height: number;
  /** width * height * 4 bytes, R, G, B, A. */
  readonly rgba: Uint8Array;
}

function encode(linear: ArrayLike<number>, i: number): number {
  return Math.round(linearToSrgb(Math.min(1, Math.max(0, linear[i]!))) * 255);
}

/** One cycle of a gradient, t = (x + 1/2) / width left to right, the same in every row. */
export function gradientSwatch(gradient: ExteriorGradientName | readonly GradientStop[], width = 512, height = 48): Swatch {
  const rgba = new Uint8Array(width * height * 4);
  const c = [0, 0, 0];
  const prepared = typeof gradient === 'string' ? null : prepareGradient(gradient);
  for (let x = 0; x < width; x++) {
    const t = (x + 0.5) / width;
    if (prepared === null) gradientLinear(gradient as ExteriorGradientName, t, c);
    else customGradientLinear(prepared, t, c);
    for (let y = 0; y < height; y++) {
      const k = 4 * (y * width + x);
      rgba[k] = encode(c, 0);
      rgba[k + 1] = encode(c, 1);
      rgba[k + 2] = encode(c, 2);
      rgba[k + 3] = 255;
    }
  }
  return { width, height, rgba };
}

/**
 * An interior style on `periods` side by side: within each period's block the
 * multiplier's modulus grows from 0 (left) to 1 (right) and its internal
 * angle from 0 (top) to 1 (bottom), shaded by shadeSamples with no edge.
 */
export function interiorSwatch(style: InteriorStyle, periods: readonly number[] = [1, 2, 3, 4], block = 96, height = 48): Swatch {
  const width = block * periods.length;
  const n = width * height;
  const s = createSampleSet(n);
  for (let y = 0; y < height; y++) {
    for (let x = 0; x < width; x++) {
      const k = y * width + x;
      const m = ((x % block) + 0.5) / block;
      const a = 2 * Math.PI * ((y + 0.5) / height);
      s.period[k] = periods[Math.floor(x / block)]!;
      s.mulRe[k] = m * Math.cos(a);
      s.mulIm[k] = m * Math.sin(a);
      s.distance[k] = Number.NaN;
    }
  }
  const settings: ColourSettings = { ...DEFAULT_COLOUR_SETTINGS, interior: style, interiorColour: '#6f7d8c' };
  const linear = new Float64Array(3 * n);
  shadeSamples(s, 0, n, 1, settings, linear);
  const rgba = new Uint8Array(4 * n);
  for (let k = 0; k < n; k++) {
    rgba[4 * k] = encode(linear, 3 * k);
    rgba[4 * k + 1] = encode(linear, 3 * k + 1);
    rgba[4 * k + 2] = encode(linear, 3 * k + 2);
    rgba[4 * k + 3] = 255;
  }
  return { width, height, rgba };
}

/** The period colours 1..count as a legend panel (swatch and number each), over white. */
export function periodSwatch(font: LegendFont, count = 24, dpi = 200): Swatch {
  const settings: ColourSettings = { ...DEFAULT_COLOUR_SETTINGS, legend: 'inset', legendCorner: 'top-left', legendPeriods: count };
  const legend = layoutLegend(settings, 100000, 100000, dpi, firstPeriods(count), font)!;
  const { width, height } = legend;
  const rgba = new Uint8Array(width * height * 4);
  const c = [1, 1, 1];
  for (let k = 0; k < width * height; k++) {
    const a = legend.rgba[4 * k + 3]!;
    for (let ch = 0; ch < 3; ch++) c[ch] = legend.rgba[4 * k + ch]! + (1 - a);
    rgba[4 * k] = encode(c, 0);
    rgba[4 * k + 1] = encode(c, 1);
    rgba[4 * k + 2] = encode(c, 2);
    rgba[4 * k + 3] = 255;
  }
  return { width, height, rgba };
}
