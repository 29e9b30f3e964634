// `plate --data DIR`: the per-pixel arrays and their coordinates, read back
// by NumPy itself (numpy.load; Debian's python3-numpy, installed by .ci/run).
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';
import { requireInCi } from '../helpers/require-in-ci.js';

const PYTHON = process.env['QUADATLAS_PYTHON'] ?? '/usr/bin/python3';
const numpy = requireInCi(spawnSync(PYTHON, ['-c', 'import numpy'], { stdio: 'ignore' }).status === 0, 'python3-numpy');
if (process.env['CI'] === 'true' && !numpy) throw new Error(`CI: numpy is missing for ${PYTHON} (install python3-numpy)`);

/** Runs a NumPy script on the data folder; it prints one JSON value. */
function py(script: string, dir: string): unknown {
  const r = spawnSync(PYTHON, ['-c', `import sys, json, numpy as np\nd = sys.argv[1]\n${script}`, dir], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout);
}

describe('plate --data', () => {
  it.skipIf(!numpy)('writes period, smooth, distance, interior and re/im arrays numpy reads, with pixel-centre coordinates', () => {
    const dir = tempDir();
    const data = path.join(dir, 'data');
    const r = runCli(['plate', '--center', '-0.75,0.25', '--span', '2', '--rotation', '30', '--size', '40x30', '--samples', '1', '--data', data, '--out', path.join(dir, 'p.png')]);
    expect(r.status, r.stderr).toBe(0);
    const info = py(
      `out = {}
for n in ['period', 'smooth', 'distance', 'interior', 're', 'im']:
    a = np.load(f'{d}/{n}.npy')
    out[n] = [a.dtype.str, list(a.shape)]
p = np.load(f'{d}/period.npy'); k = np.load(f'{d}/interior.npy')
out['codes'] = sorted(set(int(x) for x in np.unique(k)))
out['consistent'] = bool(np.all((p == 0) == (k == 0)) and np.all((p == -1) == (k == 2)) and np.all((p > 0) == (k == 1)))
re = np.load(f'{d}/re.npy'); im = np.load(f'{d}/im.npy')
out['corners'] = [[float(re[0, 0]), float(im[0, 0])], [float(re[29, 39]), float(im[29, 39])], [float(re[0, 39]), float(im[0, 39])]]
print(json.dumps(out))`,
      data,
    ) as { codes: number[]; consistent: boolean; corners: number[][] } & Record<string, [string, number[]]>;
    expect(info['period']).toEqual(['<i4', [30, 40]]);
    expect(info['smooth']).toEqual(['<f8', [30, 40]]);
    expect(info['distance']).toEqual(['<f8', [30, 40]]);
    expect(info['interior']).toEqual(['|u1', [30, 40]]);
    expect(info['re']).toEqual(['<f8', [30, 40]]);
    expect(info['im']).toEqual(['<f8', [30, 40]]);
    expect(info.codes).toContain(0);
    expect(info.codes).toContain(1);
    expect(info.consistent).toBe(true);
    // Exact geometry: pixel (i, j) centre at offset u = i + 1/2 - W/2, v = H/2 - j - 1/2 pixel spacings
    // (spacing = span / W), turned by the rotation (counter-clockwise), added to the centre.
    const turn = (30 * Math.PI) / 180;
    const at = (i: number, j: number): [number, number] => {
      const u = (i + 0.5 - 20) * (2 / 40);
      const v = (15 - j - 0.5) * (2 / 40);
      return [-0.75 + u * Math.cos(turn) - v * Math.sin(turn), 0.25 + u * Math.sin(turn) + v * Math.cos(turn)];
    };
    const want = [at(0, 0), at(39, 29), at(39, 0)];
    for (let k = 0; k < 3; k++) {
      expect(info.corners[k]![0]).toBeCloseTo(want[k]![0], 13);
      expect(info.corners[k]![1]).toBeCloseTo(want[k]![1], 13);
    }
    const grid = JSON.parse(readFileSync(path.join(data, 'grid.json'), 'utf8')) as { spacing: string; centre: { re: string } };
    expect(grid.spacing).toBe('0.05');
    expect(grid.centre.re).toBe('-0.75');
  });

  it.skipIf(!numpy)('for a deep view writes offsets in pixel spacings and grid.json whose map gives c to the digits of the view', () => {
    const dir = tempDir();
    const data = path.join(dir, 'data');
    const centre = { re: '-0.7436438870371587047', im: '0.1318259042053988143' };
    const r = runCli([
      'plate',
      '--center',
      `${centre.re},${centre.im}`,
      '--span',
      '1e-17',
      '--rotation',
      '90',
      '--size',
      '16x12',
      '--samples',
      '1',
      '--iterations',
      '3000',
      '--data',
      data,
      '--out',
      path.join(dir, 'p.png'),
    ]);
    expect(r.status, r.stderr).toBe(0);
    const off = py(
      `a = np.load(f'{d}/offset_re.npy'); b = np.load(f'{d}/offset_im.npy')
print(json.dumps([a.dtype.str, list(a.shape), float(a[0, 0]), float(b[0, 0]), float(a[11, 15]), float(b[11, 15])]))`,
      data,
    ) as [string, number[], number, number, number, number];
    expect(off[0]).toBe('<f8');
    expect(off[1]).toEqual([12, 16]);
    const grid = JSON.parse(readFileSync(path.join(data, 'grid.json'), 'utf8')) as {
      spacing: string;
      centre: { re: string; im: string };
      offsets: [[number, number, number], [number, number, number]];
    };
    // A quarter turn counter-clockwise: pixel offset (u, v) -> (-v, u), exactly.
    // Pixel (0, 0): u = -7.5, v = 5.5 -> (-5.5, -7.5); pixel (15, 11): u = 7.5, v = -5.5 -> (5.5, 7.5).
    expect([off[2], off[3], off[4], off[5]]).toEqual([-5.5, -7.5, 5.5, 7.5]);
    // The affine map of grid.json gives the same offsets.
    const [[a, b, e], [c, d, f]] = grid.offsets;
    expect(a * 15 + b * 11 + e).toBeCloseTo(5.5, 12);
    expect(c * 15 + d * 11 + f).toBeCloseTo(7.5, 12);
    // c of pixel (0, 0) from the decimal centre and spacing, in decimal.js: centre + spacing * offset.
    Decimal.set({ precision: 50 });
    const re = new Decimal(grid.centre.re).plus(new Decimal(grid.spacing).times(off[2]));
    expect(grid.spacing).toBe('6.25e-19');
    expect(re.toString()).toBe(new Decimal(centre.re).minus(new Decimal('1e-17').div(16).times(5.5)).toString());
  });
});
