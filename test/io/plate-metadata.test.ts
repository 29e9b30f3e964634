import { writeFile } from 'node:fs/promises';
import path from 'node:path';
import { deflateSync } from 'node:zlib';
import { PNG } from 'pngjs';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { openPngSink } from '../../src/io/png-sink.js';
import { openTiffSink } from '../../src/io/tiff-sink.js';
import { readPlateMetadata } from '../../src/io/plate-metadata.js';
import { pngChunk } from '../../src/io/png-chunk.js';
import type { RasterSink, RasterSpec } from '../../src/io/raster-sink.js';
import { scratchDir, testPixels } from './io-fixtures.js';

let dir = '';
let cleanup: () => Promise<void> = async () => undefined;
beforeEach(async () => ({ dir, cleanup } = await scratchDir()));
afterEach(() => cleanup());

// Metadata with everything that needs care: non-Latin-1 text, XML specials, quotes and escapes.
const META = JSON.stringify({
  exhibition: 'Edges of Stability',
  venue: 'Harrowgate Institute',
  formula: 'z → z² + c',
  xml: '<a href="x">&amp;</a> \'q\'',
  escapes: 'tab\tnewline\n',
  centre: ['-0.743643887037158704752191506114774', '0.131825904205311970493132056385139'],
});

function spec(depth: 8 | 16): RasterSpec {
  return { width: 9, height: 5, depth, channels: 3, dpi: 300, metadata: META, software: 'quadatlas test' };
}

async function write(open: (file: string, s: RasterSpec) => Promise<RasterSink>, file: string, depth: 8 | 16): Promise<void> {
  const sink = await open(file, spec(depth));
  await sink.writeRows(testPixels(9, 5, 3, depth), 5);
  await sink.finish();
}

/** Splices `chunks` into a pngjs-written PNG right after its 33-byte signature + IHDR (ecosystem.md §2). */
function pngjsWith(chunks: Buffer[]): Buffer {
  const png = new PNG({ width: 2, height: 2 });
  png.data.fill(128);
  const bytes = PNG.sync.write(png);
  return Buffer.concat([bytes.subarray(0, 33), ...chunks, bytes.subarray(33)]);
}

describe('readPlateMetadata', () => {
  for (const depth of [8, 16] as const) {
    it(`returns the exact JSON text a ${depth}-bit PNG sink stored`, async () => {
      await write(openPngSink, path.join(dir, 'p.png'), depth);
      expect(await readPlateMetadata(path.join(dir, 'p.png'))).toBe(META);
    });

    it(`returns the exact JSON text a ${depth}-bit TIFF sink stored`, async () => {
      await write(openTiffSink, path.join(dir, 'p.tif'), depth);
      expect(await readPlateMetadata(path.join(dir, 'p.tif'))).toBe(META);
    });
  }

  it('reads an uncompressed iTXt and a tEXt written by other code (PNG spec 11.3.4)', async () => {
    const itxt = Buffer.concat([Buffer.from('quadatlas-sheet\0\0\0en\0\0', 'latin1'), Buffer.from('{"a":"Ω"}', 'utf8')]);
    await writeFile(path.join(dir, 'i.png'), pngjsWith([pngChunk('iTXt', itxt)]));
    expect(await readPlateMetadata(path.join(dir, 'i.png'))).toBe('{"a":"Ω"}');
    const text = Buffer.from('quadatlas-sheet\0{"b":1}', 'latin1');
    await writeFile(path.join(dir, 't.png'), pngjsWith([pngChunk('tEXt', text)]));
    expect(await readPlateMetadata(path.join(dir, 't.png'))).toBe('{"b":1}');
  });

  it('ignores text chunks with other keywords and returns undefined for a PNG without ours', async () => {
    const other = Buffer.concat([Buffer.from('Comment\0\x01\0\0\0', 'latin1'), deflateSync('{"not":"ours"}')]);
    await writeFile(path.join(dir, 'o.png'), pngjsWith([pngChunk('iTXt', other)]));
    expect(await readPlateMetadata(path.join(dir, 'o.png'))).toBeUndefined();
  });

  it('returns undefined for a file that is neither PNG nor TIFF', async () => {
    await writeFile(path.join(dir, 'x.json'), META);
    expect(await readPlateMetadata(path.join(dir, 'x.json'))).toBeUndefined();
  });

  it('rejects for a missing file', async () => {
    await expect(readPlateMetadata(path.join(dir, 'none.png'))).rejects.toThrow(/ENOENT/);
  });
});
