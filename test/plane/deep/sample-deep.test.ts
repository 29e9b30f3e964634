import { describe, expect, it } from 'vitest';
import { computeReferenceOrbit, referenceBits } from '../../../src/precise/reference-orbit.js';
import { buildBlaTable } from '../../../src/plane/deep/bla-table.js';
import { createDeepStats, sampleDeep } from '../../../src/plane/deep/sample-deep.js';
import { createSampleSet, PERIOD_ESCAPED, PERIOD_UNDECIDED } from '../../../src/plane/sample-set.js';
import { sampleParameters } from '../../../src/plane/sample-parameters.js';
import { decimalAt, decimalEscape, exactDouble, gridOffsets } from './helpers.js';
import type { Dec } from './helpers.js';

const R = 65536; // the shallow kernel's default escape radius (sample-parameters.ts)

describe('sampleDeep against the shallow kernel (span 0.1, double offsets)', () => {
  it('gives the same periods, escape counts, smooth counts and distances as sampleParameters on a 32x32 grid near -1.3+0.05i', () => {
    // Perturbation about one reference equals direct double iteration up to
    // rounding (docs/methods.md B1/B3); the colour-relevant fields must agree.
    const size = 32;
    const D = decimalAt(40);
    const centre = { re: '-1.3', im: '0.05' };
    const orbit = computeReferenceOrbit(centre, referenceBits('0.1', size), 4000, { escapeRadius: R });
    const off = gridOffsets(D, new D(0), new D(0), new D('0.1'), size, 0);
    const cr = off.re.map((x) => -1.3 + x);
    const ci = off.im.map((y) => 0.05 + y);
    // the shallow kernel samples c = C + offset rounded to double; give the deep kernel the same points
    const dr = new Float64Array(size * size),
      di = new Float64Array(size * size);
    for (let k = 0; k < size * size; k++) {
      dr[k] = new D(exactDouble(D, cr[k]!)).minus('-1.3').toNumber();
      di[k] = new D(exactDouble(D, ci[k]!)).minus('0.05').toNumber();
    }
    const shallow = createSampleSet(size * size);
    sampleParameters(cr, ci, size * size, { maxIterations: 4000, escapeRadius: R, periodTolerance: (1e-3 * 0.1) / size }, shallow);
    const deep = createSampleSet(size * size);
    sampleDeep(orbit, null, dr, di, size * size, { maxIterations: 4000, escapeRadius: R, unitExponent: 0 }, deep, createDeepStats());
    let escapedBoth = 0,
      countDiff = 0,
      interiorBoth = 0,
      periodDiff = 0,
      classDiff = 0;
    let smoothErr = 0,
      distErr = 0,
      mulErr = 0;
    for (let k = 0; k < size * size; k++) {
      const a = shallow.period[k]!,
        b = deep.period[k]!;
      if (a === PERIOD_ESCAPED && b === PERIOD_ESCAPED) {
        escapedBoth++;
        if (Math.ceil(shallow.smooth[k]!) !== Math.ceil(deep.smooth[k]!)) countDiff++;
        else if (deep.smooth[k]! < 60) {
          // long orbits amplify rounding differences chaotically; compare the well-conditioned ones
          smoothErr = Math.max(smoothErr, Math.abs(shallow.smooth[k]! - deep.smooth[k]!));
          distErr = Math.max(distErr, Math.abs(shallow.distance[k]! / deep.distance[k]! - 1));
        }
      } else if (a > 0 && b > 0) {
        interiorBoth++;
        if (a !== b) periodDiff++;
        else mulErr = Math.max(mulErr, Math.hypot(shallow.mulRe[k]! - deep.mulRe[k]!, shallow.mulIm[k]! - deep.mulIm[k]!));
      } else if (!(a === PERIOD_UNDECIDED || b === PERIOD_UNDECIDED)) classDiff++;
    }
    expect(escapedBoth).toBeGreaterThan(300);
    expect(interiorBoth).toBeGreaterThan(300);
    // stated: at most 1% of escaped pixels may differ in count (two double
    // computations of a chaotic orbit part ways after ~1000 iterations);
    // measured 2 of 496, both above 1300 iterations
    expect(countDiff / escapedBoth).toBeLessThanOrEqual(0.01);
    expect(periodDiff).toBe(0);
    expect(classDiff).toBe(0);
    // below 60 iterations only rounding differs (measured 6e-9 at most; bound 1e-6)
    expect(smoothErr).toBeLessThan(1e-6);
    expect(distErr).toBeLessThan(1e-6);
    expect(mulErr).toBeLessThan(1e-9);
  });
});

