/**
 * `quadatlas section universality`: the fixed-point constants by order
 * (docs/methods.md E9) beside the cascade's own estimates (E2, E3, E8).
 */
import { describe, expect, it } from 'vitest';
import { parseOrders, roundedAgreement } from '../../src/cli/section/universality.js';
import { UserError } from '../../src/check/user-error.js';
import { runCli } from '../helpers/run-cli.js';

interface Row {
  order: number;
  functionClass: string;
  alpha: string;
  delta: string;
  cascadeFamily: string;
  cascadeDelta: string | null;
  deltaDigitsAgreeing: number | null;
  alphaDigitsAgreeing: number | null;
}

describe('section universality', () => {
  it('section universality --orders 2,3,4 names the family, the function class, and the cascades agree with the fixed point', () => {
    const r = runCli(['section', 'universality', '--orders', '2,3,4', '--digits', '15', '--cascade-levels', '10', '--json']);
    expect(r.status).toBe(0);
    const t = JSON.parse(r.stdout) as { title: string; rows: Row[] };
    expect(t.title).toContain('x -> r - |x|^Z');
    expect(t.rows.map((row) => row.functionClass)).toEqual(['even, in |x|^2', 'even, in |x|^3', 'even, in |x|^4']);
    // OEIS A006890 (delta, 15 places) and A195102 (|alpha| of order 4).
    expect(t.rows[0]!.delta).toBe('4.669201609102990');
    expect(t.rows[2]!.alpha.slice(0, 17)).toBe('1.690302971405244');
    // The logistic cascade (10 levels) and the quartic one: their own trusted digits all agree with the fixed point
    // (universality: a different family, the same constants); a cascade that were wrong would agree in fewer.
    for (const i of [0, 2]) {
      const row = t.rows[i]!;
      const shown = row.cascadeDelta!.replace('.', '').length;
      expect(row.deltaDigitsAgreeing).toBe(shown);
      expect(row.deltaDigitsAgreeing).toBeGreaterThanOrEqual(i === 0 ? 6 : 4);
    }
    expect(t.rows[1]!.cascadeFamily).toBe('none in the project');
  });

  it('roundedAgreement counts the digits of a rounded estimate that are right', () => {
    expect(roundedAgreement('2.50290788', '2.502907875095892822')).toBe(9);
    expect(roundedAgreement('2.50290799', '2.502907875095892822')).toBe(7);
    expect(roundedAgreement('7.2', '4.669')).toBe(0);
  });

  it('parseOrders refuses a bad, non-integer or repeated order naming --orders', () => {
    expect(parseOrders('2, 4,6')).toEqual([2, 4, 6]);
    for (const bad of ['2,x', '2,3.5', '2,2', '2,,4', '1']) expect(() => parseOrders(bad), bad).toThrow(UserError);
    expect(() => parseOrders('2,3.5')).toThrow(/for --orders but received "2,3.5"/);
  });

  it('section universality --orders 2,17 exits 2 with one line naming --orders', () => {
    const r = runCli(['section', 'universality', '--orders', '2,17']);
    expect(r.status).toBe(2);
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --orders but received');
  });
});

describe('section cascade beside the fixed point', () => {
  it('section cascade --family sine --json reports the fixed-point delta, and every trusted cascade digit agrees (universality)', () => {
    const r = runCli(['section', 'cascade', '--family', 'sine', '--levels', '8', '--json']);
    expect(r.status).toBe(0);
    const t = JSON.parse(r.stdout) as { estimates: { delta: { significantDigits: number } }; fixedPoint: { order: number; delta: string; deltaDigitsAgreeing: number } };
    // OEIS A006890 (docs/checks.md), the order-2 delta
    expect(t.fixedPoint.order).toBe(2);
    expect(t.fixedPoint.delta.slice(0, 16)).toBe('4.66920160910299');
    expect(t.estimates.delta.significantDigits).toBeGreaterThanOrEqual(4);
    expect(t.fixedPoint.deltaDigitsAgreeing).toBe(t.estimates.delta.significantDigits);
  });
});
