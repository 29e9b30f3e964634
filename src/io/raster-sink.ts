/**
 * The streaming shape every raster writer shares.
 *
 * A renderer hands a plate to a sink in horizontal bands, top to bottom, and
 * never holds the whole image: `writeRows(pixels, rowCount)` takes the next
 * `rowCount` rows (interleaved RGB or RGBA, `width * channels` samples per row,
 * a `Uint8Array` for depth 8 or a `Uint16Array` of native values for depth 16).
 * The sink writes to a temporary name in the target directory; `finish()`
 * checks that all `height` rows arrived and renames to the final name;
 * `abort()` removes the temporary file (safe to call at any time, any number
 * of times). If a write fails the sink removes its temporary file itself and
 * rejects; nothing ever appears under the final name unless `finish()`
 * resolved.
 */
export interface RasterSink {
  writeRows(pixels: Uint8Array | Uint16Array, rowCount: number): Promise<void>;
  finish(): Promise<void>;
  abort(): Promise<void>;
}

/** What a raster sink writes: size, sample depth, channels and the records stored in the file. */
export interface RasterSpec {
  width: number;
  height: number;
  depth: 8 | 16;
  channels: 3 | 4;
  /** Print resolution in dots per inch; omitted = no resolution recorded. */
  dpi?: number;
  /** JSON text stored in the file (read back with readPlateMetadata). */
  metadata: string;
  /** The writing program, e.g. "quadatlas 0.1.0". */
  software: string;
}

/**
 * Throws a RangeError for a spec no caller should build (sizes are validated
 * as user input upstream; reaching here with a bad one is a programming error).
 */
export function assertRasterSpec(spec: RasterSpec): void {
  const { width, height, depth, channels, dpi } = spec;
  if (!Number.isInteger(width) || width < 1 || width > 0x7fffffff) throw new RangeError(`raster width ${width}`);
  if (!Number.isInteger(height) || height < 1 || height > 0x7fffffff) throw new RangeError(`raster height ${height}`);
  if (depth !== 8 && depth !== 16) throw new RangeError(`raster depth ${String(depth)}`);
  if (channels !== 3 && channels !== 4) throw new RangeError(`raster channels ${String(channels)}`);
  if (dpi !== undefined && !(Number.isFinite(dpi) && dpi > 0)) throw new RangeError(`raster dpi ${dpi}`);
}

/**
 * Checks one band handed to writeRows against the spec and the rows already
 * written; returns the number of samples the band occupies.
 */
export function assertBand(spec: RasterSpec, rowsWritten: number, pixels: Uint8Array | Uint16Array, rowCount: number): number {
  const want = spec.depth === 16 ? Uint16Array : Uint8Array;
  if (!(pixels instanceof want)) throw new TypeError(`expected ${want.name} pixels for depth ${spec.depth}`);
  if (!Number.isInteger(rowCount) || rowCount < 0) throw new RangeError(`row count ${rowCount}`);
  if (rowsWritten + rowCount > spec.height) {
    throw new RangeError(`rows ${rowsWritten}..${rowsWritten + rowCount} exceed height ${spec.height}`);
  }
  const samples = rowCount * spec.width * spec.channels;
  if (pixels.length < samples) throw new RangeError(`band holds ${pixels.length} samples, ${samples} needed`);
  return samples;
}
