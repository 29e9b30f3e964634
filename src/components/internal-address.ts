/**
 * Kneading sequences and internal addresses of external angles (docs/methods.md D3).
 *
 * Kneading sequence of t: symbol k (k >= 1) is 1 when 2^(k-1) t lies in the
 * open arc (t/2, (t+1)/2), 0 on the complementary open arc, and * at an
 * endpoint (which, for t of exact period p, happens first at k = p).
 * Internal address: S_0 = 1, S_{j+1} = rho(S_j), rho(n) = min{ k > n : nu_k != nu_{k-n} },
 * stopping at the period.
 * Source: D. Schleicher, "Internal addresses of the Mandelbrot set and Galois
 * groups of polynomials", Arnold Math. J. 3 (2017), arXiv math/9411238.
 */
import type { Angle } from './external-angle.js';

/** The first `length` kneading symbols of the angle ('0', '1' or '*'). */
export function kneadingSequence(a: Angle, length: number): string {
  let out = '';
  const den2 = 2n * a.den;
  let x = a.num; // 2^(k-1) t = x / den
  for (let k = 1; k <= length; k += 1) {
    // compare 2x/(2den) with t/2 = num/(2den) and (t+1)/2 = (num+den)/(2den)
    const y = 2n * x;
    if (y === a.num || y === a.num + a.den) out += '*';
    else if (y > a.num && y < a.num + a.den) out += '1';
    else out += '0';
    x = (2n * x) % a.den;
    void den2;
  }
  return out;
}

/**
 * The internal address read from a kneading sequence, up to `limit`
 * (the period for a periodic angle). Returns the list 1, S_1, ..., ending at
 * the first S_j >= limit, or where the sequence runs out.
 */
export function internalAddress(kneading: string, limit: number): number[] {
  const nu = (k: number): string => kneading[k - 1] ?? '?';
  const address = [1];
  let n = 1;
  while (n < limit) {
    let k = n + 1;
    while (k <= kneading.length && nu(k) === nu(k - n)) k += 1;
    if (k > kneading.length) break;
    address.push(k);
    n = k;
  }
  return address;
}

/** The internal address of a periodic angle of exact period p. */
export function addressOfAngle(a: Angle, period: number): number[] {
  return internalAddress(kneadingSequence(a, period), period);
}

/** "1-2-4" text. */
export function addressText(address: readonly number[]): string {
  return address.join('-');
}
