import { mkdir, rename, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import type { PngSinkOptions } from './png-sink.js';
import { openPngSink } from './png-sink.js';
import type { RasterSink, RasterSpec } from './raster-sink.js';
import { assertBand, assertRasterSpec } from './raster-sink.js';
import { releaseTemp, removeStaleTemps, tempPathFor } from './temp-path.js';
import { xmpPacket } from './xmp-packet.js';

/** Rows per temporary band file: few enough files for any plate, small enough to bound memory. */
const BAND_BYTES = 64 * 1024 * 1024;
/** Above this many bytes of raw samples we ask for BigTIFF (classic TIFF offsets stop at 4 GiB). */
const BIGTIFF_BYTES = 2 ** 31;

let sharpReady: Promise<typeof import('sharp')> | undefined;
let srgbProfile: Promise<Buffer> | undefined;

/** sharp, loaded on first use, with libvips allowed every core (it defaults to 1 on glibc, ecosystem.md §1). */
function loadSharp(): Promise<typeof import('sharp')> {
  sharpReady ??= import('sharp').then((m) => {
    m.default.concurrency(os.availableParallelism());
    return m;
  });
  return sharpReady;
}

/**
 * The sRGB ICC profile libvips attaches with withIccProfile('srgb'), taken
 * once from a 1-pixel 8-bit image (on 8-bit data that call leaves pixels
 * unchanged, ecosystem.md §1).
 */
function srgbIcc(): Promise<Buffer> {
  srgbProfile ??= loadSharp().then(async ({ default: sharp }) => {
    const png = await sharp(Buffer.from([0, 0, 0]), { raw: { width: 1, height: 1, channels: 3 } })
      .withIccProfile('srgb')
      .png()
      .toBuffer();
    const icc = (await sharp(png).metadata()).icc;
    if (icc === undefined) throw new Error('libvips attached no sRGB profile');
    return icc;
  });
  return srgbProfile;
}

/** Tuning for openTiffSink. */
export interface TiffSinkOptions {
  /** Rows per temporary band file; default: as many as fit in 64 MiB of samples. */
  bandRows?: number;
}

/**
 * Opens a streaming TIFF writer for `spec` at `path` (see RasterSink for the
 * band protocol). Deflate with horizontal predictor (TIFF 6.0 §14; Adobe
 * TIFF Technical Note 2 for deflate), BigTIFF above 2 GiB of samples,
 * resolution in dots per inch, the metadata JSON in an XMP packet (tag 700,
 * UTF-8, read back by readPlateMetadata) and the sRGB ICC profile (tag 34675).
 *
 * The incoming rows go to temporary 16-bit-exact PNG band files (our PNG
 * sink, fast settings, each carrying the sRGB profile as iCCP) in a hidden
 * folder beside `path`; finish() has sharp (libvips) join the bands
 * vertically and stream them into the TIFF, so memory stays bounded for any
 * height. 16-bit output goes through toColourspace('rgb16') (without it
 * sharp silently writes 8 bits) and keeps the bands' ICC with
 * keepIccProfile(): withIccProfile('srgb') would convert and change 16-bit
 * values (ecosystem.md §1).
 */
export async function openTiffSink(path_: string, spec: RasterSpec, options: TiffSinkOptions = {}): Promise<RasterSink> {
  assertRasterSpec(spec);
  const { width, height, depth, channels } = spec;
  const rowBytes = (width * channels * depth) / 8;
  const bandRows = Math.max(1, Math.min(height, options.bandRows ?? Math.floor(BAND_BYTES / rowBytes)));
  const icc = await srgbIcc();
  await removeStaleTemps(path.dirname(path_), path.basename(path_));
  // The bands wait in a hidden folder named like a temporary file, so a signal or a later run removes it too.
  const bandDir = tempPathFor(path_);
  await mkdir(bandDir);
  const bandFiles: string[] = [];
  const bandOptions: PngSinkOptions = { compressionLevel: 1, filter: 1, iccProfile: icc };
  let band: RasterSink | undefined;
  let bandLeft = 0;
  let rowsWritten = 0;
  let state: 'open' | 'done' | 'failed' = 'open';
  let tmp: string | undefined;

  const fail = async (err: unknown): Promise<never> => {
    if (state !== 'failed') {
      state = 'failed';
      await band?.abort();
      await rm(bandDir, { recursive: true, force: true });
      releaseTemp(bandDir);
      if (tmp !== undefined) {
        await rm(tmp, { force: true });
        releaseTemp(tmp);
      }
    }
    throw err;
  };
  const closed = (): Error => new Error(`TIFF sink for ${path_} is ${state === 'done' ? 'finished' : 'closed'}`);

  return {
    async writeRows(pixels, rowCount) {
      if (state !== 'open') throw closed();
      try {
        assertBand(spec, rowsWritten, pixels, rowCount);
        const rowSamples = width * channels;
        let done = 0;
        while (done < rowCount) {
          if (band === undefined) {
            const rows = Math.min(bandRows, height - rowsWritten - done);
            const file = path.join(bandDir, `${String(bandFiles.length).padStart(6, '0')}.png`);
            band = await openPngSink(file, { width, height: rows, depth, channels, metadata: '{}', software: spec.software }, bandOptions);
            bandFiles.push(file);
            bandLeft = rows;
          }
          const n = Math.min(bandLeft, rowCount - done);
          await band.writeRows(pixels.subarray(done * rowSamples, (done + n) * rowSamples), n);
          done += n;
          bandLeft -= n;
          if (bandLeft === 0) {
            await band.finish();
            band = undefined;
          }
        }
        rowsWritten += rowCount;
      } catch (err) {
        return fail(err);
      }
    },
    async finish() {
      if (state !== 'open') throw closed();
      try {
        if (rowsWritten !== height) throw new Error(`TIFF sink for ${path_} got ${rowsWritten} of ${height} rows`);
        const { default: sharp } = await loadSharp();
        // libvips' arrayjoin gives every cell the largest band's size, so a short
        // last band is padded at the bottom (valign top); extract cuts it off.
        let pipeline =
          bandFiles.length === 1
            ? sharp(bandFiles[0]!, { limitInputPixels: false })
            : sharp(bandFiles, { join: { across: 1, valign: 'top' }, limitInputPixels: false }).extract({
                left: 0,
                top: 0,
                width,
                height,
              });
        pipeline = pipeline.keepIccProfile();
        if (depth === 16) pipeline = pipeline.toColourspace('rgb16');
        pipeline = pipeline.withXmp(xmpPacket(spec.metadata, spec.software));
        if (spec.dpi !== undefined) pipeline = pipeline.withDensity(spec.dpi);
        tmp = tempPathFor(path_);
        await pipeline
          .tiff({
            compression: 'deflate',
            predictor: 'horizontal',
            bigtiff: width * height * channels * (depth / 8) > BIGTIFF_BYTES,
          })
          .toFile(tmp);
        await rename(tmp, path_);
        releaseTemp(tmp);
        state = 'done';
        await rm(bandDir, { recursive: true, force: true });
        releaseTemp(bandDir);
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
