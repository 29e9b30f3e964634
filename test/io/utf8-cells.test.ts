import { describe, expect, it } from 'vitest';
import { utf8Cells } from '../../src/io/parquet-groups.js';

// Reference: the WHATWG TextEncoder, one call per cell (the encoding Parquet's UTF8 columns hold).
describe('utf8Cells', () => {
  it('gives each ASCII cell its own bytes', () => {
    const cells = ['-1.75487766624669276', '', '3/7', '1-2-4', '0.5e-300'];
    const got = utf8Cells(cells);
    expect(got.map((b) => Array.from(b))).toEqual(cells.map((c) => Array.from(new TextEncoder().encode(c))));
  });
  it('falls back to one encoding a cell when a cell is not ASCII', () => {
    const cells = ['1 → 2', 'abc', 'é'];
    const got = utf8Cells(cells);
    expect(got.map((b) => Array.from(b))).toEqual(cells.map((c) => Array.from(new TextEncoder().encode(c))));
    expect(got[0]!.length).toBe(7); // the arrow is 3 bytes in UTF-8 (U+2192)
  });
});
