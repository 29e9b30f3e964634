/**
 * Encodes and writes one pyramid tile. A tile is small (at most a few hundred
 * pixels a side), so it is encoded in memory and written in one go to a
 * temporary name beside its final path, then renamed: a tile file either does
 * not exist or is complete. The tile is not fsynced before the rename: a
 * pyramid has tens of thousands of tiles and one fsync each would dominate
 * the run; a killed process still never leaves a partial tile under its final
 * name (only a power cut could leave an empty one, which `pyramid --finish`
 * reports as missing).
 */
import { mkdir, open, rename, rm, stat } from 'node:fs/promises';
import path from 'node:path';
import { deflateSync } from 'node:zlib';
import { ihdrChunk, PNG_SIGNATURE, pngChunk, srgbChunks } from './png-chunk.js';
import { filterScanline } from './png-filter.js';
import { releaseTemp, tempPathFor } from './temp-path.js';
import type { TileFormat } from '../view/pyramid-spec.js';

/**
 * An 8-bit RGB PNG of the tile (PNG spec, W3C 2nd ed.): IHDR, sRGB with gAMA
 * and cHRM, one IDAT holding the zlib stream (level 6) of the rows filtered
 * by the spec's minimum-sum heuristic (png-filter.ts), IEND. No metadata
 * chunks: the sheet is recorded once, in the pyramid's pyramid.json.
 */
export function encodePngTile(pixels: Uint8Array, width: number, height: number): Buffer {
  const stride = width * 3;
  const filtered = new Uint8Array(height * (stride + 1));
  let prev: Uint8Array = new Uint8Array(stride);
  for (let j = 0; j < height; j++) {
    const cur = pixels.subarray(j * stride, (j + 1) * stride);
    filterScanline(filtered, j * (stride + 1), cur, prev, 3);
    prev = cur;
  }
  return Buffer.concat([
    PNG_SIGNATURE,
    ihdrChunk(width, height, 8, 3),
    ...srgbChunks(),
    pngChunk('IDAT', deflateSync(filtered, { level: 6 })),
    pngChunk('IEND', new Uint8Array(0)),
  ]);
}

/** A baseline JPEG of the tile through sharp (libvips), 4:2:0, at `quality` (1-100). */
export async function encodeJpegTile(pixels: Uint8Array, width: number, height: number, quality: number): Promise<Buffer> {
  const { default: sharp } = await import('sharp');
  return sharp(pixels, { raw: { width, height, channels: 3 } })
    .jpeg({ quality })
    .toBuffer();
}

export async function encodeTile(pixels: Uint8Array, width: number, height: number, format: TileFormat, quality: number): Promise<Buffer> {
  return format === 'png' ? encodePngTile(pixels, width, height) : encodeJpegTile(pixels, width, height, quality);
}

/** Writes `bytes` to `file` through a temporary name and a rename; creates the folders. */
export async function writeTileFile(file: string, bytes: Uint8Array): Promise<void> {
  await mkdir(path.dirname(file), { recursive: true });
  const tmp = tempPathFor(file);
  try {
    const fh = await open(tmp, 'wx');
    try {
      let at = 0;
      while (at < bytes.length) at += (await fh.write(bytes, at, bytes.length - at)).bytesWritten;
    } finally {
      await fh.close();
    }
    await rename(tmp, file);
  } catch (err) {
    await rm(tmp, { force: true });
    throw err;
  } finally {
    releaseTemp(tmp);
  }
}

/** Size in bytes of a finished tile, or 0 when it is missing (or empty). */
export async function tileFileSize(file: string): Promise<number> {
  try {
    return (await stat(file)).size;
  } catch {
    return 0;
  }
}
