import { describe, expect, it } from 'vitest';
import { UserError } from '../../src/check/user-error.js';
import { compareRecord, parseCompareSheet } from '../../src/section/compare-sheet.js';
import { diagramRecord, parseDiagramSheet } from '../../src/section/diagram-sheet.js';
import { lyapunovRecord, parseLyapunovSheet } from '../../src/section/lyapunov-sheet.js';

describe('section sheets', () => {
  it('parseDiagramSheet fills the defaults, and its record parses back to the same record', () => {
    const sheet = parseDiagramSheet({ kind: 'section-diagram', schema: 1, pixels: { width: 300, height: 200 } });
    expect(sheet.r).toEqual({ from: '2.8', to: '4' });
    expect(sheet.x).toEqual({ from: '0', to: '1' });
    expect(sheet.iterations).toBe(1000);
    expect(sheet.output).toEqual({ file: 'out/logistic-diagram.png', sidecar: true });
    const record = diagramRecord(sheet);
    expect(record).not.toHaveProperty('output');
    expect(diagramRecord(parseDiagramSheet(JSON.parse(JSON.stringify(record)) as Record<string, unknown>))).toEqual(record);
  });

  it('parseDiagramSheet names the field in a one-line error, or the flag that set it', () => {
    expect(() => parseDiagramSheet({ kind: 'section-diagram', schema: 1, r: { from: '3.9', to: '3.1' } })).toThrow(
      'Expected a value above r.from (3.9) for r.to but received "3.1"',
    );
    expect(() => parseDiagramSheet({ kind: 'section-diagram', schema: 1, r: { from: '3.9', to: '3.1' } }, { 'r.to': '--r-to', 'r.from': '--r-from' })).toThrow(
      'Expected a value above --r-from (3.9) for --r-to but received "3.1"',
    );
    expect(() => parseDiagramSheet({ kind: 'section-diagram', schema: 1, samples: 0 }, { samples: '--samples' })).toThrow('for --samples but received 0');
    expect(() => parseDiagramSheet({ kind: 'section-diagram', schema: 1, r: { from: 2.8 } })).toThrow(
      'Expected a decimal number written as a string (e.g. "2.8") for r.from but received 2.8',
    );
    expect(() => parseDiagramSheet({ kind: 'section-diagram', schema: 1, colour: {} })).toThrow(UserError);
    expect(() => parseDiagramSheet({ kind: 'section-diagram', schema: 1, depth: 12 })).toThrow('Expected one of 8, 16 for depth but received 12');
    expect(() => parseDiagramSheet({ kind: 'section-diagram', schema: 1, family: 'sine', r: { from: '2' } })).toThrow(
      'Expected an r of the sine family between 0 and 1 for r.from',
    );
  });

  it('parseLyapunovSheet writes no file unless one is named, and checks the extension', () => {
    const sheet = parseLyapunovSheet({ kind: 'section-lyapunov', schema: 1, family: 'sine' });
    expect(sheet.r).toEqual({ from: '0.7', to: '1' });
    expect(sheet.output.file).toBeNull();
    expect(lyapunovRecord(sheet)).toEqual({
      kind: 'section-lyapunov',
      schema: 1,
      family: 'sine',
      r: { from: '0.7', to: '1' },
      steps: 1000,
      transient: 1000,
      iterations: 10000,
      starts: 3,
    });
    expect(() => parseLyapunovSheet({ kind: 'section-lyapunov', schema: 1, output: { file: 'a.jpg' } }, { 'output.file': '--out' })).toThrow(
      'Expected a file name ending in .svg or .png for --out',
    );
  });

  it('parseCompareSheet keeps c on the real slice of the set, -2 to 1/4', () => {
    const sheet = parseCompareSheet({ kind: 'section-compare', schema: 1 });
    expect(compareRecord(sheet)).toMatchObject({ c: { from: '-2', to: '-0.7' }, x: { from: '0', to: '1' }, pixels: { width: 2400, height: 1500 }, iterations: 2000, maxPeriod: 5 });
    expect(() => parseCompareSheet({ kind: 'section-compare', schema: 1, c: { to: '0.3' } }, { 'c.to': '--c-to' })).toThrow(
      'Expected a c on the real slice of the set between -2 and 0.25 for --c-to but received "0.3"',
    );
    expect(() => parseCompareSheet({ kind: 'section-compare', schema: 1, pixels: { width: 50, height: 500 } }, { pixels: '--size' })).toThrow('for --size but received 50x500');
  });
});
