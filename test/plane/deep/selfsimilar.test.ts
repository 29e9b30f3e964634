import { describe, expect, it } from 'vitest';
import { computeReferenceOrbit, referenceBits } from '../../../src/precise/reference-orbit.js';
import { buildBlaTable } from '../../../src/plane/deep/bla-table.js';
import { createDeepStats, sampleDeep } from '../../../src/plane/deep/sample-deep.js';
import { createSampleSet, PERIOD_ESCAPED } from '../../../src/plane/sample-set.js';
import { decimalAt, exactDouble, gridOffsets } from './helpers.js';

// Self-similarity at the Misiurewicz point c0 = i (Tan Lei, "Similarity between
// the Mandelbrot set and Julia sets", Comm. Math. Phys. 134 (1990)): the orbit
// of c0 lands on the repelling 2-cycle {-1+i, -i} with multiplier
// rho = 2(-1+i) 2(-i) = 4(1+i) (exact algebra). The parameter derivative obeys
// A_{n+2} = rho A_n + O(1), so the offset delta / rho^k follows the offset
// delta exactly 2k iterations later, up to O(|delta|): escape counts shift by
// exactly 2k and smooth counts by 2k. With k = 1249, |rho|^k ~ 1e940 takes a
// view at span 1e-60 (checked against decimal.js in deep-extreme.test.ts) to
// span ~1e-1000, far below the double range.
const K = 1249;
const R = 65536;

describe('sampleDeep at span ~1e-1000 near c = i, by self-similarity with span 1e-60', () => {
  it('gives escape counts exactly 2k higher and smooth counts 2k higher for delta / rho^k, with and without skipping', () => {
    const size = 12;
    const D = decimalAt(1100);
    const span = new D('1e-60');
    const off1 = gridOffsets(D, span.times(0.1), span.times(0.37), span, size, 0);
    // rho^k as an exact complex decimal
    let pr = new D(1),
      pi = new D(0);
    for (let j = 0; j < K; j++) [pr, pi] = [pr.minus(pi).times(4), pr.plus(pi).times(4)];
    const p2 = pr.times(pr).plus(pi.times(pi));
    const UNIT = -3400; // 2^-3400 ~ 1e-1023
    const unit = new D(2).pow(UNIT);
    const n = size * size;
    const re2 = new Float64Array(n),
      im2 = new Float64Array(n);
    let deltaMax = 0;
    for (let k = 0; k < n; k++) {
      const a = exactDouble(D, off1.re[k]!),
        b = exactDouble(D, off1.im[k]!);
      // (a + ib) / (pr + i pi)
      re2[k] = a.times(pr).plus(b.times(pi)).div(p2).div(unit).toNumber();
      im2[k] = b.times(pr).minus(a.times(pi)).div(p2).div(unit).toNumber();
      deltaMax = Math.max(deltaMax, Math.abs(re2[k]!), Math.abs(im2[k]!));
    }
    const span2 = span.div(p2.sqrt()); // span / |rho|^k
    expect(span2.lt('1e-990')).toBe(true);

    const shallow = createSampleSet(n);
    const orbit1 = computeReferenceOrbit({ re: '0', im: '1' }, referenceBits('1e-60', size), 4000, { escapeRadius: R });
    sampleDeep(orbit1, null, off1.re, off1.im, n, { maxIterations: 4000, escapeRadius: R, unitExponent: 0 }, shallow, createDeepStats());

    const orbit2 = computeReferenceOrbit({ re: '0', im: '1' }, referenceBits(span2.toExponential(5), size), 4000 + 2 * K, { escapeRadius: R });
    const settings2 = { maxIterations: 4000 + 2 * K, escapeRadius: R, unitExponent: UNIT };
    for (const bla of [null, buildBlaTable(orbit2, UNIT, deltaMax)]) {
      const deep = createSampleSet(n);
      const stats = createDeepStats();
      sampleDeep(orbit2, bla, re2, im2, n, settings2, deep, stats);
      let mismatched = 0,
        smoothErr = 0;
      for (let k = 0; k < n; k++) {
        expect(shallow.period[k]).toBe(PERIOD_ESCAPED);
        expect(deep.period[k]).toBe(PERIOD_ESCAPED);
        if (Math.ceil(deep.smooth[k]!) !== Math.ceil(shallow.smooth[k]!) + 2 * K) mismatched++;
        else smoothErr = Math.max(smoothErr, Math.abs(deep.smooth[k]! - shallow.smooth[k]! - 2 * K));
      }
      // stated: at most 2 of 144 pixels on an escape boundary; measured 0
      expect(mismatched).toBeLessThanOrEqual(2);
      // measured: 9e-13 without skipping, 6e-10 with (eps = 2^-40); span2 = 1.08e-1000
      expect(smoothErr).toBeLessThan(bla === null ? 1e-10 : 1e-8);
      if (bla !== null) expect(stats.skipped).toBeGreaterThan(0.9 * (stats.skipped + stats.stepped));
    }
  });
});
