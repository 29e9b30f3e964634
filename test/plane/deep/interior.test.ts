import { describe, expect, it } from 'vitest';
import { computeReferenceOrbit, referenceBits } from '../../../src/precise/reference-orbit.js';
import { buildBlaTable } from '../../../src/plane/deep/bla-table.js';
import { createDeepStats, sampleDeep } from '../../../src/plane/deep/sample-deep.js';
import { createSampleSet, PERIOD_ESCAPED, PERIOD_UNDECIDED } from '../../../src/plane/sample-set.js';
import { decimalAt, decimalEscape, exactDouble, gridOffsets, decimalMultiplier, decimalNucleusStep } from './helpers.js';
import type { Dec } from './helpers.js';

// A period-79 nucleus near c = i, found by Newton's method in decimal.js from
// the guess 1e-31 + (1 + 5e-32)i (atom-domain period 79 there); the test
// re-checks z_79 = 0 below. Its size estimate is 6.04e-59 (components/size-estimate.ts,
// Hunt & Ott 1997), so a span of 2.4e-58 frames the minibrot.
const NUCLEUS = {
  re: '0.0000000000000000000000000000056601783822120579436465436167707854399762373350100776036003776325215751641144544769727625509114596865',
  im: '0.9999999999999999999999999999971756386712434047927096950958000911478774441797251960078428535562965546474977099556868901645866371002',
};
const PERIOD = 79;
const SPAN = '2.4e-58';
const SIZE = 24;
const MAX_IT = 6000;
const R = 65536;

const D = decimalAt(90);
const orbit = computeReferenceOrbit(NUCLEUS, referenceBits(SPAN, SIZE), MAX_IT, { period: PERIOD, escapeRadius: R });
const off = gridOffsets(D, new D(0), new D(0), new D(SPAN), SIZE, 0);
const settings = { maxIterations: MAX_IT, escapeRadius: R, unitExponent: 0 };
const c = (k: number): [Dec, Dec] => [new D(NUCLEUS.re).plus(exactDouble(D, off.re[k]!)), new D(NUCLEUS.im).plus(exactDouble(D, off.im[k]!))];

const decimalMultiplierAt = (cr: Dec, ci: Dec, p: number): [number, number] => decimalMultiplier(D, cr, ci, p, 40, 80);

