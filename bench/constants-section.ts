/**
 * Feigenbaum's constants from the renormalisation fixed point
 * (src/section/constants/): wall time of both truncations on two worker
 * threads, the trusted digits they agree on, and for order 2 the digits
 * correct against OEIS A006890 / A006891 (40 digits, Briggs 1991).
 * Targets of issue 14: order 2 to 100 digits under 10 s and to 500 under
 * 30 minutes, orders 4 and 6 to 50 digits under a minute.
 */
import { constantsOnWorkers } from '../src/render/feigenbaum-pool.js';
import { agreeingDigits, constantsPlan } from '../src/section/constants/feigenbaum-constants.js';
import type { BenchRow, BenchSection } from './bench-section.js';

// OEIS A006890 and A006891 (Briggs 1991).
const DELTA = '4.669201609102990671853203820466201617258';
const ALPHA = '2.502907875095892822283902873218215786381';

function prefix(a: string, b: string): number {
  return agreeingDigits(a, b).significant;
}

export const constantsSection: BenchSection = {
  name: 'constants',
  title: 'Feigenbaum alpha and delta from the fixed point: order 2 to 100 and 500 digits, orders 4 and 6 to 50, two truncations on two workers',
  async run(context) {
    const rows: BenchRow[] = [];
    await constantsOnWorkers(constantsPlan(2, 20), 2, 24); // warm-up (thread start, JIT)
    for (const [order, digits] of [
      [2, 100],
      [4, 50],
      [6, 50],
      [2, 500],
    ] as const) {
      const plan = constantsPlan(order, digits);
      const t0 = performance.now();
      const [a, b] = await constantsOnWorkers(plan, 2, digits + 4);
      const seconds = (performance.now() - t0) / 1000;
      const alpha = agreeingDigits(a!.alpha, b!.alpha);
      const delta = agreeingDigits(a!.delta, b!.delta);
      rows.push({
        label: `order ${order}, ${digits} digits (${plan.terms.join(' and ')} terms)`,
        figures: {
          seconds,
          alphaTrusted: alpha.significant,
          deltaTrusted: delta.significant,
          correctOf40: order === 2 ? Math.min(prefix(alpha.text, ALPHA), prefix(delta.text, DELTA)) : null,
          workers: 2,
        },
      });
    }
    context.note('correctOf40: leading digits of alpha and delta (the lesser) that match the 40 digits of OEIS A006891 / A006890');
    return rows;
  },
};
