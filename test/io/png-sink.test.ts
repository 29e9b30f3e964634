import { mkdir, readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { crc32, inflateSync } from 'node:zlib';
import { PNG } from 'pngjs';
import sharp from 'sharp';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { openPngSink } from '../../src/io/png-sink.js';
import type { PngSinkOptions } from '../../src/io/png-sink.js';
import type { RasterSpec } from '../../src/io/raster-sink.js';
import { chunksOf, chunkTypes, scratchDir, testPixels } from './io-fixtures.js';

let dir = '';
let cleanup: () => Promise<void> = async () => undefined;
beforeEach(async () => ({ dir, cleanup } = await scratchDir()));
afterEach(() => cleanup());

const META = JSON.stringify({ exhibition: 'Edges of Stability', venue: 'Harrowgate Institute', note: 'z → z² + c, Ω' });

function spec(width: number, height: number, depth: 8 | 16, channels: 3 | 4, dpi?: number): RasterSpec {
  return { width, height, depth, channels, metadata: META, software: 'quadatlas test', ...(dpi === undefined ? {} : { dpi }) };
}

/** Writes `pixels` in bands of `bandRows` rows and returns the file's bytes. */
async function writePng(file: string, s: RasterSpec, pixels: Uint8Array | Uint16Array, bandRows: number, options: PngSinkOptions = {}): Promise<Buffer> {
  const sink = await openPngSink(file, s, options);
  const rowSamples = s.width * s.channels;
  for (let r = 0; r < s.height; r += bandRows) {
    const n = Math.min(bandRows, s.height - r);
    await sink.writeRows(pixels.subarray(r * rowSamples, (r + n) * rowSamples), n);
  }
  await sink.finish();
  return readFile(file);
}

/** pngjs (independent npm decoder) output as samples in our channel count (it always returns RGBA). */
function decodeWithPngjs(bytes: Buffer, depth: 8 | 16, channels: 3 | 4): { width: number; height: number; samples: number[] } {
  const png = PNG.sync.read(bytes, depth === 16 ? { skipRescale: true } : {});
  const data = png.data as unknown as ArrayLike<number>; // Uint16Array when skipRescale and depth 16
  const samples: number[] = [];
  for (let p = 0; p < png.width * png.height; p++) for (let c = 0; c < channels; c++) samples.push(data[p * 4 + c]!);
  return { width: png.width, height: png.height, samples };
}

describe('openPngSink', () => {
  for (const depth of [8, 16] as const) {
    for (const channels of [3, 4] as const) {
      it(`writes ${depth}-bit ${channels === 3 ? 'RGB' : 'RGBA'} that pngjs decodes to exactly the same samples`, async () => {
        const s = spec(53, 29, depth, channels);
        const px = testPixels(53, 29, channels, depth);
        const bytes = await writePng(path.join(dir, 'p.png'), s, px, 7);
        const got = decodeWithPngjs(bytes, depth, channels);
        expect([got.width, got.height]).toEqual([53, 29]);
        expect(got.samples).toEqual(Array.from(px));
      });
    }
  }

  it('writes 16-bit RGB that sharp reads back as 16-bit with exact samples', async () => {
    const px = testPixels(40, 12, 3, 16) as Uint16Array;
    await writePng(path.join(dir, 'p.png'), spec(40, 12, 16, 3), px, 5);
    const m = await sharp(path.join(dir, 'p.png')).metadata();
    expect(m.depth).toBe('ushort');
    const raw = await sharp(path.join(dir, 'p.png')).toColourspace('rgb16').raw({ depth: 'ushort' }).toBuffer();
    expect(Array.from(new Uint16Array(raw.buffer, raw.byteOffset, raw.length / 2))).toEqual(Array.from(px));
  });

  it('records dpi as pHYs that sharp reads back as density', async () => {
    // PNG spec 11.3.5.3: pixels per metre, unit 1; 300 dpi = round(300 / 0.0254) = 11811 px/m.
    const bytes = await writePng(path.join(dir, 'p.png'), spec(8, 8, 8, 3, 300), testPixels(8, 8, 3, 8), 8);
    const phys = chunksOf(bytes, 'pHYs')[0]!;
    expect([phys.readUInt32BE(0), phys.readUInt32BE(4), phys[8]]).toEqual([11811, 11811, 1]);
    expect((await sharp(bytes).metadata()).density).toBe(300);
  });

  it('omits pHYs when no dpi is given', async () => {
    const bytes = await writePng(path.join(dir, 'p.png'), spec(8, 8, 8, 3), testPixels(8, 8, 3, 8), 8);
    expect(chunkTypes(bytes)).not.toContain('pHYs');
  });

  it('puts sRGB, gAMA, cHRM, pHYs, iTXt and tEXt after IHDR and before the first IDAT, IEND last', async () => {
    // PNG spec 5.6 chunk ordering: sRGB/gAMA/cHRM before PLTE and IDAT; pHYs before IDAT; text anywhere,
    // but sharp only sees text before IDAT (ecosystem.md §2), so we put it there.
    const bytes = await writePng(path.join(dir, 'p.png'), spec(8, 8, 8, 3, 150), testPixels(8, 8, 3, 8), 8);
    const types = chunkTypes(bytes);
    const firstIdat = types.indexOf('IDAT');
    expect(types.slice(0, firstIdat)).toEqual(['IHDR', 'sRGB', 'gAMA', 'cHRM', 'pHYs', 'iTXt', 'tEXt']);
    expect(types.slice(firstIdat).every((t, k, all) => (k < all.length - 1 ? t === 'IDAT' : t === 'IEND'))).toBe(true);
    // sRGB intent 0 = perceptual; gAMA 45455 = 1/2.2 (PNG spec 11.3.3.5 recommended values with sRGB).
    expect(chunksOf(bytes, 'sRGB')[0]![0]).toBe(0);
    expect(chunksOf(bytes, 'gAMA')[0]!.readUInt32BE(0)).toBe(45455);
  });

  it('stores the metadata as compressed UTF-8 iTXt that sharp lists among its comments', async () => {
    const bytes = await writePng(path.join(dir, 'p.png'), spec(8, 8, 8, 3), testPixels(8, 8, 3, 8), 8);
    const itxt = chunksOf(bytes, 'iTXt')[0]!;
    const nul = itxt.indexOf(0);
    expect(itxt.toString('latin1', 0, nul)).toBe('quadatlas-sheet');
    expect(itxt[nul + 1]).toBe(1); // compression flag (PNG spec 11.3.4.5)
    expect(inflateSync(itxt.subarray(nul + 5)).toString('utf8')).toBe(META);
    const comments = (await sharp(bytes).metadata()).comments ?? [];
    expect(comments).toContainEqual({ keyword: 'quadatlas-sheet', text: META });
    expect(comments).toContainEqual({ keyword: 'Software', text: 'quadatlas test' });
  });

  it('writes chunks whose CRC-32 matches their type and data', async () => {
    // PNG spec 5.3: CRC over type and data. Checked here by walking the file independently of the writer.
    const bytes = await writePng(path.join(dir, 'p.png'), spec(30, 30, 16, 4, 72), testPixels(30, 30, 4, 16), 4);
    let checked = 0;
    for (let at = 8; at < bytes.length;) {
      const len = bytes.readUInt32BE(at);
      expect(bytes.readUInt32BE(at + 8 + len)).toBe(crc32(bytes.subarray(at + 4, at + 8 + len)) >>> 0);
      at += 12 + len;
      checked += 1;
    }
    expect(checked).toBeGreaterThan(8);
  });

  it('decodes to the same pixels whichever filter is used for every row', async () => {
    // Filtering is lossless (PNG spec 9): each fixed filter and the heuristic must decode identically.
    const px = testPixels(31, 17, 3, 16);
    const s = spec(31, 17, 16, 3);
    const reference = decodeWithPngjs(await writePng(path.join(dir, 'h.png'), s, px, 17), 16, 3).samples;
    const sizes = new Set<number>();
    for (const filter of [0, 1, 2, 3, 4] as const) {
      const bytes = await writePng(path.join(dir, `f${filter}.png`), s, px, 17, { filter });
      sizes.add(bytes.length);
      expect(decodeWithPngjs(bytes, 16, 3).samples).toEqual(reference);
    }
    expect(sizes.size).toBeGreaterThan(1); // the filters really differ
  });

  it('uses more than one filter type on mixed 16-bit content with the heuristic', async () => {
    const bytes = await writePng(path.join(dir, 'p.png'), spec(64, 40, 16, 3), testPixels(64, 40, 3, 16), 40);
    const raw = inflateSync(Buffer.concat(chunksOf(bytes, 'IDAT')));
    const filters = new Set<number>();
    for (let r = 0; r < 40; r++) filters.add(raw[r * (64 * 3 * 2 + 1)]!);
    expect(filters.size).toBeGreaterThan(1);
    for (const f of filters) expect(f).toBeLessThanOrEqual(4);
  });

  it('filters every 8-bit row with Paeth by default, and pngjs decodes the Paeth rows exactly', async () => {
    // PNG spec 9.4: filter type byte 4 = Paeth; decoding by pngjs (independent) checks the predictor.
    const px = testPixels(64, 40, 3, 8);
    const bytes = await writePng(path.join(dir, 'p.png'), spec(64, 40, 8, 3), px, 9);
    const raw = inflateSync(Buffer.concat(chunksOf(bytes, 'IDAT')));
    for (let r = 0; r < 40; r++) expect(raw[r * (64 * 3 + 1)]).toBe(4);
    expect(decodeWithPngjs(bytes, 8, 3).samples).toEqual(Array.from(px));
  });

  it('writes the same bytes in many bands as in one band, and splits long data into several IDAT chunks', async () => {
    const w = 300;
    const h = 600; // 300*600*8 bytes, a quarter of it noise: over 256 KiB compressed, so several IDAT chunks
    const px = testPixels(w, h, 4, 16);
    const one = await writePng(path.join(dir, 'one.png'), spec(w, h, 16, 4), px, h);
    const many = await writePng(path.join(dir, 'many.png'), spec(w, h, 16, 4), px, 13);
    const rows = await writePng(path.join(dir, 'rows.png'), spec(w, h, 16, 4), px, 1);
    expect(many.equals(one)).toBe(true);
    expect(rows.equals(one)).toBe(true);
    const idat = chunksOf(one, 'IDAT');
    expect(idat.length).toBeGreaterThan(1);
    expect(Math.max(...idat.map((c) => c.length))).toBeLessThanOrEqual(256 * 1024);
  });

  it('writes one zlib stream from several independently deflated bands that zlib and pngjs accept', async () => {
    // 1 MiB bands: 700 rows of 1201 filtered bytes make one full band and a partial one.
    // inflateSync (zlib itself) checks the stream's header and Adler-32 trailer.
    const w = 400;
    const h = 1700;
    const px = testPixels(w, h, 3, 8);
    const bytes = await writePng(path.join(dir, 'p.png'), spec(w, h, 8, 3), px, 37);
    const raw = inflateSync(Buffer.concat(chunksOf(bytes, 'IDAT')));
    expect(raw.length).toBe(h * (w * 3 + 1));
    expect(decodeWithPngjs(bytes, 8, 3).samples).toEqual(Array.from(px));
    const again = await writePng(path.join(dir, 'q.png'), spec(w, h, 8, 3), px, h);
    expect(again.equals(bytes)).toBe(true);
  });

  it('leaves no file behind after abort', async () => {
    const sink = await openPngSink(path.join(dir, 'p.png'), spec(10, 10, 8, 3));
    await sink.writeRows(testPixels(10, 5, 3, 8), 5);
    await sink.abort();
    await sink.abort(); // idempotent
    expect(await readdir(dir)).toEqual([]);
  });

  it('rejects a band of the wrong sample type and leaves no file, temporary or final', async () => {
    const sink = await openPngSink(path.join(dir, 'p.png'), spec(10, 10, 16, 3));
    await sink.writeRows(testPixels(10, 5, 3, 16), 5);
    await expect(sink.writeRows(testPixels(10, 5, 3, 8), 5)).rejects.toThrow(/Uint16Array/);
    expect(await readdir(dir)).toEqual([]);
    await expect(sink.finish()).rejects.toThrow(/closed/);
  });

  it('cleans up its temporary file when the final rename fails, leaving the final name untouched', async () => {
    // The final name is taken by a directory, so rename(2) fails (EISDIR) at the very end.
    const target = path.join(dir, 'p.png');
    await mkdir(target);
    const sink = await openPngSink(target, spec(10, 10, 8, 3));
    await sink.writeRows(testPixels(10, 10, 3, 8), 10);
    await expect(sink.finish()).rejects.toThrow();
    expect(await readdir(dir)).toEqual(['p.png']);
    expect(await readdir(target)).toEqual([]);
  });

  it('refuses to finish before every row arrived and leaves no file', async () => {
    const sink = await openPngSink(path.join(dir, 'p.png'), spec(10, 10, 8, 3));
    await sink.writeRows(testPixels(10, 9, 3, 8), 9);
    await expect(sink.finish()).rejects.toThrow(/9 of 10 rows/);
    expect(await readdir(dir)).toEqual([]);
  });

  it('rejects rows beyond the height', async () => {
    const sink = await openPngSink(path.join(dir, 'p.png'), spec(4, 2, 8, 3));
    await expect(sink.writeRows(testPixels(4, 3, 3, 8), 3)).rejects.toThrow(/exceed height/);
    expect(await readdir(dir)).toEqual([]);
  });

  it('fails to open in a missing directory without creating anything', async () => {
    await expect(openPngSink(path.join(dir, 'missing', 'p.png'), spec(4, 2, 8, 3))).rejects.toThrow(/ENOENT/);
    expect(await readdir(dir)).toEqual([]);
  });
});
