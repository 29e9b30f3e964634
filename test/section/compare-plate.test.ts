import { describe, expect, it } from 'vitest';
import { outlineLettering } from '../../src/figure/outline-lettering.js';
import { comparePlateSvg as plate, type CompareSpec } from '../../src/section/compare-plate.js';
import { outlines, overlaps } from '../helpers/outline-boxes.js';

const comparePlateSvg = (s: CompareSpec): string => plate(s, outlineLettering());
/** Centre of an outline's ink across; DejaVu digits sit almost centred in their advance (side bearings within 0.1 em of each other: 1.2 px at 12 px). */
const midX = (o: { x0: number; x1: number }): number => (o.x0 + o.x1) / 2;

const spec = {
  from: -2,
  to: -0.75,
  width: 1000,
  stripHeight: 200,
  diagramHeight: 400,
  stripPng: 'AAAA',
  diagramPng: 'BBBB',
  title: 'Edges of Stability: the real slice',
  marks: [
    { c: -1.75487766624669, label: '3', kind: 'window' as const, from: -1.75, to: -1.7903274919993457 },
    { c: -1.25, label: '2->4', kind: 'doubling' as const },
  ],
};

describe('comparePlateSvg', () => {
  it('comparePlateSvg puts a mark and its r tick at the same x as the c axis says', () => {
    const svg = comparePlateSvg(spec);
    // c = -1.25 sits at 84 + (0.75 / 1.25) * 1000 = 684 px (left margin 84).
    expect(svg).toMatch(/<line x1="684.00"[^>]*stroke="#c0392b"/);
    // r = 3.5 maps to c = 3.5/2 - 3.5^2/4 = -1.3125 (docs/methods.md E1): x = 84 + 0.6875 / 1.25 * 1000 = 634.
    const r35 = outlines(svg).find((o) => o.cls === 'r-label' && o.label === '3.5')!;
    expect(Math.abs(midX(r35) - 634)).toBeLessThan(1.2);
    expect(svg).toContain('data:image/png;base64,AAAA');
    expect(svg).toContain('data:image/png;base64,BBBB');
  });

  it('comparePlateSvg shades the window from onset to end in the diagram panel', () => {
    const svg = comparePlateSvg(spec);
    // onset -1.75 -> 284 px, end -1.7903 -> 251.74 px: the band starts at the smaller x.
    expect(svg).toMatch(/<rect x="251.74" y="\d+" width="32.26"/);
  });

  it('scales the strip in Im c (square pixels: the strip is 200 px of 1.25 / 1000, so Im c runs over +-0.125, 0 in the middle) and the diagram in x (0 at the bottom, 1 at the top)', () => {
    const svg = comparePlateSvg(spec);
    const top = Number(/<image x="\d+" y="(\d+)"/.exec(svg)![1]);
    // a tick label's baseline is 4 px below its tick; digits rest on the baseline (their ink overshoots it by under 0.02 em)
    const im = outlines(svg)
      .filter((o) => o.cls === 'im-label')
      .map((o) => [o.y1 - 4, Number(o.label)] as const);
    expect(im.length).toBeGreaterThanOrEqual(3);
    for (const [y, v] of im) expect(Math.abs(top + 100 - (v / 0.125) * 100 - y), `Im c ${v}`).toBeLessThan(0.3);
    expect(im.some(([, v]) => v === 0)).toBe(true);
    const xs = outlines(svg)
      .filter((o) => o.cls === 'x-label')
      .map((o) => [o.y1 - 4, Number(o.label)] as const);
    expect(xs.length).toBeGreaterThanOrEqual(3);
    for (const [y, v] of xs) expect(Math.abs(top + 200 + 400 - v * 400 - y), `x ${v}`).toBeLessThan(0.3);
  });

  for (const width of [1000, 300, 160]) {
    it(`at ${width} px wide no label overprints another (ink of the drawn outlines)`, () => {
      const marks = [...spec.marks, { c: -1.368, label: '4->8', kind: 'doubling' as const }, { c: -1.394, label: '8->16', kind: 'doubling' as const }];
      const svg = comparePlateSvg({ ...spec, width, marks });
      const boxes = outlines(svg).filter((o) => ['mark-label', 'c-label', 'r-label', 'im-label', 'x-label'].includes(o.cls));
      expect(boxes.length).toBeGreaterThan(4);
      for (let i = 0; i < boxes.length; i++)
        for (let j = i + 1; j < boxes.length; j++) expect(overlaps(boxes[i]!, boxes[j]!), `${boxes[i]!.label} / ${boxes[j]!.label}`).toBe(false);
    });
  }

  for (const width of [1000, 400, 200, 100]) {
    it(`at ${width} px wide every text lies on the page and no text overprints another, a tick or a mark line (title, axis titles and footnote wrap)`, () => {
      const marks = [...spec.marks, { c: -1.368, label: '4->8', kind: 'doubling' as const }];
      const svg = comparePlateSvg({ ...spec, width, marks });
      const page = /<svg [^>]*width="(\d+)" height="(\d+)"/.exec(svg)!;
      const [pw, ph] = [Number(page[1]), Number(page[2])];
      const texts = outlines(svg).filter((o) => !o.rotated);
      expect(texts.length).toBeGreaterThan(6);
      for (const t of texts) {
        expect(t.x0 >= 0 && t.x1 <= pw && t.y0 >= 0 && t.y1 <= ph, `${t.label} at ${t.x0}..${t.x1} x ${t.y0}..${t.y1} on ${pw} x ${ph}`).toBe(true);
      }
      for (let i = 0; i < texts.length; i++)
        for (let j = i + 1; j < texts.length; j++) expect(overlaps(texts[i]!, texts[j]!), `${texts[i]!.label} / ${texts[j]!.label}`).toBe(false);
      // every line segment of the plate: ticks (black) and marks (coloured), as thin boxes
      const lines = [...svg.matchAll(/<line (?:class="[^"]+" )?x1="([\d.]+)" y1="([\d.]+)" x2="([\d.]+)" y2="([\d.]+)"/g)].map((m) => {
        const [x1, y1, x2, y2] = [m[1], m[2], m[3], m[4]].map(Number) as [number, number, number, number];
        return { cls: 'line', label: `line ${m[0]}`, rotated: false, x0: Math.min(x1, x2) - 0.4, x1: Math.max(x1, x2) + 0.4, y0: Math.min(y1, y2), y1: Math.max(y1, y2) };
      });
      expect(lines.length).toBeGreaterThan(6);
      for (const t of texts) for (const l of lines) expect(overlaps(t, l), `${t.label} / ${l.label}`).toBe(false);
      // the long texts are all there, however they were wrapped
      const all = texts.map((t) => t.label).join(' ');
      expect(all).toContain(spec.title);
      expect(all).toContain('c (the plane z -> z^2 + c; real axis through the middle of the strip)');
      expect(all).toContain('shaded: window onset to end');
    });
  }
});
