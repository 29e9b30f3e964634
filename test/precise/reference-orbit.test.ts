import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import {
  computeReferenceOrbit,
  extendReferenceOrbit,
  orbitComplete,
  orbitSnapshot,
  referenceBits,
  referenceOffset,
  shareReferenceOrbit,
  startReferenceOrbit,
  TINY_ITERATE,
} from '../../src/precise/reference-orbit.js';

// decimal.js (npm) is the independent reference for every orbit value here.
const D = Decimal.clone({ precision: 120, minE: -9e15, maxE: 9e15 });
type DD = InstanceType<typeof D>;

function decimalOrbit(cr: string, ci: string, steps: number, prec = 120): [DD, DD][] {
  const E = D.clone({ precision: prec });
  const a = new E(cr);
  const b = new E(ci);
  let x = new E(0);
  let y = new E(0);
  const out: [DD, DD][] = [[x, y]];
  for (let m = 0; m < steps; m++) {
    const nx = x.times(x).minus(y.times(y)).plus(a);
    y = x.times(y).times(2).plus(b);
    x = nx;
    out.push([x, y]);
  }
  return out;
}

const rel = (x: number, ref: DD): number => (ref.isZero() ? Math.abs(x) : new D(x).minus(ref).abs().div(ref.abs()).toNumber());

describe('computeReferenceOrbit', () => {
  it('matches decimal.js iterates rounded to double and stops at escape (c = 0.26 + 0.0015i, slow escape past the cusp)', () => {
    const c = { re: '0.26', im: '0.0015' };
    const orbit = computeReferenceOrbit(c, 256, 10_000, { escapeRadius: 1024 });
    expect(orbit.escaped).toBe(true);
    const ref = decimalOrbit(c.re, c.im, orbit.length);
    // it escaped exactly at M: |Z_M| > 1024 and |Z_{M-1}| <= 1024
    const norm = (p: [DD, DD]): DD => p[0].times(p[0]).plus(p[1].times(p[1]));
    expect(norm(ref[orbit.length]!).gt(1024 * 1024)).toBe(true);
    expect(norm(ref[orbit.length - 1]!).lte(1024 * 1024)).toBe(true);
    let worst = 0;
    for (let m = 1; m <= orbit.length; m++) {
      worst = Math.max(worst, rel(orbit.re[m]!, ref[m]![0]), rel(orbit.im[m]!, ref[m]![1]));
    }
    // one rounding to double: 2^-53 relative, allow 2^-52
    expect(worst).toBeLessThanOrEqual(2 ** -52);
    expect(orbit.length).toBeGreaterThan(30);
  });

  it('keeps a periodic reference of length p with Z_p in full range (period-3 nucleus to 200 digits)', () => {
    // exact algebra: z_3 = c (c^3 + 2c^2 + c + 1); the real period-3 nucleus is the real root near -1.7549
    const E = D.clone({ precision: 220 });
    let c = new E('-1.7548776662466927');
    for (let k = 0; k < 12; k++) {
      const f = c.pow(3).plus(c.pow(2).times(2)).plus(c).plus(1);
      const df = c.pow(2).times(3).plus(c.times(4)).plus(1);
      c = c.minus(f.div(df));
    }
    const cre = c.toFixed(200);
    const orbit = computeReferenceOrbit({ re: cre, im: '0' }, 720, 1000, { period: 3 });
    expect(orbit.length).toBe(3);
    expect(orbit.period).toBe(3);
    const ref = decimalOrbit(cre, '0', 3, 260);
    const z3 = ref[3]![0];
    expect(z3.abs().lt(TINY_ITERATE)).toBe(true);
    expect(Array.from(orbit.tinyIndex)).toEqual([3]);
    const full = new D(orbit.tinyRe[0]!).times(new D(2).pow(orbit.tinyExp[0]!));
    expect(full.minus(z3).abs().div(z3.abs()).toNumber()).toBeLessThan(2 ** -50);
    expect(orbit.tinyIm[0]).toBe(0);
  });

  it('shareReferenceOrbit copies into SharedArrayBuffers with equal contents', () => {
    const orbit = computeReferenceOrbit({ re: '-0.75', im: '0.1' }, 128, 500);
    const shared = shareReferenceOrbit(orbit);
    expect(shared.re.buffer).toBeInstanceOf(SharedArrayBuffer);
    expect(Array.from(shared.re)).toEqual(Array.from(orbit.re));
    expect(shared.length).toBe(orbit.length);
  });
});

