import { describe, expect, it } from 'vitest';
import { createSampleSet, PERIOD_UNDECIDED } from '../../src/plane/sample-set.js';
import { DEFAULT_COLOUR_SETTINGS, parseColourSettings } from '../../src/colour/colour-settings.js';
import { edgeKeep, shadeSamples } from '../../src/colour/shade-samples.js';
import { gradientLinear, gradientPosition } from '../../src/colour/exterior-gradients.js';
import { periodLinear } from '../../src/colour/period-palette.js';
import { hexToLinear } from '../../src/colour/oklab.js';

/** Relative luminance of linear sRGB (ITU-R BT.709 / sRGB primaries: 0.2126, 0.7152, 0.0722). */
const luminance = (o: Float64Array, i: number): number => 0.2126 * o[3 * i]! + 0.7152 * o[3 * i + 1]! + 0.0722 * o[3 * i + 2]!;

describe('edgeKeep', () => {
  it('edgeKeep is tanh(delta / k): 0 on the boundary, tanh(1) at delta = k, 1 when k = 0 or distance is NaN', () => {
    expect(edgeKeep(0, 1e-3, 2)).toBe(0);
    expect(edgeKeep(2e-3, 1e-3, 2)).toBeCloseTo(Math.tanh(1), 15);
    expect(edgeKeep(5e-3, 1e-3, 0)).toBe(1);
    expect(edgeKeep(Number.NaN, 1e-3, 2)).toBe(1);
  });

  it('edgeKeep equals Math.tanh(distance / spacing / k) bit for bit on both sides of the skip at 22', () => {
    // Reference: the engine's Math.tanh itself; arguments 0 .. 60 in steps of 1/64 and around 22 ulp by ulp.
    const xs: number[] = [];
    for (let i = 0; i <= 60 * 64; i++) xs.push(i / 64);
    for (let i = -8; i <= 8; i++) xs.push(22 + i * 2 ** -48);
    for (const x of xs) expect(edgeKeep(x * 3e-4 * 1.5, 3e-4, 1.5), String(x)).toBe(Math.tanh((x * 3e-4 * 1.5) / 3e-4 / 1.5));
  });
});

