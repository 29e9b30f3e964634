import { existsSync, readdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { convertTable, parseFamily, parseInteger, tableFormat } from '../../src/cli/section.js';
import { UserError } from '../../src/cli/user-error.js';
import { runCli, tempDir } from '../helpers/run-cli.js';

describe('section option parsing', () => {
  it('parseFamily rejects an unknown family with a UserError naming --family', () => {
    expect(parseFamily(undefined).name).toBe('logistic');
    expect(() => parseFamily('tent')).toThrow(UserError);
    expect(() => parseFamily('tent')).toThrow('Expected one of logistic, sine, quartic for --family but received "tent"');
  });

  it('parseInteger rejects levels outside its range', () => {
    expect(parseInteger('12', '--levels', 2, 22, 5)).toBe(12);
    expect(() => parseInteger('40', '--levels', 2, 22, 5)).toThrow('Expected an integer between 2 and 22 for --levels but received "40"');
    expect(() => parseInteger('1.5', '--levels', 2, 22, 5)).toThrow(UserError);
  });

  it('tableFormat refuses --json together with --csv', () => {
    expect(() => tableFormat({ json: true, csv: true })).toThrow(UserError);
  });

  it('convertTable converts r = 1 + sqrt 8 region values and states the orientation flip', () => {
    // checks.md "Conversion": r = 4 -> c = -2; x > 1/2 exactly when z < 0.
    const t = convertTable({ r: '4', x: '0.75', digits: '20' });
    expect(t.rows[0]).toEqual(['-2', '4', '0.75', '-1']);
    expect(t.summary[0]!.note).toContain('x > 1/2 exactly when z < 0');
    expect(() => convertTable({ c: '0.3' })).toThrow(UserError);
    expect(() => convertTable({})).toThrow(UserError);
  });
});

// These spawn the built CLI (npm test builds first).
describe.skipIf(!existsSync(path.resolve('dist/src/cli/main.js')))('quadatlas section (spawned)', () => {
  it('section cascade --family tent exits 2 with one line naming --family', () => {
    const r = runCli(['section', 'cascade', '--family', 'tent']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --family');
    expect(r.stdout).toBe('');
  });

  it('section cascade --levels 99 exits 2 with one line naming --levels', () => {
    const r = runCli(['section', 'cascade', '--levels', '99']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --levels');
  });

  it('section lyapunov --from 5 exits 2 with one line naming --from', () => {
    const r = runCli(['section', 'lyapunov', '--from', '5', '--to', '6']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --from');
  });

  it('section windows --family quartic exits 2: windows need a quadratic maximum', () => {
    const r = runCli(['section', 'windows', '--family', 'quartic']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
  });

  it('section windows --max-period 4 --json lists 1 + 1 + 1 + 2 windows (OEIS A000048)', () => {
    const r = runCli(['section', 'windows', '--max-period', '4', '--json']);
    expect(r.status).toBe(0);
    const j = JSON.parse(r.stdout) as { rows: { period: string; word: string }[] };
    expect(j.rows.map((w) => w.word)).toEqual(['(C)', 'R', 'RLR', 'RL', 'RLL']);
  });

  it('section cascade --csv prints a header and one row per level', () => {
    const r = runCli(['section', 'cascade', '--levels', '5', '--digits', '15', '--csv']);
    expect(r.status).toBe(0);
    const lines = r.stdout.trim().split('\n');
    expect(lines[0]).toBe('n,period,doubling_r,doubling_c,superstable_r,superstable_c,delta_n,alpha_n');
    expect(lines).toHaveLength(7);
    // checks.md: first doubling r = 3, c = -3/4 (exact).
    expect(lines[2]!.split(',').slice(2, 4)).toEqual(['3', '-0.75']);
  });

  it('section diagram writes a 16-bit PNG and leaves no temporary file', () => {
    const dir = tempDir();
    const file = path.join(dir, 'd.png');
    const r = runCli(['section', 'diagram', '--size', '120x60', '--workers', '2', '--out', file]);
    expect(r.status).toBe(0);
    const png = readFileSync(file);
    // IHDR: bit depth byte at offset 24 (PNG spec), colour type 2 (RGB) at 25.
    expect([png[24], png[25]]).toEqual([16, 2]);
    expect(readdirSync(dir)).toEqual(['d.png']);
  });

  it('section diagram gives the same bytes with 1 and 2 workers', () => {
    const dir = tempDir();
    const files = ['1', '2'].map((w) => {
      const file = path.join(dir, `w${w}.png`);
      expect(runCli(['section', 'diagram', '--family', 'sine', '--size', '97x40', '--samples', '3', '--workers', w, '--out', file]).status).toBe(0);
      return readFileSync(file);
    });
    expect(files[0]!.equals(files[1]!)).toBe(true);
  });
});
