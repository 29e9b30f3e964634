import { describe, expect, it } from 'vitest';
import { UserError } from '../../src/check/user-error.js';
import { parseSheet, printPixels } from '../../src/view/sheet.js';

function errorOf(value: unknown): string {
  try {
    parseSheet(value);
  } catch (err) {
    expect(err).toBeInstanceOf(UserError);
    return (err as Error).message;
  }
  throw new Error('expected a UserError');
}

describe('parseSheet', () => {
  it('fills every default for an empty sheet', () => {
    const s = parseSheet({}, 'x');
    expect(s.view).toEqual({ re: '-0.75', im: '0', span: '3.2', rotation: 0 });
    expect(s.output.file).toBe('out/x.png');
    expect([s.depth, s.samples]).toEqual([8, 9]);
  });

  it('keeps decimal strings exactly as written, trailing zeros included', () => {
    const s = parseSheet({ view: { re: '-1.76852915246768501511813499857784340001', im: '0.000', span: '1e-9' } });
    expect(s.view.re).toBe('-1.76852915246768501511813499857784340001');
    expect(s.view.im).toBe('0.000');
  });

  it('computes pixels from a print size: A3 at 300 dpi is 4961 x 3508', () => {
    // ISO 216: A3 = 420 x 297 mm; 420 / 25.4 * 300 = 4960.6, 297 / 25.4 * 300 = 3507.9.
    const s = parseSheet({ print: { width_mm: 420, height_mm: 297 }, dpi: 300 });
    expect([s.width, s.height]).toEqual([4961, 3508]);
    expect(printPixels(25.4, 300)).toBe(300);
  });

  it('names the field, the expectation and the received value in each error', () => {
    expect(errorOf({ view: { re: -0.75 } })).toBe('Expected a decimal number written as a string (e.g. "-0.75") for view.re but received -0.75');
    expect(errorOf({ view: { span: '0' } })).toMatch(/for view\.span but received "0"/);
    expect(errorOf({ view: { span: '-1' } })).toMatch(/for view\.span/);
    expect(errorOf({ pixels: { width: 0, height: 10 } })).toMatch(/for pixels\.width but received 0/);
    expect(errorOf({ iterations: 2 ** 31 })).toMatch(/for iterations but received 2147483648/);
    expect(errorOf({ samples: 5 })).toMatch(/square number .* for samples but received 5/);
    expect(errorOf({ depth: 12 })).toMatch(/Expected 8 or 16 for depth but received 12/);
    expect(errorOf({ colours: {} })).toMatch(/for colours but received an unknown field "colours"/);
    expect(errorOf({ view: { zoom: 3 } })).toMatch(/for view\.zoom/);
    expect(errorOf({ output: { file: 'x.jpg' } })).toMatch(/for output\.file but received "x\.jpg"/);
    expect(errorOf([])).toMatch(/for sheet/);
  });
});
