/**
 * Figure annotations beyond axes and rays: the scale bar, the period legend
 * beside the frame. Geometry is checked against the view (the image spans
 * centre ± span/2 across, docs/architecture.md conventions); PDF text is read
 * back by pdftotext (Debian poppler-utils).
 */
import { spawnSync } from 'node:child_process';
import { existsSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { requireInCi } from '../helpers/require-in-ci.js';
import { runCli, tempDir } from '../helpers/run-cli.js';

const havePoppler = requireInCi(spawnSync('pdftotext', ['-v']).status === 0, 'pdftotext (poppler-utils)');

interface Word {
  text: string;
  x0: number;
  x1: number;
  y0: number;
  y1: number;
}

function pdfWords(file: string): Word[] {
  const r = spawnSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  return [...r.stdout.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)].map((m) => ({
    text: m[5]!,
    x0: Number(m[1]),
    y0: Number(m[2]),
    x1: Number(m[3]),
    y1: Number(m[4]),
  }));
}

function plateOf(svg: string): { x: number; y: number; width: number; height: number } {
  const img = /<image x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"/.exec(svg)!;
  return { x: Number(img[1]), y: Number(img[2]), width: Number(img[3]), height: Number(img[4]) };
}

const FLAGS = ['--center', '-0.75,0', '--span', '3', '--size', '450x300', '--iterations', '300', '--samples', '1', '--dpi', '150'];

