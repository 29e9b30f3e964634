import { requireInCi } from '../helpers/require-in-ci.js';
import { spawnSync } from 'node:child_process';
import { mkdir, readdir, readFile } from 'node:fs/promises';
import path from 'node:path';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { npyHeader, openNpySink } from '../../src/io/npy-sink.js';
import type { NpyDtype } from '../../src/io/npy-sink.js';
import { scratchDir } from './io-fixtures.js';

let dir = '';
let cleanup: () => Promise<void> = async () => undefined;
beforeEach(async () => ({ dir, cleanup } = await scratchDir()));
afterEach(() => cleanup());

/**
 * Parses an NPY 1.0 file per numpy.lib.format: magic \x93NUMPY, major 1, minor 0,
 * uint16 LE header length, ASCII dict ending in '\n', data from 10 + HEADER_LEN.
 */
function parseNpy(bytes: Buffer): { descr: string; fortran: string; shape: number[]; headerTotal: number; dict: string; data: Buffer } {
  expect(bytes.toString('latin1', 0, 6)).toBe('\x93NUMPY');
  expect([bytes[6], bytes[7]]).toEqual([1, 0]);
  const headerLen = bytes.readUInt16LE(8);
  const dict = bytes.toString('latin1', 10, 10 + headerLen);
  const m = /^\{'descr': '([^']+)', 'fortran_order': (True|False), 'shape': \((\d+), (\d+)\), \} *\n$/.exec(dict);
  expect(m).not.toBeNull();
  return {
    descr: m![1]!,
    fortran: m![2]!,
    shape: [Number(m![3]), Number(m![4])],
    headerTotal: 10 + headerLen,
    dict,
    data: bytes.subarray(10 + headerLen),
  };
}

type Typed = Int32Array | Float64Array | Float32Array | Uint8Array;
const cases: { dtype: NpyDtype; make: (n: number) => Typed; read: (b: Buffer, i: number) => number }[] = [
  { dtype: '<i4', make: (n) => Int32Array.from({ length: n }, (_, i) => (i * 2654435761) | 0), read: (b, i) => b.readInt32LE(4 * i) },
  { dtype: '<f8', make: (n) => Float64Array.from({ length: n }, (_, i) => Math.sin(i) * 1e300 ** ((i % 3) - 1)), read: (b, i) => b.readDoubleLE(8 * i) },
  { dtype: '<f4', make: (n) => Float32Array.from({ length: n }, (_, i) => i / 7 - 3), read: (b, i) => b.readFloatLE(4 * i) },
  { dtype: '|u1', make: (n) => Uint8Array.from({ length: n }, (_, i) => (i * 37) & 0xff), read: (b, i) => b[i]! },
];

describe('npyHeader', () => {
  it('pads magic + version + length + header to a multiple of 64 bytes, ending in a newline', () => {
    // numpy.lib.format: "padded with spaces (\x20) to make the total of len(magic string) + 2 +
    // len(length) + HEADER_LEN be evenly divisible by 64"; terminated by '\n'.
    for (const shape of [
      [1, 1],
      [4000, 4000],
      [123456789, 987654321],
    ] as [number, number][]) {
      const h = npyHeader('<f8', shape);
      expect(h.length % 64).toBe(0);
      expect(h[h.length - 1]).toBe(0x0a);
      expect(h.readUInt16LE(8)).toBe(h.length - 10);
    }
    // The common case fits in one 128-byte preamble, as numpy itself writes for 2-D arrays (common practice).
    expect(npyHeader('<i4', [480, 640]).length).toBe(128);
  });
});

