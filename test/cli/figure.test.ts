/**
 * `plate --axes --out fig.pdf|fig.svg`: the tick labels a reader sees sit
 * where the view geometry (docs/architecture.md conventions: the image spans
 * centre ± span/2 across, pixels square, Im c upwards) puts those values.
 * PDF text is read back by pdftotext (Debian poppler-utils, an outside
 * reader); SVG text by the aria-label of each outline and the outline's own
 * coordinates.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
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

/** Words of page 1 with their boxes, from `pdftotext -bbox` (points, y down). */
function pdfWords(file: string): Word[] {
  const r = spawnSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  const words: Word[] = [];
  for (const m of r.stdout.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)) {
    words.push({ text: m[5]!.replace(/&amp;/g, '&'), x0: Number(m[1]), y0: Number(m[2]), x1: Number(m[3]), y1: Number(m[4]) });
  }
  return words;
}

/** A printed number with U+2212 minus as a double, or NaN. */
function printed(label: string): number {
  const t = label.replace(/\u2212/g, '-');
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : Number.NaN;
}

/** Half a unit in the label's last printed digit. */
function halfDigit(label: string): number {
  const decimals = label.includes('.') ? label.split('.')[1]!.length : 0;
  return 0.5 * 10 ** -decimals;
}

/** Labels in increasing order are evenly spaced by 1, 2 or 5 times a power of ten (a round step). */
function expectRoundSteps(values: number[]): void {
  const sorted = [...values].sort((a, b) => a - b);
  expect(sorted.length).toBeGreaterThanOrEqual(3);
  const step = sorted[1]! - sorted[0]!;
  const mant = step / 10 ** Math.floor(Math.log10(step) + 1e-9);
  expect([1, 2, 5].some((m) => Math.abs(mant - m) < 1e-6)).toBe(true);
  for (let i = 1; i < sorted.length; i++) expect(sorted[i]! - sorted[i - 1]!).toBeCloseTo(step, 9);
}

const VIEW = { re: -0.75, im: 0.1, span: 3, width: 480, height: 320 };
const FLAGS = ['--center', `${VIEW.re},${VIEW.im}`, '--span', String(VIEW.span), '--size', `${VIEW.width}x${VIEW.height}`, '--iterations', '300', '--samples', '1', '--dpi', '200'];

/** c at a page point over the plate rectangle (x, y, w, h in points): the view geometry, done here in doubles. */
function cAt(plate: { x: number; y: number; width: number; height: number }, px: number, py: number): [number, number] {
  const spacing = VIEW.span / VIEW.width;
  const i = ((px - plate.x) / plate.width) * VIEW.width;
  const j = ((py - plate.y) / plate.height) * VIEW.height;
  return [VIEW.re + (i - VIEW.width / 2) * spacing, VIEW.im + (VIEW.height / 2 - j) * spacing];
}

