import { requireInCi } from '../helpers/require-in-ci.js';
import { existsSync, readFileSync, rmSync } from 'node:fs';
import { createServer, type Server } from 'node:http';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { PNG } from 'pngjs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { doubleGrid, pixelToC } from '../../src/view/view.js';
import { tempDir } from '../helpers/run-cli.js';
import { runWithEnv, treeFiles } from './pyramid-helpers.js';

const CHROMIUM = '/usr/bin/chromium';
const haveChromium = existsSync(CHROMIUM);
if (!haveChromium) console.warn('skipping the viewer tests: /usr/bin/chromium is missing (apt-get install chromium; .ci/run installs it)');

const VIEW = { re: '-0.75', im: '0.1', span: '2.9', width: 400, height: 256 };
const ARGS = [
  '--center',
  `${VIEW.re},${VIEW.im}`,
  '--span',
  VIEW.span,
  '--size',
  `${VIEW.width}x${VIEW.height}`,
  '--iterations',
  '200',
  '--samples',
  '4',
  '--tile-size',
  '64',
  '--title',
  'Edges of Stability: the whole set',
];

let root: string;
let dir: string;
let browser: Browser | undefined;
let server: Server | undefined;

beforeAll(async () => {
  root = tempDir('quadatlas-viewer-');
  dir = path.join(root, 'pyr');
  const r = runWithEnv(['pyramid', ...ARGS, '--out-dir', dir]);
  expect(r.status).toBe(0);
  if (!haveChromium) return;
  const { chromium } = await import('playwright-core');
  browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--no-first-run'],
  });
  server = createServer((req, res) => {
    const file = path.join(dir, decodeURIComponent(new URL(req.url ?? '/', 'http://x').pathname));
    if (!file.startsWith(dir) || !existsSync(file)) {
      res.writeHead(404).end();
      return;
    }
    const type = file.endsWith('.html') ? 'text/html' : file.endsWith('.js') ? 'text/javascript' : file.endsWith('.png') ? 'image/png' : 'application/octet-stream';
    res.writeHead(200, { 'content-type': type }).end(readFileSync(file));
  });
  await new Promise<void>((r) => server!.listen(0, '127.0.0.1', r));
});

afterAll(async () => {
  await browser?.close();
  await new Promise((r) => (server ? server.close(r) : r(undefined)));
  rmSync(root, { recursive: true, force: true });
});

/** Waits until OpenSeadragon has drawn every tile the current view needs. */
async function fullyLoaded(page: Page): Promise<void> {
  await page.waitForFunction(
    () => {
      const v = (globalThis as unknown as { quadatlasViewer?: { world: { getItemAt(i: number): { getFullyLoaded(): boolean } | undefined } } }).quadatlasViewer;
      return v?.world.getItemAt(0)?.getFullyLoaded() === true;
    },
    null,
    { timeout: 20_000 },
  );
}

/** Distinct colours in a screenshot (a blank or black view has a handful). */
function distinctColours(png: Buffer): number {
  const img = PNG.sync.read(png);
  const seen = new Set<number>();
  for (let p = 0; p < img.width * img.height; p++) seen.add((img.data[4 * p]! << 16) | (img.data[4 * p + 1]! << 8) | img.data[4 * p + 2]!);
  return seen.size;
}

async function openAndZoom(url: string): Promise<{ page: Page; failures: number; requests: string[] }> {
  const page = await browser!.newPage({ viewport: { width: 640, height: 400 } });
  const requests: string[] = [];
  page.on('request', (r) => requests.push(r.url()));
  await page.goto(url);
  await fullyLoaded(page);
  // Zoom in three levels (8x) about a point on the boundary, drawing each step.
  for (let k = 0; k < 3; k++) {
    await page.evaluate(() => {
      const v = (
        globalThis as unknown as {
          quadatlasViewer: { viewport: { zoomBy(f: number, p: unknown, immediately: boolean): void; imageToViewportCoordinates(x: number, y: number): unknown } };
        }
      ).quadatlasViewer;
      v.viewport.zoomBy(2, v.viewport.imageToViewportCoordinates(140, 120), true);
    });
    await fullyLoaded(page);
  }
  const failures = await page.evaluate(() => (globalThis as unknown as { quadatlasTileFailures: number }).quadatlasTileFailures);
  return { page, failures, requests };
}

