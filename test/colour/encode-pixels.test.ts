import { describe, expect, it } from 'vitest';
import { createSrgb8Encoder, ditherAt, encodePixels, mix32, srgbEstimate, TABLE_ERROR } from '../../src/colour/encode-pixels.js';
import { linearToSrgb, srgbToLinear } from '../../src/colour/oklab.js';

describe('encodePixels', () => {
  it('16-bit: encodes known linear values exactly (IEC 61966-2-1, hand-evaluated)', () => {
    // linear 0.5 -> sRGB 0.7353569830524495 -> 0.73535698 * 65535 = 48191.9... -> 48192
    // linear 0.0031308 -> 12.92 * 0.0031308 = 0.04044994 -> * 65535 = 2650.87 -> 2651
    // linear 0.001 -> 0.01292 * 65535 = 846.71 -> 847
    const lin = new Float64Array([0, 1, 0.5, 0.0031308, 0.001, 2, -1, Number.NaN, 1]);
    const out = new Uint16Array(9);
    encodePixels(lin, 3, 1, 0, 0, 16, out);
    expect(Array.from(out)).toEqual([0, 65535, 48192, 2651, 847, 65535, 0, 0, 65535]);
  });

  it('16-bit: round-trips every 16-bit code through srgbToLinear', () => {
    const n = 65536;
    const lin = new Float64Array(3 * n);
    for (let v = 0; v < n; v++) lin[3 * v] = lin[3 * v + 1] = lin[3 * v + 2] = srgbToLinear(v / 65535);
    const out = new Uint16Array(3 * n);
    encodePixels(lin, 256, 256, 0, 0, 16, out);
    for (let v = 0; v < n; v += 1) if (out[3 * v] !== v) expect(out[3 * v]).toBe(v);
  });

  it('8-bit: dither has mean error within 0.01 LSB on a flat field of 128 x 128', () => {
    // Target 100.3 in 8-bit sRGB units: undithered rounding would give 100 everywhere (bias -0.3).
    const target = 100.3;
    const lin = new Float64Array(3 * 128 * 128).fill(srgbToLinear(target / 255));
    const out = new Uint8Array(lin.length);
    encodePixels(lin, 128, 128, 5000, 7000, 8, out);
    let sum = 0;
    const seen = new Set<number>();
    for (const v of out) {
      sum += v;
      seen.add(v);
    }
    // TPDF of +/-1 LSB spreads 100.3 over 99..101 only.
    expect([...seen].sort((a, b) => a - b)).toEqual([99, 100, 101]);
    // Standard error of the mean: sigma ~ 0.5 LSB over 49152 values -> ~0.002; 0.01 is 4+ sigma.
    expect(Math.abs(sum / out.length - target)).toBeLessThan(0.01);
  });

  it('8-bit: the same pixel gets the same byte in two different tilings', () => {
    const W = 37;
    const H = 23;
    const lin = new Float64Array(3 * W * H);
    for (let k = 0; k < lin.length; k++) lin[k] = ((k * 7919) % 1000) / 1000;
    const whole = new Uint8Array(lin.length);
    encodePixels(lin, W, H, 0, 0, 8, whole);
    // Re-encode as tiles of 10 x 6 at their absolute offsets.
    for (let ty = 0; ty < H; ty += 6)
      for (let tx = 0; tx < W; tx += 10) {
        const w = Math.min(10, W - tx);
        const h = Math.min(6, H - ty);
        const tile = new Float64Array(3 * w * h);
        for (let j = 0; j < h; j++) tile.set(lin.subarray(3 * ((ty + j) * W + tx), 3 * ((ty + j) * W + tx + w)), 3 * j * w);
        const bytes = new Uint8Array(tile.length);
        encodePixels(tile, w, h, tx, ty, 8, bytes);
        for (let j = 0; j < h; j++) for (let q = 0; q < 3 * w; q++) expect(bytes[3 * j * w + q]).toBe(whole[3 * ((ty + j) * W + tx) + q]);
      }
  });

  it('8-bit: exact black and white are not dithered', () => {
    const lin = new Float64Array(3 * 64).fill(0);
    lin.fill(1, 96);
    const out = new Uint8Array(lin.length);
    encodePixels(lin, 64, 1, 0, 0, 8, out);
    expect(out.subarray(0, 96).every((v) => v === 0)).toBe(true);
    expect(out.subarray(96).every((v) => v === 255)).toBe(true);
  });
});