describe('plate --axes --out fig.pdf', () => {
  it.runIf(havePoppler)('prints tick labels (read back by pdftotext) equal to the c values at their positions, to the printed digits', () => {
    const dir = tempDir();
    const file = path.join(dir, 'f.pdf');
    const r = runCli(['plate', ...FLAGS, '--axes', '--caption', 'Axes test', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const plate = (JSON.parse(r.stdout) as { figure: { plate: { x: number; y: number; width: number; height: number } } }).figure.plate;
    // The plate's print size: pixels / dpi inches.
    expect(plate.width).toBeCloseTo((VIEW.width / 200) * 72, 6);
    const words = pdfWords(file);
    const re = words.filter((w) => !Number.isNaN(printed(w.text)) && w.y0 > plate.y + plate.height);
    const im = words.filter((w) => !Number.isNaN(printed(w.text)) && w.x1 < plate.x);
    expect(re.length).toBeGreaterThanOrEqual(4);
    expect(im.length).toBeGreaterThanOrEqual(3);
    for (const w of re) {
      const [c] = cAt(plate, (w.x0 + w.x1) / 2, 0);
      expect(Math.abs(c - printed(w.text)), w.text).toBeLessThan(halfDigit(w.text));
      // and placed to a quarter point (pdftotext's boxes follow the glyph advances)
      expect(Math.abs(c - printed(w.text)) * (plate.width / VIEW.span)).toBeLessThan(0.25);
    }
    for (const w of im) {
      // The label is centred on the tick by its capitals; pdftotext's box runs from the ascent to the descent line,
      // whose middle lies within a fifth of a point of the capitals' middle for a 7 pt DejaVu Sans label.
      const [, c] = cAt(plate, 0, (w.y0 + w.y1) / 2);
      expect(Math.abs(c - printed(w.text)), w.text).toBeLessThan(halfDigit(w.text));
      expect(Math.abs(c - printed(w.text)) * (plate.height / ((VIEW.span * VIEW.height) / VIEW.width))).toBeLessThan(0.6);
    }
    expectRoundSteps(re.map((w) => printed(w.text)));
    expectRoundSteps(im.map((w) => printed(w.text)));
    const text = words.map((w) => w.text).join(' ');
    expect(text).toContain('Re c');
    expect(text).toContain('Axes test');
    // the plate is embedded at 16 bits per component (pdfimages, poppler-utils)
    const list = spawnSync('pdfimages', ['-list', file], { encoding: 'utf8' });
    expect(list.stdout.split('\n')[2]!.trim().split(/\s+/).slice(3, 8)).toEqual([String(VIEW.width), String(VIEW.height), 'rgb', '3', '16']);
  });

  it.runIf(havePoppler)('deep view: offsets from the centre with the exponent factored out, each offset where the geometry puts it', () => {
    const dir = tempDir();
    const file = path.join(dir, 'deep.pdf');
    const centre = '-0.74530000000001234';
    const span = 4e-13;
    const r = runCli([
      'plate',
      '--center',
      `${centre},0.1127`,
      '--span',
      String(span),
      '--size',
      '300x200',
      '--iterations',
      '2000',
      '--samples',
      '1',
      '--dpi',
      '100',
      '--axes',
      '--out',
      file,
      '--json',
    ]);
    expect(r.status, r.stderr).toBe(0);
    const plate = (JSON.parse(r.stdout) as { figure: { plate: { x: number; y: number; width: number } } }).figure.plate;
    const words = pdfWords(file);
    const line = spawnSync('pdftotext', ['-raw', file, '-'], { encoding: 'utf8' }).stdout;
    const title = /Re c = (\S+) \+ x × 1e(\S+)/.exec(line);
    expect(title, line).not.toBeNull();
    expect(title![1]!.replace('\u2212', '-')).toBe(centre);
    const exponent = Number(title![2]!.replace('\u2212', '-'));
    expect(exponent).toBe(-13);
    // tick labels are short offsets; the title's centre is the one long number below the plate
    const re = words.filter((w) => !Number.isNaN(printed(w.text)) && w.text.length < 8 && w.y0 > plate.y + (plate.width * 2) / 3 && w.x0 > plate.x - 10);
    expect(re.length).toBeGreaterThanOrEqual(3);
    for (const w of re) {
      const offset = (((w.x0 + w.x1) / 2 - plate.x) / plate.width - 0.5) * span;
      expect(Math.abs(offset / 10 ** exponent - printed(w.text)), w.text).toBeLessThan(halfDigit(w.text));
    }
  });
});

describe('plate --axes --out fig.svg', () => {
  it('labels every tick with an outline whose aria-label is the c value at its position, to the printed digits', () => {
    const dir = tempDir();
    const file = path.join(dir, 'f.svg');
    const r = runCli(['plate', ...FLAGS, '--axes', '--out', file]);
    expect(r.status, r.stderr).toBe(0);
    const svg = readFileSync(file, 'utf8');
    const img = /<image x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"[^>]*href="data:image\/png;base64,/.exec(svg);
    expect(img).not.toBeNull();
    const plate = { x: Number(img![1]), y: Number(img![2]), width: Number(img![3]), height: Number(img![4]) };
    const labels = [...svg.matchAll(/<path role="img" class="(re-tick|im-tick)" aria-label="([^"]+)"[^>]* d="([^"]+)"/g)];
    expect(labels.filter((m) => m[1] === 're-tick').length).toBeGreaterThanOrEqual(4);
    expect(labels.filter((m) => m[1] === 'im-tick').length).toBeGreaterThanOrEqual(3);
    expect(svg).not.toContain('<text');
    for (const [, kind, label, d] of labels) {
      const nums = d!.match(/-?\d+(\.\d+)?/g)!.map(Number);
      const xs = nums.filter((_, i) => i % 2 === 0);
      const ys = nums.filter((_, i) => i % 2 === 1);
      // the centre of the ink; side bearings of DejaVu Sans shift it from the advance's centre by well under a point
      const [cr, ci] = cAt(plate, (Math.min(...xs) + Math.max(...xs)) / 2, (Math.min(...ys) + Math.max(...ys)) / 2);
      const c = kind === 're-tick' ? cr : ci;
      expect(Math.abs(c - printed(label!)), `${kind} ${label}`).toBeLessThan(halfDigit(label!));
    }
  });
});

describe('figure bytes', () => {
  it('are the same for --workers 1 and 2 and again from the file alone (--again), for PDF and SVG with axes, rays, outlines, equipotentials and period labels', () => {
    const dir = tempDir();
    for (const ext of ['pdf', 'svg']) {
      const a = path.join(dir, `a.${ext}`);
      const b = path.join(dir, `b.${ext}`);
      expect(
        runCli([
          'plate',
          ...FLAGS,
          '--axes',
          '--caption',
          'Ünïcode (caption) \\ test',
          '--rays',
          '1/3,2/3',
          '--outlines',
          '2',
          '--equipotentials',
          '3',
          '--label-periods',
          '2',
          '--workers',
          '1',
          '--out',
          a,
        ]).status,
      ).toBe(0);
      expect(
        runCli([
          'plate',
          ...FLAGS,
          '--axes',
          '--caption',
          'Ünïcode (caption) \\ test',
          '--rays',
          '1/3,2/3',
          '--outlines',
          '2',
          '--equipotentials',
          '3',
          '--label-periods',
          '2',
          '--workers',
          '2',
          '--out',
          b,
        ]).status,
      ).toBe(0);
      expect(readFileSync(a).equals(readFileSync(b)), ext).toBe(true);
      const again = runCli(['plate', '--again', a, '--workers', '2']);
      expect(again.status, again.stderr).toBe(0);
      expect(readFileSync(path.join(dir, `a-again.${ext}`)).equals(readFileSync(a)), `${ext} --again`).toBe(true);
      const sheet = runCli(['sheet', a]);
      expect(sheet.status, sheet.stderr).toBe(0);
      expect((JSON.parse(sheet.stdout) as { figure: unknown }).figure).toEqual({
        axes: true,
        caption: 'Ünïcode (caption) \\ test',
        rays: ['1/3', '2/3'],
        raysOf: 0,
        equipotentials: 3,
        outlines: 2,
        scaleBar: false,
        internalRays: null,
        marks: [],
      });
    }
    // nothing but the figures and their sidecars is left (no temporary plate)
    expect(readdirSync(dir).sort()).toEqual([
      'a-again.pdf',
      'a-again.pdf.json',
      'a-again.svg',
      'a-again.svg.json',
      'a.pdf',
      'a.pdf.json',
      'a.svg',
      'a.svg.json',
      'b.pdf',
      'b.pdf.json',
      'b.svg',
      'b.svg.json',
    ]);
  });
});

describe('plate --rays', () => {
  it('reports landings within a pixel of the exact points in --json, and each drawn ray ends at its landing on the page (SVG)', () => {
    const dir = tempDir();
    const file = path.join(dir, 'r.svg');
    const r = runCli(['plate', ...FLAGS, '--axes', '--rays', '1/3,2/3,1/7,2/7,1/6', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as {
      rays: Array<{ angle: string; kind: string; landing: { re: string; im: string }; tracedEnd: { re: string; im: string }; tracedEndPixels: number }>;
    };
    // exact landings: -3/4 (root of the period-2 disk); -1/8 + (3 sqrt 3/8) i (cardioid formula at internal
    // angle 1/3, docs/methods.md C3); c = i (Misiurewicz, preperiod 1, period 2), by the Douady-Hubbard landing theorem
    const exact: Record<string, [number, number]> = {
      '1/3': [-0.75, 0],
      '2/3': [-0.75, 0],
      '1/7': [-1 / 8, (3 * Math.sqrt(3)) / 8],
      '2/7': [-1 / 8, (3 * Math.sqrt(3)) / 8],
      '1/6': [0, 1],
    };
    const pixel = VIEW.span / VIEW.width;
    expect(out.rays.map((x) => x.angle)).toEqual(['1/3', '2/3', '1/7', '2/7', '1/6']);
    for (const ray of out.rays) {
      const [re, im] = exact[ray.angle]!;
      expect(Math.hypot(Number(ray.landing.re) - re, Number(ray.landing.im) - im), ray.angle).toBeLessThan(pixel);
      expect(Math.hypot(Number(ray.landing.re) - re, Number(ray.landing.im) - im), ray.angle).toBeLessThan(1e-15);
      expect(ray.landing.re).toMatch(/^-?\d+(\.\d+)?$/);
      // the traced part, before the joining segment, ends within a pixel of the exact landing
      expect(Math.hypot(Number(ray.tracedEnd.re) - re, Number(ray.tracedEnd.im) - im) / pixel, ray.angle).toBeLessThan(1);
      expect(ray.tracedEndPixels, ray.angle).toBeLessThan(1);
    }
    const svg = readFileSync(file, 'utf8');
    const img = /<image x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"/.exec(svg)!;
    const plate = { x: Number(img[1]), y: Number(img[2]), width: Number(img[3]), height: Number(img[4]) };
    const ends = [...svg.matchAll(/<polyline points="([^"]+)" fill="none" stroke="#ffffff"/g)].map(
      (m) => m[1]!.trim().split(' ').at(-1)!.split(',').map(Number) as [number, number],
    );
    expect(ends.length).toBeGreaterThanOrEqual(5);
    for (const ray of out.rays) {
      const [re, im] = exact[ray.angle]!;
      const hit = ends.some(([x, y]) => {
        const [cr, ci] = cAt(plate, x, y);
        return Math.hypot(cr - re, ci - im) < pixel / 2;
      });
      expect(hit, ray.angle).toBe(true);
    }
    const labels = [...svg.matchAll(/class="ray" aria-label="([^"]+)"/g)].map((m) => m[1]);
    expect(labels.sort()).toEqual(['1/3', '1/6', '1/7', '2/3', '2/7']);
  });
});

describe('plate --rays-of', () => {
  it('draws both rays of every period-3 component in view: 1/7, 2/7 | 3/7, 4/7 | 5/7, 6/7, landing at the roots (angles: Douady-Hubbard, from memory; roots: the window at -7/4, the cardioid formula at internal angle 1/3)', () => {
    const dir = tempDir();
    const r = runCli([
      'plate',
      '--center',
      '-0.75,0',
      '--span',
      '3',
      '--size',
      '480x360',
      '--iterations',
      '300',
      '--samples',
      '1',
      '--rays-of',
      '3',
      '--out',
      path.join(dir, 'r.pdf'),
      '--json',
    ]);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { rays: Array<{ angle: string; landing: { re: string; im: string } }> };
    const at = (a: string): [number, number] => {
      const x = out.rays.find((y) => y.angle === a)!;
      return [Number(x.landing.re), Number(x.landing.im)];
    };
    expect(out.rays.map((x) => x.angle).sort()).toEqual(['1/7', '2/7', '3/7', '4/7', '5/7', '6/7']);
    const bulb = (3 * Math.sqrt(3)) / 8;
    for (const [a, re, im] of [
      ['3/7', -1.75, 0],
      ['4/7', -1.75, 0],
      ['1/7', -0.125, bulb],
      ['2/7', -0.125, bulb],
      ['5/7', -0.125, -bulb],
      ['6/7', -0.125, -bulb],
    ] as const) {
      const [x, y] = at(a);
      expect(Math.hypot(x - re, y - im), a).toBeLessThan(1e-12);
    }
  });
});

describe('plate --label-periods on a figure', () => {
  it.runIf(havePoppler)('sets each period label in the font (pdftotext reads it) centred on its nucleus: 1 at c = 0, 2 at c = -1 (0 -> -1 -> 0)', () => {
    const dir = tempDir();
    const file = path.join(dir, 'l.pdf');
    const r = runCli(['plate', ...FLAGS, '--label-periods', '3', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as {
      labels: Array<{ period: number; c: { re: number; im: number } }>;
      figure: { plate: { x: number; y: number; width: number; height: number } };
    };
    expect(out.labels.map((l) => l.period)).toEqual([1, 2]);
    const plate = out.figure.plate;
    const words = pdfWords(file).filter((w) => w.x0 > plate.x && w.x1 < plate.x + plate.width && w.y0 > plate.y && w.y1 < plate.y + plate.height);
    const nuclei: Record<string, [number, number]> = { '1': [0, 0], '2': [-1, 0] };
    expect(words.map((w) => w.text).sort()).toEqual(['1', '2']);
    const pointC = VIEW.span / plate.width; // c units per point
    for (const w of words) {
      const [cr] = cAt(plate, (w.x0 + w.x1) / 2, 0);
      const [, ci] = cAt(plate, 0, (w.y0 + w.y1) / 2);
      expect(Math.abs(cr - nuclei[w.text]![0]) / pointC, w.text).toBeLessThan(0.25);
      // the box runs from the ascent to the descent line; its middle is within a point of the capitals' middle
      expect(Math.abs(ci - nuclei[w.text]![1]) / pointC, w.text).toBeLessThan(1);
    }
  });
});

describe('plate --equipotentials', () => {
  /** The Green's function by direct iteration: log|z_n| / 2^(n-1) once |z_n| > 1e50. */
  function green(cr: number, ci: number): number {
    let zr = cr;
    let zi = ci;
    for (let n = 1; n < 100000; n++) {
      const m = zr * zr + zi * zi;
      if (m > 1e100) return (0.5 * Math.log(m)) / 2 ** (n - 1);
      [zr, zi] = [zr * zr - zi * zi + cr, 2 * zr * zi + ci];
    }
    return 0;
  }

  it('span 64: G_0 is the potential at the far corner, G_k = G_0 / 2^k, and every drawn point has its level by direct iteration', () => {
    const dir = tempDir();
    const file = path.join(dir, 'e.svg');
    const r = runCli(['plate', '--center', '0,0', '--span', '64', '--size', '256x256', '--iterations', '300', '--samples', '1', '--equipotentials', '4', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { equipotentials: Array<{ potential: number }> };
    const g = out.equipotentials.map((e) => e.potential);
    expect(g).toHaveLength(4);
    // far out G(c) = log|c + 1/2| + O(1/|c|^2): largest at the corners (32, ±32), farthest from -1/2
    expect(Math.abs(g[0]! - green(32, 32))).toBeLessThan(1e-9);
    for (let k = 1; k < 4; k++) expect(g[k]).toBe(g[0]! / 2 ** k);
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
    const perPoint = 64 / plate.width;
    for (const line of lines) {
      const levels = line.map(([x, y]) => {
        const i = ((x - plate.x) / plate.width) * 256;
        const j = ((y - plate.y) / plate.height) * 256;
        return green((i - 128) * (64 / 256), (128 - j) * (64 / 256));
      });
      // one of the levels, to the SVG's rounding: 1/1000 pt is perPoint/1000 in c, and |grad G| is below 2 outside the
      // set's neighbourhood shown here (far out it is 1/|c|); neighbouring levels differ by a factor 2
      const tol = (v: number): number => 2 * (perPoint / 1000) + 1e-6 * v;
      const level = g.find((v) => Math.abs(levels[Math.floor(levels.length / 2)]! - v) < tol(v))!;
      expect(level, `${levels[0]}`).toBeDefined();
      for (const v of levels) expect(Math.abs(v - level)).toBeLessThan(tol(level));
    }
  });
});

describe('plate --outlines', () => {
  it('draws the period-2 outline on the circle |c + 1| = 1/4 (the 2-cycle multiplier is 4(c + 1)), closed, and lists it in --json', () => {
    const dir = tempDir();
    const file = path.join(dir, 'o.svg');
    const r = runCli(['plate', ...FLAGS, '--outlines', '2', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { outlines: Array<{ period: number; nucleus: { re: number; im: number } }> };
    expect(out.outlines.map((o) => [o.period, o.nucleus.re, o.nucleus.im])).toEqual([[2, -1, 0]]);
    const svg = readFileSync(file, 'utf8');
    const img = /<image x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"/.exec(svg)!;
    const plate = { x: Number(img[1]), y: Number(img[2]), width: Number(img[3]), height: Number(img[4]) };
    const lines = [...svg.matchAll(/<polyline points="([^"]+)" fill="none" stroke="#ffd84a"/g)].map((m) =>
      m[1]!
        .trim()
        .split(' ')
        .map((p) => p.split(',').map(Number) as [number, number]),
    );
    expect(lines).toHaveLength(1);
    const pixel = VIEW.span / VIEW.width;
    expect(lines[0]!.length).toBeGreaterThan(90);
    for (const [x, y] of lines[0]!) {
      const [cr, ci] = cAt(plate, x, y);
      // SVG coordinates are rounded to 1/1000 pt, under 1/100 of a pixel here
      expect(Math.abs(Math.hypot(cr + 1, ci) - 0.25)).toBeLessThan(pixel / 100);
    }
    expect(lines[0]![0]).toEqual(lines[0]!.at(-1));
  });
});

describe('figure bad input', () => {
  const cases: Array<[string, string[], RegExp]> = [
    [
      'a rotated view with --axes',
      ['--rotation', '30', '--axes', '--out', 'X.pdf'],
      /^quadatlas: Expected a view without rotation .* for --axes \(sheet field figure\.axes\) but received rotation 30$/,
    ],
    [
      'an angle not below 1',
      ['--rays', '1/3,3/2', '--out', 'X.pdf'],
      /^quadatlas: Expected an external angle written p\/q with integers 0 <= p < q < 2\^52 \(e\.g\. 1\/3\) for --rays \(sheet field figure\.rays\[1\]\) but received "?3\/2"?$/,
    ],
    [
      'an angle that is no fraction',
      ['--rays', 'x', '--out', 'X.svg'],
      /^quadatlas: Expected an external angle .* for --rays \(sheet field figure\.rays\[0\]\) but received "?x"?$/,
    ],
    [
      'rays in a view too deep for doubles',
      ['--span', '1e-15', '--rays', '1/3', '--out', 'X.pdf'],
      /^quadatlas: Expected a view that doubles resolve \(rays are traced in double precision\) for --rays \(sheet field figure\.rays\) but received "?span 1e-15"?$/,
    ],
    [
      'outlines of a period with no component in view',
      ['--center', '0.3,0', '--span', '0.01', '--outlines', '2', '--out', 'X.pdf'],
      /^quadatlas: Expected a period with a component in view at least 3 pixels across for --outlines \(sheet field figure\.outlines\) but received "?period 2 \(none in view\)"?$/,
    ],
    [
      'rays of a period with no component in view',
      ['--center', '0.3,0', '--span', '0.01', '--rays-of', '2', '--out', 'X.pdf'],
      /^quadatlas: Expected a period with a component in view at least 3 pixels across for --rays-of \(sheet field figure\.raysOf\) but received "?period 2 \(none in view\)"?$/,
    ],
    ['rays of period 13', ['--rays-of', '13', '--out', 'X.svg'], /^quadatlas: Expected an integer between 0 and 12 for --rays-of \(sheet field figure\.raysOf\) but received 13$/],
    [
      '65 equipotentials',
      ['--equipotentials', '65', '--out', 'X.pdf'],
      /^quadatlas: Expected an integer between 0 and 64 for --equipotentials \(sheet field figure\.equipotentials\) but received 65$/,
    ],
    [
      'equipotentials in a view inside the set',
      ['--center', '0,0', '--span', '0.01', '--equipotentials', '2', '--out', 'X.pdf'],
      /^quadatlas: Expected a view with points outside the set for --equipotentials \(sheet field figure\.equipotentials\) but received "?no escaping point on the frame of the view"?$/,
    ],
    [
      'outlines of period 15',
      ['--outlines', '15', '--out', 'X.pdf'],
      /^quadatlas: Expected an integer between 0 and 14 for --outlines \(sheet field figure\.outlines\) but received 15$/,
    ],
    [
      'an unknown output kind',
      ['--out', 'X.eps'],
      /^quadatlas: Expected a file name ending in \.png, \.tif, \.tiff, \.pdf or \.svg for --out \(sheet field output\.file\) but received .*X\.eps"?$/,
    ],
  ];
  for (const [what, flags, line] of cases) {
    it(`${what}: one line, exit 2, no file`, () => {
      const dir = tempDir();
      const args = flags.map((f) => (f.startsWith('X.') ? path.join(dir, f) : f));
      const r = runCli(['plate', ...FLAGS, ...args]);
      expect(r.status).toBe(2);
      expect(r.stderr.trimEnd().split('\n')).toHaveLength(1);
      expect(r.stderr.trimEnd()).toMatch(line);
      expect(readdirSync(dir)).toEqual([]);
    });
  }

  it('an output name that is a directory is refused before any work', () => {
    const dir = tempDir();
    mkdirSync(path.join(dir, 'd.pdf'));
    const r = runCli(['plate', ...FLAGS, '--out', path.join(dir, 'd.pdf')]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toMatch(
      /^quadatlas: Expected a file name \(not an existing directory\) for --out \(sheet field output\.file\) but received .*d\.pdf \(a directory\)"?$/,
    );
    expect(readdirSync(dir)).toEqual(['d.pdf']);
  });

  it('julia keeps its own --rays (dynamic rays) and refuses the parameter rays of a sheet (figure.rays) in one line', () => {
    const dir = tempDir();
    const help = runCli(['julia', '--help']);
    expect(help.status, help.stderr).toBe(0);
    expect(help.stdout).toContain('dynamic rays');
    expect(help.stdout).toContain('Re z and Im z');
    const sheet = path.join(dir, 'j.json');
    writeFileSync(
      sheet,
      JSON.stringify({ kind: 'julia', c: { re: '-1', im: '0' }, pixels: { width: 40, height: 30 }, output: { file: path.join(dir, 'j.pdf') }, figure: { rays: ['1/3'] } }),
    );
    const r = runCli(['julia', sheet]);
    expect(r.status).toBe(2);
    expect(r.stderr.trim()).toBe('quadatlas: Expected no parameter rays on a Julia figure (its dynamic rays are marks.rays, --rays) for figure.rays but received ["1/3"]');
    expect(readdirSync(dir)).toEqual(['j.json']);
  });

  it('a sheet whose figure.caption is not a string names the field', () => {
    const dir = tempDir();
    const sheet = path.join(dir, 's.json');
    writeFileSync(sheet, JSON.stringify({ output: { file: path.join(dir, 'x.pdf') }, figure: { caption: 3 } }));
    const s = runCli(['plate', sheet]);
    expect(s.status).toBe(2);
    expect(s.stderr.trim()).toBe('quadatlas: Expected a string for figure.caption but received 3');
    expect(existsSync(path.join(dir, 'x.pdf'))).toBe(false);
  });
});