/** Escape-count comparison with decimal.js on every `stride`-th pixel. */
function compareWithDecimal(
  D: ReturnType<typeof decimalAt>,
  refRe: Dec,
  refIm: Dec,
  off: { re: Float64Array; im: Float64Array },
  unitExponent: number,
  out: ReturnType<typeof createSampleSet>,
  maxIterations: number,
  stride: number,
): { checked: number; mismatched: number; smoothErr: number } {
  const unit = new D(2).pow(unitExponent);
  let checked = 0,
    mismatched = 0,
    smoothErr = 0;
  for (let k = 0; k < off.re.length; k += stride) {
    const cr = refRe.plus(exactDouble(D, off.re[k]!).times(unit));
    const ci = refIm.plus(exactDouble(D, off.im[k]!).times(unit));
    const { n, mu } = decimalEscape(D, cr, ci, maxIterations, R);
    const mine = out.period[k] === PERIOD_ESCAPED ? Math.ceil(out.smooth[k]!) : -1;
    checked++;
    if (n !== mine) mismatched++;
    else if (n > 0) smoothErr = Math.max(smoothErr, Math.abs(mu - out.smooth[k]!));
  }
  return { checked, mismatched, smoothErr };
}

describe('sampleDeep at span 1e-20 near the Misiurewicz point c = i', () => {
  it('matches direct decimal.js iteration on sampled pixels, with and without skipping', () => {
    // c = i is preperiodic (0 -> i -> -1+i -> -i -> -1+i, exact algebra), so
    // every depth around it shows escaping filaments; reference = i itself.
    const size = 16;
    const D = decimalAt(45);
    const orbit = computeReferenceOrbit({ re: '0', im: '1' }, referenceBits('1e-20', size), 2000, { escapeRadius: R });
    const span = new D('1e-20');
    const off = gridOffsets(D, span.times(0.1), span.times(0.37), span, size, 0);
    for (const bla of [null, buildBlaTable(orbit, 0, 1e-20)]) {
      const out = createSampleSet(size * size);
      sampleDeep(orbit, bla, off.re, off.im, size * size, { maxIterations: 2000, escapeRadius: R, unitExponent: 0 }, out, createDeepStats());
      const r = compareWithDecimal(D, new D(0), new D(1), off, 0, out, 2000, 5);
      // stated tolerance: at most 1 in 20 sampled pixels may sit on an escape boundary; measured 0
      expect(r.checked).toBeGreaterThanOrEqual(50);
      expect(r.mismatched / r.checked).toBeLessThanOrEqual(0.05);
      // smooth counts: measured 9e-13 without skipping, 8e-10 with (eps = 2^-40)
      expect(r.smoothErr).toBeLessThan(bla === null ? 1e-10 : 1e-7);
    }
  });
});

describe('sampleDeep as a worker would call it', () => {
  it('gives identical bytes for shared or structured-cloned inputs and for any batching of the pixels', async () => {
    const { shareReferenceOrbit } = await import('../../../src/precise/reference-orbit.js');
    const { shareBlaTable } = await import('../../../src/plane/deep/bla-table.js');
    const size = 12;
    const D = decimalAt(45);
    const orbit = computeReferenceOrbit({ re: '0', im: '1' }, referenceBits('1e-30', size), 1000, { escapeRadius: R });
    const span = new D('1e-30');
    const off = gridOffsets(D, span.times(0.2), new D(0), span, size, -100);
    const settings = { maxIterations: 1000, escapeRadius: R, unitExponent: -100 };
    const table = buildBlaTable(orbit, -100, 1e-30 * 2 ** 100);
    const n = size * size;
    const a = createSampleSet(n);
    sampleDeep(orbit, table, off.re, off.im, n, settings, a, createDeepStats());
    // plain data: survives structuredClone (what postMessage does) and SharedArrayBuffer copies
    const cloned = structuredClone({ orbit, table });
    const b = createSampleSet(n);
    sampleDeep(cloned.orbit, cloned.table, off.re, off.im, n, settings, b, createDeepStats());
    const c = createSampleSet(n);
    sampleDeep(shareReferenceOrbit(orbit), shareBlaTable(table), off.re, off.im, n, settings, c, createDeepStats());
    // batches of 7 pixels
    const d = createSampleSet(n);
    for (let k0 = 0; k0 < n; k0 += 7) {
      const m = Math.min(7, n - k0);
      const part = createSampleSet(m);
      sampleDeep(orbit, table, off.re.subarray(k0, k0 + m), off.im.subarray(k0, k0 + m), m, settings, part, createDeepStats());
      d.smooth.set(part.smooth, k0);
      d.distance.set(part.distance, k0);
      d.period.set(part.period, k0);
    }
    for (const other of [b, c, d]) {
      expect(Buffer.from(other.smooth.buffer)).toEqual(Buffer.from(a.smooth.buffer));
      expect(Buffer.from(other.distance.buffer)).toEqual(Buffer.from(a.distance.buffer));
      expect(Array.from(other.period)).toEqual(Array.from(a.period));
    }
  });
});
