import { describe, expect, it } from 'vitest';
import { planPyramid, pyramidTileAt } from '../../src/view/pyramid-plan.js';

describe('planPyramid', () => {
  it('planPyramid(1000, 700, 256) has levels 250x175, 500x350, 1000x700 with 1 + 4 + 12 tiles', () => {
    // Level sizes ceil(W / s) x ceil(H / s) (IIIF Image API 3.0, section 5.6 "scaleFactors"); the
    // smallest level of a 1000x700 image is 250,175 in sharp's iiif3 tree too (ecosystem.md section 1).
    const plan = planPyramid(1000, 700, 256);
    expect(plan.levels.map((l) => [l.scale, l.width, l.height, l.cols, l.rows])).toEqual([
      [4, 250, 175, 1, 1],
      [2, 500, 350, 2, 2],
      [1, 1000, 700, 4, 3],
    ]);
    expect(plan.tileCount).toBe(17);
  });

  it('planPyramid stops at the first level that fits one tile, and a one-tile image has one level', () => {
    expect(planPyramid(256, 256, 256).levels.map((l) => l.scale)).toEqual([1]);
    expect(planPyramid(257, 10, 256).levels.map((l) => l.scale)).toEqual([2, 1]);
    expect(planPyramid(65536, 65536, 256).levels.map((l) => l.scale)).toEqual([256, 128, 64, 32, 16, 8, 4, 2, 1]);
    // 4^0 + 4^1 + ... + 4^8 tiles for a 65536^2 base in 256 tiles.
    expect(planPyramid(65536, 65536, 256).tileCount).toBe((4 ** 9 - 1) / 3);
  });

  it('pyramidTileAt: at every level the regions tile the base image exactly once, and tile sizes are ceil(region / s)', () => {
    for (const [W, H, T] of [
      [1000, 700, 256],
      [3001, 2001, 256],
      [129, 1, 16],
      [77, 300, 32],
    ] as const) {
      const plan = planPyramid(W, H, T);
      for (const level of plan.levels) {
        const cover = new Uint8Array(W * H);
        for (let k = 0; k < level.cols * level.rows; k++) {
          const t = pyramidTileAt(plan, level.first + k);
          expect(t.scale).toBe(level.scale);
          expect(t.w).toBe(Math.ceil(t.region.w / t.scale));
          expect(t.h).toBe(Math.ceil(t.region.h / t.scale));
          expect(t.region.x).toBe(t.x0 * t.scale);
          for (let y = t.region.y; y < t.region.y + t.region.h; y++) for (let x = t.region.x; x < t.region.x + t.region.w; x++) cover[y * W + x]! += 1;
        }
        expect(cover.every((c) => c === 1)).toBe(true);
      }
    }
  });

  it('pyramidTileAt numbers tiles coarsest level first, row-major, and rejects numbers out of range', () => {
    const plan = planPyramid(1000, 700, 256);
    expect(pyramidTileAt(plan, 0)).toMatchObject({ scale: 4, col: 0, row: 0, w: 250, h: 175 });
    expect(pyramidTileAt(plan, 2)).toMatchObject({ scale: 2, col: 1, row: 0, x0: 256, w: 244, h: 256 });
    expect(pyramidTileAt(plan, 16)).toMatchObject({ scale: 1, col: 3, row: 2, region: { x: 768, y: 512, w: 232, h: 188 } });
    expect(() => pyramidTileAt(plan, 17)).toThrow(RangeError);
    expect(() => pyramidTileAt(plan, -1)).toThrow(RangeError);
  });
});
