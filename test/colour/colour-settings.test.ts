import { describe, expect, it } from 'vitest';
import { DEFAULT_COLOUR_SETTINGS, parseColourSettings } from '../../src/colour/colour-settings.js';
import { UserError } from '../../src/check/user-error.js';

function errorOf(fn: () => unknown): UserError {
  try {
    fn();
  } catch (e) {
    if (e instanceof UserError) return e;
    throw e;
  }
  throw new Error('expected a UserError');
}

describe('parseColourSettings', () => {
  it('parseColourSettings({}) and parseColourSettings(undefined) give the defaults', () => {
    expect(parseColourSettings({})).toEqual(DEFAULT_COLOUR_SETTINGS);
    expect(parseColourSettings(undefined)).toEqual(DEFAULT_COLOUR_SETTINGS);
  });

  it('keeps every given field and survives a JSON round trip unchanged', () => {
    const given = {
      exterior: 'vellum',
      countScale: 'linear',
      cycle: 40,
      offset: 0.25,
      edge: 3,
      edgeColour: '#FFFFFF',
      interior: 'solid',
      interiorColour: '#102030',
      interiorEdge: 0,
      undecidedColour: '#808080',
      legend: 'inset',
      legendCorner: 'top-left',
      legendPeriods: 20,
    };
    const s = parseColourSettings(given);
    expect(s).toEqual({ ...given, edgeColour: '#ffffff' });
    expect(parseColourSettings(JSON.parse(JSON.stringify(s)))).toEqual(s);
  });

  it('names colour.edge with the expected range and the received value', () => {
    const e = errorOf(() => parseColourSettings({ edge: -1 }));
    expect(e.field).toBe('colour.edge');
    expect(e.message).toBe('Expected a number in [0, 1000] for colour.edge but received -1');
  });

  it('names the field under a caller-given prefix (sheet.colour.cycle)', () => {
    const e = errorOf(() => parseColourSettings({ cycle: 0 }, 'sheet.colour'));
    expect(e.message).toBe('Expected a number in (0, 1000000] for sheet.colour.cycle but received 0');
  });

  it('rejects an unknown key, naming it', () => {
    const e = errorOf(() => parseColourSettings({ palette: 'x' }));
    expect(e.field).toBe('colour.palette');
    expect(e.message).toMatch(/^Expected no such key \(known: exterior, .*\) for colour\.palette but received "x"$/);
  });

  it('rejects a bad gradient name, listing the names', () => {
    const e = errorOf(() => parseColourSettings({ exterior: 'rainbow' }));
    expect(e.message).toBe('Expected one of "tidepool", "heather", "brass", "vellum" for colour.exterior but received "rainbow"');
  });

  it('rejects malformed colours, offsets, styles and legend settings, each by its own field', () => {
    const cases: Array<[Record<string, unknown>, string]> = [
      [{ edgeColour: 'black' }, 'colour.edgeColour'],
      [{ undecidedColour: '#12345' }, 'colour.undecidedColour'],
      [{ interiorColour: 7 }, 'colour.interiorColour'],
      [{ offset: 1 }, 'colour.offset'],
      [{ cycle: Number.NaN }, 'colour.cycle'],
      [{ countScale: 'sqrt' }, 'colour.countScale'],
      [{ interior: 'flat' }, 'colour.interior'],
      [{ interiorEdge: '2' }, 'colour.interiorEdge'],
      [{ legend: 'below' }, 'colour.legend'],
      [{ legendCorner: 'centre' }, 'colour.legendCorner'],
      [{ legendPeriods: 65 }, 'colour.legendPeriods'],
      [{ legendPeriods: 2.5 }, 'colour.legendPeriods'],
    ];
    for (const [input, field] of cases) expect(errorOf(() => parseColourSettings(input)).field).toBe(field);
  });

  it('rejects a non-object block, naming the block', () => {
    for (const bad of [null, [], 'tidepool', 3]) {
      const e = errorOf(() => parseColourSettings(bad));
      expect(e.field).toBe('colour');
      expect(e.message.startsWith('Expected an object of colour settings for colour but received')).toBe(true);
    }
  });
});
