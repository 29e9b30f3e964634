/**
 * Kneading words of a unimodal map with a maximum and the MSS order.
 *
 * The itinerary of a point is written with R (x > x_c), L (x < x_c) and C
 * (x = x_c). The MSS word of a superstable orbit of period p is the
 * itinerary of x_1 .. x_{p-1}, the orbit of the critical value, before it
 * returns to C (N. Metropolis, M. Stein, P. Stein, J. Combin. Theory A 15
 * (1973) 25-44; docs/methods.md E5).
 *
 * Order: itineraries compare lexicographically with L < C < R, except that
 * after a common prefix holding an odd number of R's the comparison is
 * reversed (each R is an orientation-reversing branch). The kneading
 * sequence of the critical value is the largest itinerary of the orbit, and
 * it increases with the parameter of a full family (J. Milnor, W. Thurston,
 * "On iterated maps of the interval", LNM 1342 (1988) 465-563).
 */

const RANK: Record<string, number> = { L: 0, C: 1, R: 2 };

/** Compares two itineraries of the same length in the unimodal order: -1, 0 or 1. */
export function compareItineraries(a: string, b: string): number {
  let flipped = false;
  const n = Math.min(a.length, b.length);
  for (let i = 0; i < n; i++) {
    const x = a[i]!;
    const y = b[i]!;
    if (x !== y) {
      const s = RANK[x]! < RANK[y]! ? -1 : 1;
      return flipped ? -s : s;
    }
    if (x === 'R') flipped = !flipped;
  }
  return 0;
}

/**
 * True when W C repeated is shift-maximal: every shift of (W C)^inf is
 * below it. This is the MSS admissibility condition; the first p symbols
 * decide each comparison, since the shifted C meets a letter there.
 */
export function isAdmissibleWord(word: string): boolean {
  const k = `${word}C`;
  const p = k.length;
  const twice = k + k;
  for (let s = 1; s < p; s++) {
    if (compareItineraries(twice.slice(s, s + p), k) > 0) return false;
  }
  return true;
}

/**
 * The MSS words of superstable orbits of exact period p (p >= 1), in the
 * order of the parameter. Their number is OEIS A000048(p).
 */
export function mssWords(period: number): string[] {
  if (period === 1) return [''];
  const words: string[] = [];
  const n = period - 1;
  // The first letter of any admissible word of period >= 2 is R.
  for (let bits = 0; bits < 2 ** (n - 1); bits++) {
    let w = 'R';
    for (let i = n - 2; i >= 0; i--) w += (bits >> i) & 1 ? 'R' : 'L';
    if (isAdmissibleWord(w)) words.push(w);
  }
  return words.sort((a, b) => compareItineraries(`${a}C`, `${b}C`));
}

/**
 * For a satellite (period-doubled) word W = V x V of period 2q, returns V;
 * otherwise undefined. x is R when V holds an even number of R's, L when
 * odd (the harmonic of Metropolis-Stein-Stein 1973; V = '' gives R).
 */
export function satelliteParent(word: string): string | undefined {
  const p = word.length + 1;
  if (p % 2 !== 0) return undefined;
  const q = p / 2;
  const v = word.slice(0, q - 1);
  const rs = [...v].filter((ch) => ch === 'R').length;
  const x = rs % 2 === 0 ? 'R' : 'L';
  return word === v + x + v ? v : undefined;
}

/** Writes a word in the compact form of docs/checks.md: RLR^2 for RLRR. */
export function compactWord(word: string): string {
  return word.replace(/(R{2,}|L{2,})/g, (run) => `${run[0]}^${run.length}`);
}
