/** `quadatlas section entropy` end to end (docs/methods.md E10). */
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';

describe('section entropy', () => {
  it('section entropy --r-from 3.5 --r-to 4 --csv ends at log 2 and starts at 0', () => {
    const r = runCli(['section', 'entropy', '--r-from', '3.5', '--r-to', '4', '--steps', '3', '--digits', '12', '--csv']);
    expect(r.status).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toBe('r,entropy,kneading,entropy_below,symbols');
    expect(lines[1]).toMatch(/^3\.5,0\.000000000000,/);
    // log 2 = 0.693147180560 (12 places)
    expect(lines[3]).toMatch(/^4,0\.693147180560,/);
  });

  it('section entropy --out FILE.svg writes the plot with its parameters', () => {
    const file = path.join(tempDir(), 'entropy.svg');
    const r = runCli(['section', 'entropy', '--steps', '20', '--out', file]);
    expect(r.status).toBe(0);
    const svg = readFileSync(file, 'utf8');
    expect(svg).toContain('<svg');
    expect(svg).toContain('section-entropy');
  });

  for (const [args, field] of [
    [['--r-to', '4.5'], '--r-to'],
    [['--r-from', 'x'], '--r-from'],
    [['--steps', '0'], '--steps'],
    [['--out', 'a.png'], '--out'],
  ] as const) {
    it(`section entropy ${args.join(' ')} exits 2 with one line naming ${field}`, () => {
      const r = runCli(['section', 'entropy', ...args]);
      expect(r.status).toBe(2);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toContain(`for ${field} but received`);
    });
  }
});
