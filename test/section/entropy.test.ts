/**
 * Topological entropy from the kneading determinant (docs/methods.md E10;
 * Milnor-Thurston, LNM 1342, 1988), against values known in closed form.
 */
import { describe, expect, it } from 'vitest';
import { eventualPeriod, kneadingEntropy, kneadingOrbit, thetas, withoutUnitRoot } from '../../src/section/entropy.js';
import { logistic } from '../../src/section/families/index.js';
import { findWindows } from '../../src/section/windows.js';

const entropyAt = (r: string) => kneadingEntropy(kneadingOrbit(logistic, r, 60, 2000));

describe('kneadingEntropy on the logistic family', () => {
  it('kneadingEntropy at r = 4 is log 2 (full shift on two symbols; Milnor-Thurston)', () => {
    expect(entropyAt('4').entropy).toBeCloseTo(Math.log(2), 14);
  });

  it('kneadingEntropy at the period-3 onset r = 1 + sqrt 8 and inside the window is log of the golden ratio', () => {
    // 1 + sqrt 8 to 40 digits (exact algebra); entropy log((1 + sqrt 5)/2) (Milnor-Thurston: D(t) = (1 - t - t^2)/(1 + t^3)).
    const phi = Math.log((1 + Math.sqrt(5)) / 2);
    expect(entropyAt('3.828427124746190097603377448419396157139').entropy).toBeCloseTo(phi, 12);
    expect(entropyAt('3.83').entropy).toBeCloseTo(phi, 12);
  });

  it('kneadingEntropy is exactly 0 below the Feigenbaum point r_inf = 3.5699456718... (OEIS A098587)', () => {
    for (const r of ['3.2', '3.5', '3.56', '3.569']) {
      const e = entropyAt(r);
      expect(e.method, r).toBe('periodic');
      expect(e.entropy, r).toBe(0);
    }
    // Just below r_inf the cycle is too long to see in 2000 symbols: 0 with a stated bound.
    const near = entropyAt('3.5699456');
    expect(near.entropy).toBe(0);
    expect(near.below).toBeGreaterThan(0);
    expect(near.below).toBeLessThan(0.01);
    expect(entropyAt('3.6').entropy).toBeGreaterThan(0.1);
  });

  it('kneadingEntropy at the superstable period-4 parameter of word RLL is log of the tribonacci constant (OEIS A058265)', () => {
    // D(t) = 1 - t - t^2 - t^3 for the kneading RLLC; 1/s = 1.839286755214161... (OEIS A058265).
    const w = findWindows(logistic, 4, 40).windows.find((x) => x.word === 'RLL')!;
    expect(entropyAt(w.superstable.toFixed(38)).entropy).toBeCloseTo(Math.log(1.839286755214161), 12);
  });

  it('kneadingEntropy does not decrease along r (monotonicity of the logistic kneading, Milnor-Thurston)', () => {
    let last = 0;
    for (let k = 0; k <= 60; k++) {
      const r = (3.5 + (0.5 * k) / 60).toFixed(6);
      const e = entropyAt(r).entropy;
      expect(e, r).toBeGreaterThanOrEqual(last - 1e-9);
      last = e;
    }
  });
});

describe('kneading helpers', () => {
  it('thetas multiplies the signs of the branches (R reverses, L keeps, C ends)', () => {
    expect([...thetas('RLLC')]).toEqual([1, -1, -1, -1, 0]);
  });

  it('eventualPeriod finds the preperiod and period of RLLLL...', () => {
    expect(eventualPeriod(`R${'L'.repeat(30)}`)).toEqual({ preperiod: 1, period: 1 });
    expect(eventualPeriod('RLRRRLRRRLRRRLRR')).toEqual({ preperiod: 0, period: 4 });
    expect(eventualPeriod('RLLRLRRLLLRRLRLLLRLR')).toBeUndefined();
  });

  it('withoutUnitRoot divides out (1 - t): (1 - t)^2 (1 + 2t) -> 1 + 2t', () => {
    // (1 - t)^2 (1 + 2t) = 1 - 3t^2 + 2t^3
    expect([...withoutUnitRoot([1, 0, -3, 2])]).toEqual([1, 2]);
  });
});
