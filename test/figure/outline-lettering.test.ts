import { describe, expect, it } from 'vitest';
import { outlineLettering, typeset } from '../../src/figure/outline-lettering.js';
import { outlines } from '../helpers/outline-boxes.js';

describe('typeset', () => {
  it('sets "->" as U+2192 and "_n", "_0" as the subscript characters of the Unicode standard (U+2099, U+2080), leaving a run without subscript forms alone', () => {
    expect(typeset('x -> r x_n')).toBe('x \u2192 r x\u2099');
    expect(typeset('x_0 = 0.2')).toBe('x\u2080 = 0.2');
    expect(typeset('f^3(x)')).toBe('f^3(x)');
    // q has no subscript form in Unicode
    expect(typeset('x_q')).toBe('x_q');
  });
});

describe('outlineLettering', () => {
  it('anchors start, middle and end on the advance: the same string at three anchors is shifted by half and a whole width', () => {
    const L = outlineLettering();
    const w = L.width('1/7', 20);
    const [a, b, c] = (['start', 'middle', 'end'] as const).map((anchor) => outlines(L.text('1/7', 100, 50, 20, anchor, 'black'))[0]!);
    expect(a!.label).toBe('1/7');
    expect(a!.x0 - b!.x0).toBeCloseTo(w / 2, 1);
    expect(a!.x0 - c!.x0).toBeCloseTo(w, 1);
    expect(L.text('a', 0, 0, 10, 'start', 'black')).not.toMatch(/<text[\s>]/);
  });
});
