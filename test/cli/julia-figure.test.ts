/**
 * `julia ... --axes --out fig.pdf|.svg|.png|.tif`: Julia figures. Tick labels
 * are read back by pdftotext (poppler-utils, an outside reader) and checked
 * against the view geometry (docs/architecture.md conventions: the image
 * spans centre ± span/2 across, pixels square, Im z upwards), as for plates
 * (test/cli/figure.test.ts).
 */
import { spawnSync } from 'node:child_process';
import { readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
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
    text: m[5]!.replace(/&amp;/g, '&'),
    x0: Number(m[1]),
    y0: Number(m[2]),
    x1: Number(m[3]),
    y1: Number(m[4]),
  }));
}

function printed(label: string): number {
  const t = label.replace(/\u2212/g, '-');
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : Number.NaN;
}

function halfDigit(label: string): number {
  return 0.5 * 10 ** -(label.includes('.') ? label.split('.')[1]!.length : 0);
}

const RABBIT = '-0.12256116687665,0.74486176661974';
const VIEW = { re: 0.1, im: -0.2, span: 3.2, width: 240, height: 180 };
const FLAGS = [
  '--c',
  RABBIT,
  '--center',
  `${VIEW.re},${VIEW.im}`,
  '--span',
  String(VIEW.span),
  '--size',
  `${VIEW.width}x${VIEW.height}`,
  '--iterations',
  '400',
  '--samples',
  '1',
  '--dpi',
  '150',
];

type Plate = { x: number; y: number; width: number; height: number };

