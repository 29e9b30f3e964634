import type { FileHandle } from 'node:fs/promises';
import { open, rename, rm } from 'node:fs/promises';
import path from 'node:path';
import { promisify } from 'node:util';
import { deflate as deflateCallback } from 'node:zlib';
import type { RasterSink, RasterSpec } from './raster-sink.js';
import { assertBand, assertRasterSpec } from './raster-sink.js';
import { releaseTemp, removeStaleTemps, tempPathFor } from './temp-path.js';
import { xmpPacket } from './xmp-packet.js';

const deflate = promisify(deflateCallback);

/** Raw bytes per strip (TIFF 6.0 §3 recommends strips of about 8 KB; larger strips compress better and cost fewer entries). */
const STRIP_BYTES = 1024 * 1024;
/** Strips being compressed at once on zlib's thread pool (libuv, 4 threads by default). */
const IN_FLIGHT = 4;
/** Above this many bytes of raw samples we write BigTIFF (classic TIFF offsets stop at 4 GiB). */
const BIGTIFF_BYTES = 2 ** 31;
/** zlib level of the strips (deflate's default). */
const LEVEL = 6;

let srgbProfile: Promise<Buffer> | undefined;

/**
 * The sRGB ICC profile libvips attaches with withIccProfile('srgb'), taken
 * once from a 1-pixel 8-bit image through sharp (on 8-bit data that call
 * leaves pixels unchanged, ecosystem.md §1). sharp is loaded only here.
 */
