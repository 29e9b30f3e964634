/**
 * Helpers for midpoint-radius complex ball arithmetic in BigInt fixed point
 * (a ball is a complex midpoint m = (re + i im) 2^-bits and a radius
 * r 2^-bits with r >= 0; it stands for the closed disk |x - m| <= r).
 *
 * Every radius is rounded upwards and every midpoint rounding error is added
 * to the radius, so the ball computed for an expression contains every value
 * the expression takes when its inputs range over their balls. Midpoint
 * operations round to nearest (error at most 1/2 unit per part, so less than
 * one unit in modulus), radius operations round up. Doubles appear only as a
 * first guess for a square root, which is then checked in exact integers.
 *
 * Source: S. M. Rump, "Verification methods: rigorous results using
 * floating-point arithmetic", Acta Numerica 19 (2010) 287-449 (midpoint-
 * radius arithmetic); J. van der Hoeven, "Ball arithmetic" (2009);
 * R. E. Moore, Interval Analysis (1966). docs/certificates.md has the rules.
 */
import { bitLength } from './fixed.js';

/** Below this, Number(n) is finite. */
const DOUBLE_SAFE = 1n << 1000n;

/** ceil(x / 2^shift) for x >= 0. */
export function shiftUp(x: bigint, shift: bigint): bigint {
  return -(-x >> shift);
}

/**
 * An integer s >= sqrt(n) for n >= 0 (and s <= sqrt(n) (1 + 2^-38) + 2).
 * A double gives the guess; the bound is then proved by s * s >= n.
 */
export function sqrtUp(n: bigint): bigint {
  if (n <= 0n) return 0n;
  let s: bigint;
  if (n < DOUBLE_SAFE) {
    s = BigInt(Math.ceil(Math.sqrt(Number(n))));
  } else {
    const half = BigInt((bitLength(n) - 900) >> 1);
    s = BigInt(Math.ceil(Math.sqrt(Number(n >> (2n * half))))) << half;
  }
  s += (s >> 38n) + 2n;
  while (s * s < n) s += (s >> 30n) + 1n;
  return s;
}

/** An upper bound of |re + i im| in the same units. */
export function modulusUp(re: bigint, im: bigint): bigint {
  return sqrtUp(re * re + im * im);
}

/** True when the ball (re + i im, r) provably excludes 0: |m| > r, decided in exact integers. */
export function excludesZero(re: bigint, im: bigint, r: bigint): boolean {
  return re * re + im * im > r * r;
}
