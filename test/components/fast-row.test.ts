// The listing's double-double fast path (src/components/fast-row.ts, docs/methods.md C7):
// its rows equal the BigInt path's (the implementation before it) for periods 8..12, and
// the printed nucleus digits of a sample agree with Newton run independently in decimal.js
// at 60 digits; roots of the satellites of the main cardioid agree with the exact
// parametrisation of its boundary, c = mu/2 - mu^2/4 at mu = e^{2 pi i r/q} (exact algebra,
// docs/checks.md).
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { census } from '../../src/components/census.js';
import { componentRows, listItem } from '../../src/components/list-components.js';
import { formatDD } from '../../src/components/fast-row.js';

const D = Decimal.clone({ precision: 60 });

/** The period-p nucleus near (re, im) by Newton on F_p(c) = f_c^p(0) in decimal.js at 60 digits. */
function nucleusDecimal(p: number, re: string, im: string): { re: Decimal; im: Decimal } {
  let cr = new D(re);
  let ci = new D(im);
  for (let it = 0; it < 8; it++) {
    let zr = new D(0);
    let zi = new D(0);
    let dr = new D(0);
    let di = new D(0);
    for (let k = 0; k < p; k++) {
      const ndr = zr.mul(dr).sub(zi.mul(di)).mul(2).add(1);
      di = zr.mul(di).add(zi.mul(dr)).mul(2);
      dr = ndr;
      const nzr = zr.mul(zr).sub(zi.mul(zi)).add(cr);
      zi = zr.mul(zi).mul(2).add(ci);
      zr = nzr;
    }
    const m = dr.mul(dr).add(di.mul(di));
    cr = cr.sub(zr.mul(dr).add(zi.mul(di)).div(m));
    ci = ci.sub(zi.mul(dr).sub(zr.mul(di)).div(m));
  }
  return { re: cr, im: ci };
}

/** x to `digits` after the point, as the listing prints (round half even; exact 0 is "0"). */
function fixed(x: Decimal, digits: number): string {
  return x.isZero() ? '0' : x.toFixed(digits, Decimal.ROUND_HALF_EVEN);
}

describe('listing rows in double-double', () => {
  it('equal the BigInt rows for periods 8..12', async () => {
    for (let p = 8; p <= 12; p++) {
      const items = (await census(p)).components.map(listItem);
      const fast = await componentRows({ period: p, digits: 20, items });
      const slow = await componentRows({ period: p, digits: 20, items, bigint: true });
      expect(fast.length, `period ${p}`).toBe(items.length);
      expect(fast, `period ${p}`).toEqual(slow);
    }
  }, 120_000);

  it('print nucleus digits that decimal.js confirms, and main-cardioid satellite roots on c = mu/2 - mu^2/4', async () => {
    const p = 13;
    const comps = (await census(p)).components;
    const sample = comps.filter((_, i) => i % 40 === 0);
    const rows = await componentRows({ period: p, digits: 20, items: sample.map(listItem) });
    for (const r of rows) {
      const n = nucleusDecimal(p, r.nucleus.re, r.nucleus.im);
      expect(r.nucleus.re).toBe(fixed(n.re, 20));
      if (r.nucleus.im !== '0') expect(r.nucleus.im).toBe(fixed(n.im, 20));
    }
    const all = await componentRows({ period: p, digits: 20, items: comps.slice(0, 3).map(listItem) });
    const satellites = all.filter((r) => r.parent?.period === 1);
    expect(satellites.length).toBeGreaterThan(0);
    for (const r of satellites) {
      const a = D.acos(-1)
        .mul(2 * r.parent!.num)
        .div(r.parent!.den);
      const [mr, mi] = [D.cos(a), D.sin(a)];
      // mu/2 - mu^2/4
      const re = mr.div(2).sub(mr.mul(mr).sub(mi.mul(mi)).div(4));
      const im = mi.div(2).sub(mr.mul(mi).div(2));
      expect(r.root.re).toBe(fixed(re, 20));
      expect(r.root.im).toBe(fixed(im, 20));
    }
  }, 120_000);

  it('refuses to print digits a rounding boundary lies within the error bound of', () => {
    // 0.125 + 2^-60 lies 2^-60 above the half-unit boundary 0.125 of 2 digits (exact binary fractions)
    expect(formatDD(0.125, 2 ** -60, 2 ** -70, 2)).toBe('0.13');
    expect(formatDD(0.125, 2 ** -60, 2 ** -55, 2)).toBeNull();
    // an interval across 0 would print "-0.00" at one end and "0.00" at the other
    expect(formatDD(2 ** -80, 0, 2 ** -70, 2)).toBeNull();
    expect(formatDD(0, 0, 0, 5)).toBe('0');
  });
});
