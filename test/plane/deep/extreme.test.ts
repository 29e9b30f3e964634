import { describe, expect, it } from 'vitest';
import { computeReferenceOrbit, referenceBits } from '../../../src/precise/reference-orbit.js';
import { buildBlaTable } from '../../../src/plane/deep/bla-table.js';
import { createDeepStats, sampleDeep } from '../../../src/plane/deep/sample-deep.js';
import { createSampleSet, PERIOD_ESCAPED } from '../../../src/plane/sample-set.js';
import { decimalAt, decimalEscapeDistance, exactDouble, gridOffsets } from './helpers.js';

const R = 65536;

// Views around the Misiurewicz point c = i (0 -> i -> -1+i -> -i -> -1+i:
// exact algebra), off-centre by (0.1 + 0.37i) span so that the view centre
// differs from the reference. Escape counts grow like log(1/span): about 170
// at 1e-60 and 860 at 1e-320.
const CASES = [
  // span, tile unit exponent, decimal digits, sampling stride
  { span: '1e-60', unit: 0, digits: 85, stride: 7 },
  // 1e-320 is below the double range: offsets are given in units of 2^-1070
  { span: '1e-320', unit: -1070, digits: 345, stride: 43 },
] as const;

describe.each(CASES)('sampleDeep at span $span near c = i', ({ span, unit, digits, stride }) => {
  const size = 16;
  const D = decimalAt(digits);
  const orbit = computeReferenceOrbit({ re: '0', im: '1' }, referenceBits(span, size), 3000, { escapeRadius: R });
  const s = new D(span);
  const off = gridOffsets(D, s.times(0.1), s.times(0.37), s, size, unit);
  const settings = { maxIterations: 3000, escapeRadius: R, unitExponent: unit };
  const plain = createSampleSet(size * size);
  sampleDeep(orbit, null, off.re, off.im, size * size, settings, plain, createDeepStats());
  const skipped = createSampleSet(size * size);
  const stats = createDeepStats();
  const deltaMax = Math.max(...off.re.map(Math.abs), ...off.im.map(Math.abs));
  sampleDeep(orbit, buildBlaTable(orbit, unit, deltaMax), off.re, off.im, size * size, settings, skipped, stats);

  it('gives the escape counts, smooth counts and distances (in units of 2^unit) of direct decimal.js iteration on sampled pixels', () => {
    const u = new D(2).pow(unit);
    let checked = 0,
      mismatched = 0,
      smoothErr = 0,
      distErr = 0;
    for (let k = 0; k < size * size; k += stride) {
      const cr = exactDouble(D, off.re[k]!).times(u);
      const ci = new D(1).plus(exactDouble(D, off.im[k]!).times(u));
      const { n, mu, distance } = decimalEscapeDistance(D, cr, ci, 3000, R, true);
      checked++;
      const mine = plain.period[k] === PERIOD_ESCAPED ? Math.ceil(plain.smooth[k]!) : -1;
      if (n !== mine) mismatched++;
      else if (n > 0 && distance !== undefined) {
        smoothErr = Math.max(smoothErr, Math.abs(mu - plain.smooth[k]!));
        distErr = Math.max(distErr, Math.abs(plain.distance[k]! / distance.div(u).toNumber() - 1));
      }
    }
    expect(checked).toBeGreaterThanOrEqual(6);
    // stated: at most 1 in 10 sampled pixels may sit on an escape boundary; measured 0
    expect(mismatched / checked).toBeLessThanOrEqual(0.1);
    // measured: smooth 3e-14 and distance 2e-15 relative at both depths
    expect(smoothErr).toBeLessThan(1e-10);
    expect(distErr).toBeLessThan(1e-10);
  });

  it('keeps every escape count with skipping on (tolerance: 1 iteration on 1% of pixels) and skips iterations', () => {
    let changed = 0,
      worst = 0;
    for (let k = 0; k < size * size; k++) {
      expect(skipped.period[k]).toBe(plain.period[k]);
      const d = Math.abs(Math.ceil(skipped.smooth[k]!) - Math.ceil(plain.smooth[k]!));
      if (d > 0) changed++;
      worst = Math.max(worst, d);
    }
    expect(worst).toBeLessThanOrEqual(1);
    expect(changed / (size * size)).toBeLessThanOrEqual(0.01);
    expect(stats.skipped).toBeGreaterThan(0.3 * (stats.skipped + stats.stepped));
  });
});
