import type { FileHandle } from 'node:fs/promises';
import { open, rename, rm } from 'node:fs/promises';
import { basename, dirname } from 'node:path';
import { releaseTemp, removeStaleTemps, tempPathFor } from './temp-path.js';

/** The element types we write: little-endian int32, float64, float32, and bytes. */
export type NpyDtype = '<i4' | '<f8' | '|u1' | '<f4';

/** A streaming writer of one 2-D NPY array, rows in order; same temp-name protocol as RasterSink. */
export interface NpySink {
  /** The next `rowCount` rows, `rowCount * width` elements from the start of `values`. */
  writeRows(values: ArrayBufferView, rowCount: number): Promise<void>;
  finish(): Promise<void>;
  abort(): Promise<void>;
}

const ITEM_BYTES: Record<NpyDtype, number> = { '<i4': 4, '<f8': 8, '|u1': 1, '<f4': 4 };
const LITTLE_ENDIAN = new Uint8Array(new Uint16Array([1]).buffer)[0] === 1;

/**
 * The NPY version 1.0 preamble (NumPy, numpy.lib.format; NEP 1): magic
 * "\x93NUMPY", version 1 0, header length as little-endian uint16, then the
 * header dict as ASCII, "terminated by a newline (\n) and padded with spaces
 * (\x20) to make the total of len(magic string) + 2 + len(length) + HEADER_LEN
 * be evenly divisible by 64 for alignment purposes" (numpy.lib.format docs).
 */
export function npyHeader(dtype: NpyDtype, shape: readonly [number, number]): Buffer {
  const dict = `{'descr': '${dtype}', 'fortran_order': False, 'shape': (${shape[0]}, ${shape[1]}), }`;
  const unpadded = 10 + dict.length + 1;
  const total = Math.ceil(unpadded / 64) * 64;
  const headerLen = total - 10;
  if (headerLen > 0xffff) throw new RangeError('NPY 1.0 header too long');
  const out = Buffer.alloc(total, 0x20);
  out.write('\x93NUMPY', 0, 'latin1');
  out[6] = 1;
  out[7] = 0;
  out.writeUInt16LE(headerLen, 8);
  out.write(dict, 10, 'latin1');
  out[total - 1] = 0x0a;
  return out;
}

/**
 * Opens a streaming NPY (version 1.0, C order) writer of a `shape[0]` x
 * `shape[1]` array of `dtype` at `path`. Rows arrive top to bottom as typed
 * arrays whose element size matches the dtype (Int32Array, Float64Array,
 * Uint8Array, Float32Array); data is written little-endian. The file goes to
 * a temporary name and is renamed on finish(); abort() removes it.
 */
export async function openNpySink(path: string, dtype: NpyDtype, shape: [number, number]): Promise<NpySink> {
  const [height, width] = shape;
  if (!Number.isInteger(height) || height < 0 || !Number.isInteger(width) || width < 0) {
    throw new RangeError(`NPY shape ${JSON.stringify(shape)}`);
  }
  const itemBytes = ITEM_BYTES[dtype];
  if (itemBytes === undefined) throw new RangeError(`NPY dtype ${String(dtype)}`);
  await removeStaleTemps(dirname(path), basename(path));
  const tmp = tempPathFor(path);
  const fh = await open(tmp, 'wx');
  let state: 'open' | 'done' | 'failed' = 'open';
  let rowsWritten = 0;

  const fail = async (err: unknown): Promise<never> => {
    if (state !== 'failed') {
      state = 'failed';
      await fh.close().catch(() => undefined);
      await rm(tmp, { force: true });
      releaseTemp(tmp);
    }
    throw err;
  };
  const closed = (): Error => new Error(`NPY sink for ${path} is ${state === 'done' ? 'finished' : 'closed'}`);

  try {
    await writeAll(fh, npyHeader(dtype, shape));
  } catch (err) {
    return fail(err);
  }

  return {
    async writeRows(values, rowCount) {
      if (state !== 'open') throw closed();
      try {
        if (!Number.isInteger(rowCount) || rowCount < 0 || rowsWritten + rowCount > height) {
          throw new RangeError(`rows ${rowsWritten}..${rowsWritten + rowCount} exceed NPY height ${height}`);
        }
        const elementBytes = (values as { BYTES_PER_ELEMENT?: number }).BYTES_PER_ELEMENT ?? 1;
        if (elementBytes !== itemBytes) throw new TypeError(`expected ${itemBytes}-byte elements for ${dtype}`);
        const bytes = rowCount * width * itemBytes;
        if (values.byteLength < bytes) throw new RangeError(`band holds ${values.byteLength} bytes, ${bytes} needed`);
        let data = new Uint8Array(values.buffer, values.byteOffset, bytes);
        if (!LITTLE_ENDIAN && itemBytes > 1) data = swapped(data, itemBytes);
        await writeAll(fh, data);
        rowsWritten += rowCount;
      } catch (err) {
        return fail(err);
      }
    },
    async finish() {
      if (state !== 'open') throw closed();
      try {
        if (rowsWritten !== height) throw new Error(`NPY sink for ${path} got ${rowsWritten} of ${height} rows`);
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

/** A byte-swapped copy (big-endian hosts only). */
function swapped(data: Uint8Array, size: number): Uint8Array {
  const out = new Uint8Array(data.length);
  for (let i = 0; i < data.length; i += size) for (let k = 0; k < size; k++) out[i + k] = data[i + size - 1 - k]!;
  return out;
}

async function writeAll(fh: FileHandle, buf: Uint8Array): Promise<void> {
  let at = 0;
  while (at < buf.length) {
    const { bytesWritten } = await fh.write(buf, at, buf.length - at);
    at += bytesWritten;
  }
}
