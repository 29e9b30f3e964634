import { oklabToLinear, oklchToOklab, type Vec3 } from './oklab.js';

/**
 * Exterior gradients: cyclic colour ramps for escaped samples, indexed by the
 * smooth escape count mu (docs/methods.md A1) through a periodic transform.
 *
 * Each gradient is a handful of OKLCh stops spaced evenly around one cycle;
 * between stops the colour is interpolated linearly in OKLab (Ottosson 2020),
 * where equal steps look roughly equally large, so bands stay even
 * (docs/methods.md F3). The last stop blends back into the first, so a cycle has no
 * seam. Interpolating in OKLCh was dropped: its hue path swings through
 * unrelated hues between distant stops. Stops were chosen by hand for this
 * project; the coloured ones keep lightness mostly below 0.6 so the light
 * period palette (period-palette.ts) stands out inside.
 *
 * Names (ours):
 * - `tidepool`: deep navy, slate teal, sea-glass, dusk blue.
 * - `heather`: peat brown, heather purple, bracken gold, moss.
 * - `brass`: ink, verdigris, brass, bronze.
 * - `vellum`: plain monochrome for print: paper white with a faint grey
 *   ripple, no chroma.
 */
export const EXTERIOR_GRADIENTS = {
  tidepool: [
    [0.22, 0.05, 258],
    [0.4, 0.065, 215],
    [0.6, 0.08, 178],
    [0.34, 0.07, 268],
  ],
  heather: [
    [0.24, 0.035, 55],
    [0.44, 0.11, 330],
    [0.66, 0.11, 82],
    [0.38, 0.06, 132],
  ],
  brass: [
    [0.19, 0.02, 262],
    [0.46, 0.07, 186],
    [0.7, 0.1, 92],
    [0.36, 0.065, 58],
  ],
  vellum: [
    [0.97, 0, 0],
    [0.88, 0, 0],
  ],
} as const satisfies Record<string, ReadonlyArray<readonly [number, number, number]>>;

export type ExteriorGradientName = keyof typeof EXTERIOR_GRADIENTS;

/** One line about each gradient, for `quadatlas palettes` and --help. */
export const EXTERIOR_GRADIENT_NOTES: Readonly<Record<ExteriorGradientName, string>> = {
  tidepool: 'deep navy, slate teal, sea-glass, dusk blue',
  heather: 'peat brown, heather purple, bracken gold, moss',
  brass: 'ink, verdigris, brass, bronze',
  vellum: 'monochrome for print: paper white with a faint grey ripple',
};
export const EXTERIOR_GRADIENT_NAMES = Object.keys(EXTERIOR_GRADIENTS) as ExteriorGradientName[];

/** Stops converted once to OKLab, flat [L, a, b, L, a, b, ...] per gradient (never mutated). */
const STOPS_OKLAB: Readonly<Record<ExteriorGradientName, Float64Array>> = (() => {
  const table = {} as Record<ExteriorGradientName, Float64Array>;
  for (const name of EXTERIOR_GRADIENT_NAMES) {
    const stops = EXTERIOR_GRADIENTS[name];
    const lab = new Float64Array(3 * stops.length);
    const t = [0, 0, 0];
    stops.forEach(([L, C, h], i) => {
      oklchToOklab(L, C, h, t);
      lab.set(t, 3 * i);
    });
    table[name] = lab;
  }
  return table;
})();

/**
 * The position in [0, 1) along a gradient for smooth count mu:
 * t = frac(u / cycle + offset), where u = ln(1 + mu) for `log` scale (bands
 * widen gently as mu grows, so deep zooms with mu in the thousands still show
 * several cycles) or u = mu for `linear` scale. cycle > 0 is in units of u.
 */
export function gradientPosition(mu: number, scale: 'log' | 'linear', cycle: number, offset: number): number {
  const m = mu > 0 ? mu : 0;
  const u = scale === 'log' ? Math.log1p(m) : m;
  const x = u / cycle + offset;
  const t = x - Math.floor(x);
  return t < 1 ? t : 0;
}

/** The OKLab colour at position t in [0, 1) of a gradient, written into out. */
export function gradientOklab<T extends Vec3>(name: ExteriorGradientName, t: number, out: T): T {
  const lab = STOPS_OKLAB[name];
  const n = lab.length / 3;
  const x = t * n;
  let i = Math.floor(x);
  if (i >= n) i = n - 1;
  if (i < 0) i = 0;
  const f = x - i;
  const j = i + 1 === n ? 0 : i + 1;
  for (let c = 0; c < 3; c++) {
    const a = lab[3 * i + c]!;
    out[c] = a + (lab[3 * j + c]! - a) * f;
  }
  return out;
}

/** The linear-light sRGB colour at position t of a gradient (clipped to [0, 1]). */
export function gradientLinear<T extends Vec3>(name: ExteriorGradientName, t: number, out: T): T {
  gradientOklab(name, t, out);
  oklabToLinear(out[0]!, out[1]!, out[2]!, out);
  for (let c = 0; c < 3; c++) {
    const v = out[c]!;
    out[c] = v < 0 ? 0 : v > 1 ? 1 : v;
  }
  return out;
}

/** The stops of a named gradient in OKLab, flat [L, a, b, ...] (shared; never write to it). */
export function gradientStopsOklab(name: ExteriorGradientName): Float64Array {
  return STOPS_OKLAB[name];
}

/**
 * gradientLinear on stops from gradientStopsOklab, written into out[o .. o + 2]
 * of a Float64Array: the same operations in the same order (so the same
 * doubles), in a form the shading loop calls with one array type only (the
 * generic Vec3 functions see both number[] and Float64Array, and V8 then
 * keeps their element access polymorphic).
 */
export function stopsLinear(lab: Float64Array, t: number, out: Float64Array, o: number): void {
  const n = lab.length / 3;
  const x = t * n;
  let i = Math.floor(x);
  if (i >= n) i = n - 1;
  if (i < 0) i = 0;
  const f = x - i;
  const j = i + 1 === n ? 0 : i + 1;
  const i3 = 3 * i,
    j3 = 3 * j;
  const L0 = lab[i3]!,
    a0 = lab[i3 + 1]!,
    b0 = lab[i3 + 2]!;
  const L = L0 + (lab[j3]! - L0) * f;
  const a = a0 + (lab[j3 + 1]! - a0) * f;
  const b = b0 + (lab[j3 + 2]! - b0) * f;
  // oklabToLinear (oklab.ts), term for term.
  const l1 = L + 0.3963377774 * a + 0.2158037573 * b;
  const m1 = L - 0.1055613458 * a - 0.0638541728 * b;
  const s1 = L - 0.0894841775 * a - 1.291485548 * b;
  const l3 = l1 * l1 * l1;
  const m3 = m1 * m1 * m1;
  const s3 = s1 * s1 * s1;
  const r = 4.0767416621 * l3 - 3.3077115913 * m3 + 0.2309699292 * s3;
  const g = -1.2684380046 * l3 + 2.6097574011 * m3 - 0.3413193965 * s3;
  const bl = -0.0041960863 * l3 - 0.7034186147 * m3 + 1.707614701 * s3;
  out[o] = r < 0 ? 0 : r > 1 ? 1 : r;
  out[o + 1] = g < 0 ? 0 : g > 1 ? 1 : g;
  out[o + 2] = bl < 0 ? 0 : bl > 1 ? 1 : bl;
}