describe('sampleDeep around a period-79 minibrot at span 2.4e-58 (periodic reference)', () => {
  const out = createSampleSet(SIZE * SIZE);
  const stats = createDeepStats();
  sampleDeep(orbit, null, off.re, off.im, SIZE * SIZE, settings, out, stats);

  it('uses a reference that is a nucleus: the decimal.js Newton step z_79 / (dz_79/dc) is below 1e-100', () => {
    const E = decimalAt(160);
    const step = decimalNucleusStep(E, NUCLEUS.re, NUCLEUS.im, PERIOD);
    expect(step.lt(1e-100)).toBe(true);
    expect(orbit.length).toBe(PERIOD);
    expect(orbit.period).toBe(PERIOD);
  });

  it('finds period 79 inside, with multipliers equal to decimal.js Newton to 1e-9', () => {
    const interior: number[] = [];
    for (let k = 0; k < SIZE * SIZE; k++) if (out.period[k] === PERIOD) interior.push(k);
    // the cardioid covers about 40 of the 576 pixels at this framing
    expect(interior.length).toBeGreaterThan(25);
    for (const k of interior.filter((_, i) => i % 20 === 0)) {
      const [cr, ci] = c(k);
      const [lr, li] = decimalMultiplierAt(cr, ci, PERIOD);
      expect(Math.hypot(lr, li)).toBeLessThan(1);
      expect(Math.hypot(out.mulRe[k]! - lr, out.mulIm[k]! - li)).toBeLessThan(1e-9);
      // interior: direct iteration does not escape within the limit
      expect(decimalEscape(D, cr, ci, MAX_IT, R).n).toBe(-1);
      expect(out.distance[k]).toBeGreaterThan(0);
    }
    // satellite bulbs of the minibrot have periods 2*79 and 3*79 (period-q bulbs of a cardioid: q p)
    const periods = new Set(out.period);
    for (const p of periods) expect([PERIOD_ESCAPED, PERIOD_UNDECIDED, PERIOD, 2 * PERIOD, 3 * PERIOD, 4 * PERIOD]).toContain(p);
  });

  it('matches decimal.js escape counts on sampled exterior pixels and leaves few undecided', () => {
    let checked = 0,
      mismatched = 0,
      undecided = 0;
    for (let k = 0; k < SIZE * SIZE; k++) if (out.period[k] === PERIOD_UNDECIDED) undecided++;
    for (let k = 3; k < SIZE * SIZE; k += 23) {
      if (out.period[k] !== PERIOD_ESCAPED) continue;
      const [cr, ci] = c(k);
      checked++;
      if (decimalEscape(D, cr, ci, MAX_IT, R).n !== Math.ceil(out.smooth[k]!)) mismatched++;
    }
    expect(checked).toBeGreaterThanOrEqual(15);
    // stated: at most 1 in 10 sampled pixels on an escape boundary; measured 0
    expect(mismatched / checked).toBeLessThanOrEqual(0.1);
    // stated: at most 2% of pixels undecided (they sit on component boundaries); measured 1 of 576
    expect(undecided / (SIZE * SIZE)).toBeLessThanOrEqual(0.02);
  });

  it('skipping (BLA, eps 2^-40) changes no period and escape counts by at most the stated tolerance', () => {
    const skipped = createSampleSet(SIZE * SIZE);
    const s2 = createDeepStats();
    sampleDeep(orbit, buildBlaTable(orbit, 0, new D(SPAN).toNumber()), off.re, off.im, SIZE * SIZE, settings, skipped, s2);
    let changed = 0,
      worst = 0;
    for (let k = 0; k < SIZE * SIZE; k++) {
      if (out.period[k] === PERIOD_ESCAPED && skipped.period[k] === PERIOD_ESCAPED) {
        const d = Math.abs(Math.ceil(out.smooth[k]!) - Math.ceil(skipped.smooth[k]!));
        if (d > 0) changed++;
        worst = Math.max(worst, d);
      } else if (out.period[k] !== skipped.period[k] && out.period[k] !== PERIOD_UNDECIDED && skipped.period[k] !== PERIOD_UNDECIDED) {
        changed++;
        worst = Infinity;
      }
    }
    // stated tolerance: no count moves by more than 1, on at most 1% of pixels; measured 0
    expect(worst).toBeLessThanOrEqual(1);
    expect(changed / (SIZE * SIZE)).toBeLessThanOrEqual(0.01);
    // and it pays: most iterations are skipped (measured 92%)
    expect(s2.skipped / (s2.skipped + s2.stepped)).toBeGreaterThan(0.8);
  });
});

describe('sampleDeep with a tile unit of 2^-1000 on the same view', () => {
  it('gives the same periods, counts and multipliers, exterior distances exactly 2^1000 larger and interior ones (full-range A6) to 1e-9', () => {
    const a = createSampleSet(SIZE * SIZE);
    const sa = createDeepStats();
    sampleDeep(orbit, null, off.re, off.im, SIZE * SIZE, settings, a, sa);
    const scale = 2 ** 1000;
    const re = off.re.map((x) => x * scale),
      im = off.im.map((y) => y * scale);
    const b = createSampleSet(SIZE * SIZE);
    const sb = createDeepStats();
    sampleDeep(orbit, null, re, im, SIZE * SIZE, { ...settings, unitExponent: -1000 }, b, sb);
    let interior = 0,
      worst = 0,
      periods = 0;
    for (let k = 0; k < SIZE * SIZE; k++) {
      expect(b.period[k]).toBe(a.period[k]);
      expect(b.smooth[k]).toBe(a.smooth[k]);
      expect(b.mulRe[k]).toBe(a.mulRe[k]);
      if (a.period[k] === PERIOD_ESCAPED) expect(b.distance[k]).toBe(a.distance[k]! * scale);
      else if (a.period[k]! > 0) {
        interior++;
        periods += a.period[k]!;
        worst = Math.max(worst, Math.abs(b.distance[k]! / scale / a.distance[k]! - 1));
      }
    }
    expect(interior).toBeGreaterThan(25);
    // the full-range A6 ran (one period per interior pixel, counted with Newton's iterations)
    expect(sb.newtonIterations - sa.newtonIterations).toBe(periods);
    // the same products and sums up to exact power-of-two scalings (measured: identical)
    expect(worst).toBeLessThan(1e-9);
  });
});