describe('ditherAt', () => {
  it('is triangular on (-1, 1): mean ~0, variance ~1/6', () => {
    // TPDF as the difference of two U(0,1): mean 0, variance 1/12 + 1/12 = 1/6 (exact algebra).
    let s = 0;
    let s2 = 0;
    let inner = 0;
    let worst = 0;
    const n = 200 * 200;
    for (let y = 0; y < 200; y++)
      for (let x = 0; x < 200; x++) {
        const d = ditherAt(x, y, 1);
        worst = Math.max(worst, Math.abs(d));
        s += d;
        s2 += d * d;
        if (Math.abs(d) < 0.5) inner++;
      }
    expect(worst).toBeLessThan(1);
    // Tolerances: about 4 standard errors for n = 40000 (sd of d is 0.41, so SE of the mean ~0.002).
    expect(Math.abs(s / n)).toBeLessThan(0.01);
    expect(Math.abs(s2 / n - 1 / 6)).toBeLessThan(0.01);
    // P(|d| < 1/2) for the triangle on (-1, 1) is 1 - (1/2)^2 = 3/4.
    expect(Math.abs(inner / n - 0.75)).toBeLessThan(0.01);
  });

  it('mix32 avalanches: flipping one input bit flips about half (16 of 32) of the output bits', () => {
    // The avalanche criterion Wellons' hash prospector optimises (nullprogram.com/blog/2018/07/31).
    let flips = 0;
    let trials = 0;
    for (let x = 1; x < 2000; x += 7)
      for (let bit = 0; bit < 32; bit++) {
        let d = (mix32(x) ^ mix32(x ^ (1 << bit))) >>> 0;
        while (d) {
          flips += d & 1;
          d >>>= 1;
        }
        trials++;
      }
    expect(Math.abs(flips / trials - 16)).toBeLessThan(0.3);
    expect(mix32(2 ** 32 + 1)).toBe(mix32(1));
  });
});

