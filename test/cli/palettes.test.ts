import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { INTERIOR_STYLES } from '../../src/colour/colour-settings.js';
import { EXTERIOR_GRADIENT_NAMES } from '../../src/colour/exterior-gradients.js';
import { periodHex } from '../../src/colour/period-palette.js';
import { runCli, tempDir } from '../helpers/run-cli.js';

const hexOf = (png: PNG, x: number, y: number): string => {
  const k = 4 * (y * png.width + x);
  return `#${[0, 1, 2].map((i) => png.data[k + i]!.toString(16).padStart(2, '0')).join('')}`;
};

describe('quadatlas palettes', () => {
  it('names every exterior gradient and interior style, and lists the period colours', () => {
    const r = runCli(['palettes']);
    expect(r.status, r.stderr).toBe(0);
    for (const name of [...EXTERIOR_GRADIENT_NAMES, ...INTERIOR_STYLES]) expect(r.stdout).toMatch(new RegExp(`^  ${name} `, 'm'));
    for (let p = 1; p <= 24; p++) expect(r.stdout).toContain(`${String(p).padStart(2)} ${periodHex(p)}`);
    // NO_COLOR is set by runCli and stdout is a pipe: no escape sequences.
    expect(r.stdout).not.toContain('\x1b');
  });

  it('--out-dir writes one opaque swatch PNG per gradient and style and a period swatch holding each period colour', () => {
    const dir = tempDir();
    const stops = path.join(dir, 'stops.json');
    writeFileSync(
      stops,
      JSON.stringify([
        { at: 0, colour: '#123456' },
        { at: 0.5, colour: '#fedcba' },
      ]),
    );
    const out = path.join(dir, 'swatches');
    const r = runCli(['palettes', '--out-dir', out, '--gradient', stops, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const listing = JSON.parse(r.stdout) as { exterior: { name: string; default: boolean }[]; interior: { name: string }[]; gradient: unknown; files: string[] };
    expect(listing.exterior.map((g) => g.name)).toEqual(EXTERIOR_GRADIENT_NAMES);
    expect(listing.exterior.filter((g) => g.default).map((g) => g.name)).toEqual(['tidepool']);
    expect(listing.interior.map((s) => s.name)).toEqual(INTERIOR_STYLES);
    expect(listing.gradient).toEqual([
      { at: 0, colour: '#123456' },
      { at: 0.5, colour: '#fedcba' },
    ]);
    const want = [
      ...EXTERIOR_GRADIENT_NAMES.map((n) => `gradient-${n}.png`),
      'gradient-custom.png',
      ...INTERIOR_STYLES.map((s) => `interior-${s}.png`),
      'period-palette.png',
    ].sort();
    expect(readdirSync(out).sort()).toEqual(want);
    expect(listing.files.map((f) => path.basename(f)).sort()).toEqual(want);
    for (const f of want) {
      const png = PNG.sync.read(readFileSync(path.join(out, f)));
      for (let k = 3; k < png.data.length; k += 4) expect(png.data[k]).toBe(255);
    }
    // The custom gradient passes through its stops: at t = 0 (x = 0, t = 1/1024) and t = 0.5 (x = 256) within one 8-bit step.
    const custom = PNG.sync.read(readFileSync(path.join(out, 'gradient-custom.png')));
    const near = (a: string, b: string): boolean => [1, 3, 5].every((i) => Math.abs(parseInt(a.slice(i, i + 2), 16) - parseInt(b.slice(i, i + 2), 16)) <= 2);
    expect(near(hexOf(custom, 0, 0), '#123456')).toBe(true);
    expect(near(hexOf(custom, 256, 10), '#fedcba')).toBe(true);
    // Every period colour 1..24 appears in the period swatch.
    const periods = PNG.sync.read(readFileSync(path.join(out, 'period-palette.png')));
    const seen = new Set<string>();
    for (let y = 0; y < periods.height; y++) for (let x = 0; x < periods.width; x++) seen.add(hexOf(periods, x, y));
    for (let p = 1; p <= 24; p++) expect(seen.has(periodHex(p)), `period ${p}`).toBe(true);
  });

  it('refuses an unreadable stop file in one line (exit 2)', () => {
    const r = runCli(['palettes', '--gradient', '/nonexistent/stops.csv']);
    expect(r.status).toBe(2);
    expect(r.stderr).toBe('quadatlas: Expected a readable file of colour stops (JSON or CSV) for --gradient but received /nonexistent/stops.csv (ENOENT)\n');
  });
});
