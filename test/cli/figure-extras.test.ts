/**
 * Figure annotations beyond axes and rays: the scale bar, the period legend
 * beside the frame. Geometry is checked against the view (the image spans
 * centre ± span/2 across, docs/architecture.md conventions); PDF text is read
 * back by pdftotext (Debian poppler-utils).
 */
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { requireInCi } from '../helpers/require-in-ci.js';
import { runCli, tempDir } from '../helpers/run-cli.js';

const havePoppler = requireInCi(spawnSync('pdftotext', ['-v']).status === 0, 'pdftotext (poppler-utils)');

interface Word { text: string; x0: number; x1: number; y0: number; y1: number }

function pdfWords(file: string): Word[] {
  const r = spawnSync('pdftotext', ['-bbox', file, '-'], { encoding: 'utf8' });
  expect(r.status, r.stderr).toBe(0);
  return [...r.stdout.matchAll(/<word xMin="([\d.]+)" yMin="([\d.]+)" xMax="([\d.]+)" yMax="([\d.]+)">([^<]*)<\/word>/g)].map((m) => ({ text: m[5]!, x0: Number(m[1]), y0: Number(m[2]), x1: Number(m[3]), y1: Number(m[4]) }));
}

function plateOf(svg: string): { x: number; y: number; width: number; height: number } {
  const img = /<image x="([\d.]+)" y="([\d.]+)" width="([\d.]+)" height="([\d.]+)"/.exec(svg)!;
  return { x: Number(img[1]), y: Number(img[2]), width: Number(img[3]), height: Number(img[4]) };
}

const FLAGS = ['--center', '-0.75,0', '--span', '3', '--size', '450x300', '--iterations', '300', '--samples', '1', '--dpi', '150'];

describe('plate --scale-bar', () => {
  it('draws a bar whose length on the page is the printed length in c at the view scale, 1, 2 or 5 times a power of ten within a quarter of the span', () => {
    for (const [center, span, label, value] of [['-0.75,0', '3', '0.5', 0.5], ['-0.74530000000001234,0.1127', '4e-13', '1e\u221213', 1e-13]] as const) {
      const file = path.join(tempDir(), 's.svg');
      const r = runCli(['plate', '--center', center, '--span', span, '--size', '450x300', '--iterations', '2000', '--samples', '1', '--dpi', '150', '--scale-bar', '--out', file, '--json']);
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

  it.runIf(havePoppler)('PDF: the bar\'s label is text pdftotext reads back inside the plate', () => {
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
  it.runIf(havePoppler)('lists beside the frame the periods present (at least 4 interior pixels in the plate\'s histogram, at most --legend-periods), with the palette colours of the legend file a PNG plate writes', () => {
    const dir = tempDir();
    const file = path.join(dir, 'l.pdf');
    const r = runCli(['plate', ...FLAGS, '--axes', '--legend', 'beside', '--legend-periods', '6', '--out', file, '--json']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { periods: Record<string, number>; figure: { legend: number[]; plate: { x: number; width: number } } };
    const present = Object.entries(out.periods).filter(([, n]) => n >= 4).sort((a, b) => b[1] - a[1]).slice(0, 6).map(([p]) => Number(p)).sort((a, b) => a - b);
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
  });
});
