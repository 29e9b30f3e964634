/**
 * Components: time to count every component of periods 10..20 by landing
 * one ray per Lavaurs pair (all cores), checked against OEIS A000740, and time to locate a
 * period-1000 nucleus (the 1/1000 bulb of the main cardioid) to 300 digits.
 */
import { availableParallelism } from 'node:os';
import { census } from '../src/components/census.js';
import { findNucleus } from '../src/components/nucleus.js';
import type { BenchRow, BenchSection } from './bench-section.js';

/** A000740(p) = sum over d | p of mu(p/d) 2^(d-1) (OEIS), used only to check the census. */
export function a000740(p: number): number {
  const mu = (n: number): number => {
    let m = 1;
    for (let q = 2; q * q <= n; q += 1) {
      if (n % q === 0) {
        n /= q;
        if (n % q === 0) return 0;
        m = -m;
      }
    }
    return n > 1 ? -m : m;
  };
  let s = 0;
  for (let d = 1; d <= p; d += 1) if (p % d === 0) s += mu(p / d) * 2 ** (d - 1);
  return s;
}

export const componentsSection: BenchSection = {
  name: 'components',
  title: 'census of periods 10..20 (ray landing, all cores) and a period-1000 nucleus to 300 digits',
  async run(context) {
    const rows: BenchRow[] = [];
    const workers = availableParallelism();
    await census(8, { workers }); // warm-up: workers start, code is compiled
    for (let p = 10; p <= 20; p += 1) {
      const t0 = performance.now();
      const r = await census(p, { workers });
      const seconds = (performance.now() - t0) / 1000;
      if (r.components.length !== a000740(p)) context.note(`period ${p}: found ${r.components.length}, OEIS A000740 says ${a000740(p)}`);
      rows.push({ label: `count period ${p}`, figures: { components: r.components.length, seconds, workers, rays: r.raysTraced } });
    }
    const q = 1000;
    const th = (2 * Math.PI) / q;
    const rr = Math.cos(th) / 2 - Math.cos(2 * th) / 4;
    const ri = Math.sin(th) / 2 - Math.sin(2 * th) / 4;
    const rad = Math.sin(Math.PI / q) / q ** 2;
    const m = Math.hypot(rr, ri);
    const t0 = performance.now();
    const found = findNucleus(q, { re: String(rr + (rad * rr) / m), im: String(ri + (rad * ri) / m) }, 300);
    rows.push({ label: 'nucleus period 1000, 300 digits', figures: { components: 1, seconds: (performance.now() - t0) / 1000, workers: 1 } });
    context.note(`period-1000 nucleus starts ${found.nucleus.re.slice(0, 24)}, ${found.nucleus.im.slice(0, 24)} (${found.steps} Newton steps)`);
    return rows;
  },
};
