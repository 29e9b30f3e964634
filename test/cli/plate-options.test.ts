import { describe, expect, it } from 'vitest';
import { applyPlateOptions, attributeName } from '../../src/cli/plate-options.js';
import { UserError } from '../../src/check/user-error.js';

describe('applyPlateOptions', () => {
  it('overrides sheet fields from flags, keeping decimals as strings', () => {
    const sheet: Record<string, unknown> = { view: { re: '0', im: '0', span: '3' }, pixels: { width: 10, height: 10 } };
    applyPlateOptions(sheet, { center: '-1.25,0.0000000000000000000001', span: '1e-5', print: '420x297mm', iterations: '5000' });
    expect(sheet['view']).toEqual({ re: '-1.25', im: '0.0000000000000000000001', span: '1e-5' });
    expect(sheet['print']).toEqual({ width_mm: 420, height_mm: 297 });
    expect(sheet['pixels']).toBeUndefined();
    expect(sheet['iterations']).toBe(5000);
  });

  it('rejects a centre that is not two numbers with a one-line error naming --center', () => {
    expect(() => applyPlateOptions({}, { center: '1' })).toThrow(UserError);
    expect(() => applyPlateOptions({}, { center: '1' })).toThrow(/for --center but received "1"/);
  });

  it('passes a non-integer iteration count through for the sheet check to reject', () => {
    const s = applyPlateOptions({}, { iterations: 'many' });
    expect(s['iterations']).toBe('many');
  });
});

describe('attributeName', () => {
  it('matches commander attribute names', () => {
    expect(attributeName('--no-sidecar')).toBe('sidecar');
    expect(attributeName('--span <width>')).toBe('span');
  });
});
