// The library examples in examples/ run as a user would run them (node, importing
// the package by its name) and print what outside sources say they should.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { ROOT } from './helpers/run-cli.js';

function run(name: string): string {
  const r = spawnSync(process.execPath, [path.join(ROOT, 'examples', name)], { cwd: ROOT, encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  return r.stdout;
}

describe('examples/', () => {
  it('plate-to-buffer.mjs renders 160x120 RGB pixels in memory, interior of periods 1, 2 and 3 among them', () => {
    const out = run('plate-to-buffer.mjs');
    expect(out).toContain(`rgb bytes: ${160 * 120 * 3}`);
    const periods = JSON.parse(/periods: (.*)/.exec(out)![1]!) as Record<string, number>;
    // The main cardioid, the period-2 disk and the 1/3 and 2/3 bulbs are wide enough for this view (Douady-Hubbard).
    for (const p of ['1', '2', '3']) expect(periods[p]).toBeGreaterThan(0);
  });

  it('components-of-period.mjs counts 15 components of period 5, 3 of them real, and polishes the leftmost nucleus', () => {
    const out = run('components-of-period.mjs');
    // OEIS A000740(5) = 15 components of period 5; OEIS A000048(5) = 3 of them real.
    expect(out).toContain('period 5: 15 components, 3 on the real axis');
    const printed = new Decimal(/leftmost real nucleus: (\S+)/.exec(out)![1]!);
    // Independent check in the test: Newton on F(c) = f_c^5(0) in decimal.js at 60 digits from c = -1.985.
    Decimal.set({ precision: 60 });
    let c = new Decimal('-1.985');
    for (let k = 0; k < 30; k++) {
      let z = new Decimal(0);
      let dz = new Decimal(0);
      for (let n = 0; n < 5; n++) {
        dz = dz.times(z).times(2).plus(1);
        z = z.times(z).plus(c);
      }
      c = c.minus(z.div(dz));
    }
    expect(printed.minus(c).abs().lessThan('1e-39')).toBe(true);
    // The leftmost real component of each period is primitive with angles (2^(p-1)-1)/(2^p-1), 2^(p-1)/(2^p-1) (Douady-Hubbard; period 5: 15/31, 16/31).
    expect(out).toMatch(/external angles 15\/31, 16\/31/);
  });

  it('cascade.mjs estimates the Feigenbaum delta', () => {
    const out = run('cascade.mjs');
    // OEIS A006890: delta = 4.66920160910299067185...
    const est = /delta ~ (\S+)/.exec(out)![1]!;
    expect(Math.abs(Number(est) - 4.66920160910299)).toBeLessThan(1e-3);
  });
});
