// A census run in angle-range chunks (census-shard.ts; the slices `components --shard` computes) equals the census
// run whole, component for component, for periods 10..16; the chunks' statistics add up to the whole's.
import { describe, expect, it } from 'vitest';
import { census, type CensusResult } from '../../src/components/census.js';
import { shardAngleRange } from '../../src/components/census-shard.js';

// OEIS A000740(10..16): components of exact period p (docs/checks.md "Counts").
const A000740 = new Map([
  [10, 495],
  [11, 1023],
  [12, 2010],
  [13, 4095],
  [14, 8127],
  [15, 16365],
  [16, 32640],
]);

describe('census in chunks', () => {
  it('chunks of the lower-angle range, concatenated, equal the whole census row for row for p = 10..16 (3, 4 or 5 chunks)', async () => {
    for (let p = 10; p <= 16; p++) {
      const whole = await census(p);
      expect(whole.components.length, `period ${p}`).toBe(A000740.get(p));
      const n = 3 + (p % 3);
      const parts: CensusResult[] = [];
      for (let i = 0; i < n; i++) parts.push(await census(p, { angleRange: shardAngleRange(p, { index: i, count: n }) }));
      const rows = parts.flatMap((r) => r.components);
      expect(rows.length, `period ${p} in ${n} chunks`).toBe(whole.components.length);
      for (let k = 0; k < rows.length; k++) expect(rows[k], `period ${p}, row ${k}`).toEqual(whole.components[k]);
      const sum = (f: (s: CensusResult['statistics']) => number): number => parts.reduce((a, r) => a + f(r.statistics), 0);
      expect([sum((s) => s.count), sum((s) => s.real), sum((s) => s.satellite)]).toEqual([whole.statistics.count, whole.statistics.real, whole.statistics.satellite]);
      // the area is a floating-point sum in a different grouping: equal to about 1e-13 relative
      expect(sum((s) => s.areaEstimate) / whole.statistics.areaEstimate).toBeCloseTo(1, 12);
      expect(parts.every((r) => r.unpaired === 0 && r.raysLost === 0)).toBe(true);
    }
  }, 120_000);

  it('shardAngleRange tiles [0, 2^p - 1) without gaps or overlaps, floor(I (2^p - 1) / N) to floor((I + 1) (2^p - 1) / N)', () => {
    for (const [p, n] of [
      [12, 4],
      [13, 7],
      [30, 1000],
    ] as const) {
      let end = 0;
      for (let i = 0; i < n; i++) {
        const r = shardAngleRange(p, { index: i, count: n });
        expect(r.from).toBe(end);
        expect(r.to).toBe(Math.floor(((i + 1) * (2 ** p - 1)) / n));
        end = r.to;
      }
      expect(end).toBe(2 ** p - 1);
    }
  });
});