describe('plate --scale-bar', () => {
  it('draws a bar whose length on the page is the printed length in c at the view scale, 1, 2 or 5 times a power of ten within a quarter of the span', () => {
    for (const [center, span, label, value] of [
      ['-0.75,0', '3', '0.5', 0.5],
      ['-0.74530000000001234,0.1127', '4e-13', '1e\u221213', 1e-13],
    ] as const) {
      const file = path.join(tempDir(), 's.svg');
      const r = runCli([
        'plate',
        '--center',
        center,
        '--span',
        span,
        '--size',
        '450x300',
        '--iterations',
        '2000',
        '--samples',
        '1',
        '--dpi',
        '150',
        '--scale-bar',
        '--out',
        file,
        '--json',
      ]);
      expect(r.status, r.stderr).toBe(0);
      const svg = readFileSync(file, 'utf8');
      const plate = plateOf(svg);
      expect(svg).toContain(`class="scale-bar" aria-label="${label}"`);
      const bar = /<rect x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)" fill="#ffffff" fill-opacity="1"\/>/.exec(svg);
      expect(bar, 'the white bar').not.toBeNull();
      // view geometry: plate.width points show span units of c
      expect(Number(bar![3])).toBeCloseTo((value / Number(span)) * plate.width, 2);
      expect(value / Number(span)).toBeLessThanOrEqual(0.25);
      expect(value / Number(span)).toBeGreaterThan(0.25 / 2.5);
      // inside the plate, lower left
      expect(Number(bar![1])).toBeGreaterThan(plate.x);
      expect(Number(bar![2])).toBeGreaterThan(plate.y + plate.height / 2);
      expect((JSON.parse(r.stdout) as { figure: { scaleBar: { label: string } } }).figure.scaleBar.label).toBe(label);
    }
  });

  it.runIf(havePoppler)("PDF: the bar's label is text pdftotext reads back inside the plate", () => {
    const file = path.join(tempDir(), 's.pdf');
    const r = runCli(['plate', ...FLAGS, '--scale-bar', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const plate = (JSON.parse(r.stdout) as { figure: { plate: { x: number; y: number; width: number; height: number } } }).figure.plate;
    const word = pdfWords(file).find((w) => w.text === '0.5');
    expect(word).toBeDefined();
    expect(word!.x0).toBeGreaterThan(plate.x);
    expect(word!.y1).toBeLessThan(plate.y + plate.height);
  });
});

describe('plate --legend beside on a figure', () => {
  it.runIf(havePoppler)(
    "lists beside the frame the periods present (at least 4 interior pixels in the plate's histogram, at most --legend-periods), with the palette colours of the legend file a PNG plate writes",
    () => {
      const dir = tempDir();
      const file = path.join(dir, 'l.pdf');
      const r = runCli(['plate', ...FLAGS, '--axes', '--legend', 'beside', '--legend-periods', '6', '--out', file, '--json']);
      expect(r.status, r.stderr).toBe(0);
      const out = JSON.parse(r.stdout) as { periods: Record<string, number>; figure: { legend: number[]; plate: { x: number; width: number } } };
      const present = Object.entries(out.periods)
        .filter(([, n]) => n >= 4)
        .sort((a, b) => b[1] - a[1])
        .slice(0, 6)
        .map(([p]) => Number(p))
        .sort((a, b) => a - b);
      // the main cardioid, the period-2 disk and the period-3 bulbs are in this view (from memory)
      expect(present.slice(0, 3)).toEqual([1, 2, 3]);
      expect(out.figure.legend).toEqual(present);
      const right = pdfWords(file).filter((w) => w.x0 > out.figure.plate.x + out.figure.plate.width);
      expect(right.map((w) => w.text)).toEqual(['Period', ...present.map(String)]);
      // swatches: the same colours as the separate legend of a PNG plate
      const svgFile = path.join(dir, 'l.svg');
      expect(runCli(['plate', ...FLAGS, '--legend', 'beside', '--legend-periods', '6', '--out', svgFile]).status).toBe(0);
      const png = path.join(dir, 'l.png');
      expect(runCli(['plate', ...FLAGS, '--legend', 'beside', '--legend-periods', '6', '--out', png]).status).toBe(0);
      const separate = readFileSync(path.join(dir, 'l-legend.svg'), 'utf8');
      const svg = readFileSync(svgFile, 'utf8');
      for (const p of present) {
        const colour = new RegExp(`<g id="period-${p}">\\s*<rect [^>]*fill="(#[0-9a-f]{6})"`).exec(separate)![1]!;
        expect(svg, `period ${p}`).toMatch(new RegExp(`fill="${colour}" fill-opacity="1"`));
      }
    },
  );
});

/** Points of the polylines drawn in `stroke`, per polyline, on the page (points). */
function polylines(svg: string, stroke: string): Array<Array<[number, number]>> {
  return [...svg.matchAll(new RegExp(`<polyline points="([^"]+)" fill="none" stroke="${stroke}"`, 'g'))].map((m) =>
    m[1]!
      .trim()
      .split(' ')
      .map((p) => p.split(',').map(Number) as [number, number]),
  );
}

/** c at a page point of a plate showing centre (re, im) and span across. */
function cAt(plate: { x: number; y: number; width: number; height: number }, view: { re: number; im: number; span: number }, px: number, py: number): [number, number] {
  const scale = view.span / plate.width;
  return [view.re + (px - plate.x - plate.width / 2) * scale, view.im - (py - plate.y - plate.height / 2) * scale];
}

describe('plate --internal-rays', () => {
  it("draws the cardioid's internal rays 0 and 1/2 along the real axis from the nucleus 0 to the cusp 1/4 and to the root -3/4 (the cardioid formula c = t/2 - t^2/4 at t = 1 and t = -1)", () => {
    const file = path.join(tempDir(), 'i.svg');
    const r = runCli(['plate', ...FLAGS, '--internal-rays', '1:0,1/2', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { internalRays: Array<{ period: number; angle: string; end: { re: string; im: string } }> };
    expect(out.internalRays.map((x) => [x.period, x.angle])).toEqual([
      [1, '0'],
      [1, '1/2'],
    ]);
    expect(out.internalRays[0]!.end.re).toBe('0.25000000000000000000');
    expect(Math.abs(Number(out.internalRays[1]!.end.re) + 0.75)).toBeLessThan(1e-19);
    expect(Math.abs(Number(out.internalRays[1]!.end.im))).toBeLessThan(1e-19);
    const svg = readFileSync(file, 'utf8');
    const plate = plateOf(svg);
    const view = { re: -0.75, im: 0, span: 3 };
    const lines = polylines(svg, '#9ee7ff');
    expect(lines).toHaveLength(2);
    const pixel = view.span / 450;
    for (const [line, [endRe]] of [
      [lines[0]!, [0.25]],
      [lines[1]!, [-0.75]],
    ] as const) {
      const [sr, si] = cAt(plate, view, ...line[0]!);
      expect(Math.hypot(sr, si), 'starts at the nucleus 0').toBeLessThan(pixel / 2);
      const [er, ei] = cAt(plate, view, ...line.at(-1)!);
      expect(Math.hypot(er - endRe, ei), `ends at ${endRe}`).toBeLessThan(pixel / 2);
      for (const p of line) expect(Math.abs(cAt(plate, view, ...p)[1]), 'on the real axis').toBeLessThan(pixel / 2);
    }
  });

  for (const [what, flags, field] of [
    ['an angle not 0 or p/q with p < q', ['--internal-rays', '1:0,3/2'], '--internal-rays (sheet field figure.internalRays.angles[1])'],
    ['no period', ['--internal-rays', '0,1/2'], '--internal-rays'],
    ['a period with no component in view', ['--center', '2,2', '--span', '0.5', '--internal-rays', '2:0'], '--internal-rays (sheet field figure.internalRays.period)'],
  ] as const) {
    it(`refuses ${what} in one line naming the field, exit 2, no file`, () => {
      const dir = tempDir();
      const file = path.join(dir, 'bad.svg');
      const r = runCli(['plate', ...FLAGS, ...flags, '--out', file]);
      expect(r.status).toBe(2);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toContain(`for ${field} but received`);
      expect(existsSync(file)).toBe(false);
    });
  }
});

describe('plate --marks FILE.csv', () => {
  const CSV = 're,im,label\n-0.75,0,root\n# a comment\n\n"-1.7548776662466927",0,"airplane, period 3"\n0,1,c = i\n5,5,far away\n';

  it('rings each point where the view puts it, labels it beside the ring, records the rows in the sheet so --again needs no file, and the bytes agree across workers', () => {
    const dir = tempDir();
    const csv = path.join(dir, 'm.csv');
    writeFileSync(csv, CSV);
    const file = path.join(dir, 'm.svg');
    const r = runCli(['plate', ...FLAGS, '--marks', csv, '--workers', '1', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { marks: Array<{ re: string; label: string; inView: boolean; labelled: boolean }> };
    expect(out.marks.map((m) => [m.label, m.inView])).toEqual([
      ['root', true],
      ['airplane, period 3', true],
      ['c = i', true],
      ['far away', false],
    ]);
    const svg = readFileSync(file, 'utf8');
    const plate = plateOf(svg);
    const view = { re: -0.75, im: 0, span: 3 };
    // rings: 17-point closed white polylines; their centres are the marks
    const rings = polylines(svg, '#ffffff').filter((l) => l.length === 17);
    const centres = rings.map((l) => cAt(plate, view, l.slice(0, 16).reduce((a, p) => a + p[0], 0) / 16, l.slice(0, 16).reduce((a, p) => a + p[1], 0) / 16));
    const pixel = view.span / 450;
    for (const [re, im] of [
      [-0.75, 0],
      [-1.7548776662466927, 0],
      [0, 1],
    ])
      expect(
        centres.some(([a, b]) => Math.hypot(a - re!, b - im!) < pixel / 4),
        `${re} ${im}`,
      ).toBe(true);
    const labels = [...svg.matchAll(/class="mark" aria-label="([^"]+)"/g)].map((m) => m[1]);
    expect(labels).toEqual(out.marks.filter((m) => m.labelled).map((m) => m.label));
    expect(labels).toContain('airplane, period 3');
    const b = path.join(dir, 'b.svg');
    expect(runCli(['plate', ...FLAGS, '--marks', csv, '--workers', '2', '--out', b]).status).toBe(0);
    expect(readFileSync(b).equals(readFileSync(file))).toBe(true);
    rmSync(csv);
    const again = runCli(['plate', '--again', file]);
    expect(again.status, again.stderr).toBe(0);
    expect(readFileSync(path.join(dir, 'm-again.svg')).equals(readFileSync(file))).toBe(true);
  });

  for (const [what, text, row] of [
    ['a row whose re is not a number', 're,im,label\n-0.75,0,root\nabc,0,x\n', 3],
    ['a row with two fields', '-0.75,0,root\n\n0.25,cusp\n', 3],
    ['a row with an open quote', '"-0.75,0,root\n', 1],
    ['a row with an empty label', '-0.75,0,root\n0,0,  \n', 2],
  ] as const) {
    it(`refuses ${what} in one line naming the file and row ${row}, exit 2, no file`, () => {
      const dir = tempDir();
      const csv = path.join(dir, 'bad.csv');
      writeFileSync(csv, text);
      const file = path.join(dir, 'bad.svg');
      const r = runCli(['plate', ...FLAGS, '--marks', csv, '--out', file]);
      expect(r.status).toBe(2);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr).toContain(`for ${csv} row ${row} but received`);
      expect(existsSync(file)).toBe(false);
    });
  }

  it('refuses a missing file in one line naming --marks', () => {
    const r = runCli(['plate', ...FLAGS, '--marks', '/nonexistent/m.csv', '--out', path.join(tempDir(), 'x.svg')]);
    expect(r.status).toBe(2);
    expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('for --marks but received');
  });
});

interface Raster {
  width: number;
  height: number;
  channels: number;
  data: Uint8Array;
}

async function decode(file: string): Promise<Raster> {
  const sharp = (await import('sharp')).default;
  const { data, info } = await sharp(file).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  return { width: info.width, height: info.height, channels: info.channels, data };
}

/** Darkness (255 - mean of R, G, B) of pixel (x, y). */
function dark(r: Raster, x: number, y: number): number {
  const o = (y * r.width + x) * r.channels;
  return 255 - (r.data[o]! + r.data[o + 1]! + r.data[o + 2]!) / 3;
}

describe('plate --axes on PNG and TIFF', () => {
  const SIZE = { width: 450, height: 300, dpi: 150 };
  const ARGS = ['--center', '-0.75,0', '--span', '3', '--size', `${SIZE.width}x${SIZE.height}`, '--iterations', '300', '--samples', '1', '--dpi', String(SIZE.dpi)];

  it("copies the plate pixel for pixel (the plain plate's own pixels away from the frame) and draws each tick where the view geometry puts its value", async () => {
    const dir = tempDir();
    const fig = path.join(dir, 'f.png');
    const plain = path.join(dir, 'p.png');
    const r = runCli(['plate', ...ARGS, '--axes', '--out', fig, '--json']);
    expect(r.status, r.stderr).toBe(0);
    expect(runCli(['plate', ...ARGS, '--out', plain]).status).toBe(0);
    const out = JSON.parse(r.stdout) as {
      figure: {
        raster: { width: number; height: number; plateX: number; plateY: number };
        axes: { re: { ticks: Array<{ value: string }> }; im: { ticks: Array<{ value: string }> } };
      };
    };
    const { plateX, plateY } = out.figure.raster;
    const a = await decode(fig);
    const p = await decode(plain);
    expect([a.width, a.height]).toEqual([out.figure.raster.width, out.figure.raster.height]);
    let differ = 0;
    for (let y = 2; y < SIZE.height - 2; y += 1) {
      for (let x = 2; x < SIZE.width - 2; x += 1) {
        for (let c = 0; c < 3; c += 1) if (a.data[((plateY + y) * a.width + plateX + x) * 3 + c] !== p.data[(y * p.width + x) * 3 + c]) differ += 1;
      }
    }
    expect(differ, 'plate samples changed').toBe(0);
    // ticks: 3.5 pt long outside the frame; the darkest column just below the plate sits at the tick's value
    const scale = SIZE.width / 3;
    const row = plateY + SIZE.height + 3;
    for (const t of out.figure.axes.re.ticks) {
      const at = plateX + (Number(t.value) - (-0.75 - 1.5)) * scale; // continuous pixel coordinate
      let best = -1;
      for (let x = Math.floor(at) - 3; x <= Math.floor(at) + 3; x += 1) if (best < 0 || dark(a, x, row) > dark(a, best, row)) best = x;
      expect(Math.abs(best + 0.5 - at), `Re tick ${t.value}`).toBeLessThanOrEqual(0.5);
      expect(dark(a, best, row)).toBeGreaterThan(100);
    }
    const col = plateX - 3;
    for (const t of out.figure.axes.im.ticks) {
      const at = plateY + (1 - Number(t.value)) * scale;
      let best = -1;
      for (let y = Math.floor(at) - 3; y <= Math.floor(at) + 3; y += 1) if (best < 0 || dark(a, col, y) > dark(a, col, best)) best = y;
      expect(Math.abs(best + 0.5 - at), `Im tick ${t.value}`).toBeLessThanOrEqual(0.5);
    }
  });

  it.runIf(havePoppler)(
    "sets each tick label where the PDF of the same sheet has it (pdftotext's word boxes, an outside reader): the ends of the ink within the side bearings of the glyphs from the ends of the box",
    async () => {
      const dir = tempDir();
      const png = path.join(dir, 'f.png');
      const pdf = path.join(dir, 'f.pdf');
      const r = runCli(['plate', ...ARGS, '--axes', '--out', png, '--json']);
      expect(r.status, r.stderr).toBe(0);
      expect(runCli(['plate', ...ARGS, '--axes', '--out', pdf]).status).toBe(0);
      const { plateX } = (JSON.parse(r.stdout) as { figure: { raster: { plateX: number } } }).figure.raster;
      const pdfPlateX = (JSON.parse(runCli(['plate', ...ARGS, '--axes', '--out', path.join(dir, 'g.pdf'), '--json']).stdout) as { figure: { plate: { x: number } } }).figure.plate
        .x;
      const a = await decode(png);
      const k = SIZE.dpi / 72;
      // the raster puts the plate at a whole pixel: the page is shifted by this much against the PDF's
      const shift = plateX - pdfPlateX * k;
      const words = pdfWords(pdf).filter((w) => /^[\u2212\d.]+$/.test(w.text));
      expect(words.length).toBeGreaterThanOrEqual(8);
      for (const w of words) {
        const x0 = Math.floor(w.x0 * k + shift) - 1;
        const x1 = Math.ceil(w.x1 * k + shift) + 1;
        const y0 = Math.floor(w.y0 * k);
        const y1 = Math.ceil(w.y1 * k);
        // the ink's extent (columns with any ink) lies inside the box, the box's ends within the glyphs' side bearings
        // (DejaVu Sans digits, point and minus: at most 0.11 em, 1.6 px at 7 pt and 150 dpi, read from the font by fontkit) of the ink's ends, half a pixel either way for antialiasing
        let left = Infinity;
        let right = -Infinity;
        for (let y = y0; y < y1; y += 1)
          for (let x = x0; x < x1; x += 1)
            if (dark(a, x, y) > 64) {
              left = Math.min(left, x);
              right = Math.max(right, x + 1);
            }
        expect(right, w.text).toBeGreaterThan(left);
        expect(left - (w.x0 * k + shift), w.text).toBeGreaterThan(-0.5);
        expect(left - (w.x0 * k + shift), w.text).toBeLessThan(2);
        expect(w.x1 * k + shift - right, w.text).toBeGreaterThan(-0.5);
        expect(w.x1 * k + shift - right, w.text).toBeLessThan(2);
      }
    },
  );

  it('gives the same bytes for --workers 1 and 2 and --again, for PNG and 16-bit TIFF with rays, outlines and labels', async () => {
    const dir = tempDir();
    for (const ext of ['png', 'tif']) {
      const a = path.join(dir, `a.${ext}`);
      const b = path.join(dir, `b.${ext}`);
      const flags = [...ARGS, '--depth', ext === 'tif' ? '16' : '8', '--axes', '--rays', '1/3,2/3', '--outlines', '2', '--label-periods', '2', '--scale-bar'];
      expect(runCli(['plate', ...flags, '--workers', '1', '--out', a]).status).toBe(0);
      expect(runCli(['plate', ...flags, '--workers', '2', '--out', b]).status).toBe(0);
      expect(readFileSync(a).equals(readFileSync(b)), ext).toBe(true);
      const again = runCli(['plate', '--again', a]);
      expect(again.status, again.stderr).toBe(0);
      expect(readFileSync(path.join(dir, `a-again.${ext}`)).equals(readFileSync(a)), `${ext} --again`).toBe(true);
    }
    const sharp = (await import('sharp')).default;
    expect((await sharp(path.join(dir, 'a.tif')).metadata()).depth).toBe('ushort');
  });
});
