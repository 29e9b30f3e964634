import type { FileHandle } from 'node:fs/promises';
import { open, rename, rm } from 'node:fs/promises';
import { basename, dirname } from 'node:path';
import { constants, deflateRaw } from 'node:zlib';
import { adler32 } from './adler32.js';
import { ihdrChunk, iccpChunk, itxtChunk, METADATA_KEYWORD, physChunk, PNG_SIGNATURE, pngChunk, srgbChunks, textChunk } from './png-chunk.js';
import { filterScanline } from './png-filter.js';
import type { RasterSink, RasterSpec } from './raster-sink.js';
import { assertBand, assertRasterSpec } from './raster-sink.js';
import { releaseTemp, removeStaleTemps, tempPathFor } from './temp-path.js';

/** Largest IDAT chunk we write (bytes of data); PNG allows up to 2^31 - 1. */
const IDAT_BYTES = 256 * 1024;
/** Filtered bytes per deflate band; the band height follows from the row length only, never from the worker count. */
const FEED_BYTES = 1024 * 1024;
/** Bands compressing at once on libuv's thread pool (memory stays bounded by this many bands). */
const BANDS_IN_FLIGHT = 4;

/** Knobs for temporary PNGs (the TIFF sink's bands); plates use the defaults. */
export interface PngSinkOptions {
  /** zlib level, default 6. */
  compressionLevel?: number;
  /** zlib strategy; default Z_RLE for 8-bit images, the default strategy for 16-bit ones (see openPngSink). */
  strategy?: number;
  /** A fixed filter type for every row instead of the per-row heuristic; default Paeth (4) for 8-bit images. */
  filter?: 0 | 1 | 2 | 3 | 4;
  /** Embed this ICC profile (iCCP, named "sRGB") instead of the sRGB/gAMA/cHRM chunks. */
  iccProfile?: Uint8Array;
}

/** The filter (undefined: the per-row heuristic), zlib level and strategy plates use at a depth (docs/methods.md F5). */
export function pngCompression(depth: 8 | 16): { filter: 4 | undefined; level: number; strategy: number } {
  return depth === 8 ? { filter: 4, level: 6, strategy: constants.Z_RLE } : { filter: undefined, level: 6, strategy: constants.Z_DEFAULT_STRATEGY };
}

/**
 * Opens a streaming PNG encoder (PNG spec, W3C 2nd ed. / ISO 15948) writing
 * `spec` to `path`; see RasterSink for the band protocol.
 *
 * Layout: signature, IHDR, then before any IDAT: sRGB + gAMA + cHRM (or iCCP),
 * pHYs when `spec.dpi` is set, iTXt "quadatlas-sheet" holding `spec.metadata`
 * (compressed UTF-8), tEXt "Software"; then IDAT chunks of at most 256 KiB cut
 * from one zlib stream (level 6) of the filtered scanlines, deflated in
 * fixed-height bands on zlib's thread pool (docs/methods.md F5); IEND. 16-bit
 * samples are written big-endian.
 *
 * Filter and compression by depth (docs/methods.md F5): 8-bit rows get the
 * Paeth filter and zlib's run-length strategy (Z_RLE). A plate's 8-bit pixels
 * carry dither, so deflate's match search finds little beyond runs: for about a
 * tenth of the compression time, files grow by 0.4% (the 1600x1600 whole-set
 * plate) to 8% (a deep preset) over the per-row heuristic with level-6 matching.
 * 16-bit rows keep the per-row minimum-sum-of-absolute-differences heuristic
 * and level-6 matching (there Z_RLE made files a third larger). Memory stays bounded by five bands of about 1 MiB plus scratch rows,
 * whatever the height: at most four bands are compressing at once.
 */
