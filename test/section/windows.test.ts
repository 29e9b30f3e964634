import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { componentOf } from '../../src/section/component-of.js';
import { rToC } from '../../src/section/conjugacy.js';
import { logistic, sine } from '../../src/section/families/index.js';
import { findWindows } from '../../src/section/windows.js';
import { requireInCi } from '../helpers/require-in-ci.js';
import { haveMpmath, runMpmath } from '../oracles/mpmath.js';

const D = Decimal.clone({ precision: 60 });
const { windows } = findWindows(logistic, 7, 30);
const period3 = windows.find((w) => w.period === 3)!;

describe('findWindows on the logistic family', () => {
  it("findWindows puts each window's superstable r where the critical orbit has exact period p and the window's MSS word", () => {
    // The window list has one entry per MSS word by construction (the word count is tested against
    // OEIS A000048 in kneading.test.ts); what can fail is where Newton put each one. Checked here in
    // decimal.js, independently of src/section: x_0 = 1/2, x_(k+1) = r x_k (1 - x_k) returns to 1/2 at
    // step p and not before, and the letters of x_1 .. x_(p-1) (R above 1/2, L below) spell the word
    // (Metropolis, Stein & Stein 1973).
    const half = new D('0.5');
    for (const w of windows) {
      let x = half;
      let word = '';
      for (let k = 1; k < w.period; k++) {
        x = w.superstable.times(x).times(new D(1).minus(x));
        expect(x.minus(half).abs().toNumber(), `${w.word} returns early at ${k}`).toBeGreaterThan(1e-6);
        word += x.gt(half) ? 'R' : 'L';
      }
      x = w.superstable.times(x).times(new D(1).minus(x));
      expect(x.minus(half).abs().toNumber(), `${w.word || 'C'} at step ${w.period}`).toBeLessThan(1e-25);
      expect(word).toBe(w.word);
    }
  });

  it('findWindows puts the period-3 onset at r = 1 + sqrt 8 (c = -7/4)', () => {
    // docs/checks.md "period-3 real window onset" (classical, exact).
    expect(period3.onset.minus(new D(8).sqrt().plus(1)).abs().toNumber()).toBeLessThan(1e-28);
    expect(rToC(period3.onset.toString(), 25)).toBe('-1.75');
  });

  it('findWindows puts the period-3 nucleus at the real root of c^3 + 2c^2 + c + 1', () => {
    // docs/checks.md "period-3 nuclei" (exact polynomial; OEIS A060006): -1.7548776662466927600.
    const c = new D(rToC(period3.superstable.toString(), 40));
    expect(c.minus('-1.7548776662466927600').abs().toNumber()).toBeLessThan(1e-19);
    expect(c.pow(3).plus(c.pow(2).times(2)).plus(c).plus(1).abs().toNumber()).toBeLessThan(1e-28);
  });

  it('findWindows puts the period-3 doubling and crisis at the docs/methods.md E4 values', () => {
    // Doubling: -1.768529152467685015118... (mpmath 1.2.1 findroot on the period-3 cycle-and-multiplier system at
    // 40 digits; the real root of 64c^3 + 128c^2 + 72c + 81, test/components/boundary-point.test.ts). Crisis:
    // docs/methods.md E4, -1.7903274919993457 (re-checked below).
    expect(new D(rToC(period3.doubling.toString(), 30)).minus('-1.768529152467685015118134998577843403365').abs().toNumber()).toBeLessThan(1e-14);
    expect(Number(rToC(period3.end.toString(), 20)) - -1.7903274919993457).toBeCloseTo(0, 14);
    // The crisis: f^(3p)(x_c) = f^(2p)(x_c) (docs/methods.md E4), re-checked here in double precision.
    const r = period3.end.toNumber();
    let x = 0.5;
    const orbit: number[] = [];
    for (let k = 0; k <= 9; k++) {
      orbit.push(x);
      x = r * x * (1 - x);
    }
    expect(Math.abs(orbit[9]! - orbit[6]!)).toBeLessThan(1e-9);
  });

  it("findWindows puts each doubling where the window's p-cycle has multiplier -1 (decimal.js Newton written here)", () => {
    // The order onset < superstable < doubling < end is enforced inside findWindows; this checks the
    // doubling itself by another route than its 2x2 system: Newton in x on f^p(x) = x at r = doubling,
    // from x = 1/2 (the cycle point nearest the critical point), then the multiplier prod r (1 - 2 x_k).
    for (const w of windows) {
      const r = w.doubling;
      let x = new D('0.5');
      for (let it = 0; it < 60; it++) {
        let y = x,
          dy = new D(1);
        for (let k = 0; k < w.period; k++) {
          dy = dy.times(r.times(new D(1).minus(y.times(2))));
          y = r.times(y).times(new D(1).minus(y));
        }
        x = x.minus(y.minus(x).div(dy.minus(1)));
      }
      let y = x,
        m = new D(1);
      for (let k = 0; k < w.period; k++) {
        m = m.times(r.times(new D(1).minus(y.times(2))));
        y = r.times(y).times(new D(1).minus(y));
      }
      expect(y.minus(x).abs().toNumber(), `${w.word || 'C'}: a p-cycle`).toBeLessThan(1e-25);
      expect(m.plus(1).abs().toNumber(), `${w.word || 'C'}: multiplier at the doubling`).toBeLessThan(1e-20);
    }
  });

  it.skipIf(!requireInCi(haveMpmath, 'python3-mpmath'))('findWindows puts the period-3 crisis where mpmath finds F^9(0, c) = F^6(0, c)', () => {
    // The oracle, written only here: the crisis is the tip of the small copy, renormalised parameter -2
    // (docs/methods.md E4), so it lies near nucleus - 2 |s| with the Hunt-Ott size |s| = 0.019035515913132
    // (docs/checks.md); the bracket [nucleus - 2.2|s|, nucleus - 1.8|s|] holds one sign change of
    // F^9 - F^6 (a 400-point scan found one), which mpmath's bracketing solver pins at 40 digits.
    const out = runMpmath(`
from mpmath import mp, mpf, findroot, nstr
mp.dps = 40
def F(c, n):
    z = mpf(0)
    for _ in range(n):
        z = z * z + c
    return z
c0 = mpf('-1.7548776662466927600495088963585286918946')
s = mpf('0.019035515913132')
print(nstr(findroot(lambda c: F(c, 9) - F(c, 6), (c0 - mpf('2.2') * s, c0 - mpf('1.8') * s), solver='anderson', tol=mpf(10) ** -70), 35))
`);
    const crisis = new D(out.trim());
    expect(new D(rToC(period3.end.toString(), 30)).minus(crisis).abs().toNumber()).toBeLessThan(1e-25);
  });

  it('componentOf gives the Hunt-Ott size 0.019035515913132 for the period-3 window', () => {
    // docs/checks.md "size estimate of the real period-3 component" (Hunt & Ott 1997).
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
    // -1.76 lies between the period-3 onset -7/4 (docs/checks.md) and its crisis -1.7903 (docs/methods.md E4).
    expect(windowOf('-1.76', 5)?.word).toBe('RL');
    // c = -1.5 (r = 1 + sqrt 7 = 3.6458) lies inside the period-2 window R: onset r = 3, end (band merging) c = -1.5437 (r = 3.6786).
    // c = -1.6 (r = 3.7203) lies between the windows of period <= 5.
    expect(windowOf('-1.5', 5)?.word).toBe('R');
    expect(windowOf('-1.6', 5)).toBeUndefined();
  });
});

