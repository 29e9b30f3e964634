import { describe, expect, it } from 'vitest';
import { parseColourSettings } from '../../src/colour/colour-settings.js';
import { EXTERIOR_GRADIENTS, gradientOklab } from '../../src/colour/exterior-gradients.js';
import { customGradientOklab, gradientStopsFromText, parseGradientStops, prepareGradient } from '../../src/colour/gradient-stops.js';
import { hexToLinear, linearToOklab, oklabDistance, oklchToOklab } from '../../src/colour/oklab.js';
import { shadeSamples } from '../../src/colour/shade-samples.js';
import { createSampleSet } from '../../src/plane/sample-set.js';
import { UserError } from '../../src/check/user-error.js';

function message(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    if (e instanceof UserError) return e.message;
    throw e;
  }
  throw new Error('expected a UserError');
}

const labOfHex = (hex: string): number[] => {
  const c = hexToLinear(hex, [0, 0, 0]) as number[];
  return linearToOklab(c[0]!, c[1]!, c[2]!, [0, 0, 0]) as number[];
};

describe('gradientStopsFromText', () => {
  it('reads CSV with a header, blank lines and comments, and JSON, to the same stops (colours normalised to #rrggbb lower case)', () => {
    const csv = 'at,colour\n# a comment\n0,#102030\n\n0.5, A0B0C0\n1,#ffffff\n';
    const json = '[{"at": 0, "colour": "#102030"}, {"at": 0.5, "colour": "#a0b0c0"}, {"at": 1, "colour": "#FFFFFF"}]';
    const want = [
      { at: 0, colour: '#102030' },
      { at: 0.5, colour: '#a0b0c0' },
      { at: 1, colour: '#ffffff' },
    ];
    expect(gradientStopsFromText(csv, 'stops.csv')).toEqual(want);
    expect(gradientStopsFromText(json, 'stops.json')).toEqual(want);
  });

  it('names the file, the row and the field in a one-line error', () => {
    expect(message(() => gradientStopsFromText('0,#000000\n1.5,#ffffff\n', 's.csv'))).toBe('Expected a position in [0, 1] for --gradient (s.csv, row 2, at) but received 1.5');
    expect(message(() => gradientStopsFromText('0,#000000\nhalf,#ffffff\n', 's.csv'))).toBe('Expected a position in [0, 1] for --gradient (s.csv, row 2, at) but received "half"');
    expect(message(() => gradientStopsFromText('0,#000000\n1,white\n', 's.csv'))).toBe(
      'Expected an sRGB colour "#rrggbb" for --gradient (s.csv, row 2, colour) but received "white"',
    );
    expect(message(() => gradientStopsFromText('0,#000000\n0.5\n', 's.csv'))).toBe(
      'Expected two fields: at,colour (e.g. 0.5,#3a6ea5) for --gradient (s.csv, row 2) but received "0.5"',
    );
    expect(message(() => gradientStopsFromText('0.6,#000000\n0.5,#ffffff\n', 's.csv'))).toBe(
      "Expected a position at or after the previous stop's 0.6 for --gradient (s.csv, row 2, at) but received 0.5",
    );
    expect(message(() => gradientStopsFromText('0,#000000\n', 's.csv'))).toBe('Expected between 2 and 256 colour stops for --gradient (s.csv) but received 1 stops');
    expect(message(() => gradientStopsFromText('[{"at": 0, "colour": "#000000"}, {"at": 1, "color": "#ffffff"}]', 's.json'))).toBe(
      'Expected no such key (known: at, colour) for --gradient (s.json, entry 1, color) but received "#ffffff"',
    );
    expect(message(() => gradientStopsFromText('[{"at": 0', 's.json'))).toMatch(/^Expected a JSON array of colour stops for --gradient \(s\.json\) but received invalid JSON/);
    for (const text of ['0,#000000\n2,#fff\n', '[1, 2]']) expect(message(() => gradientStopsFromText(text, 'x.csv'))).not.toContain('\n');
  });
});

describe('parseGradientStops (colour.gradient in a sheet)', () => {
  it('is optional: absent stays absent, present is checked and kept', () => {
    expect('gradient' in parseColourSettings({})).toBe(false);
    const s = parseColourSettings({
      gradient: [
        { at: 0, colour: '#000000' },
        { at: 1, colour: '#FFFFFF' },
      ],
    });
    expect(s.gradient).toEqual([
      { at: 0, colour: '#000000' },
      { at: 1, colour: '#ffffff' },
    ]);
    expect(parseColourSettings(JSON.parse(JSON.stringify(s)))).toEqual(s);
  });
  it('names the sheet field of a bad stop', () => {
    expect(
      message(() =>
        parseColourSettings({
          gradient: [
            { at: 0, colour: '#000000' },
            { at: 1, colour: 'red' },
          ],
        }),
      ),
    ).toBe('Expected an sRGB colour "#rrggbb" for colour.gradient[1].colour but received "red"');
    expect(message(() => parseGradientStops('stops.csv', 'colour.gradient'))).toMatch(/^Expected an array of colour stops/);
  });
});

