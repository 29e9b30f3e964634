import { deflateSync } from 'node:zlib';
import { describe, expect, it } from 'vitest';
import { adler32 } from '../../src/io/adler32.js';

/** zlib's own Adler-32: the last 4 bytes of a zlib stream (RFC 1950, 2.2) written by node:zlib's deflate. */
function zlibAdler(bytes: Uint8Array): number {
  const z = deflateSync(bytes);
  return z.readUInt32BE(z.length - 4);
}

describe('adler32', () => {
  it('matches the trailer zlib writes, for empty, short, 0xff-filled and long inputs', () => {
    const long = new Uint8Array(3 * 5552 + 17);
    for (let i = 0; i < long.length; i++) long[i] = (i * 2654435761) >>> 24;
    for (const bytes of [new Uint8Array(0), Buffer.from('Wikipedia'), new Uint8Array(20000).fill(255), long]) {
      expect(adler32(bytes)).toBe(zlibAdler(bytes));
    }
  });

  it('gives 0x11E60398 for "Wikipedia" (the worked example of the Adler-32 article)', () => {
    expect(adler32(Buffer.from('Wikipedia'))).toBe(0x11e60398);
  });

  it('continues across pieces as over the whole', () => {
    const all = new Uint8Array(12345).map((_, i) => (i * 7919) & 0xff);
    expect(adler32(all.subarray(7000), adler32(all.subarray(0, 7000)))).toBe(zlibAdler(all));
  });
});
