// The cascade inside a periodic window (src/section/window-cascade.ts). Its
// ratios converge to Feigenbaum's constants by renormalisation: the first
// return map near the critical point is again unimodal with a quadratic
// maximum (Feigenbaum, J. Stat. Phys. 19 (1978) 25-52; docs/methods.md E2).
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { computeCascade } from '../../src/section/cascade.js';
import { cascadeSolverFor } from '../../src/section/cascade-solver-for.js';
import { logistic, sine } from '../../src/section/families/index.js';
import { doubledWord, parseWindowWord, windowSolver } from '../../src/section/window-cascade.js';
import { UserError } from '../../src/check/user-error.js';

const D = Decimal.clone({ precision: 60 });
// OEIS A006890 and A006891 (Briggs, Math. Comp. 57 (1991) 435-439).
const DELTA = new D('4.669201609102990671853203820466201617258');
const ALPHA = new D('2.502907875095892822283902873218215786381');

/** f_c^n(0) for z -> z^2 + c on the real line, in decimal.js at 60 digits (written here, not the tool's code). */
function F(n: number, c: Decimal): Decimal {
  let z = new D(0);
  for (let k = 0; k < n; k++) z = z.times(z).plus(c);
  return z;
}

describe('the cascade inside the period-3 window of the logistic family', () => {
  const solver = cascadeSolverFor(logistic, 40);
  const cascade = computeCascade(windowSolver(logistic, 'RL', solver.solver), 11, 40);

  it('level n is a superstable orbit of period 3 * 2^n: its c = r/2 - r^2/4 is a zero of F_(3 2^n) and of no F_(3 2^(n-1))', () => {
    // Logistic r and c: c = r/2 - r^2/4 (conjugacy of the two families; docs/methods.md E1).
    for (const level of cascade.levels.slice(0, 5)) {
      const r = new D(level.superstable.toString());
      const c = r.div(2).minus(r.pow(2).div(4));
      const p = 3 * 2 ** level.level;
      expect(F(p, c).abs().toNumber(), `period ${p}`).toBeLessThan(1e-30);
      if (level.level > 0)
        expect(
          F(p / 2, c)
            .abs()
            .toNumber(),
        ).toBeGreaterThan(1e-12);
    }
  });

  it('level 0 is the period-3 nucleus: the real root of c^3 + 2c^2 + c + 1 (exact algebra: F_3(c) = c (c^3 + 2c^2 + c + 1))', () => {
    const r = new D(cascade.levels[0]!.superstable.toString());
    const c = r.div(2).minus(r.pow(2).div(4));
    expect(c.pow(3).plus(c.pow(2).times(2)).plus(c).plus(1).abs().toNumber()).toBeLessThan(1e-35);
  });

  it('its delta_n approach A006890 geometrically and its accelerated delta and alpha agree with A006890 and A006891', () => {
    const errors = cascade.levels.filter((l) => l.delta !== undefined).map((l) => new D(l.delta!.toString()).minus(DELTA).abs().toNumber());
    // The error of delta_n shrinks by a constant factor per level (common practice: we check only that it decreases).
    for (let i = 1; i < errors.length; i++) expect(errors[i]!).toBeLessThan(errors[i - 1]!);
    expect(errors.at(-1)!).toBeLessThan(1e-4);
    expect(cascade.delta.digits).toBeGreaterThanOrEqual(8);
    expect(new D(cascade.delta.value.toString()).minus(DELTA).abs().toNumber()).toBeLessThan(10 ** (1 - cascade.delta.digits));
    expect(new D(cascade.alpha.value.toString()).abs().minus(ALPHA).abs().toNumber()).toBeLessThan(10 ** (1 - cascade.alpha.digits));
  });

  it('the accumulation point lies inside the window, between its first doubling and the end of the period-3 window', () => {
    // The period-3 window ends at the crisis; its cascade accumulates before it (r about 3.8495 < 3.857, from memory).
    const acc = cascade.accumulation.value.toNumber();
    expect(acc).toBeGreaterThan(cascade.levels[1]!.doubling!.toNumber());
    expect(acc).toBeLessThan(3.857);
  });
});

describe('universality inside windows', () => {
  it('the sine family r sin(pi x) has the same delta inside its period-3 window (quadratic maximum)', () => {
    const cascade = computeCascade(windowSolver(sine, 'RL', cascadeSolverFor(sine, 30).solver), 6, 30);
    const last = cascade.levels.at(-1)!.delta!;
    expect(new D(last.toString()).minus(DELTA).abs().toNumber()).toBeLessThan(0.01);
  });
});

describe('window words', () => {
  it('doubling W gives W x W with x = R after an even number of R, else L (Metropolis-Stein-Stein 1973: C -> R -> RLR -> RLRRRLR)', () => {
    expect(doubledWord('')).toBe('R');
    expect(doubledWord('R')).toBe('RLR');
    expect(doubledWord('RLR')).toBe('RLRRRLR');
    // Period 3 -> 6: the MSS table lists RL^2RL among the period-6 words.
    expect(doubledWord('RL')).toBe('RLLRL');
  });

  it('reads plain and compact words and refuses inadmissible ones in one line', () => {
    expect(parseWindowWord('RL')).toBe('RL');
    expect(parseWindowWord('rlr^2')).toBe('RLRR');
    // MSS 1973: the admissible words of period 4 are RLR and RLL only.
    for (const bad of ['RRL', 'LR', 'R L', 'RX', '', 'R^0']) expect(() => parseWindowWord(bad), bad).toThrow(UserError);
  });
});
