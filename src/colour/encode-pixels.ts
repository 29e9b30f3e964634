import { instantiateWasm } from '../plane/instantiate-wasm.js';
import { linearToSrgb } from './oklab.js';
import { WASM_BASE64 as SRGB8_WASM_BASE64 } from './wasm/encode-srgb8-bytes.js';

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
 * survey", J. Audio Eng. Soc. 40(5), 1992); docs/methods.md F4. The seed is the
 * absolute coordinate, so a pixel gets the same dither in any tiling.
 */
export function ditherAt(x: number, y: number, ch: number): number {
  const h = mix32(mix32(mix32(ch + 0x9e3779b9) ^ x) ^ y);
  const u1 = ((h & 0xffff) + 0.5) / 65536;
  const u2 = ((h >>> 16) + 0.5) / 65536;
  return u1 - u2;
}

/**
 * The sRGB transfer curve by table, for encoding: g(t) = 1.055 t^(5/6) - 0.055
 * sampled at TABLE_SIZE + 1 points of t = sqrt(v) in [0, 1] and interpolated
 * linearly. In t the curve is gentle where it is steep in v (near the start of
 * the power segment at v = 0.0031308, |g''| <= 4.3), so linear interpolation
 * is within h^2/8 max|g''| = 3.2e-8 of the curve (h = 1/4096);
 * TABLE_ERROR allows five times that. The table only decides which integer a
 * channel rounds to when that is certain: when the interval
 * [estimate - TABLE_ERROR, estimate + TABLE_ERROR] (scaled) rounds to one
 * integer, that is the integer the exact curve gives; otherwise (about 2% of
 * 16-bit channels, a few in 10^4 of 8-bit ones) the exact curve decides. So
 * the bytes are those of the exact curve, at a fraction of the cost of
 * Math.pow per channel (which took four times as long as the escape loop on
 * a whole-set plate). A polynomial in v was tried and dropped: near the
 * segment join it needs degree 9 for the same accuracy.
 */
const TABLE_SIZE = 4096;
export const TABLE_ERROR = 1.6e-7;
const POWER_FROM = 0.0031308;
const TABLE = (() => {
  const t = new Float64Array(TABLE_SIZE + 2);
  for (let k = 0; k <= TABLE_SIZE + 1; k++) t[k] = 1.055 * Math.pow(k / TABLE_SIZE, 5 / 6) - 0.055;
  return t;
})();

/** The table's estimate of linearToSrgb(v) for POWER_FROM < v < 1 (within TABLE_ERROR). */
export function srgbEstimate(v: number): number {
  const x = Math.sqrt(v) * TABLE_SIZE;
  const k = x | 0;
  const a = TABLE[k]!;
  return a + (x - k) * (TABLE[k + 1]! - a);
}

/**
 * Encodes linear-light RGB (3 doubles per pixel, `rows` rows of `width`
 * pixels, row-major) to sRGB integers in `out` (3 per pixel): clip to [0, 1],
 * apply the IEC 61966-2-1 transfer curve, then
 * - depth 8: add TPDF dither of about +/-1 LSB seeded by the absolute pixel
 *   coordinate (x0 + i, y0 + j), round, clip to 0..255; exact 0 and 1 are
 *   not dithered;
 * - depth 16: round to nearest, no dither (one step is below visibility).
 * NaN input encodes as 0. The result equals encoding with the exact curve
 * (linearToSrgb) channel for channel; the table above only saves time, and
 * so does `encoder` (createSrgb8Encoder, depth 8 only), which gives the same
 * bytes as the JS loop.
 */
export function encodePixels(
  linear: Float64Array,
  width: number,
  rows: number,
  x0: number,
  y0: number,
  depth: 8 | 16,
  out: Uint8Array | Uint16Array,
  encoder?: Srgb8Encoder,
): void {
  if (depth === 16) encode16(linear, width * rows * 3, out as Uint16Array);
  else if (encoder === undefined || !encoder.encode(linear, width, rows, x0, y0, out as Uint8Array)) encode8(linear, width, rows, x0, y0, out as Uint8Array);
}

