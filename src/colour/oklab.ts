/**
 * Colour-space conversions: the sRGB transfer function, linear sRGB <-> OKLab,
 * and OKLab <-> OKLCh.
 *
 * Sources:
 * - sRGB transfer function: IEC 61966-2-1:1999 (Amendment 1, 2003), the
 *   piecewise curve with a linear toe below 0.0031308 (linear) / 0.04045
 *   (encoded), exponent 2.4, offset 0.055.
 * - OKLab: Björn Ottosson, "A perceptual color space for image processing"
 *   (2020), https://bottosson.github.io/posts/oklab/ . Both 3x3 matrix pairs
 *   below (linear sRGB -> LMS and cube-rooted LMS -> Lab, and their inverses)
 *   are the ones published in that post, to the 10 digits given there.
 * - OKLCh is the polar form of OKLab (C = hypot(a, b), h = atan2(b, a)); hue is
 *   in degrees in [0, 360), as CSS Color 4 writes it.
 *
 * Determinism: colour is computed once per sample, in the worker, always through
 * these same functions in the same order, so a plate's bytes depend only on the
 * sheet. The transcendental functions used in src/colour/ (Math.pow, cbrt,
 * atan2, cos, sin, log1p, tanh; hypot is a scaled square root) are V8's own
 * ports of fdlibm, not the host C library, so they agree across machines
 * running the same Node version; a change of engine could move a value by an
 * ulp, far below one 16-bit step. The 8-bit dither is integer-only.
 */

/** Something a conversion can write three numbers into (Float64Array, number[]). */
export type Vec3 = { [index: number]: number };

/** Decodes one sRGB-encoded channel value (0..1) to linear light (IEC 61966-2-1). */
export function srgbToLinear(v: number): number {
  return v <= 0.04045 ? v / 12.92 : Math.pow((v + 0.055) / 1.055, 2.4);
}

/** Encodes one linear-light channel value (0..1) to sRGB (IEC 61966-2-1). */
export function linearToSrgb(v: number): number {
  return v <= 0.0031308 ? 12.92 * v : 1.055 * Math.pow(v, 1 / 2.4) - 0.055;
}

/** Linear sRGB -> OKLab (Ottosson 2020). Writes [L, a, b] into out and returns it. */
export function linearToOklab<T extends Vec3>(r: number, g: number, b: number, out: T): T {
  const l = Math.cbrt(0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b);
  const m = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b);
  const s = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b);
  out[0] = 0.2104542553 * l + 0.793617785 * m - 0.0040720468 * s;
  out[1] = 1.9779984951 * l - 2.428592205 * m + 0.4505937099 * s;
  out[2] = 0.0259040371 * l + 0.7827717662 * m - 0.808675766 * s;
  return out;
}

/**
 * OKLab -> linear sRGB (Ottosson 2020). Writes [r, g, b] into out and returns
 * it. The result is not clipped: colours outside the sRGB gamut give channels
 * below 0 or above 1 (see `inSrgbGamut`).
 */
export function oklabToLinear<T extends Vec3>(L: number, a: number, b: number, out: T): T {
  const l1 = L + 0.3963377774 * a + 0.2158037573 * b;
  const m1 = L - 0.1055613458 * a - 0.0638541728 * b;
  const s1 = L - 0.0894841775 * a - 1.291485548 * b;
  const l = l1 * l1 * l1;
  const m = m1 * m1 * m1;
  const s = s1 * s1 * s1;
  out[0] = 4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s;
  out[1] = -1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s;
  out[2] = -0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s;
  return out;
}

/** OKLab -> OKLCh: [L, C, h] with h in degrees, [0, 360). Aliasing-safe. */
export function oklabToOklch<T extends Vec3>(L: number, a: number, b: number, out: T): T {
  const C = Math.hypot(a, b);
  let h = (Math.atan2(b, a) * 180) / Math.PI;
  if (h < 0) h += 360;
  out[0] = L;
  out[1] = C;
  out[2] = h;
  return out;
}

/** OKLCh -> OKLab; h in degrees. Aliasing-safe. */
export function oklchToOklab<T extends Vec3>(L: number, C: number, h: number, out: T): T {
  const rad = (h * Math.PI) / 180;
  out[0] = L;
  out[1] = C * Math.cos(rad);
  out[2] = C * Math.sin(rad);
  return out;
}

/** sRGB-encoded (0..1 per channel) -> OKLab. */
export function srgbToOklab<T extends Vec3>(r: number, g: number, b: number, out: T): T {
  return linearToOklab(srgbToLinear(r), srgbToLinear(g), srgbToLinear(b), out);
}

/** OKLCh -> linear sRGB (unclipped). */
export function oklchToLinear<T extends Vec3>(L: number, C: number, h: number, out: T): T {
  oklchToOklab(L, C, h, out);
  return oklabToLinear(out[0]!, out[1]!, out[2]!, out);
}

/** True when every channel of a linear colour lies in [-tol, 1 + tol]. */
export function inSrgbGamut(r: number, g: number, b: number, tol = 1e-9): boolean {
  return r >= -tol && r <= 1 + tol && g >= -tol && g <= 1 + tol && b >= -tol && b <= 1 + tol;
}

/** Euclidean distance in OKLab, the colour difference Ottosson's post proposes. */
export function oklabDistance(p: ArrayLike<number>, q: ArrayLike<number>): number {
  return Math.hypot(p[0]! - q[0]!, p[1]! - q[1]!, p[2]! - q[2]!);
}

/**
 * The largest chroma C in [0, cap] such that OKLCh (L, C, h) lies inside the
 * sRGB gamut, found by 40 bisection steps (deterministic; error < cap * 2^-40).
 */
export function maxChromaInGamut(L: number, h: number, cap = 0.4): number {
  const t: number[] = [0, 0, 0];
  let lo = 0;
  let hi = cap;
  oklchToLinear(L, hi, h, t);
  if (inSrgbGamut(t[0]!, t[1]!, t[2]!, 0)) return hi;
  for (let i = 0; i < 40; i++) {
    const mid = 0.5 * (lo + hi);
    oklchToLinear(L, mid, h, t);
    if (inSrgbGamut(t[0]!, t[1]!, t[2]!, 0)) lo = mid;
    else hi = mid;
  }
  return lo;
}

/**
 * Parses '#rrggbb' (sRGB, as a sheet writes colours) into linear light.
 * The caller validates the string (colour-settings.ts); here a malformed
 * string is a programming error.
 */
export function hexToLinear<T extends Vec3>(hex: string, out: T): T {
  if (!/^#[0-9a-fA-F]{6}$/.test(hex)) throw new Error(`not a #rrggbb colour: ${hex}`);
  for (let c = 0; c < 3; c++) out[c] = srgbToLinear(parseInt(hex.slice(1 + 2 * c, 3 + 2 * c), 16) / 255);
  return out;
}

/** Linear light -> '#rrggbb' (clipped to the gamut, rounded to 8 bits, lower case). */
export function linearToHex(r: number, g: number, b: number): string {
  let s = '#';
  for (const v of [r, g, b]) {
    const q = Math.round(linearToSrgb(Math.min(1, Math.max(0, v))) * 255);
    s += q.toString(16).padStart(2, '0');
  }
  return s;
}
