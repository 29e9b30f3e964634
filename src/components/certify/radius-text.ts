/**
 * A length given in units of 2^-bits, as a decimal with two significant
 * digits rounded upwards ("3.2e-21"), so that a disk of the printed radius
 * contains the disk that was certified.
 */
import { bitLength, pow10 } from '../../precise/fixed.js';

export function radiusText(units: bigint, bits: number): string {
  if (units <= 0n) return '0';
  const one = 1n << BigInt(bits);
  // m(e) = ceil(x 10^(1-e)) with x = units 2^-bits; want 10 <= m <= 100
  const m = (e: number): bigint => {
    const k = 1 - e;
    const num = k >= 0 ? units * pow10(k) : units;
    const den = k >= 0 ? one : one * pow10(-k);
    return (num + den - 1n) / den;
  };
  let e = Math.floor((bitLength(units) - 1 - bits) * Math.log10(2));
  let v = m(e);
  for (;;) {
    if (v > 100n) e += 1;
    else if (v < 10n) e -= 1;
    else break;
    v = m(e);
  }
  if (v === 100n) {
    v = 10n;
    e += 1;
  }
  return `${v / 10n}.${v % 10n}e${e}`;
}
