/**
 * plotSvg's labels and clip marks, with its text as DejaVu Sans outlines
 * (figure/outline-lettering.ts). "No collision" is checked on the ink of the
 * drawn outlines (their path coordinates), not on the advances the layout
 * reserved.
 */
import { describe, expect, it } from 'vitest';
import { outlineLettering } from '../../src/figure/outline-lettering.js';
import { plotSvg } from '../../src/section/plot-svg.js';
import { outlines, overlaps, type Outline } from '../helpers/outline-boxes.js';

/** The 10 px labels (band and mark labels) with their ink boxes. */
function labels(svg: string): Outline[] {
  return outlines(svg).filter((o) => o.cls === 'band-label' || o.cls === 'mark-label');
}

function markLines(svg: string): number[] {
  return [...svg.matchAll(/<line x1="([\d.]+)" y1="[\d.]+" x2="\1" y2="[\d.]+" stroke="#c0392b"/g)].map((m) => Number(m[1]));
}

/** A crowded plot: marks accumulating like a cascade (ratios 1/4.669, Feigenbaum's delta, from memory) and adjacent windows. */
function crowded(width = 600): string {
  const xs = Float64Array.from({ length: 400 }, (_, i) => i / 399);
  const ys = Float64Array.from(xs, (x) => Math.sin(20 * x) - (Math.abs(x - 0.3) < 0.004 ? 10 : 0) - (Math.abs(x - 0.7) < 0.01 ? Infinity : 0));
  const marks = [];
  let at = 0.1;
  let step = 0.3;
  for (let n = 0; n < 8; n++) {
    marks.push({ at, label: `${2 ** n}->${2 ** (n + 1)}` });
    at += step;
    step /= 4.669;
  }
  const bands = [0.8, 0.82, 0.84, 0.9].map((from, i) => ({ from, to: from + 0.015, label: `p${i + 3} RLLR` }));
  return plotSvg({ title: 't', xLabel: 'r', yLabel: 'y', xs, ys, marks, bands, yMin: -3, width, height: 300 }, outlineLettering());
}

describe('plotSvg', () => {
  for (const w of [1200, 600, 320]) {
    it(`at ${w} px wide: no two labels overlap and no mark line runs through a label (widths by DejaVu Sans)`, () => {
      const svg = crowded(w);
      const ls = labels(svg);
      expect(ls.length).toBeGreaterThan(0);
      for (let i = 0; i < ls.length; i++) {
        for (let j = i + 1; j < ls.length; j++) {
          const a = ls[i]!;
          const b = ls[j]!;
          expect(overlaps(a, b), `${a.label} / ${b.label}`).toBe(false);
        }
        for (const x of markLines(svg)) expect(x > ls[i]!.x0 && x < ls[i]!.x1, `${ls[i]!.label} crossed at ${x}`).toBe(false);
      }
    });
  }

  it("draws a clip mark under each run of values below yMin (and -infinity), at the run's middle, and a note of the clip level", () => {
    const svg = crowded(1000);
    const clips = [...svg.matchAll(/<path class="clip" d="M([\d.]+) [\d.]+L([\d.]+)/g)].map((m) => (Number(m[1]) + Number(m[2])) / 2);
    // runs at x = 0.3 (values -10 + sin) and 0.7 (-infinity), plot 1000 - 70 - 20 wide from x = 70
    expect(clips).toHaveLength(2);
    expect(Math.abs(clips[0]! - (70 + 0.3 * 910))).toBeLessThan(3);
    expect(Math.abs(clips[1]! - (70 + 0.7 * 910))).toBeLessThan(3);
    expect(svg).toMatch(/class="clip-note" aria-label="values below -3, clipped"/);
    const plain = plotSvg({ title: 't', xLabel: 'r', yLabel: 'y', xs: Float64Array.of(0, 1), ys: Float64Array.of(0, 1), marks: [], bands: [], yMin: -3 }, outlineLettering());
    expect(plain).not.toContain('class="clip');
  });
});

describe('plotSvg text', () => {
  it('holds no <text> element: every string (title, axis labels, ticks, marks, bands) is an outline carrying it in aria-label', () => {
    const svg = crowded(1200);
    expect(svg).not.toMatch(/<text[\s>]/);
    const strings = outlines(svg).map((o) => o.label);
    for (const s of ['t', 'r', 'y', '0', '0.5', '1', '1->2', 'p3 RLLR', 'values below -3, clipped']) expect(strings, s).toContain(s);
    // every outline has ink (a path, not an empty element)
    for (const o of outlines(svg)) expect(o.x1 - o.x0, o.label).toBeGreaterThan(0);
  });
});

describe('niceTicks', () => {
  it('gives exact multiples of a 1, 2 or 5 step, 0 itself where the range holds it (never -1.7e-17)', async () => {
    const { niceTicks } = await import('../../src/section/plot-svg.js');
    for (const [lo, hi, n] of [
      [-0.125, 0.125, 5],
      [-0.3, 0.7, 10],
      [2.8, 4, 10],
      [-1e-3, 3e-3, 4],
    ] as const) {
      const ticks = niceTicks(lo, hi, n);
      const step = ticks[1]! - ticks[0]!;
      const mant = step / 10 ** Math.floor(Math.log10(step) + 1e-9);
      expect([1, 2, 5].some((m) => Math.abs(mant - m) < 1e-9)).toBe(true);
      // each tick printed is the decimal k * step (shortest round trip of the double)
      for (const t of ticks) expect(String(t)).toMatch(/^-?\d+(\.\d{1,6})?(e-\d+)?$/);
      if (lo < 0 && hi > 0) expect(ticks).toContain(0);
      expect(ticks[0]!).toBeGreaterThanOrEqual(lo - 1e-12);
      expect(ticks.at(-1)!).toBeLessThanOrEqual(hi + 1e-12);
    }
  });
});
