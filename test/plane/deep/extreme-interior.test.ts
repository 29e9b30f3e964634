import { describe, expect, it } from 'vitest';
import { computeReferenceOrbit, referenceBits } from '../../../src/precise/reference-orbit.js';
import { buildBlaTable } from '../../../src/plane/deep/bla-table.js';
import { createDeepStats, sampleDeep } from '../../../src/plane/deep/sample-deep.js';
import { createSampleSet, PERIOD_ESCAPED, PERIOD_UNDECIDED } from '../../../src/plane/sample-set.js';
import { decimalAt, decimalEscape, exactDouble, gridOffsets, decimalMultiplier, decimalNucleusStep } from './helpers.js';
import type { Dec } from './helpers.js';

// A period-427 nucleus near c = i at depth 1e-160, found by Newton's method in
// decimal.js (380 digits) from the guess 1e-160 + (1 + 5e-161)i, whose
// atom-domain period is 427; re-checked below. Its size estimate is 7.7e-321
// (components/size-estimate.ts, Hunt & Ott 1997), so a span of 3e-320 frames
// the minibrot entirely below the double range.
const NUCLEUS = {
  re: '0.000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000031832602242810733032753860063466035169533992689405029474031654293444213366503366037688609799988586953191566051267791174490177586520832282809105095266987530688925672751468093852375502496357750764412436',
  im: '1.000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000000063794318818135972697309254379149175339096396231348468625569673262971317791706143308273288036485243142036282837085306923110290733862196683344278600572010823467799202280561822029870283122100478805447717',
};
const PERIOD = 427;
const SPAN = '3e-320';
const UNIT = -1070; // offsets and distances in units of 2^-1070
const SIZE = 16;
const MAX_IT = 20000;
const R = 65536;

const D = decimalAt(380);
const orbit = computeReferenceOrbit(NUCLEUS, referenceBits(SPAN, SIZE), MAX_IT, { period: PERIOD, escapeRadius: R });
const off = gridOffsets(D, new D(0), new D(0), new D(SPAN), SIZE, UNIT);
const settings = { maxIterations: MAX_IT, escapeRadius: R, unitExponent: UNIT };
const unit = new D(2).pow(UNIT);
const c = (k: number): [Dec, Dec] => [new D(NUCLEUS.re).plus(exactDouble(D, off.re[k]!).times(unit)), new D(NUCLEUS.im).plus(exactDouble(D, off.im[k]!).times(unit))];

const decimalMultiplierAt = (cr: Dec, ci: Dec, p: number): [number, number] => decimalMultiplier(D, cr, ci, p, 12, 360);

describe('sampleDeep around a period-427 minibrot at span 3e-320 (rescaled iterations, periodic reference)', () => {
  const out = createSampleSet(SIZE * SIZE);
  sampleDeep(orbit, null, off.re, off.im, SIZE * SIZE, settings, out, createDeepStats());
  const skipped = createSampleSet(SIZE * SIZE);
  const stats = createDeepStats();
  const deltaMax = Math.max(...off.re.map(Math.abs), ...off.im.map(Math.abs));
  sampleDeep(orbit, buildBlaTable(orbit, UNIT, deltaMax), off.re, off.im, SIZE * SIZE, settings, skipped, stats);

  it('uses a nucleus: the decimal.js Newton step z_427 / (dz_427/dc) is below 1e-340 and Z_427 is kept in full range', () => {
    expect(decimalNucleusStep(D, NUCLEUS.re, NUCLEUS.im, PERIOD).lt('1e-340')).toBe(true);
    expect(orbit.period).toBe(PERIOD);
    expect(Array.from(orbit.tinyIndex)).toEqual([PERIOD]);
  });

  it('finds period 427 inside with the decimal.js multiplier, and mostly decides the rest', () => {
    const interior: number[] = [];
    let undecided = 0;
    for (let k = 0; k < SIZE * SIZE; k++) {
      if (out.period[k] === PERIOD) interior.push(k);
      if (out.period[k] === PERIOD_UNDECIDED) undecided++;
      // the minibrot's bulbs have periods q 427 (period-q bulbs of a cardioid)
      expect(out.period[k]! <= 0 || out.period[k]! % PERIOD === 0).toBe(true);
    }
    expect(interior.length).toBeGreaterThan(10);
    // interior distances (full-range A6, tile units): positive and below the
    // span; their bound is b/4 <= dist <= b (docs/methods.md A6), so no interior
    // pixel is farther than 4b from the boundary, which lies in view
    const spanTile = new D(SPAN).div(unit).toNumber();
    for (const k of interior) {
      expect(out.distance[k]).toBeGreaterThan(0);
      expect(out.distance[k]).toBeLessThan(spanTile);
    }
    // stated: at most 3% undecided; measured 3 of 256
    expect(undecided / (SIZE * SIZE)).toBeLessThanOrEqual(0.03);
    const k = interior[Math.floor(interior.length / 2)]!;
    const [cr, ci] = c(k);
    const [lr, li] = decimalMultiplierAt(cr, ci, PERIOD);
    expect(Math.hypot(lr, li)).toBeLessThan(1);
    expect(Math.hypot(out.mulRe[k]! - lr, out.mulIm[k]! - li)).toBeLessThan(1e-9);
  });

  it('matches decimal.js escape counts on sampled exterior pixels', () => {
    let checked = 0,
      mismatched = 0;
    // the three exterior pixels with the lowest counts (decimal.js at 380 digits costs ~1 ms per iteration)
    const exterior = Array.from(out.period.keys()).filter((k) => out.period[k] === PERIOD_ESCAPED);
    exterior.sort((a, b) => out.smooth[a]! - out.smooth[b]! || a - b);
    for (const k of [exterior[0]!, exterior[exterior.length >> 2]!, exterior[exterior.length >> 1]!]) {
      const [cr, ci] = c(k);
      checked++;
      if (decimalEscape(D, cr, ci, MAX_IT, R).n !== Math.ceil(out.smooth[k]!)) mismatched++;
    }
    expect(checked).toBe(3);
    // stated: at most 1 of the 3 sampled pixels on an escape boundary; measured 0
    expect(mismatched).toBeLessThanOrEqual(1);
  });

  it('skipping keeps every period and escape count within 1 iteration on 2% of pixels, and skips most iterations', () => {
    let changed = 0,
      worst = 0;
    for (let k = 0; k < SIZE * SIZE; k++) {
      if (out.period[k] === PERIOD_ESCAPED && skipped.period[k] === PERIOD_ESCAPED) {
        const d = Math.abs(Math.ceil(out.smooth[k]!) - Math.ceil(skipped.smooth[k]!));
        if (d > 0) changed++;
        worst = Math.max(worst, d);
      } else if (out.period[k] !== skipped.period[k]) {
        changed++;
        if (out.period[k] !== PERIOD_UNDECIDED && skipped.period[k] !== PERIOD_UNDECIDED) worst = Infinity;
      }
    }
    // measured: 0 changed; 99% of iterations skipped (the rescaled steps skip too)
    expect(worst).toBeLessThanOrEqual(1);
    expect(changed / (SIZE * SIZE)).toBeLessThanOrEqual(0.02);
    expect(stats.skipped / (stats.skipped + stats.stepped)).toBeGreaterThan(0.9);
  });
});