export async function openPngSink(path: string, spec: RasterSpec, options: PngSinkOptions = {}): Promise<RasterSink> {
  assertRasterSpec(spec);
  const { width, height, depth, channels } = spec;
  const bpp = (channels * depth) / 8;
  const stride = width * bpp;
  await removeStaleTemps(dirname(path), basename(path));
  const tmp = tempPathFor(path);
  const fh = await open(tmp, 'wx');

  let state: 'open' | 'done' | 'failed' = 'open';
  let rowsWritten = 0;
  let fileChain: Promise<void> = Promise.resolve();
  let fileError: unknown;
  let pending: Buffer[] = [];
  let pendingBytes = 0;
  let prev = new Uint8Array(stride);
  let cur = new Uint8Array(stride);
  const rowsPerFeed = Math.max(1, Math.floor(FEED_BYTES / (stride + 1)));

  const queueWrite = (buf: Uint8Array): void => {
    fileChain = fileChain.then(async () => {
      if (fileError !== undefined) return;
      try {
        await writeAll(fh, buf);
      } catch (err) {
        fileError = err;
      }
    });
  };
  const cutIdat = (all: boolean): void => {
    if (pendingBytes === 0 || (!all && pendingBytes < IDAT_BYTES)) return;
    const joined = Buffer.concat(pending, pendingBytes);
    let at = 0;
    while (joined.length - at >= IDAT_BYTES || (all && at < joined.length)) {
      const end = Math.min(joined.length, at + IDAT_BYTES);
      queueWrite(pngChunk('IDAT', joined.subarray(at, end)));
      at = end;
    }
    pending = at < joined.length ? [joined.subarray(at)] : [];
    pendingBytes = joined.length - at;
  };
  const settle = async (): Promise<void> => {
    await fileChain;
    if (fileError !== undefined) throw fileError;
  };
  const fail = async (err: unknown): Promise<never> => {
    if (state !== 'failed') {
      state = 'failed';
      await fileChain;
      await fh.close().catch(() => undefined);
      await rm(tmp, { force: true });
      releaseTemp(tmp);
    }
    throw err;
  };

  try {
    const head: Buffer[] = [PNG_SIGNATURE, ihdrChunk(width, height, depth, channels)];
    if (options.iccProfile !== undefined) head.push(iccpChunk('sRGB', options.iccProfile));
    else head.push(...srgbChunks());
    if (spec.dpi !== undefined) head.push(physChunk(spec.dpi));
    head.push(itxtChunk(METADATA_KEYWORD, spec.metadata), textChunk('Software', spec.software));
    queueWrite(Buffer.concat(head));
    await settle();
  } catch (err) {
    return fail(err);
  }
  const chosen = pngCompression(depth);
  const filter = options.filter ?? chosen.filter;
  const strategy = options.strategy ?? chosen.strategy;
  const level = options.compressionLevel ?? chosen.level;
  // One zlib stream (RFC 1950) cut into bands of `rowsPerFeed` filtered rows. Each band is
  // raw-deflated on its own (RFC 1951) on libuv's thread pool, so bands compress in parallel;
  // every band but the last ends with a sync flush (an empty stored block, byte-aligned), the
  // last with the final block, so the pieces concatenate into one valid deflate stream. A band
  // never refers back into the one before it, which costs a little compression at each seam.
  // We write the 2-byte header and the Adler-32 trailer ourselves (docs/methods.md F5).
  pending.push(zlibHeader(level, strategy));
  pendingBytes += 2;
  let adler = 1;
  const inflight: Promise<Buffer>[] = [];
  const settleOldest = async (): Promise<void> => {
    const piece = await inflight.shift()!;
    pending.push(piece);
    pendingBytes += piece.length;
    cutIdat(false);
  };
  const compressBand = async (band: Uint8Array, last: boolean): Promise<void> => {
    adler = adler32(band, adler);
    const done = new Promise<Buffer>((resolve, reject) => {
      deflateRaw(band, { level, strategy, finishFlush: last ? constants.Z_FINISH : constants.Z_SYNC_FLUSH }, (err, out) => (err ? reject(err) : resolve(out)));
    });
    done.catch(() => undefined); // surfaced by settleOldest
    inflight.push(done);
    while (inflight.length >= BANDS_IN_FLIGHT) await settleOldest();
  };
  const drainInflight = async (): Promise<void> => {
    while (inflight.length > 0) await settleOldest();
  };
  let band = new Uint8Array(Math.min(rowsPerFeed, height) * (stride + 1));
  let bandRows = 0;

  return {
    async writeRows(pixels, rowCount) {
      if (state !== 'open') throw new Error(`PNG sink for ${path} is ${state === 'done' ? 'finished' : 'closed'}`);
      try {
        assertBand(spec, rowsWritten, pixels, rowCount);
        const samplesPerRow = width * channels;
        for (let r = 0; r < rowCount; r++) {
          const s = r * samplesPerRow;
          if (depth === 8) cur.set(pixels.subarray(s, s + samplesPerRow));
          else bigEndian16(cur, pixels as Uint16Array, s, samplesPerRow);
          filterScanline(band, bandRows * (stride + 1), cur, prev, bpp, filter);
          const t = prev;
          prev = cur;
          cur = t;
          bandRows++;
          const row = rowsWritten + r + 1;
          if (bandRows === rowsPerFeed || row === height) {
            await compressBand(band, row === height);
            band = new Uint8Array(Math.min(rowsPerFeed, height - row) * (stride + 1));
            bandRows = 0;
          }
          if (fileError !== undefined) throw fileError;
        }
        rowsWritten += rowCount;
        await settle();
      } catch (err) {
        return fail(err);
      }
    },
    async finish() {
      if (state !== 'open') throw new Error(`PNG sink for ${path} is ${state === 'done' ? 'finished' : 'closed'}`);
      try {
        if (rowsWritten !== height) throw new Error(`PNG sink for ${path} got ${rowsWritten} of ${height} rows`);
        await drainInflight();
        const trailer = Buffer.alloc(4);
        trailer.writeUInt32BE(adler >>> 0);
        pending.push(trailer);
        pendingBytes += 4;
        cutIdat(true);
        queueWrite(pngChunk('IEND', new Uint8Array(0)));
        await settle();
        await fh.sync();
        await fh.close();
        await rename(tmp, path);
        releaseTemp(tmp);
        state = 'done';
      } catch (err) {
        return fail(err);
      }
    },
    async abort() {
      if (state !== 'open') return;
      await fail(undefined).catch(() => undefined);
    },
  };
}

