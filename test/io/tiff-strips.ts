import { inflateSync } from 'node:zlib';

/** What decodeTiffStrips found in IFD0 of a classic little- or big-endian TIFF. */
export interface DecodedTiff {
  width: number;
  height: number;
  bitsPerSample: number[];
  samplesPerPixel: number;
  tags: Map<number, { type: number; count: number; offset: number }>;
  /** Samples in file order, native numbers. */
  samples: number[];
  littleEndian: boolean;
}

/**
 * A small independent TIFF reader for tests: IFD0 of a classic TIFF (TIFF 6.0
 * §2), strips with no compression (1) or Adobe deflate (8, Adobe TIFF
 * Technical Note 2), with or without horizontal differencing (Predictor 2,
 * TIFF 6.0 §14, applied per sample at the sample's own width). Read-back of
 * 16-bit values through it does not depend on sharp/libvips reading them.
 */
export function decodeTiffStrips(file: Buffer): DecodedTiff {
  const le = file.toString('latin1', 0, 2) === 'II';
  const u16 = (o: number): number => (le ? file.readUInt16LE(o) : file.readUInt16BE(o));
  const u32 = (o: number): number => (le ? file.readUInt32LE(o) : file.readUInt32BE(o));
  if (u16(2) !== 42) throw new Error('not a classic TIFF');
  const ifd = u32(4);
  const size = [0, 1, 1, 2, 4, 8, 1, 1, 2, 4, 8, 4, 8];
  const tags = new Map<number, { type: number; count: number; offset: number }>();
  for (let i = 0, n = u16(ifd); i < n; i++) {
    const e = ifd + 2 + 12 * i;
    const type = u16(e + 2);
    const count = u32(e + 4);
    const bytes = (size[type] ?? 1) * count;
    tags.set(u16(e), { type, count, offset: bytes <= 4 ? e + 8 : u32(e + 8) });
  }
  const values = (tag: number): number[] => {
    const t = tags.get(tag);
    if (t === undefined) return [];
    const out: number[] = [];
    for (let k = 0; k < t.count; k++) out.push(t.type === 3 ? u16(t.offset + 2 * k) : u32(t.offset + 4 * k));
    return out;
  };
  const width = values(256)[0]!;
  const height = values(257)[0]!;
  const bitsPerSample = values(258);
  const spp = values(277)[0] ?? 1;
  const compression = values(259)[0] ?? 1;
  const predictor = values(317)[0] ?? 1;
  const offsets = values(273);
  const counts = values(279);
  const rowsPerStrip = values(278)[0] ?? height;
  const bytesPerSample = bitsPerSample[0]! / 8;
  const rowSamples = width * spp;
  const samples: number[] = [];
  offsets.forEach((off, s) => {
    const stored = file.subarray(off, off + counts[s]!);
    const data = compression === 8 ? inflateSync(stored) : compression === 1 ? stored : undefined;
    if (data === undefined) throw new Error(`compression ${compression} not supported by this reader`);
    const rows = Math.min(rowsPerStrip, height - s * rowsPerStrip);
    for (let r = 0; r < rows; r++) {
      const row: number[] = [];
      for (let k = 0; k < rowSamples; k++) {
        const o = (r * rowSamples + k) * bytesPerSample;
        row.push(bytesPerSample === 2 ? (le ? data.readUInt16LE(o) : data.readUInt16BE(o)) : data[o]!);
      }
      if (predictor === 2) {
        const mod = 2 ** bitsPerSample[0]!;
        for (let k = spp; k < rowSamples; k++) row[k] = (row[k]! + row[k - spp]!) % mod;
      }
      samples.push(...row);
    }
  });
  return { width, height, bitsPerSample, samplesPerPixel: spp, tags, samples, littleEndian: le };
}
