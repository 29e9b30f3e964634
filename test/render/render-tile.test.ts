import { describe, expect, it } from 'vitest';
import { DEFAULT_COLOUR_SETTINGS } from '../../src/colour/colour-settings.js';
import { DEFAULT_ESCAPE_RADIUS } from '../../src/plane/sample-parameters.js';
import type { PlateJob } from '../../src/render/plate-job.js';
import { createTileScratch, jitter, renderTile } from '../../src/render/render-tile.js';
import { planStrips } from '../../src/view/tile-plan.js';
import { doubleGrid } from '../../src/view/view.js';

function job(over: Partial<PlateJob> = {}): PlateJob {
  const grid = doubleGrid({ centerRe: '-0.75', centerIm: '0.1', span: '0.6', width: 90, height: 70, rotation: 0 });
  return {
    grid,
    iterations: 500,
    escapeRadius: DEFAULT_ESCAPE_RADIUS,
    periodTolerance: grid.spacing * 1e-3,
    samples: 4,
    depth: 16,
    colour: DEFAULT_COLOUR_SETTINGS,
    dpi: 300,
    withData: true,
    ...over,
  };
}

/** Renders the whole image by tiles of the given size and assembles it. */
function assemble(j: PlateJob, tileSize: number): { pixels: Uint16Array | Uint8Array; period: Int32Array; smooth: Float64Array } {
  const { width, height } = j.grid;
  const pixels = j.depth === 16 ? new Uint16Array(width * height * 3) : new Uint8Array(width * height * 3);
  const period = new Int32Array(width * height);
  const smooth = new Float64Array(width * height);
  const scratch = createTileScratch(tileSize);
  // Visit tiles in reverse order: order must not matter either.
  const tiles = planStrips(width, height, tileSize, tileSize)
    .flatMap((s) => s.tiles)
    .reverse();
  for (const t of tiles) {
    const r = renderTile(j, t, scratch);
    for (let y = 0; y < t.h; y++) {
      pixels.set(r.pixels.subarray(y * t.w * 3, (y + 1) * t.w * 3), ((t.y0 + y) * width + t.x0) * 3);
      period.set(r.period!.subarray(y * t.w, (y + 1) * t.w), (t.y0 + y) * width + t.x0);
      smooth.set(r.smooth!.subarray(y * t.w, (y + 1) * t.w), (t.y0 + y) * width + t.x0);
    }
  }
  return { pixels, period, smooth };
}

describe('renderTile', () => {
  it('gives the same pixels and data for tile sizes 8, 13 and 64 in any order (same sheet, same bytes)', () => {
    for (const depth of [8, 16] as const) {
      const j = job({ depth });
      const a = assemble(j, 64);
      for (const size of [8, 13]) {
        const b = assemble(j, size);
        expect(Buffer.from(b.pixels.buffer).equals(Buffer.from(a.pixels.buffer))).toBe(true);
        expect(b.period).toEqual(a.period);
        expect(b.smooth).toEqual(a.smooth);
      }
    }
  });

  it('finds period 1 at the centre of the main cardioid and period 2 at c = -1 (docs/checks.md: cardioid, period-2 disk)', () => {
    const grid = doubleGrid({ centerRe: '-0.75', centerIm: '0', span: '1', width: 2, height: 1, rotation: 0 });
    // Pixel centres at c = -0.75 +/- 0.25: -1 (period-2 disk centre) and -0.5 (inside the cardioid).
    const r = renderTile(job({ grid, samples: 1 }), { index: 0, x0: 0, y0: 0, w: 2, h: 1 }, createTileScratch(2));
    expect([...r.period!]).toEqual([2, 1]);
    expect(r.stats.interior).toBe(2);
    expect(r.stats.periods).toEqual({ 1: 1, 2: 1 });
  });

  it('refines only some pixels, and more samples where the boundary is', () => {
    const r = renderTile(job(), { index: 0, x0: 0, y0: 0, w: 64, h: 64 }, createTileScratch(64));
    expect(r.stats.refined).toBeGreaterThan(0);
    expect(r.stats.refined).toBeLessThan(64 * 64);
    expect(r.stats.samples).toBe(66 * 66 + r.stats.refined * 4);
  });
});

describe('jitter', () => {
  it('is deterministic, in [0, 1) and roughly uniform', () => {
    let sum = 0;
    const n = 20000;
    for (let i = 0; i < n; i++) {
      const u = jitter(i % 211, Math.floor(i / 211), i % 9, i & 1);
      expect(u).toBeGreaterThanOrEqual(0);
      expect(u).toBeLessThan(1);
      sum += u;
    }
    expect(Math.abs(sum / n - 0.5)).toBeLessThan(0.01);
    expect(jitter(3, 4, 5, 0)).toBe(jitter(3, 4, 5, 0));
  });
});
