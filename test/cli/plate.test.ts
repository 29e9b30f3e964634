import { existsSync, readdirSync, readFileSync, writeFileSync, chmodSync, mkdirSync } from 'node:fs';
import path from 'node:path';
import { PNG } from 'pngjs';
import sharp from 'sharp';
import { describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';

const SMALL = ['--center', '-0.75,0.05', '--span', '2.6', '--size', '150x100', '--iterations', '400', '--samples', '4'];

function npyBody(file: string): Buffer {
  const b = readFileSync(file);
  const headerLen = b.readUInt16LE(8);
  return b.subarray(10 + headerLen);
}

describe('quadatlas plate', () => {
  it('writes the same bytes for --workers 1 and 2 and tile sizes 16 and 64 (same sheet, same bytes)', () => {
    const dir = tempDir();
    const runs = [
      ['--workers', '1', '--tile-size', '64'],
      ['--workers', '2', '--tile-size', '16'],
      ['--workers', '2', '--tile-size', '64'],
    ];
    runs.forEach((extra, i) => {
      const r = runCli(['plate', ...SMALL, '--depth', '16', '--out', path.join(dir, `p${i}.png`), '--data', path.join(dir, `d${i}`), ...extra]);
      expect(r.status, r.stderr).toBe(0);
    });
    const first = readFileSync(path.join(dir, 'p0.png'));
    for (const i of [1, 2]) {
      expect(readFileSync(path.join(dir, `p${i}.png`)).equals(first)).toBe(true);
      for (const n of ['period', 'smooth', 'distance', 'interior']) {
        expect(readFileSync(path.join(dir, `d${i}`, `${n}.npy`)).equals(readFileSync(path.join(dir, 'd0', `${n}.npy`)))).toBe(true);
      }
    }
  });

  it('re-renders identical bytes from the metadata alone with --again (PNG and TIFF)', () => {
    const dir = tempDir();
    for (const ext of ['png', 'tif']) {
      const file = path.join(dir, `a.${ext}`);
      expect(runCli(['plate', ...SMALL, '--title', 'again', '--out', file]).status).toBe(0);
      const r = runCli(['plate', '--again', file, '--out', path.join(dir, `b.${ext}`)]);
      expect(r.status, r.stderr).toBe(0);
      expect(readFileSync(path.join(dir, `b.${ext}`)).equals(readFileSync(file))).toBe(true);
    }
  });

  it('writes a 16-bit PNG that an independent decoder (pngjs) reads with the right size, and sharp reads the dpi and metadata', async () => {
    const dir = tempDir();
    const file = path.join(dir, 'p.png');
    const r = runCli(['plate', ...SMALL, '--depth', '16', '--dpi', '600', '--out', file]);
    expect(r.status, r.stderr).toBe(0);
    const png = PNG.sync.read(readFileSync(file), { skipRescale: true });
    expect([png.width, png.height, png.depth]).toEqual([150, 100, 16]);
    const meta = await sharp(file).metadata();
    expect(meta.density).toBe(600);
    const sidecar = JSON.parse(readFileSync(`${file}.json`, 'utf8')) as { metadata: { sheet: { view: { span: string } } } };
    expect(sidecar.metadata.sheet.view.span).toBe('2.6');
  });

  it('writes a TIFF with resolution tags at 16 bits', async () => {
    const dir = tempDir();
    const file = path.join(dir, 'p.tiff');
    const r = runCli(['plate', ...SMALL, '--depth', '16', '--dpi', '300', '--out', file]);
    expect(r.status, r.stderr).toBe(0);
    const meta = await sharp(file).metadata();
    expect([meta.width, meta.height, meta.density, meta.depth]).toEqual([150, 100, 300, 'ushort']);
  });

  it('gives data arrays symmetric about the real axis (z -> conj z commutes with the iteration)', () => {
    const dir = tempDir();
    const r = runCli([
      'plate',
      '--center',
      '-0.6,0',
      '--span',
      '2.8',
      '--size',
      '120x90',
      '--iterations',
      '500',
      '--samples',
      '1',
      '--out',
      path.join(dir, 'p.png'),
      '--data',
      dir,
    ]);
    expect(r.status, r.stderr).toBe(0);
    const period = new Int32Array(new Uint8Array(npyBody(path.join(dir, 'period.npy'))).buffer);
    const smooth = new Float64Array(new Uint8Array(npyBody(path.join(dir, 'smooth.npy'))).buffer);
    for (let j = 0; j < 45; j++) {
      for (let i = 0; i < 120; i++) {
        expect(period[j * 120 + i]).toBe(period[(89 - j) * 120 + i]);
        expect(smooth[j * 120 + i]).toBe(smooth[(89 - j) * 120 + i]);
      }
    }
  });

  it('reports the area in pixel areas of its counts: interior, undecided, near-boundary, and u as their sum', () => {
    // The published area inside [estimate - u, estimate + u] is tested in test/cli/area.test.ts
    // (Förstemann 2012, two whole-set renders); here only the bookkeeping of the summary.
    const dir = tempDir();
    const r = runCli(['plate', ...SMALL, '--out', path.join(dir, 'p.png'), '--json']);
    expect(r.status, r.stderr).toBe(0);
    const s = JSON.parse(r.stdout) as {
      area: { interior: number; undecided: number; nearBoundary: number; uncertainty: number; pixelArea: number };
      pixels: { interior: number; undecided: number };
      view: { pixelSpacing: number };
    };
    expect(s.area.pixelArea).toBe(s.view.pixelSpacing ** 2);
    expect(s.area.interior / s.area.pixelArea).toBeCloseTo(s.pixels.interior, 6);
    expect(s.area.undecided / s.area.pixelArea).toBeCloseTo(s.pixels.undecided, 6);
    expect(s.area.uncertainty).toBeCloseTo(s.area.undecided + s.area.nearBoundary, 12);
    expect(s.area.nearBoundary).toBeGreaterThan(0);
  });

  it('prints only the JSON summary on stdout with --json, with a period histogram', () => {
    const dir = tempDir();
    const r = runCli(['plate', ...SMALL, '--out', path.join(dir, 'p.png'), '--json']);
    expect(r.status).toBe(0);
    const s = JSON.parse(r.stdout) as { periods: Record<string, number>; pixels: { escaped: number; interior: number; undecided: number; total: number } };
    expect(s.pixels.escaped + s.pixels.interior + s.pixels.undecided).toBe(s.pixels.total);
    expect(s.periods['1']).toBeGreaterThan(0);
    expect(s.periods['2']).toBeGreaterThan(0);
  });
});

describe('quadatlas plate, bad input', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['centre', ['--center', 'abc,0'], /view\.re/],
    ['centre count', ['--center', '1'], /--center/],
    ['span', ['--span', '0'], /view\.span/],
    ['negative span', ['--span', '-2'], /view\.span/],
    ['size', ['--size', '10by10'], /--size/],
    ['iterations', ['--iterations', '-5'], /iterations/],
    ['iterations beyond int32', ['--iterations', '99999999999'], /iterations/],
    ['samples', ['--samples', '3'], /samples/],
    ['depth', ['--depth', '12'], /depth/],
    ['output type', ['--out', 'x.jpg'], /output\.file/],
    ['arithmetic forced to an unknown mode', ['--arith', 'single'], /arithmetic/],
    // A strip holds at least one row of tiles: 1e6 pixels x 1024 rows x 24 bytes with data is ~24 GB.
    ['plate too big for memory', ['--size', '1000000x10', '--tile-size', '1024', '--data', 'DATA'], /pixels\.width/],
    ['plate too big for disk', ['--size', '900000x900000', '--depth', '16'], /pixels/],
  ];
  for (const [name, args, field] of cases) {
    it(`rejects a bad ${name} with one line, exit code 2 and no file`, () => {
      const dir = tempDir();
      const out = args.includes('--out') ? [] : ['--out', path.join(dir, 'p.png')];
      const r = runCli(['plate', '--size', '20x20', ...args.map((a) => (a === 'DATA' ? path.join(dir, 'data') : a)), ...out]);
      expect(r.status).toBe(2);
      expect(r.stdout).toBe('');
      const lines = r.stderr.trim().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(field);
      expect(lines[0]).toMatch(/^quadatlas: Expected .* for .* but received /);
      expect(r.stderr).not.toMatch(/\n\s+at /);
      expect(readdirSync(dir)).toEqual([]);
    });
  }

  it('rejects an unknown field in a sheet, naming it', () => {
    const dir = tempDir();
    const sheet = path.join(dir, 's.json');
    writeFileSync(sheet, JSON.stringify({ view: { re: '-0.5', im: '0', span: '3' }, zoom: 4 }));
    const r = runCli(['plate', sheet, '--out', path.join(dir, 'p.png')]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toBe(
      'quadatlas: Expected one of the fields kind, schema, writtenBy, title, note, view, pixels, print, dpi, iterations, samples, depth, colour, labels, arithmetic, skip, reference, output, figure, startup for zoom but received an unknown field "zoom"',
    );
    expect(existsSync(path.join(dir, 'p.png'))).toBe(false);
  });

  it('rejects an unwritable output path', () => {
    const dir = tempDir();
    const locked = path.join(dir, 'locked');
    mkdirSync(locked);
    chmodSync(locked, 0o500);
    const blocker = path.join(dir, 'file');
    writeFileSync(blocker, 'x');
    // A directory that cannot be created (its parent is a file) fails for any user, root included.
    const r = runCli(['plate', '--size', '20x20', '--out', path.join(blocker, 'sub', 'p.png')]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/output\.file/);
  });
});

