/**
 * A survey tile is the crop of `plate` of its frame at its level, byte for
 * byte on the decoded pixels: both go through render/sheet-job.ts and
 * render/render-tile.ts, and a pixel depends only on its coordinates and the
 * sheet (docs/architecture.md, conventions). The plate here is rendered by
 * renderSheet, the function `quadatlas plate` calls, with a different tile
 * size, so a tiling-dependent pixel would show.
 */
import { readFileSync, rmSync } from 'node:fs';
import path from 'node:path';
import { PNG } from 'pngjs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { renderSheet } from '../../src/render/render-sheet.js';
import { frameSheet, juliaInsetSheet, surveyBase, TileService } from '../../src/serve/tile-service.js';
import { renderJuliaSheet } from '../../src/render/render-julia.js';
import type { Frame } from '../../src/serve/survey-params.js';
import { parseSheet, type Sheet } from '../../src/view/sheet.js';
import { tempDir } from '../helpers/run-cli.js';

let dir: string;
beforeAll(() => {
  dir = tempDir('quadatlas-survey-tiles-');
});
afterAll(() => rmSync(dir, { recursive: true, force: true }));

function decode(png: Buffer): { width: number; height: number; data: Buffer } {
  const img = PNG.sync.read(png);
  return { width: img.width, height: img.height, data: img.data };
}

/** The RGBA crop (x0, y0, w, h) of a decoded image. */
function crop(img: { width: number; data: Buffer }, x0: number, y0: number, w: number, h: number): Buffer {
  const out = Buffer.alloc(w * h * 4);
  for (let j = 0; j < h; j++) img.data.copy(out, j * w * 4, ((y0 + j) * img.width + x0) * 4, ((y0 + j) * img.width + x0 + w) * 4);
  return out;
}

async function plateOf(sheet: Sheet, name: string): Promise<{ width: number; height: number; data: Buffer }> {
  const file = path.join(dir, `${name}.png`);
  await renderSheet({ ...sheet, output: { file, data: null, sidecar: false } }, { workers: 2, tileSize: 48 });
  return decode(readFileSync(file));
}

async function checkFrame(base: Sheet, frame: Frame, level: number, size: number, tiles: Array<[number, number]>, name: string, deep: boolean): Promise<void> {
  const service = new TileService(base, { workers: 2, maxQueue: 64, cacheBytes: 1 << 24 });
  try {
    expect(service.job(frame, level).job.deep !== undefined, 'the arithmetic of the frame').toBe(deep);
    const plate = await plateOf(frameSheet(base, frame, level), name);
    const colours = new Set<number>();
    for (let p = 0; p < plate.width * plate.height; p++) colours.add(plate.data.readUInt32BE(4 * p));
    expect(colours.size, 'a view with structure, not a flat colour').toBeGreaterThan(50);
    for (const [tx, ty] of tiles) {
      const t = await service.tile({ frame, level, size, tx, ty });
      const tile = decode(t.png);
      expect([tile.width, tile.height]).toEqual([t.rect.w, t.rect.h]);
      const same = crop(plate, t.rect.x0, t.rect.y0, t.rect.w, t.rect.h).equals(tile.data);
      expect(same, `tile ${tx},${ty} at level ${level} against the plate crop at ${t.rect.x0},${t.rect.y0}`).toBe(true);
      expect(t.cached).toBe(false);
      expect((await service.tile({ frame, level, size, tx, ty })).png.equals(t.png), 'the cached tile is the rendered one').toBe(true);
      // Negative control: the crop one pixel to the right is not the tile (the comparison can fail).
      if (t.rect.x0 + t.rect.w < plate.width) expect(crop(plate, t.rect.x0 + 1, t.rect.y0, t.rect.w, t.rect.h).equals(tile.data)).toBe(false);
    }
  } finally {
    await service.close();
  }
}

describe('survey tiles', () => {
  it('equal the crops of plate of the frame, in doubles, at level 0 and 2, edge tiles cut to the frame', async () => {
    const base = surveyBase(parseSheet({ iterations: 300, samples: 4 }));
    const frame: Frame = { re: '-0.75', im: '0.1', span: '3', width: 180, height: 120 };
    // size 64: tiles from the centre corner (90, 60); (-2, -1) starts at x = -38, so it is cut to 26 columns.
    await checkFrame(
      base,
      frame,
      0,
      64,
      [
        [0, 0],
        [-1, -1],
        [-2, -1],
        [1, 0],
        [-2, 0],
      ],
      'double0',
      false,
    );
    await checkFrame(
      base,
      { ...frame, re: '-0.16', im: '1.04' },
      2,
      64,
      [
        [0, 0],
        [-1, 0],
        [1, -1],
      ],
      'double2',
      false,
    );
  }, 120_000);

  it('equal the crops of plate of the frame on the deep path (span 1e-20, one reference orbit per frame)', async () => {
    // c = i is a Misiurewicz point on the boundary (z -> z^2 + i: 0, i, i - 1, -i, i - 1, ...; exact algebra), so every depth shows structure.
    const base = surveyBase(parseSheet({ iterations: 3000, samples: 4 }));
    const frame: Frame = { re: '0.000000000000000000003', im: '1', span: '4e-19', width: 96, height: 64 };
    await checkFrame(
      base,
      frame,
      4,
      32,
      [
        [0, 0],
        [-1, -1],
        [-2, 0],
        [1, -1],
      ],
      'deep',
      true,
    );
  }, 180_000);

  it('draw the Julia inset as quadatlas julia renders its sheet, byte for byte', async () => {
    const base = surveyBase(parseSheet({ iterations: 300, samples: 4 }));
    const service = new TileService(base, { workers: 2, maxQueue: 8, cacheBytes: 1 << 22 });
    try {
      // The period-3 nucleus (the "rabbit"), whose Julia set has a three-cycle of basins.
      const c = { re: '-0.12256116687665', im: '0.74486176661974' };
      const inset = decode(await service.julia(c, 96));
      const file = path.join(dir, 'julia.png');
      const sheet = juliaInsetSheet(base, c, 96);
      await renderJuliaSheet({ ...sheet, output: { file, data: null, sidecar: false } }, { workers: 2, tileSize: 40 });
      const plate = decode(readFileSync(file));
      expect(inset.data.equals(plate.data)).toBe(true);
      const other = decode(await service.julia({ re: '-1', im: '0' }, 96));
      expect(other.data.equals(plate.data), 'another c, another picture').toBe(false);
    } finally {
      await service.close();
    }
  }, 120_000);
});