function srgbIcc(): Promise<Buffer> {
  srgbProfile ??= import('sharp').then(async ({ default: sharp }) => {
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
  /** Rows per strip; default: as many as fit in 1 MiB of samples. */
  stripRows?: number;
}

/** TIFF field types (TIFF 6.0 §2; BigTIFF adds LONG8 = 16). */
const BYTE = 1,
  ASCII = 2,
  SHORT = 3,
  LONG = 4,
  RATIONAL = 5,
  UNDEFINED = 7,
  LONG8 = 16;
const TYPE_BYTES: Record<number, number> = { [BYTE]: 1, [ASCII]: 1, [SHORT]: 2, [LONG]: 4, [RATIONAL]: 8, [UNDEFINED]: 1, [LONG8]: 8 };

interface Entry {
  readonly tag: number;
  readonly type: number;
  /** Numbers for SHORT/LONG/LONG8, [numerator, denominator] pairs flattened for RATIONAL, bytes for the rest. */
  readonly values: readonly number[] | Uint8Array;
}

/**
 * Opens a streaming TIFF writer for `spec` at `path` (see RasterSink for the
 * band protocol): baseline RGB (or RGBA with unassociated alpha), chunky,
 * little-endian, in strips of `stripRows` rows, each strip differenced by
 * the horizontal predictor (Predictor 2, TIFF 6.0 §14: every sample minus the
 * same sample of the pixel to its left, modulo 2^depth) and compressed as
 * its own zlib stream (Compression 8, Adobe TIFF Technical Note 2);
 * BigTIFF above 2 GiB of samples; resolution in dots per inch; the metadata
 * JSON in an XMP packet (tag 700, read back by readPlateMetadata); the sRGB
 * ICC profile (tag 34675).
 *
 * Strips are compressed on zlib's thread pool, up to IN_FLIGHT at once, while
 * rows keep arriving, and appended in order; the IFD goes after the last
 * strip and the header is patched to point at it. So the bytes depend only
 * on the pixels and the spec (not on how rows are batched), memory stays at a
 * few strips, and nothing is left to do when the last row arrives but the
 * directory. Everything is written under a temporary name and renamed at the
 * end; abort() or any failure removes it.
 */
export async function openTiffSink(path_: string, spec: RasterSpec, options: TiffSinkOptions = {}): Promise<RasterSink> {
  assertRasterSpec(spec);
  const { width, height, depth, channels } = spec;
  const rowSamples = width * channels;
  const rowBytes = (rowSamples * depth) / 8;
  const stripRows = Math.max(1, Math.min(height, options.stripRows ?? Math.floor(STRIP_BYTES / rowBytes)));
  const stripCount = Math.ceil(height / stripRows);
  const big = height * rowBytes > BIGTIFF_BYTES;
  const icc = await srgbIcc();
  await removeStaleTemps(path.dirname(path_), path.basename(path_));
  const tmp = tempPathFor(path_);
  const fh = await open(tmp, 'wx');

  let state: 'open' | 'done' | 'failed' = 'open';
  let rowsWritten = 0;
  /** Rows of the strip being filled, as file bytes (little-endian), differenced when the strip is full. */
  let strip = new Uint8Array(stripRows * rowBytes);
  let stripFill = 0;
  const inflight: Array<Promise<Buffer>> = [];
  const offsets: number[] = [];
  const counts: number[] = [];
  let position = big ? 16 : 8;

  const fail = async (err: unknown): Promise<never> => {
    if (state !== 'failed') {
      state = 'failed';
      await Promise.allSettled(inflight);
      await fh.close().catch(() => undefined);
      await rm(tmp, { force: true });
      releaseTemp(tmp);
    }
    throw err;
  };
  const closed = (): Error => new Error(`TIFF sink for ${path_} is ${state === 'done' ? 'finished' : 'closed'}`);

  const append = async (bytes: Uint8Array): Promise<void> => {
    await writeAt(fh, bytes, position);
    position += bytes.length;
  };
  /** Writes the oldest compressed strip to the file. */
  const writeOldest = async (): Promise<void> => {
    const data = await inflight.shift()!;
    offsets.push(position);
    counts.push(data.length);
    await append(data);
  };
  /** Differences the filled strip and queues its compression. */
  const closeStrip = async (): Promise<void> => {
    const rows = stripFill;
    const bytes = strip.subarray(0, rows * rowBytes);
    predict(bytes, rows, rowSamples, channels, depth);
    const job = deflate(bytes, { level: LEVEL });
    job.catch(() => undefined); // surfaced by writeOldest
    inflight.push(job);
    strip = new Uint8Array(stripRows * rowBytes);
    stripFill = 0;
    while (inflight.length >= IN_FLIGHT) await writeOldest();
  };

  try {
    await append(new Uint8Array(big ? 16 : 8)); // the header, patched at the end
  } catch (err) {
    return fail(err);
  }

  return {
    async writeRows(pixels, rowCount) {
      if (state !== 'open') throw closed();
      try {
        assertBand(spec, rowsWritten, pixels, rowCount);
        for (let r = 0; r < rowCount; r++) {
          const src = pixels.subarray(r * rowSamples, (r + 1) * rowSamples);
          const at = stripFill * rowBytes;
          if (depth === 8) strip.set(src as Uint8Array, at);
          else littleEndian16(strip, at, src as Uint16Array);
          stripFill++;
          if (stripFill === stripRows || rowsWritten + r + 1 === height) await closeStrip();
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
        while (inflight.length > 0) await writeOldest();
        if (offsets.length !== stripCount) throw new Error(`TIFF sink for ${path_} wrote ${offsets.length} of ${stripCount} strips`);
        if (position % 2 === 1) await append(new Uint8Array(1)); // the IFD starts on a word boundary (TIFF 6.0 §2)
        const ifdAt = position;
        const entries = tags(spec, stripRows, offsets, counts, icc, big);
        await append(directory(entries, ifdAt, big));
        await writeAt(fh, header(ifdAt, big), 0);
        await fh.sync();
        await fh.close();
        await rename(tmp, path_);
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

/** The IFD entries, sorted by tag as TIFF 6.0 §2 requires. */
function tags(spec: RasterSpec, stripRows: number, offsets: number[], counts: number[], icc: Buffer, big: boolean): Entry[] {
  const { width, height, depth, channels } = spec;
  const text = (s: string): Uint8Array => Buffer.from(`${s}\0`, 'latin1');
  const entries: Entry[] = [
    { tag: 256, type: LONG, values: [width] }, // ImageWidth
    { tag: 257, type: LONG, values: [height] }, // ImageLength
    { tag: 258, type: SHORT, values: new Array<number>(channels).fill(depth) }, // BitsPerSample
    { tag: 259, type: SHORT, values: [8] }, // Compression: Adobe deflate
    { tag: 262, type: SHORT, values: [2] }, // PhotometricInterpretation: RGB
    { tag: 273, type: big ? LONG8 : LONG, values: offsets }, // StripOffsets
    { tag: 277, type: SHORT, values: [channels] }, // SamplesPerPixel
    { tag: 278, type: LONG, values: [stripRows] }, // RowsPerStrip
    { tag: 279, type: big ? LONG8 : LONG, values: counts }, // StripByteCounts
  ];
  if (spec.dpi !== undefined) {
    const [num, den] = rational(spec.dpi);
    entries.push({ tag: 282, type: RATIONAL, values: [num, den] }, { tag: 283, type: RATIONAL, values: [num, den] }); // X/YResolution
  }
  entries.push({ tag: 284, type: SHORT, values: [1] }); // PlanarConfiguration: chunky
  if (spec.dpi !== undefined) entries.push({ tag: 296, type: SHORT, values: [2] }); // ResolutionUnit: inch
  entries.push({ tag: 305, type: ASCII, values: text(spec.software) }); // Software
  entries.push({ tag: 317, type: SHORT, values: [2] }); // Predictor: horizontal differencing
  if (channels === 4) entries.push({ tag: 338, type: SHORT, values: [2] }); // ExtraSamples: unassociated alpha
  entries.push({ tag: 339, type: SHORT, values: new Array<number>(channels).fill(1) }); // SampleFormat: unsigned integer
  entries.push({ tag: 700, type: BYTE, values: Buffer.from(xmpPacket(spec.metadata, spec.software), 'utf8') }); // XMP
  entries.push({ tag: 34675, type: UNDEFINED, values: icc }); // ICC profile
  return entries;
}

/** A resolution as a TIFF RATIONAL: the dpi over 1, or over 1000 for a fractional dpi. */
function rational(dpi: number): [number, number] {
  return Number.isInteger(dpi) ? [dpi, 1] : [Math.round(dpi * 1000), 1000];
}

/** The 8-byte classic or 16-byte BigTIFF header (little-endian) pointing at the IFD. */
function header(ifdAt: number, big: boolean): Uint8Array {
  const b = Buffer.alloc(big ? 16 : 8);
  b.write('II', 0, 'latin1');
  if (big) {
    b.writeUInt16LE(43, 2);
    b.writeUInt16LE(8, 4); // bytes per offset
    b.writeUInt16LE(0, 6);
    b.writeBigUInt64LE(BigInt(ifdAt), 8);
  } else {
    b.writeUInt16LE(42, 2);
    b.writeUInt32LE(ifdAt, 4);
  }
  return b;
}

/** The IFD at file offset `at`: the entries, the next-IFD offset 0, then the values too long to sit in an entry. */
function directory(entries: Entry[], at: number, big: boolean): Uint8Array {
  const entrySize = big ? 20 : 12;
  const inline = big ? 8 : 4;
  const head = big ? 8 : 2;
  const next = big ? 8 : 4;
  let extra = at + head + entries.length * entrySize + next;
  const parts: Buffer[] = [];
  const table = Buffer.alloc(head + entries.length * entrySize + next);
  if (big) table.writeBigUInt64LE(BigInt(entries.length), 0);
  else table.writeUInt16LE(entries.length, 0);
  entries.forEach((e, i) => {
    const count = e.type === RATIONAL ? e.values.length / 2 : e.values.length;
    const value = encodeValues(e);
    const o = head + i * entrySize;
    table.writeUInt16LE(e.tag, o);
    table.writeUInt16LE(e.type, o + 2);
    if (big) table.writeBigUInt64LE(BigInt(count), o + 4);
    else table.writeUInt32LE(count, o + 4);
    const field = o + (big ? 12 : 8);
    if (value.length <= inline) {
      value.copy(table, field);
    } else {
      if (extra % 2 === 1) {
        parts.push(Buffer.alloc(1));
        extra += 1;
      }
      if (big) table.writeBigUInt64LE(BigInt(extra), field);
      else table.writeUInt32LE(extra, field);
      parts.push(value);
      extra += value.length;
    }
  });
  return Buffer.concat([table, ...parts]);
}

function encodeValues(e: Entry): Buffer {
  const size = TYPE_BYTES[e.type]!;
  if (e.values instanceof Uint8Array) return Buffer.from(e.values.buffer, e.values.byteOffset, e.values.length);
  const values = e.values;
  const b = Buffer.alloc(e.type === RATIONAL ? 4 * values.length : size * values.length);
  values.forEach((v, i) => {
    if (e.type === SHORT) b.writeUInt16LE(v, 2 * i);
    else if (e.type === LONG || e.type === RATIONAL) b.writeUInt32LE(v, 4 * i);
    else b.writeBigUInt64LE(BigInt(v), 8 * i);
  });
  return b;
}

/** Native 16-bit samples as little-endian bytes at `at`. */
function littleEndian16(dst: Uint8Array, at: number, src: Uint16Array): void {
  for (let i = 0, j = at; i < src.length; i++, j += 2) {
    const v = src[i]!;
    dst[j] = v & 0xff;
    dst[j + 1] = v >>> 8;
  }
}

/**
 * Predictor 2 in place, right to left along each row so every difference
 * uses the original left neighbour: 8-bit samples byte by byte, 16-bit
 * samples as little-endian words, modulo 2^depth (TIFF 6.0 §14).
 */
function predict(bytes: Uint8Array, rows: number, rowSamples: number, channels: number, depth: 8 | 16): void {
  if (depth === 8) {
    for (let r = 0; r < rows; r++) {
      const start = r * rowSamples;
      for (let i = start + rowSamples - 1; i >= start + channels; i--) bytes[i] = (bytes[i]! - bytes[i - channels]!) & 0xff;
    }
    return;
  }
  const rowBytes = 2 * rowSamples;
  for (let r = 0; r < rows; r++) {
    const start = r * rowBytes;
    for (let i = start + rowBytes - 2; i >= start + 2 * channels; i -= 2) {
      const left = i - 2 * channels;
      const d = (bytes[i]! | (bytes[i + 1]! << 8)) - (bytes[left]! | (bytes[left + 1]! << 8));
      bytes[i] = d & 0xff;
      bytes[i + 1] = (d >>> 8) & 0xff;
    }
  }
}

async function writeAt(fh: FileHandle, buf: Uint8Array, position: number): Promise<void> {
  let at = 0;
  while (at < buf.length) {
    const { bytesWritten } = await fh.write(buf, at, buf.length - at, position + at);
    at += bytesWritten;
  }
}
