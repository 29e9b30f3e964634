import { describe, expect, it } from 'vitest';
import { lavaursPairs } from '../../src/components/lavaurs.js';
import { lavaursSweep } from '../../src/components/lavaurs-sweep.js';
import { landRays, RAY_RECORD } from '../../src/components/land-rays.js';

// OEIS A000740 (as published; p = 13 is 4095; checked below against its Moebius definition): components of exact period n, i.e. Lavaurs pairs of period n (docs/methods.md C5, D2).
const A000740 = [1, 1, 3, 6, 15, 27, 63, 120, 252, 495, 1023, 2010, 4095, 8127, 16365, 32640];
// OEIS A000048: real components of period n, i.e. pairs symmetric about 1/2.
const A000048 = [1, 1, 1, 2, 3, 5, 9, 16, 28, 51, 93, 170, 315, 585, 1091, 2048];

/** Moebius mu(n) by trial division (written here, independent of the census code). */
function mobius(n: number): number {
  let m = n,
    sign = 1;
  for (let q = 2; q * q <= m; q += 1) {
    if (m % q !== 0) continue;
    m /= q;
    if (m % q === 0) return 0;
    sign = -sign;
  }
  return m > 1 ? -sign : sign;
}

describe('the check tables', () => {
  it('A000740 as typed equals its definition sum over d | n of mu(n/d) 2^(d-1) (OEIS A000740), n = 1..16', () => {
    const byDefinition = Array.from({ length: 16 }, (_, i) => {
      const n = i + 1;
      let sum = 0;
      for (let d = 1; d <= n; d += 1) if (n % d === 0) sum += mobius(n / d) * 2 ** (d - 1);
      return sum;
    });
    expect(byDefinition).toEqual(A000740);
  });
  it('A000048 as typed equals its definition (1/(2n)) sum over odd d | n of mu(d) 2^(n/d) (OEIS A000048), n = 1..16', () => {
    const byDefinition = Array.from({ length: 16 }, (_, i) => {
      const n = i + 1;
      let sum = 0;
      for (let d = 1; d <= n; d += 2) if (n % d === 0) sum += mobius(d) * 2 ** (n / d);
      return sum / (2 * n);
    });
    expect(byDefinition).toEqual(A000048);
  });
});

describe('lavaursSweep', () => {
  it('lavaursSweep(p) gives the same pairs as the quadratic lavaursPairs for p = 2..11', () => {
    const all = lavaursPairs(11);
    for (let p = 2; p <= 11; p += 1) {
      const s = lavaursSweep(p);
      const ref = all.filter((x) => x.period === p);
      expect(Array.from(s.lo), `period ${p}`).toEqual(ref.map((x) => x.lo));
      expect(Array.from(s.hi), `period ${p}`).toEqual(ref.map((x) => x.hi));
    }
  });
  it('lavaursSweep(4) gives the period-4 pairs of docs/methods.md D2', () => {
    const s = lavaursSweep(4);
    expect(Array.from(s.lo, (lo, i) => [lo, s.hi[i]])).toEqual([
      [1, 2],
      [3, 4],
      [6, 9],
      [7, 8],
      [11, 12],
      [13, 14],
    ]); // over 15
  });
  it('lavaursSweep(16) gives A000740(16) pairs, A000048(16) of them symmetric about 1/2, every period-16 angle used once', () => {
    for (const p of [12, 16]) {
      const s = lavaursSweep(p);
      const den = 2 ** p - 1;
      expect(s.lo.length).toBe(A000740[p - 1]);
      let symmetric = 0;
      const seen = new Set<number>();
      for (let i = 0; i < s.lo.length; i += 1) {
        if (s.lo[i]! + s.hi[i]! === den) symmetric += 1;
        expect(s.lo[i]!).toBeLessThan(s.hi[i]!);
        seen.add(s.lo[i]!).add(s.hi[i]!);
      }
      expect(symmetric).toBe(A000048[p - 1]);
      expect(seen.size).toBe(2 * A000740[p - 1]!);
    }
  });
  it('both rays of every pair land on one nucleus and different pairs on different nuclei, p = 2..10 (combinatorics = numerics)', () => {
    for (let p = 2; p <= 10; p += 1) {
      const s = lavaursSweep(p);
      const lo = landRays(p, s.lo, false, new Float64Array(s.lo.length * RAY_RECORD));
      const hi = landRays(p, s.hi, false, new Float64Array(s.hi.length * RAY_RECORD));
      const nuclei: Array<[number, number, number]> = [];
      for (let i = 0; i < s.lo.length; i += 1) {
        const o = i * RAY_RECORD;
        expect(lo[o + 5]).toBe(1);
        expect(hi[o + 5]).toBe(1);
        const size = lo[o + 4]!;
        expect(Math.hypot(lo[o]! - hi[o]!, lo[o + 2]! - hi[o + 2]!), `period ${p} pair ${s.lo[i]}/${s.hi[i]}`).toBeLessThan(1e-6 * size);
        nuclei.push([lo[o]!, lo[o + 2]!, size]);
      }
      nuclei.sort((a, b) => a[0] - b[0]);
      for (let i = 0; i < nuclei.length; i += 1) {
        for (let j = i + 1; j < nuclei.length && nuclei[j]![0] - nuclei[i]![0] < 1e-3; j += 1) {
          expect(Math.hypot(nuclei[j]![0] - nuclei[i]![0], nuclei[j]![1] - nuclei[i]![1])).toBeGreaterThan(1e-3 * Math.min(nuclei[i]![2], nuclei[j]![2]));
        }
      }
    }
  });
});