/** Depth 16: round to nearest, no dither. */
function encode16(linear: Float64Array, n: number, out: Uint16Array): void {
  const max = 65535;
  const slack = TABLE_ERROR * max;
  for (let p = 0; p < n; p++) {
    const v = linear[p]!;
    let q: number;
    if (v > POWER_FROM && v < 0.999) {
      const e = srgbEstimate(v) * max;
      q = certainRound(e, slack);
      if (q < 0) q = Math.round(linearToSrgb(v) * max);
    } else {
      q = v >= 1 ? max : v > 0 ? Math.round(linearToSrgb(v) * max) : 0;
    }
    out[p] = q < 0 ? 0 : q > max ? max : q;
  }
}

/**
 * mix32 with the result left as a signed int32 (the same 32 bits), so the
 * caller's bit operations stay in integers.
 */
function mixBits(x: number): number {
  x ^= x >>> 16;
  x = Math.imul(x, 0x7feb352d);
  x ^= x >>> 15;
  x = Math.imul(x, 0x846ca68b);
  x ^= x >>> 16;
  return x | 0;
}

/**
 * Math.round of every value in [e - slack, e + slack] when they all round to
 * one integer, else -1 (then the caller decides with the exact curve).
 * floor(x + 0.5) equals Math.round(x) for every double x >= 0.5 (x + 0.5
 * either is exact or stays in x's binade without reaching an integer), so
 * the faster floor is used there; below 0.5 the answer is left to the caller.
 * The dither's difference of uniforms, (a + 1/2)/2^16 - (b + 1/2)/2^16, is
 * computed as (a - b)/2^16: both are exact, so they are the same double.
 */
function certainRound(e: number, slack: number): number {
  const lo = e - slack;
  if (!(lo >= 0.5)) return -1;
  const q = Math.floor(lo + 0.5);
  return q === Math.floor(e + slack + 0.5) ? q : -1;
}

/** The 8-bit rounding slack of the table (TABLE_ERROR in units of one step). */
const SLACK8 = TABLE_ERROR * 255;

/** The per-column halves s(x, ch) = mix32(mix32(ch + K) ^ x) of ditherAt for columns x0 .. x0 + width - 1, at seeds[3 i + ch]. */
function fillColumnSeeds(x0: number, width: number, seeds: Uint32Array): void {
  for (let ch = 0; ch < 3; ch++) {
    const base = mix32(ch + 0x9e3779b9);
    for (let i = 0; i < width; i++) seeds[3 * i + ch] = mix32(base ^ (x0 + i));
  }
}

/**
 * One channel at depth 8: linear value v of a pixel in row y whose column
 * and channel have the seed s(x, ch) (fillColumnSeeds), so that
 * mixBits(seed ^ y) is ditherAt(x, y, ch)'s hash.
 */
function encodeChannel8(v: number, seed: number, y: number): number {
  const max = 255;
  let q: number;
  if (v > POWER_FROM && v < 0.999) {
    // The power segment, away from white: the table decides unless the rounding is in doubt.
    const h = mixBits(seed ^ y);
    const shift = ((h & 0xffff) - (h >>> 16)) * (1 / 65536);
    const e = srgbEstimate(v) * max + shift;
    q = certainRound(e, SLACK8);
    if (q < 0) q = Math.round(linearToSrgb(v) * max + shift);
  } else if (v >= 1) {
    // v >= 1 maps to max exactly (1.055 - 0.055 rounds just below 1 in doubles); white stays undithered.
    q = max;
  } else if (v > 0) {
    const e = linearToSrgb(v) * max;
    if (e >= max) q = max;
    else {
      const h = mixBits(seed ^ y);
      q = Math.round(e + ((h & 0xffff) - (h >>> 16)) * (1 / 65536));
    }
  } else {
    // Exact black (and NaN) stays exact, so print blacks are clean.
    q = 0;
  }
  return q < 0 ? 0 : q > max ? max : q;
}

