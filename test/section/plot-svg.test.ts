/**
 * plotSvg's labels and clip marks. Label widths are measured here with the
 * DejaVu Sans outlines read by fontkit (an outside measure of a sans-serif
 * face; the plot itself only estimates), so "no collision" is checked
 * against real advances, not against the estimate that placed them.
 */
import { createRequire } from 'node:module';
import * as fontkit from 'fontkit';
import { describe, expect, it } from 'vitest';
import { plotSvg } from '../../src/section/plot-svg.js';

const font = fontkit.openSync(createRequire(import.meta.url).resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf')) as unknown as {
  unitsPerEm: number;
  layout(t: string): { positions: Array<{ xAdvance: number }> };
};

function width(text: string, size: number): number {
  return (font.layout(text).positions.reduce((a, p) => a + p.xAdvance, 0) / font.unitsPerEm) * size;
}

interface Label {
  text: string;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

/** The 10 px labels (band and mark labels) with their boxes from DejaVu Sans advances. */
function labels(svg: string): Label[] {
  return [...svg.matchAll(/<text x="([\d.]+)" y="([\d.]+)"([^>]*)font-size="10"[^>]*>([^<]*)<\/text>/g)].map((m) => {
    const x = Number(m[1]);
    const y = Number(m[2]);
    const w = width(m[4]!.replace(/&gt;/g, '>').replace(/&lt;/g, '<').replace(/&amp;/g, '&'), 10);
    const anchor = /text-anchor="(middle|end)"/.exec(m[3]! + m[0])?.[1] ?? 'start';
    const x0 = anchor === 'middle' ? x - w / 2 : anchor === 'end' ? x - w : x;
    return { text: m[4]!, x0, x1: x0 + w, y0: y - 7.6, y1: y + 2.4 };
  });
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
  return plotSvg({ title: 't', xLabel: 'r', yLabel: 'y', xs, ys, marks, bands, yMin: -3, width, height: 300 });
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
          expect(a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1, `${a.text} / ${b.text}`).toBe(false);
        }
        for (const x of markLines(svg)) expect(x > ls[i]!.x0 && x < ls[i]!.x1, `${ls[i]!.text} crossed at ${x}`).toBe(false);
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
    expect(svg).toMatch(/class="clip-note"[^>]*>values below -3, clipped</);
    const plain = plotSvg({ title: 't', xLabel: 'r', yLabel: 'y', xs: Float64Array.of(0, 1), ys: Float64Array.of(0, 1), marks: [], bands: [], yMin: -3 });
    expect(plain).not.toContain('class="clip');
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
