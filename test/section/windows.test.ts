import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { componentOf } from '../../src/section/component-of.js';
import { rToC } from '../../src/section/conjugacy.js';
import { logistic, sine } from '../../src/section/families/index.js';
import { findWindows } from '../../src/section/windows.js';

const D = Decimal.clone({ precision: 60 });
const { windows } = findWindows(logistic, 7, 30);
const period3 = windows.find((w) => w.period === 3)!;

describe('findWindows on the logistic family', () => {
  it('findWindows lists OEIS A000048 windows per period for p = 1..7', () => {
    // OEIS A000048 (Metropolis-Stein-Stein 1973), checks.md "Counts".
    const counts = [1, 2, 3, 4, 5, 6, 7].map((p) => windows.filter((w) => w.period === p).length);
    expect(counts).toEqual([1, 1, 1, 2, 3, 5, 9]);
  });

  it('findWindows puts the period-3 onset at r = 1 + sqrt 8 (c = -7/4)', () => {
    // checks.md "period-3 real window onset" (classical, exact).
    expect(period3.onset.minus(new D(8).sqrt().plus(1)).abs().toNumber()).toBeLessThan(1e-28);
    expect(rToC(period3.onset.toString(), 25)).toBe('-1.75');
  });

  it('findWindows puts the period-3 nucleus at the real root of c^3 + 2c^2 + c + 1', () => {
    // checks.md "period-3 nuclei" (exact polynomial; OEIS A060006): -1.7548776662466927600.
    const c = new D(rToC(period3.superstable.toString(), 40));
    expect(c.minus('-1.7548776662466927600').abs().toNumber()).toBeLessThan(1e-19);
    expect(c.pow(3).plus(c.pow(2).times(2)).plus(c).plus(1).abs().toNumber()).toBeLessThan(1e-28);
  });

  it('findWindows puts the period-3 doubling and crisis at the methods.md E4 values', () => {
    // Doubling: -1.768529152467685015118... (mpmath 1.2.1 findroot on the period-3 cycle-and-multiplier system at
    // 40 digits; the real root of 64c^3 + 128c^2 + 72c + 81, test/components/boundary-point.test.ts). Crisis:
    // methods.md E4, -1.7903274919993457 (re-checked below).
    expect(new D(rToC(period3.doubling.toString(), 30)).minus('-1.768529152467685015118134998577843403365').abs().toNumber()).toBeLessThan(1e-14);
    expect(Number(rToC(period3.end.toString(), 20)) - -1.7903274919993457).toBeCloseTo(0, 14);
    // The crisis: f^(3p)(x_c) = f^(2p)(x_c) (methods.md E4), re-checked here in double precision.
    const r = period3.end.toNumber();
    let x = 0.5;
    const orbit: number[] = [];
    for (let k = 0; k <= 9; k++) {
      orbit.push(x);
      x = r * x * (1 - x);
    }
    expect(Math.abs(orbit[9]! - orbit[6]!)).toBeLessThan(1e-9);
  });

  it('findWindows returns windows in increasing r with onset < superstable < doubling < end', () => {
    for (let i = 1; i < windows.length; i++) expect(windows[i]!.superstable.gt(windows[i - 1]!.superstable)).toBe(true);
    for (const w of windows) expect(w.onset.lt(w.superstable) && w.superstable.lt(w.doubling) && w.doubling.lt(w.end)).toBe(true);
  });

  it('componentOf gives the Hunt-Ott size 0.019035515913132 for the period-3 window', () => {
    // checks.md "size estimate of the real period-3 component" (Hunt & Ott 1997).
    const comp = componentOf(3, rToC(period3.superstable.toString(), 30));
    expect(comp.size).toBeCloseTo(0.019035515913132, 12);
    expect(comp.shape).toBe('cardioid');
    expect(componentOf(2, '-1').shape).toBe('disk');
  });
});

describe('findWindows on the sine family', () => {
  it('findWindows on r sin(pi x) lists the same words per period as the logistic map', () => {
    // Metropolis-Stein-Stein 1973: the MSS sequence is universal among unimodal maps.
    const s = findWindows(sine, 5, 20).windows;
    const words = (ws: typeof windows): string[] => ws.filter((w) => w.period <= 5).map((w) => w.word);
    expect(words(s)).toEqual(words(windows));
  });
});

describe('windowOf', () => {
  it('windowOf finds RL at c = -1.76, R at -1.5 and no window of period <= 5 at -1.6', async () => {
    const { windowOf } = await import('../../src/section/window-of.js');
    // -1.76 lies between the period-3 onset -7/4 (checks.md) and its crisis -1.7903 (methods.md E4).
    expect(windowOf('-1.76', 5)?.word).toBe('RL');
    // c = -1.5 (r = 1 + sqrt 7 = 3.6458) lies inside the period-2 window R: onset r = 3, end (band merging) c = -1.5437 (r = 3.6786).
    // c = -1.6 (r = 3.7203) lies between the windows of period <= 5.
    expect(windowOf('-1.5', 5)?.word).toBe('R');
    expect(windowOf('-1.6', 5)).toBeUndefined();
  });
});