describe('encodePixels by table', () => {
  // The reference: the IEC 61966-2-1 curve evaluated with Math.pow for every channel, as encodePixels did
  // before the table (the bytes must not change).
  function reference(linear: Float64Array, width: number, rows: number, x0: number, y0: number, depth: 8 | 16): number[] {
    const max = depth === 16 ? 65535 : 255;
    const out: number[] = [];
    for (let j = 0; j < rows; j++) {
      for (let i = 0; i < width; i++) {
        for (let ch = 0; ch < 3; ch++) {
          const v = linear[3 * (j * width + i) + ch]!;
          const f = v <= 0.0031308 ? 12.92 * v : 1.055 * Math.pow(v, 1 / 2.4) - 0.055;
          const e = v >= 1 ? max : v > 0 ? f * max : 0;
          let q = depth === 16 || e <= 0 || e >= max ? Math.round(e) : Math.round(e + ditherAt(x0 + i, y0 + j, ch));
          q = Math.min(max, Math.max(0, q));
          out.push(q);
        }
      }
    }
    return out;
  }

  it('srgbEstimate stays within a quarter of TABLE_ERROR of the exact curve over the power segment', () => {
    let worst = 0;
    for (let k = 0; k <= 2_000_000; k++) {
      const v = 0.0031309 + (k / 2_000_000) * (0.999 - 0.0031309);
      worst = Math.max(worst, Math.abs(srgbEstimate(v) - linearToSrgb(v)));
    }
    expect(worst).toBeLessThan(TABLE_ERROR / 4);
  });

  for (const depth of [8, 16] as const) {
    it(`${depth}-bit: gives the bytes of the exact curve, also for values that encode next to a rounding boundary`, () => {
      const width = 256;
      const rows = 64;
      const linear = new Float64Array(width * rows * 3);
      let h = 12345;
      const max = depth === 16 ? 65535 : 255;
      for (let k = 0; k < linear.length; k++) {
        h = mix32(h + k);
        const u = h / 4294967296;
        if (k % 3 === 0) {
          // Exactly on a half-way point of the encoded scale, decoded back to linear light (IEC 61966-2-1 inverse).
          const code = (Math.floor(u * (max - 1)) + 0.5) / max;
          linear[k] = code <= 0.04045 ? code / 12.92 : Math.pow((code + 0.055) / 1.055, 2.4);
        } else if (k % 3 === 1) linear[k] = u;
        else linear[k] = u * u * u; // dense near black, where the curve is steep
      }
      linear[0] = 0;
      linear[1] = 1;
      linear[2] = Number.NaN;
      linear[3] = 0.0031308;
      linear[4] = 0.999;
      linear[5] = 1.5;
      const out = depth === 16 ? new Uint16Array(linear.length) : new Uint8Array(linear.length);
      encodePixels(linear, width, rows, 7, 11, depth, out);
      expect(Array.from(out)).toEqual(reference(linear, width, rows, 7, 11, depth));
    });
  }

  describe('the WebAssembly 8-bit encoder (createSrgb8Encoder)', () => {
    const encoder = createSrgb8Encoder();
    it('loads on this Node (WebAssembly SIMD)', () => {
      expect(encoder).toBeDefined();
    });

    // Widths whose 3 w is not a multiple of the module's 4 lanes, and a 1000-pixel row whose 40 rows take several chunks.
    for (const [width, rows] of [
      [1, 7],
      [5, 3],
      [63, 17],
      [64, 64],
      [1000, 40],
    ] as const) {
      it(`${width} x ${rows}: the bytes of the exact curve with dither, also next to every rounding boundary`, () => {
        const x0 = 37;
        const y0 = 1201;
        const linear = new Float64Array(width * rows * 3);
        let h = 777 + width;
        for (let k = 0; k < linear.length; k++) {
          h = mix32(h + k);
          const u = h / 4294967296;
          const c = k % (3 * width);
          const [x, y, ch] = [x0 + Math.floor(c / 3), y0 + Math.floor(k / (3 * width)), c % 3];
          if (k % 4 === 0) {
            // Encoded value plus this pixel's dither exactly on a half-way point, decoded back to linear light
            // (IEC 61966-2-1 inverse): the table cannot settle these, so the exact curve must.
            const code = (Math.floor(u * 250) + 2.5 - ditherAt(x, y, ch)) / 255;
            linear[k] = code <= 0.04045 ? code / 12.92 : Math.pow((code + 0.055) / 1.055, 2.4);
          } else if (k % 4 === 1) linear[k] = u;
          else if (k % 4 === 2)
            linear[k] = u * u * u * u; // the toe and the steep start of the curve
          else linear[k] = [0, 1, Number.NaN, -0.25, 1.5, 0.0031308, 0.999, 0.9989999999999999, 5e-324, u][h % 10]!;
        }
        const out = new Uint8Array(linear.length).fill(7);
        expect(encoder!.encode(linear, width, rows, x0, y0, out)).toBe(true);
        expect(Array.from(out)).toEqual(reference(linear, width, rows, x0, y0, 8));
      });
    }

    it('declines a row wider than its buffer, leaving out untouched', () => {
      const out = new Uint8Array(3 * 20000);
      expect(encoder!.encode(new Float64Array(3 * 20000), 20000, 1, 0, 0, out)).toBe(false);
      expect(out.every((b) => b === 0)).toBe(true);
    });
  });
});
