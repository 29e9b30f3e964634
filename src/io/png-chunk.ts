import { crc32, deflateSync } from 'node:zlib';

/** The eight bytes every PNG starts with (PNG spec, W3C 2nd ed., 5.2). */
export const PNG_SIGNATURE = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);

/** Keyword of the iTXt chunk that holds a plate's metadata JSON (ours; PNG spec 11.3.4.2 allows 1-79 Latin-1 bytes). */
export const METADATA_KEYWORD = 'quadatlas-sheet';

/**
 * One chunk: length (4 bytes, big-endian), type, data, CRC-32 over type and
 * data (PNG spec, W3C 2nd ed., 5.3). CRC from node:zlib crc32 (Node >= 20.15).
 */
export function pngChunk(type: string, data: Uint8Array): Buffer {
  const out = Buffer.alloc(12 + data.length);
  out.writeUInt32BE(data.length, 0);
  out.write(type, 4, 4, 'latin1');
  out.set(data, 8);
  out.writeUInt32BE(crc32(out.subarray(4, 8 + data.length)) >>> 0, 8 + data.length);
  return out;
}

/** IHDR: colour type 2 (RGB) or 6 (RGBA), deflate, adaptive filtering, no interlace (PNG spec 11.2.2). */
export function ihdrChunk(width: number, height: number, depth: 8 | 16, channels: 3 | 4): Buffer {
  const d = Buffer.alloc(13);
  d.writeUInt32BE(width, 0);
  d.writeUInt32BE(height, 4);
  d[8] = depth;
  d[9] = channels === 4 ? 6 : 2;
  d[10] = 0;
  d[11] = 0;
  d[12] = 0;
  return pngChunk('IHDR', d);
}

/**
 * sRGB (rendering intent 0, perceptual) with the gAMA and cHRM values the PNG
 * spec recommends writing beside it for decoders that ignore sRGB
 * (PNG spec, W3C 2nd ed., 11.3.3.5: gAMA 45455; cHRM white 0.3127,0.3290,
 * red 0.64,0.33, green 0.30,0.60, blue 0.15,0.06, each times 100000).
 */
export function srgbChunks(): Buffer[] {
  const gama = Buffer.alloc(4);
  gama.writeUInt32BE(45455, 0);
  const chrm = Buffer.alloc(32);
  [31270, 32900, 64000, 33000, 30000, 60000, 15000, 6000].forEach((v, i) => chrm.writeUInt32BE(v, 4 * i));
  return [pngChunk('sRGB', Buffer.from([0])), pngChunk('gAMA', gama), pngChunk('cHRM', chrm)];
}

/** iCCP: an embedded ICC profile, name then compression method 0 and the zlib-compressed profile (PNG spec 11.3.3.3). */
export function iccpChunk(name: string, profile: Uint8Array): Buffer {
  return pngChunk('iCCP', Buffer.concat([Buffer.from(name, 'latin1'), Buffer.from([0, 0]), deflateSync(profile)]));
}

/** pHYs in pixels per metre, unit 1 (PNG spec 11.3.5.3); one inch is exactly 0.0254 m. */
export function physChunk(dpi: number): Buffer {
  const d = Buffer.alloc(9);
  const ppm = Math.round(dpi / 0.0254);
  d.writeUInt32BE(ppm, 0);
  d.writeUInt32BE(ppm, 4);
  d[8] = 1;
  return pngChunk('pHYs', d);
}

/**
 * iTXt with compressed UTF-8 text (PNG spec 11.3.4.5): keyword, NUL,
 * compression flag 1, method 0, empty language tag, NUL, empty translated
 * keyword, NUL, zlib stream of the text.
 */
export function itxtChunk(keyword: string, text: string): Buffer {
  return pngChunk('iTXt', Buffer.concat([Buffer.from(keyword, 'latin1'), Buffer.from([0, 1, 0, 0, 0]), deflateSync(Buffer.from(text, 'utf8'))]));
}

/** tEXt: Latin-1 keyword, NUL, Latin-1 text (PNG spec 11.3.4.3). */
export function textChunk(keyword: string, text: string): Buffer {
  return pngChunk('tEXt', Buffer.concat([Buffer.from(keyword, 'latin1'), Buffer.from([0]), Buffer.from(text, 'latin1')]));
}
