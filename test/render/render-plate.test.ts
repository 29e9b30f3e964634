import { describe, expect, it } from 'vitest';
import { DEFAULT_COLOUR_SETTINGS } from '../../src/colour/colour-settings.js';
import type { RasterSink } from '../../src/io/raster-sink.js';
import { DEFAULT_ESCAPE_RADIUS } from '../../src/plane/sample-parameters.js';
import type { PlateJob } from '../../src/render/plate-job.js';
import { renderPlate, stripRows, type DataSink } from '../../src/render/render-plate.js';
import { doubleGrid } from '../../src/view/view.js';

/** A sink that records the bands it receives. */
function recorder(): RasterSink & DataSink & { bands: number[]; bytes: Buffer[] } {
  const bands: number[] = [];
  const bytes: Buffer[] = [];
  return {
    bands,
    bytes,
    writeRows: async (values: ArrayBufferView, rows: number) => {
      bands.push(rows);
      bytes.push(Buffer.from(values.buffer, values.byteOffset, values.byteLength));
    },
    finish: async () => undefined,
    abort: async () => undefined,
  };
}

const job: PlateJob = {
  grid: doubleGrid({ centerRe: '-0.7', centerIm: '0', span: '3', width: 100, height: 150, rotation: 0 }),
  iterations: 300,
  escapeRadius: DEFAULT_ESCAPE_RADIUS,
  periodTolerance: 1e-5,
  samples: 4,
  depth: 8,
  colour: DEFAULT_COLOUR_SETTINGS,
  dpi: 300,
  withData: true,
};

describe('renderPlate', () => {
  it('hands rows to the sinks in strips, top to bottom, never the whole image at once when the budget is small', async () => {
    const small = { image: recorder(), period: recorder() };
    // 100 px x 32 rows x (3 + 21) bytes = 76800 bytes: strips of two 16-row tiles.
    await renderPlate(job, small, { workers: 2, tileSize: 16, stripBudget: 100 * 32 * 24 });
    expect(small.image.bands).toEqual([32, 32, 32, 32, 22]);
    const whole = { image: recorder(), period: recorder() };
    await renderPlate(job, whole, { workers: 1, tileSize: 64, stripBudget: 1 << 30 });
    expect(whole.image.bands).toEqual([150]);
    expect(Buffer.concat(small.image.bytes).equals(Buffer.concat(whole.image.bytes))).toBe(true);
    expect(Buffer.concat(small.period.bytes).equals(Buffer.concat(whole.period.bytes))).toBe(true);
  });

  it('sizes strips from the budget in whole tiles, at least one tile row', () => {
    expect(stripRows(1000, job, 64, 1)).toBe(64);
    expect(stripRows(1000, job, 64, 1000 * 24 * 200)).toBe(192);
  });
});
