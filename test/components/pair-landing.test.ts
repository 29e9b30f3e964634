// Both rays of a census pair land on one nucleus. The census traces only the lower angle of each
// Lavaurs pair (src/components/census.ts); the upper one is its partner in Lavaurs' pairing
// (docs/methods.md D2), combinatorics rather than a landed ray. Here the upper ray of a seeded sample
// of rows at periods 11..16 is traced (docs/methods.md D4, src/components/trace-ray.ts through
// landRays) and Newton run from its end (docs/methods.md C2); it must reach the row's nucleus. A wrong
// pairing would send the upper ray to another component: distinct nuclei of one period lie more
// than a fraction of a size apart, far beyond the 1e-6 sizes allowed here.
import { describe, expect, it } from 'vitest';
import { census, type CensusComponent } from '../../src/components/census.js';
import { landRays, RAY_RECORD } from '../../src/components/land-rays.js';

/** A seeded generator (mulberry32), so the sample is the same on every run. */
function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Distance from the nucleus reached by the ray of angle num/(2^p - 1) to c's nucleus, in units of c's size. */
function landedOff(p: number, num: number, c: CensusComponent, careful: boolean): number {
  const out = landRays(p, Float64Array.of(num), careful, new Float64Array(RAY_RECORD));
  if (out[5] !== 1) return Infinity;
  const dr = out[0]! - c.reHi + (out[1]! - c.reLo);
  const di = out[2]! - c.imHi + (out[3]! - c.imLo);
  return Math.hypot(dr, di) / c.size;
}

describe('census pairs: the upper ray lands where the lower one did', () => {
  it("for a seeded sample of 7 rows per period 11..16 plus the row nearest -2, the upper angle lands on the row's nucleus", async () => {
    const rand = seeded(20261203);
    for (let p = 11; p <= 16; p += 1) {
      const comps = (await census(p, { workers: 2 })).components;
      const sample = Array.from({ length: 7 }, () => Math.floor(rand() * comps.length));
      // the component nearest -2, the smallest (landed in double-double)
      sample.push(comps.reduce((best, c, i) => (c.reHi < comps[best]!.reHi ? i : best), 0));
      for (const i of sample) {
        const c = comps[i]!;
        const [lo, hi] = c.angles as [number, number];
        expect(lo).toBeLessThan(hi);
        const where = `period ${p} angles ${lo}/${hi} over 2^${p}-1`;
        // the census itself uses the careful mode for rays caught on another pair's nucleus
        let off = landedOff(p, hi, c, false);
        if (!(off < 1e-6)) off = landedOff(p, hi, c, true);
        expect(off, where).toBeLessThan(1e-6);
        // the tolerance tells neighbours apart: the next row's upper ray lands elsewhere
        const next = comps[(i + 1) % comps.length]!;
        expect(landedOff(p, next.angles[1]!, c, false), `${where}, next row`).toBeGreaterThan(1e-2);
      }
    }
  });
});
