import { describe, expect, it } from 'vitest';
import { lavaursPairs } from '../../src/components/lavaurs.js';
import { lavaursSweep } from '../../src/components/lavaurs-sweep.js';
import { exactCount, LavaursStream, realCount } from '../../src/components/lavaurs-stream.js';
import { satelliteOf } from '../../src/components/census-rows.js';

// OEIS A000740: components of exact period n; OEIS A000048: real ones (pairs symmetric about 1/2).
const A000740 = [1, 1, 3, 6, 15, 27, 63, 120, 252, 495, 1023, 2010, 4095, 8127, 16365, 32640, 65535, 130788, 262143, 523770];
const A000048 = [1, 1, 1, 2, 3, 5, 9, 16, 28, 51, 93, 170, 315, 585, 1091, 2048, 3855, 7280, 13797, 26214];

function drain(s: LavaursStream, chunk: number): Array<[number, number]> {
  const out: Array<[number, number]> = [];
  for (;;) {
    const c = s.next(chunk);
    if (c.lo.length === 0) return out;
    c.lo.forEach((l, i) => out.push([l, c.hi[i]!]));
  }
}

/** Euler's phi. */
function phi(n: number): number {
  let r = 0;
  for (let j = 1; j <= n; j += 1) {
    let a = j;
    let b = n;
    while (b !== 0) [a, b] = [b, a % b];
    if (a === 1) r += 1;
  }
  return r;
}

describe('LavaursStream', () => {
  it('hands out the pairs of the quadratic lavaursPairs with lo + hi <= 2^p - 1, ascending in lo, for p = 2..11', () => {
    const all = lavaursPairs(11);
    for (let p = 2; p <= 11; p += 1) {
      const den = 2 ** p - 1;
      const ref = all.filter((x) => x.period === p && x.lo + x.hi <= den).map((x) => [x.lo, x.hi]);
      expect(drain(new LavaursStream(p), 7), `period ${p}`).toEqual(ref);
    }
  });
  it('equals lavaursSweep (every endpoint kept) for p = 12..18, in one stream and in 5 shards by lower angle', () => {
    for (let p = 12; p <= 18; p += 1) {
      const den = 2 ** p - 1;
      const s = lavaursSweep(p);
      const ref: Array<[number, number]> = [];
      for (let i = 0; i < s.lo.length; i += 1) if (s.lo[i]! + s.hi[i]! <= den) ref.push([s.lo[i]!, s.hi[i]!]);
      expect(drain(new LavaursStream(p), 4096)).toEqual(ref);
      const h = Math.floor(den / 2) + 1;
      const shards: Array<[number, number]> = [];
      for (let i = 0; i < 5; i += 1) shards.push(...drain(new LavaursStream(p, Math.floor((i * h) / 5), Math.floor(((i + 1) * h) / 5)), 1000));
      expect(shards).toEqual(ref);
    }
  });
  it('through p = 20: (A000740 + A000048)/2 pairs, A000048 symmetric; satellites by the Douady-Hubbard divisor formula', () => {
    const top = process.env['CI'] === 'true' ? 20 : 18;
    for (let p = 2; p <= top; p += 1) {
      const den = 2 ** p - 1;
      const pairs = drain(new LavaursStream(p), 8192);
      const real = pairs.filter(([a, b]) => a + b === den).length;
      expect(real, `period ${p}`).toBe(A000048[p - 1]);
      expect(2 * pairs.length - real, `period ${p}`).toBe(A000740[p - 1]);
      expect(exactCount(p)).toBe(A000740[p - 1]);
      expect(realCount(p)).toBe(A000048[p - 1]);
      // satellites of period p: sum over k | p, k < p of N(k) phi(p/k) (Douady-Hubbard; N = A000740)
      let expected = 0;
      for (let k = 1; k < p; k += 1) if (p % k === 0) expected += A000740[k - 1]! * phi(p / k);
      let sats = 0;
      for (const [a, b] of pairs) if (satelliteOf(p, a, b) !== null) sats += a + b === den ? 1 : 2;
      expect(sats, `period ${p}`).toBe(expected);
    }
  });
  it('satelliteOf gives the internal angles of known bulbs: 1/3 and 2/5 of the cardioid, 1/2 of the period-2 and period-3 components', () => {
    expect(satelliteOf(3, 1, 2)).toEqual({ parentPeriod: 1, num: 1 }); // 1/7, 2/7: the 1/3 bulb
    expect(satelliteOf(5, 9, 10)).toEqual({ parentPeriod: 1, num: 2 }); // 9/31, 10/31: the 2/5 bulb
    expect(satelliteOf(4, 6, 9)).toEqual({ parentPeriod: 2, num: 1 }); // 6/15, 9/15: period 4 on the period-2 disk (methods.md D2)
    expect(satelliteOf(6, 10, 17)).toEqual({ parentPeriod: 3, num: 1 }); // tuning of 1/3, 2/3 by 1/7, 2/7
    expect(satelliteOf(3, 3, 4)).toBeNull(); // 3/7, 4/7: the real period-3 component is primitive
  });
});
