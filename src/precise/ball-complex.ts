/**
 * Complex balls as values (midpoint re + i im and radius r, all in units of
 * 2^-bits at one scale): the general, allocating counterpart of the
 * written-out loop in certify-nucleus.ts, for small systems (roots) where
 * speed does not matter. Rounding rules as in ball.ts: midpoints to nearest
 * (error under one unit in modulus, added to the radius), radii upwards.
 * Source: S. M. Rump, Acta Numerica 19 (2010) 287-449.
 */
import { modulusUp } from './ball.js';

export interface Ball {
  readonly re: bigint;
  readonly im: bigint;
  readonly r: bigint;
}

export const ZERO_BALL: Ball = { re: 0n, im: 0n, r: 0n };

export function exactBall(re: bigint, im: bigint, r = 0n): Ball {
  return { re, im, r };
}

export function badd(a: Ball, b: Ball): Ball {
  return { re: a.re + b.re, im: a.im + b.im, r: a.r + b.r };
}

export function bsub(a: Ball, b: Ball): Ball {
  return { re: a.re - b.re, im: a.im - b.im, r: a.r + b.r };
}

export function btwice(a: Ball): Ball {
  return { re: a.re << 1n, im: a.im << 1n, r: a.r << 1n };
}

/** a b: |a| rb + |b| ra + ra rb, rounded up, plus one unit for the midpoint. */
export function bmul(a: Ball, b: Ball, bits: number): Ball {
  const sh = BigInt(bits);
  const half = 1n << (sh - 1n);
  const rad = modulusUp(a.re, a.im) * b.r + modulusUp(b.re, b.im) * a.r + a.r * b.r;
  return {
    re: (a.re * b.re - a.im * b.im + half) >> sh,
    im: (a.re * b.im + a.im * b.re + half) >> sh,
    r: -(-rad >> sh) + 1n,
  };
}

/** An upper bound of |x| over the ball. */
export function bsup(a: Ball): bigint {
  return modulusUp(a.re, a.im) + a.r;
}

/** The ball excludes 0 (decided exactly). */
export function bexcludesZero(a: Ball): boolean {
  return a.re * a.re + a.im * a.im > a.r * a.r;
}

/** An approximate 1/a at the midpoint (exact BigInt division; any value is allowed where this is used). */
export function approxInverse(re: bigint, im: bigint, bits: number): { re: bigint; im: bigint } {
  const den = re * re + im * im;
  if (den === 0n) throw new RangeError('approxInverse of 0');
  const s2 = 2n * BigInt(bits);
  return { re: (re << s2) / den, im: (-im << s2) / den };
}