describe.skipIf(!requireInCi(haveChromium, 'chromium'))('the pyramid viewer page in headless Chromium', () => {
  it('index.html from file:// loads every tile it asks for, zoomed in three levels, and draws a non-blank canvas', async () => {
    const { page, failures, requests } = await openAndZoom(pathToFileURL(path.join(dir, 'index.html')).href);
    expect(failures).toBe(0);
    expect(requests.every((u) => u.startsWith('file://') || u.startsWith('data:'))).toBe(true);
    expect(requests.filter((u) => u.includes('/default.png')).length).toBeGreaterThan(3);
    expect(distinctColours(await page.screenshot())).toBeGreaterThan(200);
    await page.close();
  });

  it("index.html over http asks only for tiles that exist, and OpenSeadragon's URL for every tile of every level is a file of the tree", async () => {
    const { port } = server!.address() as { port: number };
    const { page, failures, requests } = await openAndZoom(`http://127.0.0.1:${port}/index.html`);
    expect(failures).toBe(0);
    expect(requests.every((u) => u.startsWith(`http://127.0.0.1:${port}/`) || u.startsWith('data:'))).toBe(true);
    const urls = await page.evaluate(() => {
      const v = (
        globalThis as unknown as {
          quadatlasViewer: {
            world: {
              getItemAt(i: number): {
                source: { minLevel: number; maxLevel: number; getNumTiles(l: number): { x: number; y: number }; getTileUrl(l: number, x: number, y: number): string };
              };
            };
          };
        }
      ).quadatlasViewer;
      const s = v.world.getItemAt(0).source;
      const out: string[] = [];
      for (let l = s.minLevel; l <= s.maxLevel; l++) {
        const n = s.getNumTiles(l);
        for (let y = 0; y < n.y; y++) for (let x = 0; x < n.x; x++) out.push(s.getTileUrl(l, x, y));
      }
      return out;
    });
    const files = new Set([...treeFiles(path.join(dir, 'tiles')).keys()].filter((k) => k.endsWith('.png')));
    const asked = new Set(urls.map((u) => u.slice(`http://127.0.0.1:${port}/tiles/`.length)));
    expect(asked).toEqual(files);
    await page.close();
  });

  it('the page shows the view and, under the pointer, c at the pixel there', async () => {
    const { page } = await openAndZoom(pathToFileURL(path.join(dir, 'index.html')).href);
    const panel = await page.textContent('#panel');
    expect(panel).toContain('-0.75 + 0.1 i');
    expect(panel).toContain('2.9');
    expect(panel).toContain('400 × 256');
    const at = { x: 200, y: 300 };
    // Under load the zoom animation may still run: wait until the viewport's current zoom equals its target.
    await page.waitForFunction(
      () => {
        const v = (globalThis as unknown as { quadatlasViewer: { viewport: { getZoom(c: boolean): number } } }).quadatlasViewer.viewport;
        return Math.abs(v.getZoom(true) - v.getZoom(false)) < 1e-9 * v.getZoom(false);
      },
      undefined,
      { timeout: 30_000 },
    );
    await page.mouse.move(at.x - 1, at.y);
    await page.mouse.move(at.x, at.y);
    const text = (await page.textContent('#pointer')) ?? '';
    const image = await page.evaluate(({ x, y }) => {
      const w = globalThis as unknown as {
        OpenSeadragon: { Point: new (x: number, y: number) => unknown };
        quadatlasViewer: {
          viewport: { viewerElementToImageCoordinates(p: unknown): { x: number; y: number }; getZoom(c: boolean): number; viewportToImageZoom(z: number): number };
        };
      };
      const v = w.quadatlasViewer.viewport;
      const p = v.viewerElementToImageCoordinates(new w.OpenSeadragon.Point(x, y));
      return { x: p.x, y: p.y, zoom: v.viewportToImageZoom(v.getZoom(true)) };
    }, at);
    // c from the project's own pixel convention (src/view/view.ts), not from the page's script.
    const grid = doubleGrid({ centerRe: VIEW.re, centerIm: VIEW.im, span: VIEW.span, width: VIEW.width, height: VIEW.height, rotation: 0 });
    const c = pixelToC(grid, image.x, image.y, new Float64Array(2));
    const m = /c = (-?[\d.]+) ([+-]) ([\d.]+) i/.exec(text);
    expect(m, text).not.toBeNull();
    const shownRe = Number(m![1]);
    const shownIm = (m![2] === '-' ? -1 : 1) * Number(m![3]);
    const screenPixel = grid.spacing / image.zoom;
    expect(Math.abs(shownRe - c[0]!)).toBeLessThan(screenPixel);
    expect(Math.abs(shownIm - c[1]!)).toBeLessThan(screenPixel);
    await page.close();
  });
});
