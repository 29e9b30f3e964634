import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { runCli } from '../helpers/run-cli.js';

describe('quadatlas --certify (spawned, built dist/)', () => {
  it('components --period 12 --certify --csv prints 2010 rows (OEIS A000740), each with a positive certified_radius, and proves the census complete', () => {
    const r = runCli(['components', '--period', '12', '--certify', '--csv', '--workers', '2']);
    expect(r.status, r.stderr).toBe(0);
    const lines = r.stdout.trim().split('\n');
    const head = lines[0]!.split(',');
    const col = head.indexOf('certified_radius');
    expect(col).toBeGreaterThan(0);
    expect(lines).toHaveLength(2011);
    for (const l of lines.slice(1)) {
      const radius = new Decimal(l.split(',')[col]!);
      expect(radius.gt(0) && radius.lt(1e-19)).toBe(true); // 20 digits printed: the rounding is at most 7.1e-21
    }
    expect(r.stderr).toMatch(/certified: 2010 pairwise disjoint disks/);
  });
  it('locate --certify --json gives certifiedRadius and rootCertifiedRadius; the disk holds the mpmath root of c^3 + 2c^2 + c + 1', () => {
    const r = runCli(['locate', '--period', '3', '--near', '-1.8,0', '--digits', '30', '--certify', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const j = JSON.parse(r.stdout) as { nucleus: { re: string }; certifiedRadius: string; rootCertifiedRadius: string };
    // mpmath 1.2.1 polyroots([1, 2, 1, 1]) at 45 digits
    const dist = new Decimal(j.nucleus.re).minus('-1.754877666246692760049508896358528691895').abs();
    expect(dist.lte(j.certifiedRadius)).toBe(true);
    expect(new Decimal(j.rootCertifiedRadius).lt(1e-29)).toBe(true);
  });
  it('refuses with exit 2 and one line: too few digits for the component, and a period beyond the memory bound', () => {
    const few = runCli(['locate', '--period', '14', '--near', '-1.99999,0', '--digits', '5', '--certify']);
    expect(few.status).toBe(2);
    expect(few.stderr.trim().split('\n')).toHaveLength(1);
    expect(few.stderr).toMatch(/at least \d+ digits with --certify/);
    const big = runCli(['components', '--period', '25', '--count', '--certify']);
    expect(big.status).toBe(2);
    expect(big.stderr).toMatch(/at most 22 with --certify .* would need about \d+ GB/);
  });
  it('locate --angle 1/6 --certify says the Misiurewicz point is not certified (exit 1)', () => {
    const r = runCli(['locate', '--angle', '1/6', '--certify']);
    expect(r.status).toBe(1);
    expect(r.stdout).toMatch(/certified\s+no/);
  });
});