describe('superstable parameters against the plane', () => {
  it('for periods 8..11 they are distinct real zeros of F_p, and the same set as the real nuclei of the census (another code path)', async () => {
    const { census } = await import('../../src/components/census.js');
    const { windows: wide } = findWindows(logistic, 11, 30);
    for (let p = 8; p <= 11; p++) {
      const cs = wide.filter((w) => w.period === p).map((w) => new D(rToC(w.superstable.toString(), 40)));
      // F_p(c) = f_c^p(0) in decimal.js, written here.
      for (const c of cs) {
        let z = new D(0);
        for (let k = 0; k < p; k++) z = z.times(z).plus(c);
        expect(z.abs().toNumber(), `period ${p} at ${c.toString()}`).toBeLessThan(1e-20);
      }
      const sorted = cs.map((c) => c.toNumber()).sort((a, b) => a - b);
      for (let i = 1; i < sorted.length; i++) expect(sorted[i]! - sorted[i - 1]!, `period ${p}`).toBeGreaterThan(1e-12);
      const real = (await census(p, { workers: 1 })).components
        .filter((c) => c.real)
        .map((c) => c.reHi + c.reLo)
        .sort((a, b) => a - b);
      expect(real.length, `period ${p}`).toBe(sorted.length);
      for (let i = 0; i < real.length; i++) expect(Math.abs(real[i]! - sorted[i]!), `period ${p} #${i}`).toBeLessThan(1e-12);
    }
  });
});
