/**
 * `quadatlas section constants` end to end on the built CLI: the same bytes
 * on one and two workers, agreement with OEIS, and bad input refused as one
 * line naming the field with exit code 2.
 */
import { describe, expect, it } from 'vitest';
import { checkedPlan, parseOrder } from '../../src/cli/section/constants.js';
import { UserError } from '../../src/check/user-error.js';
import { runCli } from '../helpers/run-cli.js';

describe('section constants', () => {
  it('section constants --digits 30 writes the same bytes on 1 and 2 workers, matching OEIS A006891 and A006890', () => {
    const one = runCli(['section', 'constants', '--digits', '30', '--workers', '1', '--json']);
    const two = runCli(['section', 'constants', '--digits', '30', '--workers', '2', '--json']);
    expect(one.status).toBe(0);
    expect(two.status).toBe(0);
    expect(one.stdout).toBe(two.stdout);
    const table = JSON.parse(one.stdout) as { rows: { constant: string; value: string; trustedDigits: number }[] };
    // OEIS A006891 (alpha), A006890 (delta); docs/checks.md. 30 places, truncated.
    expect(table.rows[0]).toEqual({ constant: 'alpha', value: '2.502907875095892822283902873218', trustedDigits: 31, terms: expect.any(String) as string });
    expect(table.rows[1]!.value).toBe('4.669201609102990671853203820466');
    expect(one.stderr).toMatch(/constants in [\d.]+ s on 1 worker\n$/);
  });

  it('section constants --order 4 --csv gives |alpha| of OEIS A195102', () => {
    const r = runCli(['section', 'constants', '--order', '4', '--digits', '18', '--csv']);
    expect(r.status).toBe(0);
    expect(r.stdout.split('\n')[1]).toMatch(/^alpha,1\.690302971405244853,19,/);
  });

  for (const [args, field] of [
    [['--order', '2.5'], '--order'],
    [['--order', 'two'], '--order'],
    [['--order', '1'], '--order'],
    [['--order', '17'], '--order'],
    [['--digits', '0'], '--digits'],
    [['--digits', '90000'], '--digits'],
    [['--workers', '0'], '--workers'],
  ] as const) {
    it(`section constants ${args.join(' ')} exits 2 with one line naming ${field}`, () => {
      const r = runCli(['section', 'constants', ...args]);
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toContain(`for ${field} but received`);
    });
  }

  it('parseOrder says why a non-integer order is refused', () => {
    expect(parseOrder(undefined)).toBe(2);
    expect(parseOrder('6')).toBe(6);
    expect(() => parseOrder('2.5')).toThrow('non-integer orders are not supported');
  });

  it('checkedPlan refuses digits whose memory estimate exceeds the budget and names the largest that fits', () => {
    expect(checkedPlan(2, 100, 2 ** 30, '100').terms[0]).toBeGreaterThan(60);
    expect(() => checkedPlan(2, 2000, 2 ** 28, '2000')).toThrow(UserError);
    expect(() => checkedPlan(2, 2000, 2 ** 28, '2000')).toThrow(/at most \d+ digits at order 2/);
  });
});