describe('openNpySink', () => {
  for (const { dtype, make, read } of cases) {
    it(`writes a ${dtype} array in bands whose header parses and whose data round-trips`, async () => {
      const [h, w] = [13, 7];
      const values = make(h * w);
      const file = path.join(dir, 'a.npy');
      const sink = await openNpySink(file, dtype, [h, w]);
      const per = values.length / h;
      const bytesPer = values.BYTES_PER_ELEMENT;
      for (const [r0, n] of [
        [0, 5],
        [5, 1],
        [6, 7],
      ] as const) {
        await sink.writeRows(values.subarray(r0 * per, (r0 + n) * per), n); // a view with a non-zero byteOffset
      }
      await sink.finish();
      const parsed = parseNpy(await readFile(file));
      expect(parsed).toMatchObject({ descr: dtype, fortran: 'False', shape: [13, 7] });
      expect(parsed.headerTotal % 64).toBe(0);
      expect(parsed.data.length).toBe(h * w * bytesPer);
      const back = Array.from({ length: h * w }, (_, i) => read(parsed.data, i));
      expect(back).toEqual(Array.from(values));
    });
  }

  it('writes rows from typed arrays of the dtype, such as Float64Array bands', async () => {
    const file = path.join(dir, 'b.npy');
    const sink = await openNpySink(file, '<f8', [2, 3]);
    await sink.writeRows(new Float64Array([0.5, -0, Infinity]), 1);
    await sink.writeRows(new Float64Array([Number.NaN, 1e-310, -2]), 1);
    await sink.finish();
    const { data } = parseNpy(await readFile(file));
    const back = [0, 1, 2, 3, 4, 5].map((i) => data.readDoubleLE(8 * i));
    expect(back).toEqual([0.5, -0, Infinity, Number.NaN, 1e-310, -2]);
    expect(Object.is(back[1], -0)).toBe(true);
  });

  // NumPy itself as the reference reader, where python3 with numpy is installed (skipped otherwise).
  const numpy = spawnSync('python3', ['-c', 'import numpy'], { stdio: 'ignore' }).status === 0;
  it.skipIf(!requireInCi(numpy, 'python3-numpy'))('writes files numpy.load reads with the same dtype, shape and values', async () => {
    const file = path.join(dir, 'n.npy');
    const sink = await openNpySink(file, '<f8', [3, 2]);
    await sink.writeRows(new Float64Array([0.1, -2.5, 1e300, 5e-324]), 2);
    await sink.writeRows(new Float64Array([Math.PI, -0]), 1);
    await sink.finish();
    const py = spawnSync('python3', ['-c', 'import sys, numpy as np; a = np.load(sys.argv[1]); print(a.dtype.str, a.shape, [int(x) for x in a.view("<u8").ravel()])', file], {
      encoding: 'utf8',
    });
    expect(py.stderr).toBe('');
    // Compare bit patterns, so -0 and the smallest subnormal are checked exactly.
    const bits = Array.from(new BigUint64Array(new Float64Array([0.1, -2.5, 1e300, 5e-324, Math.PI, -0]).buffer));
    expect(py.stdout.trim()).toBe(`<f8 (3, 2) [${bits.join(', ')}]`);
  });

  it('cleans up its temporary file when the final rename fails, leaving the final name untouched', async () => {
    const target = path.join(dir, 'e.npy');
    await mkdir(target);
    const sink = await openNpySink(target, '|u1', [1, 3]);
    await sink.writeRows(new Uint8Array([1, 2, 3]), 1);
    await expect(sink.finish()).rejects.toThrow();
    expect(await readdir(dir)).toEqual(['e.npy']);
    expect(await readdir(target)).toEqual([]);
  });

  it('rejects elements of the wrong size and leaves no file', async () => {
    const sink = await openNpySink(path.join(dir, 'c.npy'), '<f8', [2, 2]);
    await expect(sink.writeRows(new Float32Array(4), 2)).rejects.toThrow(/8-byte elements/);
    expect(await readdir(dir)).toEqual([]);
  });

  it('leaves no file after abort, and none before finish', async () => {
    const sink = await openNpySink(path.join(dir, 'd.npy'), '|u1', [2, 2]);
    await sink.writeRows(new Uint8Array(4), 2);
    expect((await readdir(dir)).filter((f) => f === 'd.npy')).toEqual([]);
    await sink.abort();
    expect(await readdir(dir)).toEqual([]);
  });
});
