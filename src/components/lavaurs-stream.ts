/**
 * Lavaurs' pairing of the period-p external angles in one pass over the
 * circle with bounded working memory (docs/methods.md D2; P. Lavaurs, C. R.
 * Acad. Sci. Paris 303 (1986) 143-146), for the census at large periods.
 *
 * lavaurs-sweep.ts keeps every chord endpoint of every lower period (about
 * 25 bytes x 2^(p+1)). Here the angles of all periods 2..p are generated in
 * increasing order (a heap merging one enumerator per period), and each
 * period keeps only its own stack of gaps: a chord of period d opening
 * (closing) pushes (pops) a gap on the stack of every period above d, and an
 * angle of period d is paired with the angle waiting in the gap on top of
 * its own stack, or waits there itself. That is the same rule as the sweep
 * (pair consecutively within each gap, in circle order), applied to every
 * period at once, so each chord's kind is known the moment its endpoint is
 * met. Working memory is the stacks and the heap; the output holds the
 * period-p pairs, ascending in the lower angle, as 32-bit numerators (4 bytes
 * each: periods up to 30 have numerators below 2^30).
 *
 * Working memory: the stack of period h holds one gap per open chord of
 * lower period, deepest near angle 1/2 (every real component's chord spans
 * it): measured at most 0.81 million gaps over all stacks at period 24,
 * growing about 1.9 times a period (about 10 million, 40 MB as Int32, at
 * period 28); the output is the memory (docs/census.md "The census in slices").
 *
 * `lowerHalf`: only the pairs with lo < 2^(p-1), i.e. lo + hi <= 2^p - 1,
 * the ones the census traces (census.ts), with the sweep stopped at angle 1/2.
 * The pairing is symmetric under n -> 2^p - 1 - n (complex conjugation), and a
 * pair (a, b) with a < 1/2 < b and its mirror image (den - b, den - a) both
 * separate 0 from 1/2, so they cannot be disjoint unless equal: such a pair is
 * symmetric, b = den - a, and the pairs still open at 1/2 are closed so. That
 * halves the time and the output: (A000740(p) + A000048(p)) / 2 pairs, of which
 * A000048(p) symmetric (the real components), both checked.
 */
import { properDivisors } from './periodic-angles.js';

/** Lavaurs pairs as 32-bit numerators over 2^p - 1: lo[i] < hi[i], ascending in lo. */
export interface LavaursPairs {
  readonly period: number;
  readonly lo: Uint32Array;
  readonly hi: Uint32Array;
}

/** One enumerator of the numerators n/(2^d - 1) of exact period d, ascending. */
interface Enumerator {
  readonly d: number;
  readonly den: number;
  readonly steps: readonly number[];
  n: number;
}

function advance(e: Enumerator): void {
  const steps = e.steps;
  next: for (;;) {
    e.n += 1;
    if (e.n >= e.den) return;
    for (let i = 0; i < steps.length; i++) if (e.n % steps[i]! === 0) continue next;
    return;
  }
}

/** n1/d1 < n2/d2 exactly (distinct angles): cross products in doubles while below 2^53. */
function less(n1: number, d1: number, n2: number, d2: number): boolean {
  const v1 = n1 / d1;
  const v2 = n2 / d2;
  if (Math.abs(v1 - v2) > 1e-9) return v1 < v2;
  if (d1 * d2 < 2 ** 53) return n1 * d2 < n2 * d1;
  return BigInt(n1) * BigInt(d2) < BigInt(n2) * BigInt(d1);
}

function mu(n: number): number {
  let m = 1;
  for (let q = 2; q * q <= n; q++) {
    if (n % q === 0) {
      n /= q;
      if (n % q === 0) return 0;
      m = -m;
    }
  }
  return n > 1 ? -m : m;
}

/** The number of angles of exact period p under doubling: sum over d | p of mu(p/d) 2^d (p >= 2). */
function exactPeriodAngles(p: number): number {
  let total = 0;
  for (let d = 1; d <= p; d++) if (p % d === 0) total += mu(p / d) * 2 ** d;
  return total;
}

