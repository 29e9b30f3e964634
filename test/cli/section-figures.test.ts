/**
 * The real slice's figures: `section diagram --out fig.pdf|svg` with the
 * parameter r below, the quadratic family's c on top (c = r(2 - r)/4,
 * docs/methods.md E1) and the state x at the left. Tick labels are read back by
 * pdftotext (Debian poppler-utils) and must equal the values the sheet's
 * axes put at their positions (columns span r.from .. r.to, rows x.to at the
 * top .. x.from at the bottom), to the printed digits.
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
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

function printed(label: string): number {
  const t = label.replace(/\u2212/g, '-');
  return /^-?\d+(\.\d+)?$/.test(t) ? Number(t) : Number.NaN;
}

function halfDigit(label: string): number {
  return 0.5 * 10 ** -(label.includes('.') ? label.split('.')[1]!.length : 0);
}

const R = { from: 3.4, to: 4 };
const X = { from: 0.1, to: 0.95 };
const ARGS = [
  'section',
  'diagram',
  '--r-from',
  String(R.from),
  '--r-to',
  String(R.to),
  '--x-from',
  String(X.from),
  '--x-to',
  String(X.to),
  '--size',
  '600x300',
  '--samples',
  '1',
  '--transient',
  '200',
  '--iterations',
  '300',
];

describe('section diagram --out fig.pdf', () => {
  it.runIf(havePoppler)("labels r below, c = r(2 - r)/4 on top and x at the left, each label the value the sheet's axes put at its position", () => {
    const dir = tempDir();
    const file = path.join(dir, 'd.pdf');
    const r = runCli([...ARGS, '--caption', 'Crop of the cascade', '--out', file]);
    expect(r.status, r.stderr).toBe(0);
    // the plate's rectangle on the page (600 x 300 pixels at 300 dpi): from the SVG of the same sheet, laid out alike
    const svgFile = path.join(dir, 'd.svg');
    expect(runCli([...ARGS, '--caption', 'Crop of the cascade', '--out', svgFile]).status).toBe(0);
    const img = /<image x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"/.exec(readFileSync(svgFile, 'utf8'))!;
    const plate = { x: Number(img[1]), y: Number(img[2]), width: Number(img[3]), height: Number(img[4]) };
    expect(plate.width).toBeCloseTo((600 / 300) * 72, 6);
    const words = pdfWords(file);
    const numbers = words.filter((w) => !Number.isNaN(printed(w.text)));
    const below = numbers.filter((w) => w.y0 > plate.y + plate.height);
    const above = numbers.filter((w) => w.y1 < plate.y);
    const left = numbers.filter((w) => w.x1 < plate.x && w.y0 >= plate.y - 4 && w.y1 <= plate.y + plate.height + 4);
    expect(below.length).toBeGreaterThanOrEqual(3);
    expect(above.length).toBeGreaterThanOrEqual(3);
    expect(left.length).toBeGreaterThanOrEqual(3);
    const rAt = (px: number): number => R.from + ((px - plate.x) / plate.width) * (R.to - R.from);
    for (const w of below) expect(Math.abs(rAt((w.x0 + w.x1) / 2) - printed(w.text)), `r ${w.text}`).toBeLessThan(halfDigit(w.text));
    for (const w of above) {
      const rr = rAt((w.x0 + w.x1) / 2);
      expect(Math.abs((rr * (2 - rr)) / 4 - printed(w.text)), `c ${w.text}`).toBeLessThan(halfDigit(w.text));
    }
    for (const w of left) {
      const x = X.to - (((w.y0 + w.y1) / 2 - plate.y) / plate.height) * (X.to - X.from);
      expect(Math.abs(x - printed(w.text)), `x ${w.text}`).toBeLessThan(halfDigit(w.text));
    }
    const text = words.map((w) => w.text).join(' ');
    expect(text).toContain('Crop of the cascade');
    expect(words.some((w) => w.text === 'r' && w.y0 > plate.y + plate.height)).toBe(true);
    expect(words.some((w) => w.text === 'x' && w.x1 < plate.x)).toBe(true);
  });

  it('gives the same bytes for 1 and 2 workers and again from the figure (--again), PDF and SVG', () => {
    const dir = tempDir();
    for (const ext of ['pdf', 'svg']) {
      const a = path.join(dir, `a.${ext}`);
      const b = path.join(dir, `b.${ext}`);
      expect(runCli([...ARGS, '--workers', '1', '--out', a]).status).toBe(0);
      expect(runCli([...ARGS, '--workers', '2', '--out', b]).status).toBe(0);
      expect(readFileSync(a).equals(readFileSync(b)), ext).toBe(true);
      const again = runCli(['section', 'diagram', '--again', a]);
      expect(again.status, again.stderr).toBe(0);
      expect(readFileSync(path.join(dir, `a-again.${ext}`)).equals(readFileSync(a)), `${ext} --again`).toBe(true);
    }
  });

  it('--windows 3 --cascade: shades the period-3 window from its onset r = 1 + sqrt 8 and marks the doublings r = 3 and 1 + sqrt 6 (exact algebra: the tangent bifurcation of f^3 and the flip of the 2-cycle)', () => {
    const file = path.join(tempDir(), 'w.svg');
    const args = [
      'section',
      'diagram',
      '--r-from',
      '2.8',
      '--r-to',
      '4',
      '--size',
      '600x300',
      '--samples',
      '1',
      '--transient',
      '100',
      '--iterations',
      '200',
      '--windows',
      '3',
      '--cascade',
      '--out',
      file,
    ];
    const r = runCli(args);
    expect(r.status, r.stderr).toBe(0);
    const svg = readFileSync(file, 'utf8');
    const img = /<image x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"/.exec(svg)!;
    const plate = { x: Number(img[1]), width: Number(img[3]) };
    const at = (rv: number): number => plate.x + ((rv - 2.8) / 1.2) * plate.width;
    const bands = [...svg.matchAll(/<rect x="([\d.]+)" y="[\d.]+" width="([\d.]+)" height="[\d.]+" fill="#2a7fd4"/g)].map(
      (m) => [Number(m[1]), Number(m[1]) + Number(m[2])] as const,
    );
    expect(bands).toHaveLength(1);
    expect(Math.abs(bands[0]![0] - at(1 + Math.sqrt(8)))).toBeLessThan(0.01);
    // the window ends at its interior crisis near r = 3.8568 (from memory)
    const end = 2.8 + ((bands[0]![1] - plate.x) / plate.width) * 1.2;
    expect(end).toBeGreaterThan(3.85);
    expect(end).toBeLessThan(3.86);
    expect(svg).toMatch(/class="window" aria-label="3"/);
    const lines = [...svg.matchAll(/<polyline points="([\d.]+),[^"]*" fill="none" stroke="#c0392b"/g)].map((m) => Number(m[1]));
    for (const rv of [3, 1 + Math.sqrt(6)])
      expect(
        lines.some((x) => Math.abs(x - at(rv)) < 0.01),
        `doubling at ${rv}`,
      ).toBe(true);
    const png = runCli([...args.slice(0, -2), '--out', path.join(tempDir(), 'w.png')]);
    expect(png.status).toBe(2);
    expect(png.stderr.trimEnd().split('\n')).toHaveLength(1);
    expect(png.stderr).toMatch(/for --windows .*but received/);
  });
});
