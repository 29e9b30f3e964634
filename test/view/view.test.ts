import { describe, expect, it } from 'vitest';
import { doubleGrid, fitsDouble, pixelToC, type View } from '../../src/view/view.js';

const view = (over: Partial<View> = {}): View => ({ centerRe: '-0.5', centerIm: '0.25', span: '4', width: 400, height: 200, rotation: 0, ...over });

describe('pixelToC', () => {
  it('puts the centre of the image at the view centre and pixel centres half a spacing in', () => {
    const g = doubleGrid(view());
    const out = new Float64Array(2);
    expect([...pixelToC(g, 200, 100, out)]).toEqual([-0.5, 0.25]);
    // Pixel (0, 0) samples its cell centre (0.5, 0.5): left edge + spacing/2, top edge - spacing/2.
    pixelToC(g, 0.5, 0.5, out);
    expect(out[0]).toBeCloseTo(-0.5 - 2 + 0.005, 15);
    expect(out[1]).toBeCloseTo(0.25 + 1 - 0.005, 15);
  });

  it('grows the imaginary part upwards as j grows downwards', () => {
    const g = doubleGrid(view());
    const top = pixelToC(g, 10.5, 0.5, new Float64Array(2))[1]!;
    const bottom = pixelToC(g, 10.5, 199.5, new Float64Array(2))[1]!;
    expect(top).toBeGreaterThan(bottom);
  });

  it('turns a quarter rotation exactly: the right edge points up', () => {
    const g = doubleGrid(view({ rotation: 90, centerRe: '0', centerIm: '0' }));
    const out = pixelToC(g, 400, 100, new Float64Array(2));
    expect(out[0]).toBe(0);
    expect(out[1]).toBe(2);
  });
});

describe('fitsDouble', () => {
  it('accepts a whole-set view and refuses a span of 1e-15 at 1000 pixels', () => {
    expect(fitsDouble(doubleGrid(view()))).toBe(true);
    expect(fitsDouble(doubleGrid(view({ span: '1e-15', width: 1000 })))).toBe(false);
  });
});
