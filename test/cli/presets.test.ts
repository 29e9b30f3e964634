import { readdirSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT, runCli, tempDir } from '../helpers/run-cli.js';

describe('quadatlas presets', () => {
  it('lists every sheet in presets/ with its size and marks the startup ones', () => {
    const r = runCli(['presets', 'list', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const rows = JSON.parse(r.stdout) as Array<{ name: string; startup: boolean; width: number }>;
    const files = readdirSync(path.join(ROOT, 'presets')).filter((f) => f.endsWith('.json'));
    expect(rows.map((x) => `${x.name}.json`).sort()).toEqual(files.sort());
    expect(rows.some((x) => x.startup)).toBe(true);
    // A3 landscape at 300 dpi: 420 mm / 25.4 * 300 = 4961 pixels (ISO 216).
    expect(rows.find((x) => x.name === 'edges-poster-a3')?.width).toBe(4961);
  });

  it('shows a preset with every default filled in', () => {
    const r = runCli(['presets', 'show', 'edges-whole']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout) as { view: { span: string }; colour: { edge: number } };
    expect(s.view.span).toBe('3.3');
    expect(typeof s.colour.edge).toBe('number');
  });

  it('checks all presets clean, and reports a bad sheet by field with exit code 2', () => {
    expect(runCli(['presets', 'check']).status).toBe(0);
    const dir = tempDir();
    const bad = path.join(dir, 'bad.json');
    writeFileSync(bad, JSON.stringify({ view: { re: '-0.5', im: '0', span: 'wide' } }));
    const r = runCli(['presets', 'check', bad]);
    expect(r.status).toBe(2);
    expect(r.stdout).toMatch(/error .*bad\.json: Expected a decimal number written as a string .* for view\.span but received "wide"/);
  });

  it('refuses an unknown preset name with one line and exit code 2', () => {
    const r = runCli(['presets', 'show', 'no-such-sheet']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/for preset but received "no-such-sheet"/);
  });
});
