/**
 * The number of zeros of F_P(c) = f_c^P(0) of exact period P:
 * sum over d | P of mu(P/d) 2^(d-1). F_P has degree 2^(P-1) and its zeros
 * are simple (Gleason's lemma: A. Douady, J. H. Hubbard, "Etude dynamique
 * des polynomes complexes", Publ. Math. Orsay 84-02 (1984), expose XIX), so
 * the zeros of F_d for d | P partition those of F_P and Moebius inversion of
 * sum_{d|P} N(d) = 2^(P-1) gives N(P). This is a theorem, not a table value
 * (it matches OEIS A000740).
 */

/** The Moebius function. */
export function moebius(n: number): number {
  let m = 1;
  for (let q = 2; q * q <= n; q += 1) {
    if (n % q === 0) {
      n /= q;
      if (n % q === 0) return 0;
      m = -m;
    }
  }
  return n > 1 ? -m : m;
}

/** sum over d | p of mu(p/d) 2^(d-1), exactly. */
export function exactPeriodCount(p: number): bigint {
  let s = 0n;
  for (let d = 1; d <= p; d += 1) if (p % d === 0) s += BigInt(moebius(p / d)) * (1n << BigInt(d - 1));
  return s;
}
