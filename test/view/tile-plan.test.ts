import { describe, expect, it } from 'vitest';
import { planStrips } from '../../src/view/tile-plan.js';

describe('planStrips', () => {
  it('covers every pixel exactly once for awkward sizes', () => {
    for (const [w, h, t, rows] of [
      [100, 37, 16, 32],
      [1, 1, 64, 64],
      [257, 300, 64, 128],
      [64, 64, 64, 1],
    ] as const) {
      const seen = new Uint8Array(w * h);
      for (const s of planStrips(w, h, t, rows)) {
        for (const tile of s.tiles) {
          expect(tile.y0).toBeGreaterThanOrEqual(s.y0);
          expect(tile.y0 + tile.h).toBeLessThanOrEqual(s.y0 + s.h);
          for (let j = tile.y0; j < tile.y0 + tile.h; j++) for (let i = tile.x0; i < tile.x0 + tile.w; i++) seen[j * w + i]!++;
        }
      }
      expect(seen.every((v) => v === 1)).toBe(true);
    }
  });

  it('numbers tiles row-major over the whole image and strips hold whole tile rows', () => {
    const strips = planStrips(130, 130, 64, 64);
    expect(strips.map((s) => s.h)).toEqual([64, 64, 2]);
    expect(strips.flatMap((s) => s.tiles.map((t) => t.index))).toEqual([0, 1, 2, 3, 4, 5, 6, 7, 8]);
  });
});
