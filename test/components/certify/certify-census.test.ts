import { describe, expect, it } from 'vitest';
import { census } from '../../../src/components/census.js';
import type { CensusResult } from '../../../src/components/census.js';
import { certifyCensus } from '../../../src/components/certify/certify-census.js';
import { exactPeriodCount, moebius } from '../../../src/components/certify/exact-period-count.js';
import { firstOverlap } from '../../../src/components/certify/disjoint-disks.js';

// OEIS A000740 (number of components of exact period n), n = 1..20, as published.
const A000740 = [1, 1, 3, 6, 15, 27, 63, 120, 252, 495, 1023, 2010, 4095, 8127, 16365, 32640, 65535, 130788, 262143, 523770];

describe('exactPeriodCount', () => {
  it('sum over d | p of mu(p/d) 2^(d-1) equals OEIS A000740 for p = 1..20', () => {
    expect(A000740.map((_, i) => Number(exactPeriodCount(i + 1)))).toEqual(A000740);
    expect([1, 2, 3, 4, 5, 6, 30].map(moebius)).toEqual([1, -1, -1, 0, -1, 1, -1]); // OEIS A008683
  });
});

describe('certifyCensus', () => {
  it('proves the census of every period 1..12 complete: all nuclei certified, disks disjoint, count = the theorem', async () => {
    for (let p = 1; p <= 12; p += 1) {
      const cert = await certifyCensus(await census(p));
      expect(cert.ok, `period ${p}: ${JSON.stringify(cert.failures.slice(0, 2))}`).toBe(true);
      expect(cert.found).toBe(A000740[p - 1]);
      expect(cert.radii.every((r) => r > 0n)).toBe(true);
    }
  });
  it('proves the period-16 census complete with 2 workers, and the outcome equals the one-thread outcome at period 13', async () => {
    const c16 = await certifyCensus(await census(16, { workers: 2 }), { workers: 2 });
    expect(c16.ok).toBe(true);
    expect(c16.found).toBe(32640);
    const r13 = await census(13);
    const a = await certifyCensus(r13, { workers: 0 });
    const b = await certifyCensus(r13, { workers: 2 });
    expect(b.radii).toEqual(a.radii);
    expect(a.ok && b.ok).toBe(true);
  });
  it('refuses a census with a component missing, one listed twice, or a nucleus moved onto a lower-period nucleus', async () => {
    const r = await census(7);
    const real = r.components.findIndex((c) => c.real);
    const drop: CensusResult = { ...r, components: r.components.filter((_, i) => i !== real) };
    const dropped = await certifyCensus(drop);
    expect(dropped.ok).toBe(false);
    expect(dropped.failures).toEqual([]);
    expect(dropped.overlap).toBeNull();
    const twice: CensusResult = { ...r, components: [...r.components.slice(0, -1), r.components[real]!] };
    const doubled = await certifyCensus(twice);
    expect(doubled.ok).toBe(false);
    expect(doubled.overlap).not.toBeNull();
    const moved: CensusResult = { ...r, components: r.components.map((c, i) => (i === real ? { ...c, reHi: 0, reLo: 0, imHi: 0, imLo: 0 } : c)) };
    const m = await certifyCensus(moved);
    expect(m.ok).toBe(false);
    expect(m.failures.map((f) => f.index)).toEqual([real]);
  });
});

describe('firstOverlap', () => {
  it('finds touching and overlapping disks, also when their left edges are far apart in the order', () => {
    expect(
      firstOverlap([
        { re: 0n, im: 0n, r: 1n },
        { re: 3n, im: 0n, r: 1n },
      ]),
    ).toBeNull();
    expect(
      firstOverlap([
        { re: 0n, im: 0n, r: 1n },
        { re: 2n, im: 0n, r: 1n },
      ]),
    ).toEqual([0, 1]); // touching: closed disks meet
    // a big disk first, many small ones inside its projection, and an overlap at the far end
    const disks = [{ re: 0n, im: 0n, r: 100n }, ...Array.from({ length: 50 }, (_, k) => ({ re: BigInt(-90 + 3 * k), im: 200n, r: 1n })), { re: 95n, im: 20n, r: 1n }];
    expect(firstOverlap(disks)).toEqual([0, 51]);
  });
});
