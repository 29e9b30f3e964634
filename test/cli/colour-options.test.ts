import { readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { COLOUR_OPTIONS } from '../../src/cli/colour-options.js';
import { applyPlateOptions, attributeName, PLATE_OPTIONS } from '../../src/cli/plate-options.js';
import { UserError } from '../../src/check/user-error.js';
import { DEFAULT_COLOUR_SETTINGS, parseColourSettings } from '../../src/colour/colour-settings.js';
import { layoutLegend, LEGEND_MIN_PIXELS, presentPeriods } from '../../src/colour/legend.js';
import { figureFont } from '../../src/figure/figure-font.js';

const font = figureFont();
import { runCli, tempDir } from '../helpers/run-cli.js';

const flagOf = (spec: { flags: string }): string => spec.flags.split(' ')[0]!;

function message(fn: () => unknown): string {
  try {
    fn();
  } catch (e) {
    if (e instanceof UserError) return e.message;
    throw e;
  }
  throw new Error('expected a UserError');
}

describe('colour flags (COLOUR_OPTIONS)', () => {
  it('has one kebab-case flag per colour field of the sheet, and all of them are plate options', () => {
    const fields = [...Object.keys(DEFAULT_COLOUR_SETTINGS), 'gradient'].sort();
    const flags = COLOUR_OPTIONS.map(flagOf);
    // One flag says more than its field: --gradient-cycle sets colour.cycle (julia's --cycle marks the attracting cycle);
    // its errors name both (below).
    const alias: Record<string, string> = { gradientCycle: 'cycle' };
    const fieldOf = (f: string): string => {
      const key = f.slice(2).replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
      return alias[key] ?? key;
    };
    expect(flags.map(fieldOf).sort()).toEqual(fields);
    for (const f of fields) expect(flags.map(fieldOf)).toContain(f);
    const plate = PLATE_OPTIONS.map(flagOf);
    for (const f of flags) expect(plate.filter((p) => p === f)).toHaveLength(1);
  });

  it('every colour help line states its default', () => {
    for (const spec of COLOUR_OPTIONS) expect(spec.description, spec.flags).toMatch(/default/);
    expect(COLOUR_OPTIONS.find((s) => s.flags.startsWith('--legend-periods'))!.description).toContain(`at least ${LEGEND_MIN_PIXELS} interior pixels`);
  });

  it('sets the sheet fields, which then pass the sheet check unchanged', () => {
    const values = {
      exterior: 'brass',
      countScale: 'linear',
      gradientCycle: '40',
      offset: '0.25',
      edge: '3',
      edgeColour: '#FFFFFF',
      interior: 'solid',
      interiorColour: '#102030',
      interiorEdge: '0',
      undecidedColour: '#808080',
      legend: 'inset',
      legendCorner: 'top-left',
      legendPeriods: '20',
    };
    const sheet = applyPlateOptions({}, values);
    const want = {
      exterior: 'brass',
      countScale: 'linear',
      cycle: 40,
      offset: 0.25,
      edge: 3,
      edgeColour: '#ffffff',
      interior: 'solid',
      interiorColour: '#102030',
      interiorEdge: 0,
      undecidedColour: '#808080',
      legend: 'inset',
      legendCorner: 'top-left',
      legendPeriods: 20,
    };
    expect(parseColourSettings(sheet['colour'])).toEqual(want);
    // Every key of `values` is a flag's attribute name, so the table was exercised whole.
    expect(Object.keys(values).sort()).toEqual(
      COLOUR_OPTIONS.map((s) => attributeName(s.flags))
        .filter((k) => k !== 'gradient')
        .sort(),
    );
  });

  it('an error for a flag names the flag and the sheet field it sets', () => {
    expect(message(() => applyPlateOptions({}, { edge: '-1' }))).toBe('Expected a number in [0, 1000] for --edge (colour.edge) but received -1');
    expect(message(() => applyPlateOptions({}, { edge: 'wide' }))).toBe('Expected a number in [0, 1000] for --edge (colour.edge) but received "wide"');
    expect(message(() => applyPlateOptions({}, { legendCorner: 'middle' }))).toMatch(
      /^Expected one of "top-left", .* for --legend-corner \(colour\.legendCorner\) but received "middle"$/,
    );
    expect(message(() => applyPlateOptions({}, { edgeColour: 'black' }))).toBe('Expected a colour "#rrggbb" (sRGB hex) for --edge-colour (colour.edgeColour) but received "black"');
    expect(message(() => applyPlateOptions({}, { legendPeriods: '2.5' }))).toBe(
      'Expected an integer between 1 and 64 for --legend-periods (colour.legendPeriods) but received 2.5',
    );
    expect(message(() => applyPlateOptions({}, { gradient: '/nonexistent/stops.csv' }))).toBe(
      'Expected a readable file of colour stops (JSON or CSV) for --gradient (colour.gradient) but received /nonexistent/stops.csv (ENOENT)',
    );
  });

  it('--gradient copies the stops into the sheet; --exterior drops a gradient the sheet carried; both together are refused', () => {
    const dir = tempDir();
    const file = path.join(dir, 'stops.csv');
    writeFileSync(file, '0,#000000\n1,#ffffff\n');
    const s = applyPlateOptions({}, { gradient: file });
    expect(s['colour']).toEqual({
      gradient: [
        { at: 0, colour: '#000000' },
        { at: 1, colour: '#ffffff' },
      ],
    });
    expect(JSON.stringify(s)).not.toContain('stops.csv');
    const t = applyPlateOptions(
      {
        colour: {
          gradient: [
            { at: 0, colour: '#000000' },
            { at: 1, colour: '#ffffff' },
          ],
        },
      },
      { exterior: 'heather' },
    );
    expect(t['colour']).toEqual({ exterior: 'heather' });
    expect(message(() => applyPlateOptions({}, { exterior: 'heather', gradient: file }))).toBe(
      `Expected either --exterior or --gradient, not both for --gradient but received ${JSON.stringify(file)}`,
    );
  });
});

const SMALL = ['--center', '-0.75,0.05', '--span', '2.6', '--size', '150x100', '--iterations', '400', '--samples', '4'];

describe('quadatlas plate with colour flags', () => {
  it('renders a custom gradient from a CSV file, and --again renders the same bytes after the file is gone', () => {
    const dir = tempDir();
    const stops = path.join(dir, 'stops.csv');
    writeFileSync(stops, 'at,colour\n0,#201040\n0.5,#f0c060\n');
    const a = path.join(dir, 'a.png');
    const r = runCli(['plate', ...SMALL, '--gradient', stops, '--edge', '0', '--out', a]);
    expect(r.status, r.stderr).toBe(0);
    const plain = path.join(dir, 'plain.png');
    expect(runCli(['plate', ...SMALL, '--edge', '0', '--out', plain]).status).toBe(0);
    expect(readFileSync(a).equals(readFileSync(plain))).toBe(false);
    const sidecar = JSON.parse(readFileSync(`${a}.json`, 'utf8')) as { metadata: { sheet: { colour: { gradient: unknown } } } };
    expect(sidecar.metadata.sheet.colour.gradient).toEqual([
      { at: 0, colour: '#201040' },
      { at: 0.5, colour: '#f0c060' },
    ]);
    rmSync(stops);
    const b = path.join(dir, 'b.png');
    const again = runCli(['plate', '--again', a, '--out', b]);
    expect(again.status, again.stderr).toBe(0);
    expect(readFileSync(b).equals(readFileSync(a))).toBe(true);
  });

  it('a bad stop file fails before rendering with one line naming the file, row and field (exit 2)', () => {
    const dir = tempDir();
    const stops = path.join(dir, 'bad.csv');
    writeFileSync(stops, '0,#201040\n0.5,#f0c06\n');
    const r = runCli(['plate', ...SMALL, '--gradient', stops, '--out', path.join(dir, 'x.png')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe(`quadatlas: Expected an sRGB colour "#rrggbb" for --gradient (${stops}, row 2, colour) but received "#f0c06"\n`);
  });

  it('a bad colour flag fails with one line naming the flag and the field (exit 2)', () => {
    const r = runCli(['plate', ...SMALL, '--gradient-cycle', '0', '--out', path.join(tempDir(), 'x.png')]);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe('quadatlas: Expected a number in (0, 1000000] for --gradient-cycle (colour.cycle) but received 0\n');
  });
});

/** Pixels of a decoded 8-bit PNG that differ between two renders, as a bounding box. */
function diffBox(a: Buffer, b: Buffer): { x0: number; y0: number; x1: number; y1: number } | null {
  const pa = PNG.sync.read(a);
  const pb = PNG.sync.read(b);
  let box: { x0: number; y0: number; x1: number; y1: number } | null = null;
  for (let y = 0; y < pa.height; y++)
    for (let x = 0; x < pa.width; x++) {
      const k = 4 * (y * pa.width + x);
      if (pa.data[k] !== pb.data[k] || pa.data[k + 1] !== pb.data[k + 1] || pa.data[k + 2] !== pb.data[k + 2]) {
        box =
          box === null ? { x0: x, y0: y, x1: x + 1, y1: y + 1 } : { x0: Math.min(box.x0, x), y0: Math.min(box.y0, y), x1: Math.max(box.x1, x + 1), y1: Math.max(box.y1, y + 1) };
      }
    }
  return box;
}

describe('the legend lists the periods present in the view', () => {
  // The northern period-3 bulb: periods 1 and 2 are out of view; 3, 6, 9, ... are in it.
  const BULB = ['--center', '-0.11,0.82', '--span', '0.42', '--size', '240x180', '--iterations', '1500', '--samples', '1', '--dpi', '150', '--legend-periods', '6'];

  for (const corner of ['top-right', 'bottom-left']) {
    it(`inset at ${corner}: the same bytes for 1 and 2 workers and tiles of 16 and 64, and the legend covers exactly the layout of presentPeriods(histogram)`, () => {
      const dir = tempDir();
      const files = [
        ['--workers', '1', '--tile-size', '64'],
        ['--workers', '2', '--tile-size', '16'],
      ].map((extra, i) => {
        const f = path.join(dir, `l${i}.png`);
        const r = runCli(['plate', ...BULB, '--legend', 'inset', '--legend-corner', corner, '--out', f, ...extra]);
        expect(r.status, r.stderr).toBe(0);
        return f;
      });
      expect(readFileSync(files[1]!).equals(readFileSync(files[0]!))).toBe(true);

      const none = path.join(dir, 'none.png');
      const r = runCli(['plate', ...BULB, '--legend', 'none', '--out', none, '--json']);
      expect(r.status, r.stderr).toBe(0);
      const summary = JSON.parse(r.stdout) as { periods: Record<string, number> };
      const settings = parseColourSettings({ legend: 'inset', legendCorner: corner, legendPeriods: 6 });
      const listed = presentPeriods(summary.periods, settings);
      expect(listed).not.toContain(1);
      expect(listed).toContain(3);
      for (const p of listed) expect(summary.periods[p]!).toBeGreaterThanOrEqual(LEGEND_MIN_PIXELS);
      const L = layoutLegend(settings, 240, 180, 150, listed, font)!;
      // The legend panel is translucent over the plate, so every pixel of its rectangle changes and none outside it.
      expect(diffBox(readFileSync(files[0]!), readFileSync(none))).toEqual({ x0: L.x, y0: L.y, x1: L.x + L.width, y1: L.y + L.height });
    });
  }

  it('beside: the SVG lists the present periods, not 1..N', () => {
    const dir = tempDir();
    const f = path.join(dir, 'b.png');
    const r = runCli(['plate', ...BULB, '--legend', 'beside', '--out', f, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const summary = JSON.parse(r.stdout) as { periods: Record<string, number> };
    const svg = readFileSync(path.join(dir, 'b-legend.svg'), 'utf8');
    const ids = [...svg.matchAll(/id="period-(\d+)"/g)].map((m) => Number(m[1]));
    expect(ids).toEqual(presentPeriods(summary.periods, { legendPeriods: 6 }));
    expect(ids).not.toContain(1);
  });
});