describe('quadatlas plate --label-periods', () => {
  it('marks the period-2 nucleus c = -1 (exact: F^2(0) = c^2 + c = 0) and nothing there without labels', () => {
    const dir = tempDir();
    // c = -1 is the image centre, the corner shared by pixels (99..100, 74..75).
    const common = ['--center', '-1,0', '--span', '2', '--size', '200x150', '--iterations', '200', '--samples', '1', '--depth', '8', '--dpi', '72'];
    expect(runCli(['plate', ...common, '--label-periods', '2', '--out', path.join(dir, 'l.png')]).status).toBe(0);
    expect(runCli(['plate', ...common, '--out', path.join(dir, 'n.png')]).status).toBe(0);
    const l = PNG.sync.read(readFileSync(path.join(dir, 'l.png')));
    const n = PNG.sync.read(readFileSync(path.join(dir, 'n.png')));
    const at = (png: PNG, x: number, y: number): number[] => [...png.data.subarray(4 * (y * 200 + x), 4 * (y * 200 + x) + 3)];
    // The label's dot is dark ink (#1c1c1c); the unlabelled plate shows the period-2 colour there.
    const around = (png: PNG): number =>
      Math.min(
        ...[
          [99, 74],
          [100, 74],
          [99, 75],
          [100, 75],
        ].map(([x, y]) => Math.max(...at(png, x!, y!))),
      );
    expect(around(l)).toBeLessThan(40);
    expect(around(n)).toBeGreaterThan(60);
  });
});
