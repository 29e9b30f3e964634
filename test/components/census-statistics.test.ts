import { describe, expect, it } from 'vitest';
import { census } from '../../src/components/census.js';
import { componentAreaEstimate, satelliteAttachment, satelliteParentPeriod } from '../../src/components/census-statistics.js';

// OEIS A000740 (offset 1): components of exact period n, n = 1..16 (docs/checks.md "Counts").
const A000740 = [1, 1, 3, 6, 15, 27, 63, 120, 252, 495, 1023, 2010, 4095, 8127, 16365, 32640];
// OEIS A000048 (offset 0): a(0..16). The real components of period p number a(p) for every p >= 1,
// with no shift (a(1) = 1 is the main cardioid; OEIS A056303, "identical to A000048 for n > 1", starts 0 at n = 1).
const A000048 = [1, 1, 1, 1, 2, 3, 5, 9, 16, 28, 51, 93, 170, 315, 585, 1091, 2048];

function phi(n: number): number {
  let r = 0;
  for (let j = 1; j <= n; j++) {
    let a = j,
      b = n;
    while (b !== 0) [a, b] = [b, a % b];
    if (a === 1) r += 1;
  }
  return r;
}

/** Douady-Hubbard: a component of period k carries phi(q) satellites of period kq for each q >= 2 (docs/methods.md C6). */
function satellitesFromParents(p: number): Map<number, number> {
  const out = new Map<number, number>();
  for (let k = 1; k < p; k++) if (p % k === 0) out.set(k, A000740[k - 1]! * phi(p / k));
  return out;
}

describe('census statistics', () => {
  it('count, real (OEIS A000048(p)), primitive and satellite counts (the divisor formula over OEIS A000740) for p = 1..16', async () => {
    for (let p = 1; p <= 16; p++) {
      const s = (await census(p)).statistics;
      const expected = satellitesFromParents(p);
      const satellites = [...expected.values()].reduce((a, b) => a + b, 0);
      expect(s.count, `period ${p}`).toBe(A000740[p - 1]);
      expect(s.real, `real, period ${p}`).toBe(A000048[p]);
      expect(s.satellite, `satellites, period ${p}`).toBe(satellites);
      expect(s.primitive, `primitive, period ${p}`).toBe(A000740[p - 1]! - satellites);
      expect(s.satellitesByParentPeriod, `satellites by parent, period ${p}`).toEqual(Object.fromEntries([...expected].map(([k, n]) => [String(k), n])));
    }
  });

  it('the size histogram holds every component once, each in the decade of its own size estimate', async () => {
    const r = await census(11);
    const bins = new Map<number, number>();
    for (const c of r.components) bins.set(Math.floor(Math.log10(c.size)), (bins.get(Math.floor(Math.log10(c.size))) ?? 0) + 1);
    expect(r.statistics.sizeHistogram).toEqual([...bins.entries()].sort((a, b) => a[0] - b[0]).map(([log10From, count]) => ({ log10From, count })));
    expect(r.statistics.sizeHistogram.reduce((a, b) => a + b.count, 0)).toBe(1023); // OEIS A000740(11)
  });

  it('area estimates: the main cardioid 3 pi / 8 and the period-2 disk pi / 16 (exact algebra, docs/methods.md C6)', async () => {
    // main cardioid c = e^{it}/2 - e^{2it}/4: area pi (1 |1/2|^2 + 2 |1/4|^2) = 3 pi / 8
    expect((await census(1)).statistics.areaEstimate).toBeCloseTo((3 * Math.PI) / 8, 14);
    // period-2 disk |c + 1| < 1/4: area pi / 16
    expect((await census(2)).statistics.areaEstimate).toBeCloseTo(Math.PI / 16, 14);
    expect(componentAreaEstimate(1, false)).toBe((3 * Math.PI) / 8);
  });

  it('satelliteParentPeriod reads the parent from the angles: 1/3, 2/3 and 1/15, 2/15 on the cardioid; 6/15, 9/15 on the period-2 disk; 3/15, 4/15 primitive', () => {
    // the period-4 pairs of docs/methods.md D2: (1/15, 2/15) the 1/4 bulb of the cardioid, (2/5, 3/5) = (6/15, 9/15) the
    // period-4 disk on the period-2 disk (its nucleus -1.3107 is real), (1/5, 4/15) = (3/15, 4/15) a primitive root
    expect(satelliteParentPeriod(2, 1, 2)).toBe(1);
    expect(satelliteParentPeriod(4, 6, 9)).toBe(2);
    expect(satelliteParentPeriod(4, 1, 2)).toBe(1);
    expect(satelliteParentPeriod(4, 3, 4)).toBe(0);
    expect(satelliteParentPeriod(3, 1, 2)).toBe(1); // 1/7, 2/7: the 1/3 bulb of the cardioid
    expect(satelliteParentPeriod(3, 3, 4)).toBe(0); // 3/7, 4/7: the real period-3 component, primitive
  });

  it('satelliteAttachment gives the internal angle: 1/3 and 2/3 bulbs (1/7, 2/7 and 5/7, 6/7), the 1/4 and 3/4 bulbs (1/15, 2/15 and 13/15, 14/15)', () => {
    // the cardioid's r/q bulb carries the pair of the rotation r/q under doubling (Douady-Hubbard; docs/checks.md period-3 and 4 pairs)
    expect(satelliteAttachment(3, 1, 2)).toEqual({ k: 1, r: 1, q: 3 });
    expect(satelliteAttachment(3, 5, 6)).toEqual({ k: 1, r: 2, q: 3 });
    expect(satelliteAttachment(4, 1, 2)).toEqual({ k: 1, r: 1, q: 4 });
    expect(satelliteAttachment(4, 13, 14)).toEqual({ k: 1, r: 3, q: 4 });
    expect(satelliteAttachment(4, 6, 9)).toEqual({ k: 2, r: 1, q: 2 });
    expect(satelliteAttachment(4, 3, 4)).toBeNull();
  });

  it('satelliteAttachment over the period-12 census: every component of period k | 12 carries one satellite at each r/q, gcd(r, q) = 1 (Douady-Hubbard)', async () => {
    // so each (k, r/q) occurs A000740(k) times (OEIS A000740: 1, 1, 3, 6, 15, 27 for k = 1..6)
    const n = [0, 1, 1, 3, 6, 15, 27];
    const seen = new Map<string, number>();
    for (const c of (await census(12)).components) {
      const a = c.angles.length === 2 ? satelliteAttachment(12, c.angles[0]!, c.angles[1]!) : null;
      if (a !== null) seen.set(`${a.k} ${a.r}/${a.q}`, (seen.get(`${a.k} ${a.r}/${a.q}`) ?? 0) + 1);
    }
    const want = new Map<string, number>();
    const gcd = (a: number, b: number): number => (b === 0 ? a : gcd(b, a % b));
    for (const k of [1, 2, 3, 4, 6]) for (let r = 1; r < 12 / k; r++) if (gcd(r, 12 / k) === 1) want.set(`${k} ${r}/${12 / k}`, n[k]!);
    expect(Object.fromEntries([...seen].sort())).toEqual(Object.fromEntries([...want].sort()));
  });
});
