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
    // c = -1.25 sits at 60 + (0.75 / 1.25) * 1000 = 660 px (left margin 60).
    expect(svg).toMatch(/<line x1="660.00"[^>]*stroke="#c0392b"/);
    // r = 3.5 maps to c = 3.5/2 - 3.5^2/4 = -1.3125 (docs/methods.md E1): x = 60 + 0.6875 / 1.25 * 1000 = 610.
    expect(svg).toMatch(/<text x="610.00"[^>]*>3.5<\/text>/);
    expect(svg).toContain('data:image/png;base64,AAAA');
    expect(svg).toContain('data:image/png;base64,BBBB');
  });

  it('comparePlateSvg shades the window from onset to end in the diagram panel', () => {
    const svg = comparePlateSvg(spec);
    // onset -1.75 -> 260 px, end -1.7903 -> 227.74 px: the band starts at the smaller x.
    expect(svg).toMatch(/<rect x="227.74" y="\d+" width="32.26"/);
  });
});
