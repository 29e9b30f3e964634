import { mkdir, readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import sharp from 'sharp';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { openTiffSink } from '../../src/io/tiff-sink.js';
import type { RasterSpec } from '../../src/io/raster-sink.js';
import { scratchDir, testPixels } from './io-fixtures.js';
import { decodeTiffStrips } from './tiff-strips.js';

let dir = '';
let cleanup: () => Promise<void> = async () => undefined;
beforeEach(async () => ({ dir, cleanup } = await scratchDir()));
afterEach(() => cleanup());

const META = JSON.stringify({ exhibition: 'Edges of Stability', venue: 'Harrowgate Institute', note: 'a < b & c > d, Ω' });

function spec(width: number, height: number, depth: 8 | 16, channels: 3 | 4, dpi?: number): RasterSpec {
  return { width, height, depth, channels, metadata: META, software: 'quadatlas test', ...(dpi === undefined ? {} : { dpi }) };
}

/** Writes in calls of `bandRows` rows; the file's strips hold `fileRows` rows (default: the sink's choice). */
async function writeTiff(file: string, s: RasterSpec, pixels: Uint8Array | Uint16Array, bandRows: number, fileRows?: number): Promise<Buffer> {
  const sink = await openTiffSink(file, s, fileRows === undefined ? {} : { stripRows: fileRows });
  const rowSamples = s.width * s.channels;
  for (let r = 0; r < s.height; r += bandRows) {
    const n = Math.min(bandRows, s.height - r);
    await sink.writeRows(pixels.subarray(r * rowSamples, (r + n) * rowSamples), n);
  }
  await sink.finish();
  return readFile(file);
}

describe('openTiffSink', () => {
  for (const depth of [8, 16] as const) {
    for (const channels of [3, 4] as const) {
      it(`writes ${depth}-bit ${channels === 3 ? 'RGB' : 'RGBA'} whose strips decode to exactly the input samples`, async () => {
        const px = testPixels(45, 300, channels, depth); // 300 rows in strips of 64: several strips, the last one short
        const bytes = await writeTiff(path.join(dir, 'p.tif'), spec(45, 300, depth, channels, 300), px, 37, 64);
        const t = decodeTiffStrips(bytes);
        expect([t.width, t.height, t.samplesPerPixel]).toEqual([45, 300, channels]);
        expect(t.bitsPerSample).toEqual(new Array<number>(channels).fill(depth));
        // Compression 8 = Adobe deflate, Predictor 2 = horizontal (TIFF 6.0 §14; Adobe TIFF Tech Note 2).
        expect(t.tags.has(259) && bytes.readUInt16LE(t.tags.get(259)!.offset)).toBe(8);
        expect(t.samples).toEqual(Array.from(px));
      });
    }
  }

  it('writes the same file whether the rows arrive in one call or many', async () => {
    const px = testPixels(20, 90, 3, 16);
    const one = await writeTiff(path.join(dir, 'one.tif'), spec(20, 90, 16, 3, 300), px, 90, 11);
    const many = await writeTiff(path.join(dir, 'many.tif'), spec(20, 90, 16, 3, 300), px, 7, 11);
    expect(many.equals(one)).toBe(true);
  });

  it('writes strips that sharp (libvips and libtiff) decodes to the input samples', async () => {
    // 8-bit only: on 16-bit input with an ICC profile libvips converts on read (seen on files of both
    // writers), so 16-bit samples are checked by the independent strip reader above.
    const px = testPixels(33, 70, 3, 8);
    const bytes = await writeTiff(path.join(dir, 's.tif'), spec(33, 70, 8, 3, 300), px, 13, 16);
    expect(Array.from(await sharp(bytes).raw().toBuffer())).toEqual(Array.from(px));
  });

  it('records the dpi as resolution that sharp reads back as density', async () => {
    const bytes = await writeTiff(path.join(dir, 'p.tif'), spec(16, 8, 16, 3, 600), testPixels(16, 8, 3, 16), 8);
    expect((await sharp(bytes).metadata()).density).toBe(600);
    // TIFF 6.0 tag 296 ResolutionUnit: 2 = inch.
    const t = decodeTiffStrips(bytes);
    expect(bytes.readUInt16LE(t.tags.get(296)!.offset)).toBe(2);
  });

  for (const depth of [8, 16] as const) {
    it(`declares sRGB with an embedded ICC profile at ${depth} bits`, async () => {
      const bytes = await writeTiff(path.join(dir, 'p.tif'), spec(16, 8, depth, 3), testPixels(16, 8, 3, depth), 8);
      const m = await sharp(bytes).metadata();
      expect(m.icc).toBeDefined();
      // ICC.1:2010 §7.2: profile header bytes 16..19 hold the data colour space, 'RGB '.
      expect(m.icc!.toString('latin1', 16, 20)).toBe('RGB ');
      expect(decodeTiffStrips(bytes).tags.has(34675)).toBe(true); // TIFF tag 34675 = ICC profile
    });
  }

  it('stores the metadata JSON in XMP (tag 700) that sharp reads back', async () => {
    const bytes = await writeTiff(path.join(dir, 'p.tif'), spec(8, 8, 8, 3), testPixels(8, 8, 3, 8), 8);
    expect(decodeTiffStrips(bytes).tags.has(700)).toBe(true);
    const xmp = (await sharp(bytes).metadata()).xmpAsString ?? '';
    expect(xmp).toContain('a &lt; b &amp; c &gt; d, Ω');
  });

  it('leaves no file behind after abort', async () => {
    const sink = await openTiffSink(path.join(dir, 'p.tif'), spec(10, 10, 16, 3));
    await sink.writeRows(testPixels(10, 5, 3, 16), 5);
    await sink.abort();
    expect(await readdir(dir)).toEqual([]);
  });

  it('cleans up its temporary file when the final rename fails, leaving the final name untouched', async () => {
    const target = path.join(dir, 'p.tif');
    await mkdir(target); // rename(2) onto a directory fails
    const sink = await openTiffSink(target, spec(10, 10, 16, 3), { stripRows: 3 });
    await sink.writeRows(testPixels(10, 10, 3, 16), 10);
    await expect(sink.finish()).rejects.toThrow();
    expect(await readdir(dir)).toEqual(['p.tif']);
    expect(await readdir(target)).toEqual([]);
  });

  it('refuses to finish before every row arrived and leaves nothing behind', async () => {
    const sink = await openTiffSink(path.join(dir, 'p.tif'), spec(10, 10, 8, 3));
    await sink.writeRows(testPixels(10, 4, 3, 8), 4);
    await expect(sink.finish()).rejects.toThrow(/4 of 10 rows/);
    expect(await readdir(dir)).toEqual([]);
  });

  it('rejects a band of the wrong sample type and leaves nothing behind', async () => {
    const sink = await openTiffSink(path.join(dir, 'p.tif'), spec(10, 10, 8, 3));
    await expect(sink.writeRows(testPixels(10, 4, 3, 16), 4)).rejects.toThrow(/Uint8Array/);
    expect(await readdir(dir)).toEqual([]);
  });
});
