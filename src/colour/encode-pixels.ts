import { linearToSrgb } from './oklab.js';

/**
 * A 32-bit integer mixer: "lowbias32" from Chris Wellons' hash prospector
 * (nullprogram.com/blog/2018/07/31, "Prospecting for Hash Functions"), an
 * xorshift-multiply avalanche over uint32. Integer-only, so identical on every
 * machine.
 */
export function mix32(x: number): number {
  x >>>= 0;
  x ^= x >>> 16;
  x = Math.imul(x, 0x7feb352d);
  x ^= x >>> 15;
  x = Math.imul(x, 0x846ca68b);
  x ^= x >>> 16;
  return x >>> 0;
}

/**
 * Triangular (TPDF) dither in (-1, 1) LSB for absolute pixel (x, y) and channel
 * ch: the difference of two independent uniforms taken from the two 16-bit
 * halves of one hash. Triangular rather than uniform dither makes the mean and
 * the variance of the quantisation error independent of the signal
 * (Lipshitz, Wannamaker & Vanderkooy, "Quantization and dither: a theoretical
 * survey", J. Audio Eng. Soc. 40(5), 1992); methods.md F4. The seed is the
 * absolute coordinate, so a pixel gets the same dither in any tiling.
 */
export function ditherAt(x: number, y: number, ch: number): number {
  const h = mix32(mix32(mix32(ch + 0x9e3779b9) ^ x) ^ y);
  const u1 = ((h & 0xffff) + 0.5) / 65536;
  const u2 = ((h >>> 16) + 0.5) / 65536;
  return u1 - u2;
}

/**
 * Encodes linear-light RGB (3 doubles per pixel, `rows` rows of `width`
 * pixels, row-major) to sRGB integers in `out` (3 per pixel): clip to [0, 1],
 * apply the IEC 61966-2-1 transfer curve, then
 * - depth 8: add TPDF dither of about +/-1 LSB seeded by the absolute pixel
 *   coordinate (x0 + i, y0 + j), round, clip to 0..255; exact 0 and 1 are
 *   not dithered;
 * - depth 16: round to nearest, no dither (one step is below visibility).
 * NaN input encodes as 0.
 */
export function encodePixels(
  linear: Float64Array,
  width: number,
  rows: number,
  x0: number,
  y0: number,
  depth: 8 | 16,
  out: Uint8Array | Uint16Array,
): void {
  const max = depth === 16 ? 65535 : 255;
  for (let j = 0; j < rows; j++) {
    const y = y0 + j;
    for (let i = 0; i < width; i++) {
      const x = x0 + i;
      const p = 3 * (j * width + i);
      for (let ch = 0; ch < 3; ch++) {
        const v = linear[p + ch]!;
        // v >= 1 maps to max exactly (1.055 - 0.055 rounds just below 1 in doubles).
        const e = v >= 1 ? max : v > 0 ? linearToSrgb(v) * max : 0;
        // Exact black and white stay exact (no dither), so print blacks are clean.
        let q = depth === 16 || e <= 0 || e >= max ? Math.round(e) : Math.round(e + ditherAt(x, y, ch));
        if (q < 0) q = 0;
        else if (q > max) q = max;
        out[p + ch] = q;
      }
    }
  }
}
