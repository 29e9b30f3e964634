import { describe, expect, it } from 'vitest';
import { census, type CensusComponent } from '../../src/components/census.js';
import { censusSlices, closeNucleiInRuns } from '../../src/components/census-slices.js';

/**
 * The census in slices (src/components/census-slices.ts) against the census in
 * one piece: the same components in the same order (lower angle ascending),
 * for many small slices, and the counts of OEIS A000740 and A000048.
 */
async function sliced(period: number, sliceComponents: number): Promise<{ comps: CensusComponent[]; result: Awaited<ReturnType<typeof censusSlices>> }> {
  const comps: CensusComponent[] = [];
  const result = await censusSlices(period, {
    sliceComponents,
    onComponents: async (c) => {
      comps.push(...c);
    },
  });
  return { comps, result };
}

describe('census in slices', () => {
  it('equals the census in one piece, row for row, for periods 10 to 14 in slices of 64 to 512 components', async () => {
    for (const [p, n] of [
      [10, 64],
      [12, 128],
      [14, 512],
    ] as const) {
      const whole = await census(p);
      const { comps, result } = await sliced(p, n);
      expect(result.slices, `period ${p}: slices`).toBeGreaterThan(4);
      expect(comps, `period ${p}`).toEqual(whole.components);
      expect(result.crossDuplicates, `period ${p}`).toBe(0);
      expect(result.statistics.count).toBe(whole.statistics.count);
      expect(result.statistics.real).toBe(whole.statistics.real);
      expect(result.statistics.satellite).toBe(whole.statistics.satellite);
      expect(result.statistics.sizeHistogram).toEqual(whole.statistics.sizeHistogram);
      // the area sum runs in another order (compensated): equal to rounding
      expect(result.statistics.areaEstimate).toBeCloseTo(whole.statistics.areaEstimate, 15);
    }
  }, 120_000);

  it('counts A000740(15) = 16365 components, A000048(15) = 1091 real (OEIS), in 32 slices', async () => {
    const { comps, result } = await sliced(15, 512);
    expect(result.slices).toBe(32);
    expect(comps.length).toBe(16365);
    expect(comps.filter((c) => c.real).length).toBe(1091);
    // ascending lower angles: the order the listing promises
    for (let i = 1; i < comps.length; i++) expect(comps[i]!.angles[0]!).toBeGreaterThan(comps[i - 1]!.angles[0]!);
  }, 60_000);

  it('lands the few pairs whose arc straddles a slice boundary in both slices, and lists their components once', async () => {
    const whole = await census(9);
    const { comps, result } = await sliced(9, 16);
    expect(comps).toEqual(whole.components);
    expect(result.raysTraced).toBeGreaterThan(whole.raysTraced);
    expect(result.crossDuplicates).toBe(0);
  }, 60_000);

  it('the cross-slice sweep finds a planted duplicate: a copy of a nucleus moved by 1e-5 of its size, and not one moved by 1e-2', async () => {
    // the census rule (docs/methods.md C5): nuclei closer than 1e-3 of the smaller size are one
    const comps = (await census(10)).components;
    const pick = comps[137]!;
    const moved = (f: number): CensusComponent => ({ ...pick, reHi: pick.reHi + f * pick.size, imHi: pick.imHi - f * pick.size });
    expect(closeNucleiInRuns([comps.slice(0, 300), comps.slice(300)])).toBe(0);
    expect(closeNucleiInRuns([comps.slice(0, 300), [...comps.slice(300), moved(1e-5)]])).toBe(1);
    expect(closeNucleiInRuns([comps, [moved(1e-2)]])).toBe(0);
    // a tiny component near -2 (size ~1e-13 at period 10), moved below double resolution of its real part: the low parts carry it
    const tip = comps.reduce((a, b) => (b.size < a.size ? b : a));
    const near: CensusComponent = { ...tip, reLo: tip.reLo + 1e-4 * tip.size };
    expect(closeNucleiInRuns([comps, [near]])).toBe(1);
  });
});