describe('lavaursStream (bounded memory)', () => {
  it("gives the pairs of Lavaurs' rule itself (lavaursPairs, quadratic) for periods 2..10, and of the sweep for 11..16", async () => {
    const { lavaursStream } = await import('../../src/components/lavaurs-stream.js');
    for (let p = 2; p <= 16; p += 1) {
      const s = lavaursStream(p);
      expect(s.lo.length, `period ${p}`).toBe(A000740[p - 1]);
      if (p <= 10) {
        const byRule = lavaursPairs(p)
          .filter((q) => q.period === p)
          .map((q) => [q.lo, q.hi]);
        expect(Array.from(s.lo).map((l, i) => [l, s.hi[i]])).toEqual(byRule.sort((x, y) => x[0]! - y[0]!));
      } else {
        const w = lavaursSweep(p);
        expect(Array.from(s.lo)).toEqual(Array.from(w.lo));
        expect(Array.from(s.hi)).toEqual(Array.from(w.hi));
      }
      // A000048: the pairs symmetric about 1/2 (lo + hi = 2^p - 1) are the real components.
      expect(Array.from(s.lo).filter((l, i) => l + s.hi[i]! === 2 ** p - 1).length, `period ${p}`).toBe(A000048[p - 1]);
    }
  });
});

describe('lavaursStream lowerHalf (the pairs the census traces)', () => {
  it("gives exactly the full stream's pairs with lo + hi <= 2^p - 1, (A000740 + A000048) / 2 of them (OEIS), for periods 2..16", async () => {
    const { lavaursStream } = await import('../../src/components/lavaurs-stream.js');
    for (let p = 2; p <= 16; p += 1) {
      const den = 2 ** p - 1;
      const full = lavaursStream(p);
      const half = lavaursStream(p, { lowerHalf: true });
      const keep = Array.from(full.lo.keys()).filter((i) => full.lo[i]! + full.hi[i]! <= den);
      expect(Array.from(half.lo), `period ${p}`).toEqual(keep.map((i) => full.lo[i]));
      expect(Array.from(half.hi), `period ${p}`).toEqual(keep.map((i) => full.hi[i]));
      expect(half.lo.length, `period ${p}`).toBe((A000740[p - 1]! + A000048[p - 1]!) / 2);
    }
  });
});
