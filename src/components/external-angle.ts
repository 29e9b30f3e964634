/**
 * Rational external angles: parsing, period and preperiod under doubling,
 * as exact BigInt fractions (docs/methods.md D1).
 */
import { UserError } from '../check/user-error.js';

/** An angle num/den in [0, 1), reduced. */
export interface Angle {
  readonly num: bigint;
  readonly den: bigint;
}

function gcd(a: bigint, b: bigint): bigint {
  while (b !== 0n) [a, b] = [b, a % b];
  return a < 0n ? -a : a;
}

/** Parses "a/b" (0 <= a < b, b <= 2^4096) or "0"; throws UserError naming `field`. */
export function parseAngle(text: string, field: string): Angle {
  const t = typeof text === 'string' ? text.trim() : '';
  if (t === '0') return { num: 0n, den: 1n };
  const m = /^(\d{1,1300})\/(\d{1,1300})$/.exec(t);
  if (m === null) throw new UserError(field, 'a rational angle a/b with 0 <= a < b, such as 1/7', text);
  const a = BigInt(m[1]!);
  const b = BigInt(m[2]!);
  if (b === 0n || a >= b) throw new UserError(field, 'a rational angle a/b with 0 <= a < b, such as 1/7', text);
  const g = gcd(a, b);
  return { num: a / g, den: b / g };
}

/** Preperiod and period of the angle under doubling mod 1 (period of a periodic angle is its exact period). */
export function angleOrbit(a: Angle): { preperiod: number; period: number } {
  let den = a.den;
  let preperiod = 0;
  while (den % 2n === 0n) {
    den /= 2n;
    preperiod += 1;
  }
  if (a.num === 0n || den === 1n) return { preperiod, period: 1 };
  // multiplicative order of 2 mod den
  let x = 2n % den;
  let period = 1;
  while (x !== 1n) {
    x = (x * 2n) % den;
    period += 1;
    if (period > 100_000) throw new UserError('angle', 'an angle whose period under doubling is at most 100000', `${a.num}/${a.den}`);
  }
  return { preperiod, period };
}

/** The angle written as a numerator over 2^p - 1 (for a periodic angle of period p). */
export function overMersenne(a: Angle, period: number): bigint {
  const m = (1n << BigInt(period)) - 1n;
  return (a.num * m) / a.den;
}

/** "num/den" text. */
export function angleText(a: Angle): string {
  return a.num === 0n ? '0' : `${a.num}/${a.den}`;
}
