import { mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { readPlateMetadata } from '../../src/io/plate-metadata.js';
import { ROOT, runCli, tempDir } from '../helpers/run-cli.js';

const VERSION = (JSON.parse(readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { version: string }).version;

function ok(args: readonly string[]): string {
  const r = runCli(args);
  expect(r.stderr).toMatch(/^quadatlas: wrote /);
  expect(r.status).toBe(0);
  return r.stderr;
}

async function metadataOf(file: string): Promise<{ tool: string; version: string; sheet: Record<string, unknown> }> {
  const text = await readPlateMetadata(file);
  expect(text).toBeDefined();
  return JSON.parse(text!) as { tool: string; version: string; sheet: Record<string, unknown> };
}

/** Render, render --again, render from the extracted sheet file and from the sidecar: all the same bytes. */
async function sameBytesThreeWays(command: string, first: string, args: readonly string[]): Promise<Record<string, unknown>> {
  const dir = path.dirname(first);
  const ext = path.extname(first);
  ok(['section', command, ...args, '--out', first]);
  const again = path.join(dir, `again${ext}`);
  ok(['section', command, '--again', first, '--out', again]);
  expect(readFileSync(again).equals(readFileSync(first))).toBe(true);
  const meta = await metadataOf(first);
  expect(meta.tool).toBe('quadatlas');
  expect(meta.version).toBe(VERSION);
  expect(meta.sheet['kind']).toBe(`section-${command}`);
  const sheetFile = path.join(dir, 'sheet.json');
  writeFileSync(sheetFile, JSON.stringify(meta.sheet));
  const fromSheet = path.join(dir, `from-sheet${ext}`);
  ok(['section', command, sheetFile, '--out', fromSheet]);
  expect(readFileSync(fromSheet).equals(readFileSync(first))).toBe(true);
  const fromSidecar = path.join(dir, `from-sidecar${ext}`);
  ok(['section', command, '--again', `${first}.json`, '--out', fromSidecar]);
  expect(readFileSync(fromSidecar).equals(readFileSync(first))).toBe(true);
  const sidecar = JSON.parse(readFileSync(`${first}.json`, 'utf8')) as { metadata: unknown; summary: { file: string } };
  expect(sidecar.metadata).toEqual(meta);
  expect(sidecar.summary.file).toBe(first);
  return meta.sheet;
}

// These spawn the built CLI (npm test builds first).
describe.skipIf(!existsSync(path.resolve('dist/src/cli/main.js')))('section images carry their sheets (spawned)', () => {
  it('section diagram writes a 16-bit PNG and its sidecar, and leaves no temporary file', () => {
    const dir = tempDir();
    const file = path.join(dir, 'd.png');
    ok(['section', 'diagram', '--size', '120x60', '--workers', '2', '--out', file]);
    const png = readFileSync(file);
    // IHDR: bit depth byte at offset 24 (PNG spec), colour type 2 (RGB) at 25.
    expect([png[24], png[25]]).toEqual([16, 2]);
    expect(readdirSync(dir).sort()).toEqual(['d.png', 'd.png.json']);
  });

  it('section diagram gives the same bytes with 1 and 2 workers', () => {
    const dir = tempDir();
    const files = ['1', '2'].map((w) => {
      const file = path.join(dir, `w${w}.png`);
      ok(['section', 'diagram', '--family', 'sine', '--size', '97x40', '--samples', '3', '--workers', w, '--out', file, '--no-sidecar']);
      return readFileSync(file);
    });
    expect(files[0]!.equals(files[1]!)).toBe(true);
    expect(readdirSync(dir).sort()).toEqual(['w1.png', 'w2.png']);
  });

  it('section diagram: --again, a sheet file and the sidecar give the same bytes; the sheet holds every flag', async () => {
    const dir = tempDir();
    const sheet = await sameBytesThreeWays('diagram', path.join(dir, 'd.png'), [
      '--r-from',
      '3.4',
      '--r-to',
      '3.9',
      '--x-from',
      '0.2',
      '--x-to',
      '0.95',
      '--size',
      '90x50',
      '--samples',
      '2',
      '--depth',
      '8',
    ]);
    expect(sheet).toEqual({
      kind: 'section-diagram',
      schema: 1,
      family: 'logistic',
      r: { from: '3.4', to: '3.9' },
      x: { from: '0.2', to: '0.95' },
      pixels: { width: 90, height: 50 },
      samples: 2,
      transient: 1000,
      iterations: 1000,
      depth: 8,
    });
  });

  it('section diagram: flags override the sheet, and change the bytes', async () => {
    const dir = tempDir();
    const first = path.join(dir, 'a.png');
    ok(['section', 'diagram', '--size', '64x32', '--out', first]);
    const second = path.join(dir, 'b.png');
    ok(['section', 'diagram', '--again', first, '--samples', '1', '--out', second]);
    expect((await metadataOf(second)).sheet['samples']).toBe(1);
    expect(readFileSync(second).equals(readFileSync(first))).toBe(false);
  });

  it('section lyapunov: SVG and PNG plots, each the same bytes from --again, a sheet file and the sidecar', async () => {
    for (const ext of ['.svg', '.png']) {
      const dir = tempDir();
      const sheet = await sameBytesThreeWays('lyapunov', path.join(dir, `l${ext}`), ['--family', 'sine', '--steps', '120', '--iterations', '2000']);
      expect(sheet).toEqual({ kind: 'section-lyapunov', schema: 1, family: 'sine', r: { from: '0.7', to: '1' }, steps: 120, transient: 1000, iterations: 2000, starts: 3 });
    }
  });

  it('section compare: SVG and PNG plates, each the same bytes from --again, a sheet file and the sidecar', async () => {
    for (const ext of ['.svg', '.png']) {
      const dir = tempDir();
      const sheet = await sameBytesThreeWays('compare', path.join(dir, `c${ext}`), [
        '--c-from',
        '-1.8',
        '--c-to',
        '-1.2',
        '--x-from',
        '0.1',
        '--size',
        '200x120',
        '--samples',
        '1',
        '--plane-iterations',
        '500',
      ]);
      expect(sheet).toMatchObject({ c: { from: '-1.8', to: '-1.2' }, x: { from: '0.1', to: '1' }, pixels: { width: 200, height: 120 }, planeIterations: 500 });
    }
  });

  it('--again with a file of another kind exits 2 with one line naming the command to use', () => {
    const dir = tempDir();
    const file = path.join(dir, 'd.png');
    ok(['section', 'diagram', '--size', '40x20', '--out', file]);
    const r = runCli(['section', 'lyapunov', '--again', file]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain(`use quadatlas section diagram --again ${file}`);
    const sheetFile = path.join(dir, 'plate.json');
    writeFileSync(sheetFile, JSON.stringify({ kind: 'plate', schema: 1 }));
    const p = runCli(['section', 'compare', sheetFile]);
    expect(p.status).toBe(2);
    expect(p.stderr).toContain(`use quadatlas plate ${sheetFile}`);
  });

  it('section diagram --out naming an existing directory exits 2 with one line before rendering', () => {
    const dir = tempDir();
    const target = path.join(dir, 'x.png');
    mkdirSync(target);
    const r = runCli(['section', 'diagram', '--size', '4000x2000', '--out', target]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --out');
    expect(readdirSync(dir)).toEqual(['x.png']);
  });

  it('a bad field in a sheet file exits 2 with one line naming the field', () => {
    const dir = tempDir();
    const sheetFile = path.join(dir, 's.json');
    writeFileSync(sheetFile, JSON.stringify({ kind: 'section-diagram', schema: 1, r: { from: '3.5', to: '3' } }));
    const r = runCli(['section', 'diagram', sheetFile, '--out', path.join(dir, 'd.png')]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toBe('quadatlas: Expected a value above r.from (3.5) for r.to but received "3"');
  });
});