describe('extendReferenceOrbit', () => {
  it('gives the same iterates extended in chunks (1, 700, 2047, 5000) as computed at once (c = i: Z_3 = -i, Z_4 = -1 + i by exact algebra)', () => {
    // c = i: orbit 0, i, -1+i, -i, -1+i, ... (exact algebra); bits as for a span of 1e-300 at 16 pixels
    const bits = referenceBits('1e-300', 16);
    const once = computeReferenceOrbit({ re: '0', im: '1' }, bits, 5000);
    const b = startReferenceOrbit({ re: '0', im: '1' }, bits);
    for (const n of [1, 700, 2047, 5000]) {
      extendReferenceOrbit(b, n);
      expect(b.length).toBe(n);
      const snap = orbitSnapshot(b);
      expect(Array.from(snap.re)).toEqual(Array.from(once.re.subarray(0, n + 1)));
      expect(Array.from(snap.im)).toEqual(Array.from(once.im.subarray(0, n + 1)));
    }
    expect(orbitComplete(b)).toBe(false);
    expect([once.re[3], once.im[3], once.re[4], once.im[4]]).toEqual([0, -1, -1, 1]);
  });

  it('stops at escape and at Z_p for a periodic reference, however far it is asked to go', () => {
    const esc = startReferenceOrbit({ re: '0.26', im: '0.0015' }, 256, { escapeRadius: 1024 });
    extendReferenceOrbit(esc, 10);
    extendReferenceOrbit(esc, 1_000_000);
    const once = computeReferenceOrbit({ re: '0.26', im: '0.0015' }, 256, 1_000_000, { escapeRadius: 1024 });
    expect(esc.escaped).toBe(true);
    expect(esc.length).toBe(once.length);
    expect(orbitComplete(esc)).toBe(true);
    // memory follows the orbit: capacity never beyond what was computed, rounded up to a chunk
    expect(esc.re.length).toBeLessThanOrEqual(Math.max(1025, 2 * (once.length + 1)));
    // c = -1 is the period-2 nucleus (0 -> -1 -> 0, exact algebra): one cycle is stored
    const per = startReferenceOrbit({ re: '-1', im: '0' }, 128, { period: 2 });
    extendReferenceOrbit(per, 1_000_000);
    const snap = orbitSnapshot(per);
    expect(snap.length).toBe(2);
    expect(snap.period).toBe(2);
    expect(Array.from(snap.re)).toEqual([0, -1, 0]);
    expect(per.re.length).toBe(3);
  });
});

describe('referenceBits', () => {
  it('referenceBits("1e-20", 100) is ceil(-log2(1e-22)) + 64 = 74 + 64', () => {
    // log2(1e-22) = -73.08 (exact algebra: 22 log2 10)
    expect(referenceBits('1e-20', 100)).toBe(138);
    expect(referenceBits('1e-20', 100, 32)).toBe(106);
    expect(referenceBits('2.5e-1000', 1000)).toBe(Math.ceil(1000 * Math.log2(10) - Math.log2(2.5) + Math.log2(1000)) + 64);
    expect(referenceBits('3', 10)).toBe(66); // ceil(-log2 0.3) = 2
  });
});

describe('referenceOffset', () => {
  it('gives point - centre in units of 2^exponent from exact decimals', () => {
    const orbit = computeReferenceOrbit({ re: '-1.5', im: '0' }, 1200, 10);
    // -1.5 followed by 329 zeros and a 3: 331 decimals, so point - centre = -3e-331
    const re = `-1.5${'0'.repeat(329)}3`;
    const off = referenceOffset(orbit, { re, im: '1e-330' }, -1100);
    expect(off.re / new D('-3e-331').times(new D(2).pow(1100)).toNumber()).toBeCloseTo(1, 14);
    expect(off.im / new D('1e-330').times(new D(2).pow(1100)).toNumber()).toBeCloseTo(1, 14);
  });
});