/**
 * Depth 8 with TPDF dither. ditherAt(x, y, ch) is mix32(s(x, ch) ^ y) with
 * s(x, ch) = mix32(mix32(ch + K) ^ x), so s is computed once per column and
 * channel, and each channel costs one mix32; the values are ditherAt's.
 */
function encode8(linear: Float64Array, width: number, rows: number, x0: number, y0: number, out: Uint8Array): void {
  const seeds = new Uint32Array(width * 3);
  fillColumnSeeds(x0, width, seeds);
  for (let j = 0; j < rows; j++) {
    const y = y0 + j;
    const rowStart = 3 * j * width;
    for (let c = 0; c < 3 * width; c++) out[rowStart + c] = encodeChannel8(linear[rowStart + c]!, seeds[c]!, y);
  }
}

/** An 8-bit encoder with its own WebAssembly instance (createSrgb8Encoder), for one thread. */
export interface Srgb8Encoder {
  /** encode8's bytes into `out`; false (nothing written) when a row is wider than the module holds. */
  encode(linear: Float64Array, width: number, rows: number, x0: number, y0: number, out: Uint8Array): boolean;
}

/** What the compiled module (wasm/encode-srgb8.as) exports. */
interface Srgb8Exports {
  readonly memory: { readonly buffer: ArrayBuffer };
  capacity(): number;
  linearPointer(): number;
  seedsPointer(): number;
  outPointer(): number;
  doubtPointer(): number;
  tablePointer(): number;
  tableLength(): number;
  encode8(width: number, rows: number, y0: number, slack: number): number;
}

/**
 * The WebAssembly SIMD twin of encode8 (wasm/encode-srgb8.as): the table path
 * of the power segment, the clip at white and black, four channels at a
 * time; every channel it leaves in doubt is finished here by encodeChannel8,
 * so the bytes are encode8's (test/colour/encode-pixels.test.ts compares
 * them). Returns undefined without WebAssembly SIMD.
 */
export function createSrgb8Encoder(): Srgb8Encoder | undefined {
  const exports = instantiateWasm(SRGB8_WASM_BASE64);
  if (exports === undefined) return undefined;
  const wasm = exports as Srgb8Exports;
  const capacity = wasm.capacity();
  const buffer = wasm.memory.buffer;
  const lin = new Float64Array(buffer, wasm.linearPointer(), capacity);
  const seeds = new Uint32Array(buffer, wasm.seedsPointer(), capacity);
  const bytes = new Uint8Array(buffer, wasm.outPointer(), capacity);
  const doubt = new Int32Array(buffer, wasm.doubtPointer(), capacity);
  if (wasm.tableLength() !== TABLE.length) return undefined;
  new Float64Array(buffer, wasm.tablePointer(), TABLE.length).set(TABLE);
  return {
    encode(linear, width, rows, x0, y0, out) {
      const n3 = 3 * width;
      if (n3 > capacity || n3 === 0) return n3 === 0;
      fillColumnSeeds(x0, width, seeds);
      const chunk = Math.floor(capacity / n3);
      for (let j0 = 0; j0 < rows; j0 += chunk) {
        const m = Math.min(chunk, rows - j0);
        const base = j0 * n3;
        lin.set(linear.subarray(base, base + m * n3));
        const doubts = wasm.encode8(width, m, y0 + j0, SLACK8);
        out.set(bytes.subarray(0, m * n3), base);
        for (let d = 0; d < doubts; d++) {
          const p = doubt[d]!;
          const c = p % n3;
          out[base + p] = encodeChannel8(linear[base + p]!, seeds[c]!, y0 + j0 + (p - c) / n3);
        }
      }
      return true;
    },
  };
}
