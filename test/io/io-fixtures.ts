import { mkdtemp, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';

/** A fresh scratch directory under the OS temp dir; `cleanup` removes it. */
export async function scratchDir(): Promise<{ dir: string; cleanup: () => Promise<void> }> {
  const dir = await mkdtemp(path.join(os.tmpdir(), 'quadatlas-io-'));
  return { dir, cleanup: () => rm(dir, { recursive: true, force: true }) };
}

/**
 * Deterministic test pixels with every kind of local structure the PNG filters
 * react to: smooth ramps, a hard edge, noise, and both extremes of the range.
 * (Synthetic, our own; no external reference needed: read-back must equal it.)
 */
export function testPixels(width: number, height: number, channels: 3 | 4, depth: 8 | 16): Uint8Array | Uint16Array {
  const max = depth === 16 ? 65535 : 255;
  const out = depth === 16 ? new Uint16Array(width * height * channels) : new Uint8Array(width * height * channels);
  let seed = 0x9e3779b9;
  for (let j = 0; j < height; j++) {
    for (let i = 0; i < width; i++) {
      for (let c = 0; c < channels; c++) {
        seed = (Math.imul(seed, 1664525) + 1013904223) >>> 0;
        let v: number;
        if (j % 4 === 0)
          v = Math.round(((i + c * 7) / (width + 21)) * max); // ramp
        else if (j % 4 === 1)
          v = i < width / 2 ? 0 : max; // edge, extremes
        else if (j % 4 === 2)
          v = seed % (max + 1); // noise
        else v = Math.round((((j * 3 + i * c) % 97) / 96) * max); // diagonal pattern
        out[(j * width + i) * channels + c] = v;
      }
    }
  }
  return out;
}

/** The PNG chunk types of a file in order (PNG spec 5.3: length, type, data, CRC). */
export function chunkTypes(png: Uint8Array): string[] {
  const b = Buffer.from(png.buffer, png.byteOffset, png.length);
  const types: string[] = [];
  for (let at = 8; at < b.length;) {
    const len = b.readUInt32BE(at);
    types.push(b.toString('latin1', at + 4, at + 8));
    at += 12 + len;
  }
  return types;
}

/** Chunks of one type, as data buffers. */
export function chunksOf(png: Uint8Array, type: string): Buffer[] {
  const b = Buffer.from(png.buffer, png.byteOffset, png.length);
  const found: Buffer[] = [];
  for (let at = 8; at < b.length;) {
    const len = b.readUInt32BE(at);
    if (b.toString('latin1', at + 4, at + 8) === type) found.push(b.subarray(at + 8, at + 8 + len));
    at += 12 + len;
  }
  return found;
}