describe('customGradientOklab', () => {
  it('passes through each stop colour exactly at its position (OKLab of the sRGB hex, 1e-12)', () => {
    const stops = [
      { at: 0.1, colour: '#203040' },
      { at: 0.35, colour: '#c08040' },
      { at: 0.8, colour: '#40a0c0' },
    ];
    const g = prepareGradient(stops);
    for (const s of stops) expect(oklabDistance(customGradientOklab(g, s.at, [0, 0, 0]) as number[], labOfHex(s.colour))).toBeLessThan(1e-12);
  });

  it('interpolates linearly in OKLab between stops and across the wrap from the last stop to the first', () => {
    const g = prepareGradient([
      { at: 0.2, colour: '#000000' },
      { at: 0.6, colour: '#ffffff' },
    ]);
    const black = labOfHex('#000000');
    const white = labOfHex('#ffffff');
    const mix = (f: number): number[] => black.map((b, i) => b + (white[i]! - b) * f);
    expect(oklabDistance(customGradientOklab(g, 0.4, [0, 0, 0]) as number[], mix(0.5))).toBeLessThan(1e-12);
    // Wrap segment: white at 0.6 to black at 1.2 (= 0.2 of the next cycle), length 0.6.
    expect(oklabDistance(customGradientOklab(g, 0.9, [0, 0, 0]) as number[], mix(0.5))).toBeLessThan(1e-12);
    expect(oklabDistance(customGradientOklab(g, 0.05, [0, 0, 0]) as number[], mix(0.25))).toBeLessThan(1e-12);
  });

  it('two stops at one position make a hard step: the later one takes over there', () => {
    const g = prepareGradient([
      { at: 0, colour: '#000000' },
      { at: 0.5, colour: '#000000' },
      { at: 0.5, colour: '#ffffff' },
      { at: 1, colour: '#ffffff' },
    ]);
    expect(oklabDistance(customGradientOklab(g, 0.5 - 1e-9, [0, 0, 0]) as number[], labOfHex('#000000'))).toBeLessThan(1e-12);
    expect(oklabDistance(customGradientOklab(g, 0.5, [0, 0, 0]) as number[], labOfHex('#ffffff'))).toBeLessThan(1e-12);
  });

  it('agrees with a named gradient given as the same evenly spaced stops (two code paths, 1e-12 in OKLab)', () => {
    // The stops here are the named gradient's own OKLab values, not hex, so only the interpolation is compared.
    for (const name of Object.keys(EXTERIOR_GRADIENTS) as (keyof typeof EXTERIOR_GRADIENTS)[]) {
      const stops = EXTERIOR_GRADIENTS[name];
      const n = stops.length;
      const lab = new Float64Array(3 * n);
      stops.forEach(([L, C, h], i) => lab.set(oklchToOklab(L, C, h, [0, 0, 0]) as number[], 3 * i));
      const g = { at: Float64Array.from({ length: n }, (_, i) => i / n), lab };
      for (let k = 0; k < 997; k++) {
        const t = k / 997;
        expect(oklabDistance(customGradientOklab(g, t, [0, 0, 0]) as number[], gradientOklab(name, t, [0, 0, 0]) as number[])).toBeLessThan(1e-12);
      }
    }
  });

  it('shadeSamples colours escaped samples from colour.gradient when present and from the named gradient otherwise', () => {
    const s = createSampleSet(3);
    s.period.fill(0);
    s.smooth.set([0.5, 3, 40]);
    s.distance.fill(Number.NaN);
    const named = parseColourSettings({ edge: 0 });
    const custom = parseColourSettings({
      edge: 0,
      gradient: [
        { at: 0, colour: '#ff0000' },
        { at: 0.5, colour: '#ff0000' },
      ],
    });
    const a = new Float64Array(9);
    const b = new Float64Array(9);
    shadeSamples(s, 0, 3, 1, named, a);
    shadeSamples(s, 0, 3, 1, custom, b);
    // A gradient of one colour (#ff0000 at both stops) gives that colour at every mu.
    for (let i = 0; i < 3; i++) expect(Array.from(b.subarray(3 * i, 3 * i + 3)).map((v) => Math.round(v * 1e9) / 1e9)).toEqual([1, 0, 0]);
    expect(Array.from(a)).not.toEqual(Array.from(b));
  });
});
