import { existsSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { convertTable } from '../../src/cli/section/convert.js';
import { parseFamily, tableFormat } from '../../src/cli/section/section-options.js';
import { CASCADE_OPTIONS } from '../../src/cli/section/cascade.js';
import { COMPARE_OPTIONS } from '../../src/cli/section/compare.js';
import { CONVERT_OPTIONS } from '../../src/cli/section/convert.js';
import { DIAGRAM_OPTIONS } from '../../src/cli/section/diagram.js';
import { LYAPUNOV_OPTIONS } from '../../src/cli/section/lyapunov.js';
import { WINDOWS_OPTIONS } from '../../src/cli/section/windows.js';
import { UserError } from '../../src/check/user-error.js';
import { runCli } from '../helpers/run-cli.js';

/** A decimal string as the BigInt n with value n / 10^p. */
function scaled(s: string, p: number): bigint {
  const [int, frac = ''] = s.replace('-', '').split('.');
  if (frac.length > p) throw new Error(`${s} has more than ${p} places`);
  const n = BigInt(int! + frac.padEnd(p, '0'));
  return s.startsWith('-') ? -n : n;
}

/** True when s, read to p places, is within half a unit of the last place of 1 + sqrt(k) (exact BigInt algebra). */
function isOnePlusSqrt(s: string, k: number, p: number): boolean {
  const u = 10n ** BigInt(p);
  const t = 2n * (scaled(s, p) - u); // 2 * 10^p * (s - 1)
  const target = 4n * BigInt(k) * u * u; // (2 * 10^p * sqrt k)^2
  return (t - 1n) ** 2n <= target && target <= (t + 1n) ** 2n;
}

describe('section option parsing', () => {
  it('parseFamily rejects an unknown family with a UserError naming --family', () => {
    expect(parseFamily(undefined).name).toBe('logistic');
    expect(() => parseFamily('tent')).toThrow(UserError);
    expect(() => parseFamily('tent')).toThrow('Expected one of logistic, sine, quartic for --family but received "tent"');
  });

  it('tableFormat refuses --json together with --csv', () => {
    expect(() => tableFormat({ json: true, csv: true })).toThrow(UserError);
  });

  it('convertTable converts r = 4, x = 3/4 exactly and states the orientation flip', () => {
    // docs/checks.md "Conversion": r = 4 -> c = -2; x > 1/2 exactly when z < 0.
    const t = convertTable({ r: '4', x: '0.75', digits: '20' });
    expect(t.rows[0]).toEqual(['-2', '4', '0.75', '-1']);
    expect(t.summary[0]!.note).toContain('x > 1/2 exactly when z < 0');
    expect(() => convertTable({ c: '0.3' })).toThrow(UserError);
    expect(() => convertTable({})).toThrow(UserError);
  });

  it('convertTable --digits counts places after the point, rounding ties to even', () => {
    // Exact: c = 3.83 (2 - 3.83) / 4 = -1.752225; at 5 places the tie goes to the even -1.75222.
    expect(convertTable({ r: '3.83', digits: '5' }).rows[0]![0]).toBe('-1.75222');
    // docs/checks.md: c = -7/4 -> r = 1 + sqrt 8; at 40 places every digit is checked by exact BigInt algebra.
    const r = convertTable({ c: '-1.75', digits: '40' }).rows[0]![1] as string;
    expect(r.split('.')[1]!.length).toBeLessThanOrEqual(40);
    expect(isOnePlusSqrt(r, 8, 40)).toBe(true);
    // A large r keeps its places. Exact: r = (2 10^20 + 1) / 2 gives c = r (2 - r) / 4 = (2 10^20 + 1)(3 - 2 10^20) / 16.
    const exact16 = (2n * 10n ** 20n + 1n) * (3n - 2n * 10n ** 20n); // c * 16, negative
    const cents = (-exact16 * 100n + 8n) / 16n; // |c| * 100 rounded (no tie: 16 does not divide 2 |c16| * 100 - 16)
    expect(convertTable({ r: '100000000000000000000.5', digits: '2' }).rows[0]![0]).toBe(`-${String(cents).slice(0, -2)}.${String(cents).slice(-2)}`);
  });

  it('convertTable keeps --digits places for a tiny r, where x = 1/2 - z/r is huge', () => {
    // Exact: r = 10^-30, z = 1 gives x = 1/2 - 10^30.
    expect(convertTable({ r: '1e-30', z: '1', digits: '3' }).rows[0]![2]).toBe(`-${'9'.repeat(30)}.5`);
  });

  it('every section help line states its default', () => {
    for (const table of [CONVERT_OPTIONS, CASCADE_OPTIONS, WINDOWS_OPTIONS, LYAPUNOV_OPTIONS, DIAGRAM_OPTIONS, COMPARE_OPTIONS]) {
      for (const o of table) expect(o.description, o.flags).toMatch(/\(default|default:/);
    }
  });
});

// These spawn the built CLI (npm test builds first).
describe.skipIf(!existsSync(path.resolve('dist/src/cli/main.js')))('quadatlas section tables (spawned)', () => {
  it('section cascade --family tent exits 2 with one line naming --family', () => {
    const r = runCli(['section', 'cascade', '--family', 'tent']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --family');
    expect(r.stdout).toBe('');
  });

  it('section cascade --levels 99 exits 2 with one line naming --levels', () => {
    const r = runCli(['section', 'cascade', '--levels', '99']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --levels');
  });

  it('section lyapunov --r-from 5 exits 2 with one line naming --r-from', () => {
    const r = runCli(['section', 'lyapunov', '--r-from', '5', '--r-to', '6']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --r-from');
  });

  it('section lyapunov --from (the old name) exits 2 with one quadatlas: line naming it', () => {
    const r = runCli(['section', 'lyapunov', '--from', '2.8']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/^quadatlas: unknown option '--from'/);
  });

  it('section windows --family quartic exits 2: windows need a quadratic maximum', () => {
    const r = runCli(['section', 'windows', '--family', 'quartic']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('section windows --max-period 4 --json lists the windows in increasing r, the period-2 one at the exact 1 + sqrt 5, with numbers for doubles and camelCase keys', () => {
    const r = runCli(['section', 'windows', '--max-period', '4', '--digits', '12', '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout) as { rows: Record<string, unknown>[]; countsByPeriod: number[] };
    expect(j.rows.map((w) => w['word'])).toEqual(['(C)', 'R', 'RLR', 'RL', 'RLL']);
    // One row per MSS word by construction, so the count is no check; the order in r and the numbers are.
    expect(j.countsByPeriod).toEqual([1, 2, 3, 4].map((p) => j.rows.filter((w) => w['period'] === p).length));
    // docs/checks.md "superstable period-2 logistic parameter": r = 1 + sqrt 5 (exact).
    expect(isOnePlusSqrt(j.rows.find((w) => w['word'] === 'R')!['superstableR'] as string, 5, 10)).toBe(true);
    const p3 = j.rows.find((w) => w['word'] === 'RL')!;
    expect(p3['period']).toBe(3);
    // docs/checks.md: the period-3 window opens at c = -7/4, r = 1 + sqrt 8 (exact).
    expect(p3['onsetC']).toBe('-1.75');
    expect(isOnePlusSqrt(p3['onsetR'] as string, 8, 12)).toBe(true);
    // docs/checks.md: |s| = 0.019035515913132 for the real period-3 component (Hunt-Ott 1997); a double, so a JSON number.
    expect(p3['size']).toBeCloseTo(0.019035515913132, 13);
    expect(typeof p3['stableWidthR']).toBe('string');
    expect(p3['stableWidthR']).toMatch(/^\d\.\d{11}e-\d+$/); // 12 significant digits with an exponent
  });

  it('section cascade --csv prints snake_case columns, one row per level, values at --digits places', () => {
    const r = runCli(['section', 'cascade', '--levels', '5', '--digits', '15', '--csv']);
    expect(r.status).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toBe('n,period,doubling_r,doubling_c,superstable_r,superstable_c,delta_n,alpha_n');
    expect(lines).toHaveLength(7);
    const level1 = lines[2]!.split(',');
    // docs/checks.md: first doubling r = 3, c = -3/4 (exact); superstable period 2 at r = 1 + sqrt 5, c = -1 (exact).
    expect(level1.slice(2, 4)).toEqual(['3', '-0.75']);
    expect(isOnePlusSqrt(level1[4]!, 5, 15)).toBe(true);
    expect(level1[4]!.split('.')[1]!.length).toBeLessThanOrEqual(15); // a trailing zero is dropped
    expect(level1[5]).toBe('-1');
  });

  it('section lyapunov --steps 7 --json: r and c as exact decimal strings, exponents as numbers equal to the closed forms', () => {
    const r = runCli(['section', 'lyapunov', '--r-from', '2.8', '--r-to', '4', '--steps', '7', '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout) as { rows: { r: string; c: string; lyapunov: number; spread: number }[] };
    expect(j.rows.map((row) => row.r)).toEqual(['2.8', '3', '3.2', '3.4', '3.6', '3.8', '4']);
    // Exact: c = r (2 - r) / 4; r = 3.2 gives -0.96.
    expect(j.rows[2]!.c).toBe('-0.96');
    // docs/checks.md: ln|2 - r| on the stable fixed point, (1/2) ln|4 + 2r - r^2| on the 2-cycle.
    expect(j.rows[0]!.lyapunov).toBeCloseTo(Math.log(0.8), 9);
    expect(j.rows[2]!.lyapunov).toBeCloseTo(0.5 * Math.log(Math.abs(4 + 6.4 - 3.2 * 3.2)), 9);
    const text = runCli(['section', 'lyapunov', '--r-from', '2.8', '--r-to', '4', '--steps', '7', '--digits', '4']);
    const row = text.stdout.split('\n').find((l) => l.startsWith('3.2 '))!;
    expect(row.split(/\s+/).slice(0, 3)).toEqual(['3.2', '-0.96', '-0.9163']);
    expect(text.stdout).not.toMatch(/\d{12,}/);
  });
});
