/**
 * The angles of exact period p under doubling, by their numerators over
 * 2^p - 1, and the proper divisors that decide a lower period.
 */

/** The proper divisors of p. */
export function properDivisors(p: number): number[] {
  const d: number[] = [];
  for (let q = 1; q < p; q += 1) if (p % q === 0) d.push(q);
  return d;
}

/**
 * Numerators n of the angles n/(2^p - 1) of exact period p under doubling
 * (docs/methods.md D1), ascending; with `upperHalf`, only those below 1/2.
 * An angle has a lower period k | p exactly when (2^p-1)/(2^k-1) divides n.
 */
export function periodicNumerators(p: number, upperHalf: boolean): Float64Array {
  const den = 2 ** p - 1;
  const steps = properDivisors(p).map((k) => den / (2 ** k - 1));
  const end = upperHalf ? (den - 1) / 2 : den - 1;
  const out: number[] = [];
  for (let n = p === 1 ? 0 : 1; n <= end; n += 1) {
    let lower = false;
    for (const s of steps) {
      if (n % s === 0) {
        lower = true;
        break;
      }
    }
    if (!lower) out.push(n);
  }
  return Float64Array.from(out);
}