/** The pairs symmetric about 1/2 (real components, OEIS A000048): (1/(2p)) sum over odd d | p of mu(d) 2^(p/d). */
function symmetricPairs(p: number): number {
  let total = 0;
  for (let d = 1; d <= p; d += 2) if (p % d === 0) total += mu(d) * 2 ** (p / d);
  return total / (2 * p);
}

/**
 * Lavaurs pairs of exact period `period` (2 <= period <= 30): the same pairs
 * as lavaursSweep, in bounded working memory; with `lowerHalf` only those
 * with lo + hi <= 2^p - 1 (see the file comment).
 */
export function lavaursStream(period: number, options: { readonly lowerHalf?: boolean } = {}): LavaursPairs {
  if (!(Number.isInteger(period) && period >= 2 && period <= 30)) throw new RangeError(`lavaursStream: period ${period} outside 2..30`);
  const lowerHalf = options.lowerHalf === true;
  const symmetric = symmetricPairs(period);
  const pairs = lowerHalf ? (exactPeriodAngles(period) / 2 + symmetric) / 2 : exactPeriodAngles(period) / 2;
  const lo = new Uint32Array(pairs);
  const hi = new Uint32Array(pairs);
  let opened = 0;
  // stacks[d]: per gap, -1 when empty, else the waiting angle (its numerator, or for period p the
  // pair index), in an Int32Array grown by doubling; tops[d] is the top gap's place.
  const stacks: Int32Array[] = [];
  const tops = new Int32Array(period + 1);
  const heap: Enumerator[] = [];
  for (let d = 2; d <= period; d++) {
    stacks[d] = new Int32Array(64).fill(-1);
    const den = 2 ** d - 1;
    const e: Enumerator = { d, den, steps: properDivisors(d).map((k) => den / (2 ** k - 1)), n: 0 };
    advance(e);
    heap.push(e);
  }
  const before = (a: Enumerator, b: Enumerator): boolean => less(a.n, a.den, b.n, b.den);
  const siftDown = (i: number): void => {
    const n = heap.length;
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < n && before(heap[l]!, heap[m]!)) m = l;
      if (r < n && before(heap[r]!, heap[m]!)) m = r;
      if (m === i) return;
      [heap[i], heap[m]] = [heap[m]!, heap[i]!];
      i = m;
    }
  };
  for (let i = (heap.length >> 1) - 1; i >= 0; i--) siftDown(i);
  while (heap.length > 0) {
    const e = heap[0]!;
    if (lowerHalf && 2 * e.n > e.den) break; // angle 1/2 reached (no angle of odd denominator is 1/2)
    const d = e.d;
    const stack = stacks[d]!;
    const top = tops[d]!;
    const waiting = stack[top]!;
    let opens: boolean;
    if (waiting < 0) {
      opens = true;
      if (d === period) {
        lo[opened] = e.n;
        stack[top] = opened++;
      } else stack[top] = e.n;
    } else {
      opens = false;
      if (d === period) hi[waiting] = e.n;
      stack[top] = -1;
    }
    // The chord's endpoint cuts a gap for every higher period.
    for (let h = d + 1; h <= period; h++) {
      if (opens) {
        const t = tops[h]! + 1;
        let s = stacks[h]!;
        if (t === s.length) {
          s = new Int32Array(2 * t);
          s.set(stacks[h]!);
          stacks[h] = s;
        }
        s[t] = -1;
        tops[h] = t;
      } else tops[h] = tops[h]! - 1;
    }
    advance(e);
    if (e.n >= e.den) {
      const last = heap.pop()!;
      if (heap.length > 0 && last !== e) heap[0] = last;
    }
    if (heap.length > 0) siftDown(0);
  }
  if (lowerHalf) {
    // the pairs open at 1/2 are the symmetric ones (file comment)
    const den = 2 ** period - 1;
    let closed = 0;
    for (const w of stacks[period]!.subarray(0, tops[period]! + 1)) {
      if (w < 0) continue;
      hi[w] = den - lo[w]!;
      closed += 1;
    }
    if (closed !== symmetric) throw new Error(`lavaursStream(${period}): ${closed} pairs open at 1/2, ${symmetric} (A000048) expected`);
  }
  if (opened !== pairs) throw new Error(`lavaursStream(${period}): ${opened} pairs opened, ${pairs} expected`);
  return { period, lo, hi };
}