describe('julia --axes --out fig.pdf', () => {
  it.runIf(havePoppler)('titles the axes Re z and Im z and prints tick labels equal to the z values at their positions, to the printed digits', () => {
    const dir = tempDir();
    const file = path.join(dir, 'j.pdf');
    const r = runCli(['julia', ...FLAGS, '--axes', '--caption', 'Rabbit figure', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { figure: { plate: Plate; axes: { re: { title: string }; im: { title: string } } }; julia: { c: { re: string } } };
    expect(out.figure.axes.re.title).toBe('Re z');
    expect(out.figure.axes.im.title).toBe('Im z');
    expect(out.julia.c.re).toBe('-0.12256116687665');
    const plate = out.figure.plate;
    expect(plate.width).toBeCloseTo((VIEW.width / 150) * 72, 6);
    const words = pdfWords(file);
    const spacing = VIEW.span / VIEW.width;
    const re = words.filter((w) => !Number.isNaN(printed(w.text)) && w.y0 > plate.y + plate.height);
    const im = words.filter((w) => !Number.isNaN(printed(w.text)) && w.x1 < plate.x);
    expect(re.length).toBeGreaterThanOrEqual(4);
    expect(im.length).toBeGreaterThanOrEqual(3);
    for (const w of re) {
      const z = VIEW.re + ((((w.x0 + w.x1) / 2 - plate.x) / plate.width) * VIEW.width - VIEW.width / 2) * spacing;
      expect(Math.abs(z - printed(w.text)), w.text).toBeLessThan(halfDigit(w.text));
    }
    for (const w of im) {
      const z = VIEW.im + (VIEW.height / 2 - (((w.y0 + w.y1) / 2 - plate.y) / plate.height) * VIEW.height) * spacing;
      expect(Math.abs(z - printed(w.text)), w.text).toBeLessThan(halfDigit(w.text));
    }
    const text = words.map((w) => w.text).join(' ');
    expect(text).toContain('Re z');
    expect(text).toContain('Im z');
    expect(text).toContain('Rabbit figure');
    expect(text).not.toContain('Re c');
  });

  it.runIf(havePoppler)('deep view (span 1e-20): the axis titles state the centre and the power of ten, Re z = centre + x × 1e−21', () => {
    const dir = tempDir();
    const file = path.join(dir, 'deep.pdf');
    // a point near the alpha fixed point of the basilica's Julia set, to 18 digits
    const centre = '-0.618033988749894848';
    const r = runCli([
      'julia',
      '--c',
      '-1,0',
      '--center',
      `${centre},0.0000000000000000012`,
      '--span',
      '1e-20',
      '--size',
      '160x120',
      '--dpi',
      '40',
      '--iterations',
      '3000',
      '--samples',
      '1',
      '--axes',
      '--out',
      file,
    ]);
    expect(r.status, r.stderr).toBe(0);
    const line = spawnSync('pdftotext', ['-raw', file, '-'], { encoding: 'utf8' }).stdout;
    const title = /Re z = (\S+) \+ x × 1e(\S+)/.exec(line);
    expect(title, line).not.toBeNull();
    expect(title![1]!.replace('\u2212', '-')).toBe(centre);
    expect(Number(title![2]!.replace('\u2212', '-'))).toBe(-21);
    expect(line.replace(/\s+/g, ' ')).toContain('Im z = 0.0000000000000000012 + x × 1e\u221221');
  });
});

describe('julia figures: same sheet, same bytes', () => {
  it('PDF, SVG, PNG and TIFF are the same for --workers 1 and 2, again from the file alone (--again), and from `sheet FILE` as a sheet', () => {
    const dir = tempDir();
    const base = ['julia', ...FLAGS, '--axes', '--caption', 'c = rabbit', '--rays', '1/7,2/7,4/7', '--fixed-points', '--cycle', '--orbit', '5', '--equipotentials', '3'];
    for (const ext of ['pdf', 'svg', 'png', 'tif']) {
      for (const w of ['1', '2']) {
        const r = runCli([...base, '--workers', w, '--tile-size', w === '1' ? '64' : '16', '--out', path.join(dir, `w${w}.${ext}`)]);
        expect(r.status, r.stderr).toBe(0);
      }
      const first = readFileSync(path.join(dir, `w1.${ext}`));
      expect(readFileSync(path.join(dir, `w2.${ext}`)).equals(first), ext).toBe(true);
      const again = runCli(['julia', '--again', path.join(dir, `w1.${ext}`), '--workers', '2']);
      expect(again.status, again.stderr).toBe(0);
      expect(readFileSync(path.join(dir, `w1-again.${ext}`)).equals(first), `${ext} --again`).toBe(true);
      const printedSheet = runCli(['sheet', path.join(dir, `w1.${ext}`)]);
      expect(printedSheet.status, printedSheet.stderr).toBe(0);
      const sheet = JSON.parse(printedSheet.stdout) as { kind: string; figure: { axes: boolean; equipotentials: number }; marks: { rays: string[] } };
      expect(sheet.kind).toBe('julia');
      expect(sheet.figure.axes).toBe(true);
      expect(sheet.figure.equipotentials).toBe(3);
      expect(sheet.marks.rays).toEqual(['1/7', '2/7', '4/7']);
      const sheetFile = path.join(dir, `s-${ext}.json`);
      writeFileSync(sheetFile, printedSheet.stdout);
      const fromSheet = runCli(['julia', sheetFile, '--out', path.join(dir, `s.${ext}`), '--workers', '1']);
      expect(fromSheet.status, fromSheet.stderr).toBe(0);
      expect(readFileSync(path.join(dir, `s.${ext}`)).equals(first), `${ext} from sheet`).toBe(true);
    }
  });
});

describe('julia --equipotentials', () => {
  it('c = 0: G_0 = ln|z| at the far corner, G_k = G_0 / 2^k, and every drawn point lies on its circle |z| = e^(G_k) (G_0(z) = ln|z|, exact)', () => {
    const dir = tempDir();
    const file = path.join(dir, 'e.svg');
    const r = runCli([
      'julia',
      '--c',
      '0,0',
      '--center',
      '0.5,0',
      '--span',
      '6',
      '--size',
      '240x240',
      '--iterations',
      '200',
      '--samples',
      '1',
      '--equipotentials',
      '3',
      '--out',
      file,
      '--json',
    ]);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { equipotentials: Array<{ potential: number }> };
    const g = out.equipotentials.map((e) => e.potential);
    expect(g).toHaveLength(3);
    // the far corners are 3.5 ± 3i
    expect(Math.abs(g[0]! - Math.log(Math.hypot(3.5, 3)))).toBeLessThan(1e-12);
    for (let k = 1; k < 3; k++) expect(g[k]).toBe(g[0]! / 2 ** k);
    const svg = readFileSync(file, 'utf8');
    const img = /<image x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"/.exec(svg)!;
    const plate = { x: Number(img[1]), y: Number(img[2]), width: Number(img[3]), height: Number(img[4]) };
    const lines = [...svg.matchAll(/<polyline points="([^"]+)" fill="none" stroke="#e6eeff"/g)].map((m) =>
      m[1]!
        .trim()
        .split(' ')
        .map((p) => p.split(',').map(Number) as [number, number]),
    );
    expect(lines.length).toBeGreaterThanOrEqual(3);
    const perPoint = 6 / plate.width;
    const found = new Set<number>();
    for (const line of lines) {
      const radii = line.map(([x, y]) => Math.hypot(0.5 + (((x - plate.x) / plate.width) * 240 - 120) * (6 / 240), (120 - ((y - plate.y) / plate.height) * 240) * (6 / 240)));
      // coordinates are printed to 1/1000 pt: perPoint / 1000 in z, both ways
      const tol = 2 * (perPoint / 1000);
      const level = g.findIndex((v) => Math.abs(radii[0]! - Math.exp(v)) < tol);
      expect(level, `${radii[0]}`).toBeGreaterThanOrEqual(0);
      found.add(level);
      for (const rad of radii) expect(Math.abs(rad - Math.exp(g[level]!))).toBeLessThan(tol);
    }
    expect(found.size).toBe(3);
  });

  it('c outside the set (c = 1): levels at or below 2 G_c(0) are refused in one line, exit 2', () => {
    const dir = tempDir();
    const r = runCli(['julia', '--c', '1,0', '--size', '80x60', '--iterations', '200', '--samples', '1', '--equipotentials', '12', '--out', path.join(dir, 'o.svg')]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/^quadatlas: Expected at most \d+ levels in this view \(c is outside the set: levels must lie above 2 G_c\(0\)/);
  });
});

/** Polylines of an SVG figure with this stroke colour, as lists of page points. */
function polylines(svg: string, stroke: string): Array<Array<[number, number]>> {
  return [...svg.matchAll(new RegExp(`<polyline points="([^"]+)" fill="none" stroke="${stroke}"`, 'g'))].map((m) =>
    m[1]!
      .trim()
      .split(' ')
      .map((p) => p.split(',').map(Number) as [number, number]),
  );
}

/** The centre of a closed polyline (its points but the repeated last one). */
function centre(line: Array<[number, number]>): [number, number] {
  const pts = line.slice(0, -1);
  return [pts.reduce((a, p) => a + p[0], 0) / pts.length, pts.reduce((a, p) => a + p[1], 0) / pts.length];
}

describe('julia figure marks', () => {
  it('--marks FILE.csv rings each point z where the view puts it and records the rows, so --again needs no file; --fixed-points are discs at alpha and beta, (1 -+ sqrt(1 - 4c))/2', () => {
    const dir = tempDir();
    const csv = path.join(dir, 'm.csv');
    // the rabbit's period-3 cycle point nearest 0 is not known in closed form; these points are plain positions in z
    writeFileSync(csv, 're,im,label\n0,0,critical point\n-0.5,0.5,a point\n9,9,far away\n');
    const file = path.join(dir, 'm.svg');
    const r = runCli(['julia', ...FLAGS, '--marks', csv, '--fixed-points', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { marks: Array<{ label: string; inView: boolean }>; figure: { plate: Plate } };
    expect(out.marks.map((m) => [m.label, m.inView])).toEqual([
      ['critical point', true],
      ['a point', true],
      ['far away', false],
    ]);
    const svg = readFileSync(file, 'utf8');
    const plate = out.figure.plate;
    const spacing = VIEW.span / VIEW.width;
    const zAt = ([x, y]: [number, number]): [number, number] => [
      VIEW.re + (((x - plate.x) / plate.width) * VIEW.width - VIEW.width / 2) * spacing,
      VIEW.im + (VIEW.height / 2 - ((y - plate.y) / plate.height) * VIEW.height) * spacing,
    ];
    // coordinates are printed to 1/1000 pt; a quarter pixel is far more than that
    const near = (centres: Array<[number, number]>, re: number, im: number): boolean => centres.some(([a, b]) => Math.hypot(a - re, b - im) < spacing / 4);
    const rings = polylines(svg, '#ffffff')
      .filter((l) => l.length === 17)
      .map((l) => zAt(centre(l)));
    expect(near(rings, 0, 0)).toBe(true);
    expect(near(rings, -0.5, 0.5)).toBe(true);
    // alpha and beta from the formula, with the principal square root (exact algebra), computed here
    const [cr, ci] = RABBIT.split(',').map(Number) as [number, number];
    const [ur, ui] = [1 - 4 * cr, -4 * ci];
    const m = Math.hypot(ur, ui);
    const [sr, si] = [Math.sqrt((m + ur) / 2), (ui < 0 ? -1 : 1) * Math.sqrt((m - ur) / 2)];
    const alpha = polylines(svg, '#e8364f').map((l) => zAt(centre(l)));
    const beta = polylines(svg, '#2f9bff').map((l) => zAt(centre(l)));
    expect(alpha).toHaveLength(1);
    expect(beta).toHaveLength(1);
    expect(near(alpha, (1 - sr) / 2, -si / 2)).toBe(true);
    expect(near(beta, (1 + sr) / 2, si / 2)).toBe(true);
    const labels = [...svg.matchAll(/class="mark" aria-label="([^"]+)"/g)].map((x) => x[1]);
    expect(labels).toEqual(expect.arrayContaining(['critical point', 'a point', '\u03b1', '\u03b2']));
    rmSync(csv);
    const again = runCli(['julia', '--again', file]);
    expect(again.status, again.stderr).toBe(0);
    expect(readFileSync(path.join(dir, 'm-again.svg')).equals(readFileSync(file))).toBe(true);
  });

  it('--rays 1/7,2/7,4/7 on the rabbit are vector curves labelled with their angles, each finished at alpha (Douady-Hubbard: they land there)', () => {
    const dir = tempDir();
    const file = path.join(dir, 'r.svg');
    const r = runCli(['julia', ...FLAGS, '--rays', '1/7,2/7,4/7', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { figure: { plate: Plate } };
    const svg = readFileSync(file, 'utf8');
    const plate = out.figure.plate;
    const rays = polylines(svg, '#ffffff').filter((l) => l.length > 17);
    expect(rays.length).toBeGreaterThanOrEqual(3);
    const [cr, ci] = RABBIT.split(',').map(Number) as [number, number];
    const [ur, ui] = [1 - 4 * cr, -4 * ci];
    const m = Math.hypot(ur, ui);
    const alpha = [(1 - Math.sqrt((m + ur) / 2)) / 2, ((ui < 0 ? 1 : -1) * Math.sqrt((m - ur) / 2)) / 2];
    const spacing = VIEW.span / VIEW.width;
    const zAt = ([x, y]: [number, number]): [number, number] => [
      VIEW.re + (((x - plate.x) / plate.width) * VIEW.width - VIEW.width / 2) * spacing,
      VIEW.im + (VIEW.height / 2 - ((y - plate.y) / plate.height) * VIEW.height) * spacing,
    ];
    // each ray is finished at its landing point, alpha, to the SVG's printed precision (1/1000 pt, both ways)
    for (const ray of rays) {
      const [re, im] = zAt(ray.at(-1)!);
      expect(Math.hypot(re - alpha[0]!, im - alpha[1]!)).toBeLessThan((2 * (VIEW.span / plate.width)) / 1000);
    }
    const landed = (JSON.parse(r.stdout) as { julia: { marks: { rays: Array<{ landing: { re: number; im: number } }> } } }).julia.marks.rays;
    for (const ray of landed) expect(Math.hypot(ray.landing.re - alpha[0]!, ray.landing.im - alpha[1]!)).toBeLessThan(1e-12);
    const labels = [...svg.matchAll(/class="ray" aria-label="([^"]+)"/g)].map((x) => x[1]);
    expect(labels.sort()).toEqual(['1/7', '2/7', '4/7']);
  });
});

describe('julia refuses the options of c-plane figures', () => {
  for (const [flag, value] of [
    ['--rays-of', '3'],
    ['--label-periods', '4'],
    ['--internal-rays', '1:0,1/3'],
    ['--outlines', '2'],
  ] as const) {
    it(`${flag}: one line naming the option, exit 2, no file`, () => {
      const dir = tempDir();
      const r = runCli(['julia', '--c', '-1,0', '--size', '40x30', flag, value, '--out', path.join(dir, 'j.pdf')]);
      expect(r.status).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr.trim()).toMatch(new RegExp(`^quadatlas: Expected an option of Julia plates \\(.+\\) for ${flag} but received ${flag} ${value.replace('/', '\\/')}$`));
      expect(readdirSync(dir)).toEqual([]);
    });
  }
});