describe('shadeSamples', () => {
  it('exterior: a smaller distance gives a darker sample (monotone), reaching the black edge ink at distance 0', () => {
    const n = 200;
    const s = createSampleSet(n);
    const spacing = 1e-4;
    for (let i = 0; i < n; i++) {
      s.period[i] = 0;
      s.smooth[i] = 17.25;
      s.distance[i] = (i / 20) * spacing; // 0 .. 10 pixels
    }
    const out = new Float64Array(3 * n);
    shadeSamples(s, 0, n, spacing, { ...DEFAULT_COLOUR_SETTINGS, edge: 2 }, out);
    expect(luminance(out, 0)).toBe(0);
    for (let i = 1; i < n; i++) expect(luminance(out, i)).toBeGreaterThan(luminance(out, i - 1));
    // Far from the boundary the colour is the plain gradient colour (tanh(5) = 0.99991).
    const plain = gradientLinear('tidepool', gradientPosition(17.25, 'log', 0.8, 0), [0, 0, 0]);
    for (let c = 0; c < 3; c++) expect(Math.abs(out[3 * (n - 1) + c]! - plain[c]!)).toBeLessThan(2e-4);
  });

  it('exterior: a white edge ink lightens toward the boundary instead', () => {
    const s = createSampleSet(3);
    s.smooth.fill(9);
    s.distance.set([0, 1, 4]);
    const out = new Float64Array(9);
    shadeSamples(s, 0, 3, 1, parseColourSettings({ edgeColour: '#ffffff', edge: 1 }), out);
    expect(luminance(out, 0)).toBeCloseTo(1, 12);
    expect(luminance(out, 0)).toBeGreaterThan(luminance(out, 1));
    expect(luminance(out, 1)).toBeGreaterThan(luminance(out, 2));
  });

  it('interior: period-depth gives the plain period colour at |multiplier| = 1 and 0.4 of it at the centre', () => {
    const s = createSampleSet(2);
    s.period.set([3, 3]);
    s.mulRe.set([1, 0]);
    s.distance.set([Number.NaN, Number.NaN]);
    const out = new Float64Array(6);
    shadeSamples(s, 0, 2, 1e-3, { ...DEFAULT_COLOUR_SETTINGS, interior: 'period-depth' }, out);
    const p3 = periodLinear(3, [0, 0, 0]);
    for (let c = 0; c < 3; c++) {
      expect(out[c]).toBe(p3[c]);
      expect(out[3 + c]).toBeCloseTo(0.4 * p3[c]!, 15);
    }
  });

  it('interior: period-angle steps at internal angle 0 (just below 1 turn is lighter than just above 0)', () => {
    const s = createSampleSet(2);
    s.period.set([2, 2]);
    const eps = 1e-6;
    s.mulRe.set([0.5 * Math.cos(eps), 0.5 * Math.cos(-eps)]);
    s.mulIm.set([0.5 * Math.sin(eps), 0.5 * Math.sin(-eps)]);
    s.distance.fill(Number.NaN);
    const out = new Float64Array(6);
    shadeSamples(s, 0, 2, 1e-3, { ...DEFAULT_COLOUR_SETTINGS, interior: 'period-angle' }, out);
    expect(luminance(out, 1) / luminance(out, 0)).toBeCloseTo(1 / 0.7, 4);
  });

  it('interior: the interior edge darkens toward the component boundary; solid uses interiorColour', () => {
    const s = createSampleSet(3);
    s.period.fill(1);
    s.mulRe.fill(0.9);
    s.distance.set([0.5, 1, 5]);
    const out = new Float64Array(9);
    shadeSamples(s, 0, 3, 1, parseColourSettings({ interior: 'solid', interiorColour: '#ffffff', interiorEdge: 1 }), out);
    expect(luminance(out, 0)).toBeLessThan(luminance(out, 1));
    expect(luminance(out, 1)).toBeLessThan(luminance(out, 2));
    expect(luminance(out, 2)).toBeCloseTo(Math.tanh(5), 12);
  });

  it('undecided samples take undecidedColour', () => {
    const s = createSampleSet(1);
    s.period[0] = PERIOD_UNDECIDED;
    const out = new Float64Array(3);
    shadeSamples(s, 0, 1, 1, parseColourSettings({ undecidedColour: '#ff0000' }), out);
    expect(Array.from(out)).toEqual([1, 0, 0]);
  });

  it('shading a sub-range at an offset equals shading everything and slicing', () => {
    const n = 50;
    const s = createSampleSet(n);
    for (let i = 0; i < n; i++) {
      s.period[i] = i % 5 === 0 ? 0 : i % 7 === 0 ? -1 : (i % 9) + 1;
      s.smooth[i] = 3 + i * 0.37;
      s.distance[i] = i * 1e-4;
      s.mulRe[i] = Math.cos(i);
      s.mulIm[i] = 0.5 * Math.sin(i);
    }
    const settings = parseColourSettings({ interior: 'period-depth-angle', exterior: 'heather' });
    const all = new Float64Array(3 * n);
    shadeSamples(s, 0, n, 1e-4, settings, all);
    const part = new Float64Array(3 * 20);
    shadeSamples(s, 17, 20, 1e-4, settings, part);
    expect(Array.from(part)).toEqual(Array.from(all.subarray(3 * 17, 3 * 37)));
  });

  it('shadeSamples equals the colour composed from gradientLinear, periodLinear and Math.tanh, bit for bit', () => {
    // An independent composition of the documented rule (the generic colour functions, tanh without the skip).
    const n = 4000;
    const s = createSampleSet(n);
    for (let i = 0; i < n; i++) {
      s.period[i] = i % 3 === 0 ? (i % 11) + 1 : i % 97 === 0 ? PERIOD_UNDECIDED : 0;
      s.smooth[i] = 1 + ((i * 7919) % 3001) * 0.173;
      s.distance[i] = i % 13 === 0 ? Number.NaN : ((i * 104729) % 5000) * 1e-5; // 0 .. 50 pixels of 1e-4
      s.mulRe[i] = 0.9 * Math.cos(i);
      s.mulIm[i] = 0.9 * Math.sin(i);
    }
    const spacing = 1e-4;
    for (const over of [
      {},
      { interior: 'period-angle', exterior: 'heather', countScale: 'linear' },
      { interior: 'period-depth-angle', exterior: 'brass', edgeColour: '#ffffff', interiorEdge: 2 },
      { interior: 'solid', exterior: 'vellum', edge: 0 },
    ]) {
      const settings = parseColourSettings(over);
      const out = new Float64Array(3 * n);
      shadeSamples(s, 0, n, spacing, settings, out);
      const ink = hexToLinear(settings.edgeColour, [0, 0, 0]);
      const c = [0, 0, 0];
      const keepOf = (d: number, k: number): number => (k <= 0 || !(d >= 0) || d === Infinity ? 1 : Math.tanh(d / spacing / k));
      let mismatches = 0;
      for (let i = 0; i < n; i++) {
        const p = s.period[i]!;
        let keep = 1;
        if (p === 0) {
          gradientLinear(settings.exterior, gradientPosition(s.smooth[i]!, settings.countScale, settings.cycle, settings.offset), c);
          keep = keepOf(s.distance[i]!, settings.edge);
        } else if (p > 0) {
          if (settings.interior === 'solid') hexToLinear(settings.interiorColour, c);
          else periodLinear(p, c);
          let factor = 1;
          if (settings.interior === 'period-depth' || settings.interior === 'period-depth-angle') factor *= 0.4 + 0.6 * Math.min(1, Math.hypot(s.mulRe[i]!, s.mulIm[i]!));
          if (settings.interior === 'period-angle' || settings.interior === 'period-depth-angle') {
            let a = Math.atan2(s.mulIm[i]!, s.mulRe[i]!) / (2 * Math.PI);
            if (a < 0) a += 1;
            factor *= 0.7 + 0.3 * a;
          }
          for (let ch = 0; ch < 3; ch++) c[ch] = c[ch]! * factor;
          keep = keepOf(s.distance[i]!, settings.interiorEdge);
        } else hexToLinear(settings.undecidedColour, c);
        for (let ch = 0; ch < 3; ch++) {
          const want = keep === 1 ? c[ch]! : ink[ch]! + (c[ch]! - ink[ch]!) * keep;
          if (!Object.is(out[3 * i + ch], want)) mismatches++;
        }
      }
      expect(mismatches, JSON.stringify(over)).toBe(0);
    }
  });
});