/**
 * The zlib stream header (RFC 1950, 2.2) for deflate with a 32 KiB window, no
 * preset dictionary, FLEVEL as zlib's deflate writes it (0 for levels below 2
 * and for the Huffman-only and run-length strategies), FCHECK making the
 * 16-bit header a multiple of 31.
 */
function zlibHeader(level: number, strategy: number): Buffer {
  const flevel = strategy === constants.Z_HUFFMAN_ONLY || strategy === constants.Z_RLE || level < 2 ? 0 : level < 6 ? 1 : level === 6 || level === -1 ? 2 : 3;
  const cmf = 0x78;
  let flg = flevel << 6;
  flg += 31 - ((cmf * 256 + flg) % 31);
  return Buffer.from([cmf, flg]);
}

/** Writes `count` native 16-bit samples from `src` at `start` into `dst` as big-endian bytes (PNG spec 7.1). */
function bigEndian16(dst: Uint8Array, src: Uint16Array, start: number, count: number): void {
  for (let i = 0, j = 0; i < count; i++, j += 2) {
    const v = src[start + i]!;
    dst[j] = v >>> 8;
    dst[j + 1] = v & 0xff;
  }
}

async function writeAll(fh: FileHandle, buf: Uint8Array): Promise<void> {
  let at = 0;
  while (at < buf.length) {
    const { bytesWritten } = await fh.write(buf, at, buf.length - at);
    at += bytesWritten;
  }
}
