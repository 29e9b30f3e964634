import { readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';

const RE79 = '0.0000000000000000000000000000056601783822120579436465436167707854399762373350100776036003776325215751641144544769727625509114596865';
const IM79 = '0.9999999999999999999999999999971756386712434047927096950958000911478774441797251960078428535562965546474977099556868901645866371002';

describe('quadatlas pyramid on a deep view', () => {
  it('renders with the deep arithmetic, and its base tiles equal the same pixels of a deep plate', () => {
    const dir = tempDir();
    const sheet = path.join(dir, 'deep.json');
    writeFileSync(
      sheet,
      JSON.stringify({
        view: { re: RE79, im: IM79, span: '4e-58' },
        pixels: { width: 512, height: 256 },
        iterations: 8000,
        samples: 4,
        reference: { re: RE79, im: IM79, period: 79 },
      }),
    );
    const pyr = runCli(['pyramid', sheet, '--out-dir', path.join(dir, 'pyr'), '--json']);
    expect(pyr.status, pyr.stderr).toBe(0);
    expect((JSON.parse(pyr.stdout) as { finished: boolean }).finished).toBe(true);
    const plate = runCli(['plate', sheet, '--out', path.join(dir, 'plate.png')]);
    expect(plate.status, plate.stderr).toBe(0);
    const whole = PNG.sync.read(readFileSync(path.join(dir, 'plate.png')));
    const tile = PNG.sync.read(readFileSync(path.join(dir, 'pyr/tiles/256,0,256,256/256,256/0/default.png')));
    let differ = 0;
    for (let y = 0; y < 256; y++) {
      for (let x = 0; x < 256; x++) {
        for (let c = 0; c < 3; c++) if (tile.data[4 * (y * 256 + x) + c] !== whole.data[4 * (y * 512 + 256 + x) + c]) differ++;
      }
    }
    expect(differ).toBe(0);
  });
});
