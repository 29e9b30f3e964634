import { describe, expect, it } from 'vitest';
import { comparePlateSvg } from '../../src/section/compare-plate.js';

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
    expect(svg).toMatch(/<text x="634.00"[^>]*>3.5<\/text>/);
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
    const im = [...svg.matchAll(/class="im-label" x="[\d.]+" y="([\d.]+)"[^>]*>([^<]+)</g)].map((m) => [Number(m[1]) - 4, Number(m[2])] as const);
    expect(im.length).toBeGreaterThanOrEqual(3);
    for (const [y, v] of im) expect(Math.abs(top + 100 - (v / 0.125) * 100 - y), `Im c ${v}`).toBeLessThan(0.01);
    expect(im.some(([, v]) => v === 0)).toBe(true);
    const xs = [...svg.matchAll(/class="x-label" x="[\d.]+" y="([\d.]+)"[^>]*>([^<]+)</g)].map((m) => [Number(m[1]) - 4, Number(m[2])] as const);
    expect(xs.length).toBeGreaterThanOrEqual(3);
    for (const [y, v] of xs) expect(Math.abs(top + 200 + 400 - v * 400 - y), `x ${v}`).toBeLessThan(0.01);
  });

  for (const width of [1000, 300, 160]) {
    it(`at ${width} px wide no label overprints another (DejaVu Sans advances, read by fontkit)`, async () => {
      const { createRequire } = await import('node:module');
      const fontkit = await import('fontkit');
      const font = fontkit.openSync(createRequire(import.meta.url).resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf')) as unknown as {
        unitsPerEm: number;
        layout(t: string): { positions: Array<{ xAdvance: number }> };
      };
      const w = (t: string, size: number): number => (font.layout(t).positions.reduce((a, p) => a + p.xAdvance, 0) / font.unitsPerEm) * size;
      const marks = [...spec.marks, { c: -1.368, label: '4->8', kind: 'doubling' as const }, { c: -1.394, label: '8->16', kind: 'doubling' as const }];
      const svg = comparePlateSvg({ ...spec, width, marks });
      const boxes = [...svg.matchAll(/<text (?:class="[^"]+" )?x="([\d.]+)" y="([\d.]+)"([^>]*)font-size="12"[^>]*>([^<]+)<\/text>/g)].map((m) => {
        const x = Number(m[1]);
        const y = Number(m[2]);
        const tw = w(m[4]!.replace(/&gt;/g, '>'), 12);
        const anchor = /text-anchor="(middle|end)"/.exec(m[3]!)?.[1] ?? 'start';
        const x0 = anchor === 'middle' ? x - tw / 2 : anchor === 'end' ? x - tw : x;
        return { t: m[4]!, x0, x1: x0 + tw, y0: y - 9.1, y1: y + 2.9 };
      });
      expect(boxes.length).toBeGreaterThan(4);
      for (let i = 0; i < boxes.length; i++)
        for (let j = i + 1; j < boxes.length; j++) {
          const a = boxes[i]!;
          const b = boxes[j]!;
          expect(a.x0 < b.x1 && b.x0 < a.x1 && a.y0 < b.y1 && b.y0 < a.y1, `${a.t} / ${b.t}`).toBe(false);
        }
    });
  }
});
