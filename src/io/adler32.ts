/** Largest run of bytes whose sums cannot overflow 2^32 before reduction (RFC 1950, 8.2; zlib's NMAX). */
const NMAX = 5552;
const BASE = 65521;

/**
 * Continues the Adler-32 checksum (RFC 1950, 8.2) `adler` over `bytes`; start
 * from 1. Returns the checksum as an unsigned 32-bit integer.
 */
export function adler32(bytes: Uint8Array, adler = 1): number {
  let a = adler & 0xffff;
  let b = adler >>> 16;
  const n = bytes.length;
  for (let i = 0; i < n;) {
    const end = Math.min(n, i + NMAX);
    for (; i < end; i++) {
      a += bytes[i]!;
      b += a;
    }
    a %= BASE;
    b %= BASE;
  }
  return ((b << 16) | a) >>> 0;
}
