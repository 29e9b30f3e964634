import { describe, expect, it } from 'vitest';
import { filterScanline } from '../../src/io/png-filter.js';

/** Paeth's predictor as the PNG specification writes it (W3C PNG 2nd ed., 9.4): p = a + b - c, nearest of a, b, c, ties in that order. */
function specPaeth(a: number, b: number, c: number): number {
  const p = a + b - c;
  const pa = Math.abs(p - a),
    pb = Math.abs(p - b),
    pc = Math.abs(p - c);
  return pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
}

describe('filterScanline', () => {
  it('with filter 4 writes cur - Paeth(a, b, c) mod 256 for every byte, as the PNG specification defines it', () => {
    // Rows of random bytes, of runs (many ties between a, b and c) and of the extremes 0 and 255.
    let s = 99;
    const next = (): number => ((s = (Math.imul(s, 1103515245) + 12345) >>> 0) >>> 24) & 0xff;
    for (const bpp of [3, 6]) {
      for (const kind of ['random', 'runs', 'extremes']) {
        const n = 3 * 401;
        const cur = new Uint8Array(n);
        const prev = new Uint8Array(n);
        for (let i = 0; i < n; i++) {
          const r = next();
          cur[i] = kind === 'random' ? r : kind === 'runs' ? (i >> 4) * 7 : r & 1 ? 255 : 0;
          prev[i] = kind === 'random' ? next() : kind === 'runs' ? (i >> 3) * 5 : next() & 1 ? 255 : 0;
        }
        const out = new Uint8Array(n + 3);
        expect(filterScanline(out, 2, cur, prev, bpp, 4)).toBe(4);
        expect(out[2]).toBe(4);
        const want: number[] = [];
        for (let i = 0; i < n; i++) want.push((cur[i]! - specPaeth(i >= bpp ? cur[i - bpp]! : 0, prev[i]!, i >= bpp ? prev[i - bpp]! : 0)) & 0xff);
        expect(Array.from(out.subarray(3, 3 + n)), `${kind}, bpp ${bpp}`).toEqual(want);
      }
    }
  });

  it('with filter 4 predicts every one of the 2^24 triples (a, b, c) as the specification does', () => {
    // bpp 1, odd bytes: a = cur[2j] and c = prev[2j] run over one value each row, b = prev[2j + 1] over all 256.
    const cur = new Uint8Array(512);
    const prev = new Uint8Array(512);
    const out = new Uint8Array(513);
    let mismatches = 0;
    for (let a = 0; a < 256; a++) {
      for (let c = 0; c < 256; c++) {
        for (let b = 0; b < 256; b++) {
          cur[2 * b] = a;
          prev[2 * b] = c;
          prev[2 * b + 1] = b;
        }
        filterScanline(out, 0, cur, prev, 1, 4);
        for (let b = 0; b < 256; b++) if (out[2 + 2 * b] !== (-specPaeth(a, b, c) & 0xff)) mismatches++;
      }
    }
    expect(mismatches).toBe(0);
  });
});
