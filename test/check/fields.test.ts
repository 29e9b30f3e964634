// The shared field parsers (src/check/fields.ts). The accepted forms are
// those of JSON numbers and decimal literals (ECMA-404 number grammar without
// the JSON restriction on leading zeros); the messages follow the one-line
// form of docs/architecture.md (field, what was expected, what was received).
import { describe, expect, it } from 'vitest';
import { ConvergenceError, isDecimalText, optionalInteger, parseDecimalText, parseInteger, parseSize } from '../../src/check/fields.js';
import { UserError } from '../../src/check/user-error.js';

describe('parseInteger', () => {
  it('reads flags as text and sheets as numbers, in range', () => {
    expect(parseInteger('12', '--levels', 2, 22)).toBe(12);
    expect(parseInteger(' 7 ', '--levels', 2, 22)).toBe(7);
    expect(parseInteger(12, 'iterations', 1, 100, 'number')).toBe(12);
    expect(() => parseInteger('40', '--levels', 2, 22)).toThrow('Expected an integer between 2 and 22 for --levels but received "40"');
    expect(() => parseInteger('1.5', '--levels', 2, 22)).toThrow(UserError);
    expect(() => parseInteger('1e3', '--levels', 1, 5000)).toThrow(UserError);
    expect(() => parseInteger(2.5, 'samples', 1, 256, 'number')).toThrow('for samples but received 2.5');
  });

  it('refuses text where a sheet wants a JSON number', () => {
    expect(() => parseInteger('3000', 'iterations', 1, 1e6, 'number')).toThrow('Expected an integer between 1 and 1000000 for iterations but received "3000"');
  });

  it('an absent flag stays absent only through optionalInteger', () => {
    expect(optionalInteger(undefined, '--workers', 1, 256)).toBeUndefined();
    expect(optionalInteger('3', '--workers', 1, 256)).toBe(3);
    expect(() => parseInteger(undefined, '--workers', 1, 256)).toThrow('for --workers but received nothing');
    expect(() => optionalInteger('0', '--workers', 1, 256)).toThrow('between 1 and 256 for --workers');
  });
});

describe('decimal text', () => {
  it('takes the forms of a decimal literal and keeps them as written', () => {
    for (const ok of ['1', '-0.75', '+3', '.5', '5.', '3.5e-2', '1E+10', '007', ' -1.25 ']) expect(isDecimalText(ok), ok).toBe(true);
    for (const bad of ['', '.', '-', 'e5', '1e', '1.2.3', '0x10', 'NaN', 'Infinity', '1,5', '- 1']) expect(isDecimalText(bad), bad).toBe(false);
    expect(parseDecimalText(' -0.7500 ', 'view.re')).toBe('-0.7500');
    expect(() => parseDecimalText(-0.75, 'view.re')).toThrow('Expected a decimal number written as a string (e.g. "-0.75") for view.re but received -0.75');
  });
});

describe('parseSize', () => {
  it('reads WxH in pixels (integers) and in millimetres (fractions allowed)', () => {
    expect(parseSize('1600x1200', '--size')).toEqual([1600, 1200]);
    expect(parseSize(' 40 X 20 ', '--size')).toEqual([40, 20]);
    expect(parseSize('420x297mm', '--print', 'mm')).toEqual([420, 297]);
    expect(parseSize('210.5x148.5mm', '--print', 'mm')).toEqual([210.5, 148.5]);
    expect(() => parseSize('100.5x50', '--size')).toThrow('Expected a size written WxH (e.g. 1600x1200) for --size but received "100.5x50"');
    expect(() => parseSize('big', '--size')).toThrow(/for --size but received "big"/);
    expect(() => parseSize('420x297', '--print', 'mm')).toThrow(/WxHmm/);
  });
});

describe('ConvergenceError', () => {
  it('is told apart by its class, not by a name string', () => {
    const e = new ConvergenceError('no window end found for period 7');
    expect(e).toBeInstanceOf(ConvergenceError);
    expect(e).not.toBeInstanceOf(UserError);
    const impostor = new Error('x');
    impostor.name = 'ConvergenceError';
    expect(impostor).not.toBeInstanceOf(ConvergenceError);
  });
});
