/**
 * Certificates: time to prove the census of periods 12..20 complete
 * (Krawczyk disks for every nucleus, disjointness, count against
 * sum mu(P/d) 2^(d-1)), after the census itself, on all cores; and one
 * nucleus and root certificate at 100 digits.
 */
import { availableParallelism } from 'node:os';
import { census } from '../src/components/census.js';
import { certifyCensus } from '../src/components/certify/certify-census.js';
import { certifyNucleusDecimal } from '../src/components/certify/certify-decimal.js';
import { certifyRootDecimal } from '../src/components/certify/certify-root.js';
import { componentRoot } from '../src/components/boundary-point.js';
import { findNucleus } from '../src/components/nucleus.js';
import type { BenchRow, BenchSection } from './bench-section.js';

export const certifySection: BenchSection = {
  name: 'certify',
  title: 'certified census of periods 12..20 (all cores) and a nucleus and root certificate at 100 digits',
  async run(context) {
    const rows: BenchRow[] = [];
    const workers = availableParallelism();
    await certifyCensus(await census(8, { workers }), { workers }); // warm-up
    for (const p of [12, 14, 16, 18, 20]) {
      const r = await census(p, { workers });
      const t0 = performance.now();
      const cert = await certifyCensus(r, { workers });
      const seconds = (performance.now() - t0) / 1000;
      if (!cert.ok) context.note(`period ${p}: the census was not certified (${cert.failures.length} failures)`);
      rows.push({ label: `certify period ${p}`, figures: { components: cert.found, seconds, workers } });
    }
    const t0 = performance.now();
    const n = findNucleus(16, { re: '-1.9999', im: '0' }, 100).nucleus;
    const root = componentRoot(16, n, 100).root;
    const t1 = performance.now();
    const a = certifyNucleusDecimal(16, n);
    const b = certifyRootDecimal(16, n, root, 100);
    rows.push({ label: 'locate period 16 near -2, 100 digits', figures: { components: 1, seconds: (t1 - t0) / 1000, workers: 1 } });
    rows.push({ label: 'certify its nucleus and root', figures: { components: 1, seconds: (performance.now() - t1) / 1000, workers: 1 } });
    context.note(`nucleus radius ${a.radius ?? a.reason}, root radius ${b.radius ?? b.reason}`);
    return rows;
  },
};
