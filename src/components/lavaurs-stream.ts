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
 * period-p pairs, ascending in the lower angle.
 */
import type { LavaursSweep } from './lavaurs-sweep.js';
import { properDivisors } from './periodic-angles.js';

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

/** The number of angles of exact period p under doubling: sum over d | p of mu(p/d) 2^d (p >= 2). */
function exactPeriodAngles(p: number): number {
  const mu = (n: number): number => {
    let m = 1;
    for (let q = 2; q * q <= n; q++) {
      if (n % q === 0) {
        n /= q;
        if (n % q === 0) return 0;
        m = -m;
      }
    }
    return n > 1 ? -m : m;
  };
  let total = 0;
  for (let d = 1; d <= p; d++) if (p % d === 0) total += mu(p / d) * 2 ** d;
  return total;
}

/** Lavaurs pairs of exact period `period` (2 <= period <= 30): the same pairs as lavaursSweep, in bounded working memory. */
export function lavaursStream(period: number): LavaursSweep {
  if (!(Number.isInteger(period) && period >= 2 && period <= 30)) throw new RangeError(`lavaursStream: period ${period} outside 2..30`);
  const pairs = exactPeriodAngles(period) / 2;
  const lo = new Float64Array(pairs);
  const hi = new Float64Array(pairs);
  let opened = 0;
  // stacks[d]: per gap, -1 when empty, else the waiting angle (its numerator, or for period p the pair index).
  const stacks: number[][] = [];
  const heap: Enumerator[] = [];
  for (let d = 2; d <= period; d++) {
    stacks[d] = [-1];
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
    const d = e.d;
    const stack = stacks[d]!;
    const top = stack.length - 1;
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
      if (opens) stacks[h]!.push(-1);
      else stacks[h]!.pop();
    }
    advance(e);
    if (e.n >= e.den) {
      const last = heap.pop()!;
      if (heap.length > 0 && last !== e) heap[0] = last;
    }
    if (heap.length > 0) siftDown(0);
  }
  if (opened !== pairs) throw new Error(`lavaursStream(${period}): ${opened} pairs opened, ${pairs} expected`);
  return { period, lo, hi };
}
