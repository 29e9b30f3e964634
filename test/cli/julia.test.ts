import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';

const RABBIT = ['--c', '-0.12256116687665,0.74486176661974', '--size', '160x120', '--iterations', '600', '--samples', '4'];

describe('quadatlas julia', () => {
  it('writes the same bytes for --workers 1 and 2, tile sizes 16 and 64, and --again (PNG 16-bit and TIFF)', () => {
    const dir = tempDir();
    const runs = [
      ['--workers', '1', '--tile-size', '64'],
      ['--workers', '2', '--tile-size', '16'],
      ['--workers', '2', '--tile-size', '64'],
    ];
    runs.forEach((extra, i) => {
      const r = runCli(['julia', ...RABBIT, '--rays', '1/7,2/7,4/7', '--cycle', '--fixed-points', '--orbit', '6', '--depth', '16', '--out', path.join(dir, `j${i}.png`), ...extra]);
      expect(r.status, r.stderr).toBe(0);
    });
    const first = readFileSync(path.join(dir, 'j0.png'));
    for (const i of [1, 2]) expect(readFileSync(path.join(dir, `j${i}.png`)).equals(first)).toBe(true);
    const again = runCli(['julia', '--again', path.join(dir, 'j0.png'), '--out', path.join(dir, 'again.png'), '--workers', '2', '--tile-size', '32']);
    expect(again.status, again.stderr).toBe(0);
    expect(readFileSync(path.join(dir, 'again.png')).equals(first)).toBe(true);
    const tif = runCli(['julia', ...RABBIT, '--out', path.join(dir, 't.tif')]);
    expect(tif.status, tif.stderr).toBe(0);
    const tifAgain = runCli(['julia', '--again', path.join(dir, 't.tif'), '--workers', '1']);
    expect(tifAgain.status, tifAgain.stderr).toBe(0);
    expect(readFileSync(path.join(dir, 't-again.tif')).equals(readFileSync(path.join(dir, 't.tif')))).toBe(true);
  });

  it('--json for c = 0 reports an attracting fixed point and an interior area within 2 pi sqrt(2) h of pi (the unit disk, exact)', () => {
    const dir = tempDir();
    const r = runCli(['julia', '--c', '0,0', '--span', '2.5', '--size', '300x300', '--samples', '1', '--json', '--out', path.join(dir, 'disk.png')]);
    expect(r.status, r.stderr).toBe(0);
    const s = JSON.parse(r.stdout) as {
      area: { interior: number };
      view: { pixelSpacing: number };
      julia: { cycle: { kind: string; period: number; multiplier: { abs: number } } };
    };
    expect(s.julia.cycle.kind).toBe('attracting');
    expect(s.julia.cycle.period).toBe(1);
    expect(s.julia.cycle.multiplier.abs).toBe(0);
    expect(Math.abs(s.area.interior - Math.PI)).toBeLessThan(2 * Math.PI * Math.SQRT2 * s.view.pixelSpacing);
  });

  it('--json for c = 1/4 and -3/4 reports a parabolic cycle and interior pixels of period 1 and 2', () => {
    const dir = tempDir();
    for (const [c, period] of [
      ['0.25,0', 1],
      ['-0.75,0', 2],
    ] as const) {
      const r = runCli(['julia', '--c', c, '--size', '120x90', '--samples', '1', '--json', '--out', path.join(dir, 'p.png')]);
      expect(r.status, r.stderr).toBe(0);
      const s = JSON.parse(r.stdout) as { pixels: { interior: number }; periods: Record<string, number>; julia: { cycle: { kind: string; classes: number } } };
      expect(s.julia.cycle.kind).toBe('parabolic');
      expect(s.julia.cycle.classes).toBe(period);
      expect(s.pixels.interior).toBeGreaterThan(500);
      expect(Object.keys(s.periods)).toEqual([String(period)]);
    }
  });

  it('--data writes the interior class of every pixel as basin.npy: 0 at z = 0, 1 at z = -1 for the basilica, -1 outside; same bytes for any tiling', () => {
    const dir = tempDir();
    // 201 x 101 pixels over [-2, 2] x [-1, 1]: pixel centres fall exactly on z = 0 (i = 100, j = 50) and z = -1 (i = 50, j = 50).
    const base = ['julia', '--c', '-1,0', '--span', '4.02', '--size', '201x101', '--samples', '1'];
    for (const [i, extra] of [
      ['a', ['--workers', '1', '--tile-size', '64']],
      ['b', ['--workers', '2', '--tile-size', '16']],
    ] as const) {
      const r = runCli([...base, ...extra, '--out', path.join(dir, `${i}.png`), '--data', path.join(dir, i)]);
      expect(r.status, r.stderr).toBe(0);
    }
    const body = (f: string): Buffer => {
      const b = readFileSync(f);
      return b.subarray(10 + b.readUInt16LE(8));
    };
    const basin = body(path.join(dir, 'a', 'basin.npy'));
    expect(basin.equals(body(path.join(dir, 'b', 'basin.npy')))).toBe(true);
    const interior = body(path.join(dir, 'a', 'interior.npy'));
    const cls = (i: number, j: number): number => basin.readInt32LE(4 * (j * 201 + i));
    expect(cls(100, 50)).toBe(0);
    expect(cls(50, 50)).toBe(1);
    for (let k = 0; k < 201 * 101; k++) expect(basin.readInt32LE(4 * k) >= 0).toBe(interior[k] === 1);
  });

  it('refuses bad input in one line naming the field, exit 2', () => {
    const cases: Array<[string[], RegExp]> = [
      [['julia', '--c', 'abc,0'], /c\.re/],
      [['julia', '--c', '1'], /--c/],
      [['julia'], /--c/],
      [['julia', '--c', '0,0', '--label-periods', '3'], /--label-periods/],
      [['julia', '--c', '0,0', '--rays', '1/x'], /marks\.rays\[0\]/],
      [['julia', '--cardioid-angle', '1/500'], /cardioidAngle/],
      [['julia', '--c', '0,0', '--basin', 'colourful'], /basin/],
      [['julia', '--c', '0,0', '--orbit', '-3'], /marks\.orbit/],
    ];
    for (const [args, field] of cases) {
      const r = runCli(args);
      expect(r.status, r.stderr).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(field);
    }
  });
});
