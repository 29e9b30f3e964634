/**
 * The survey page in Debian's chromium (playwright-core), against
 * `quadatlas survey` started as a child process: the page loads and tiles
 * appear; a click on the period-3 nucleus near -0.1226 + 0.7449i shows
 * period 3 and the angles 1/7, 2/7; at a span of 1e-20 the pointer readout
 * has the digits the zoom needs, checked against the decimal centre with
 * decimal.js; the saved sheet, rendered by `plate`, is the view on screen,
 * pixel for pixel. The test leaves its screenshot in docs/images/survey.png.
 */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { Decimal } from 'decimal.js';
import { PNG } from 'pngjs';
import type { Browser, Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { requireInCi } from '../helpers/require-in-ci.js';
import { CLI, ROOT, runCli, tempDir } from '../helpers/run-cli.js';

const CHROMIUM = '/usr/bin/chromium';
const haveChromium = requireInCi(existsSync(CHROMIUM), '/usr/bin/chromium (apt-get install chromium)');
if (!haveChromium) console.warn('skipping the survey page tests: /usr/bin/chromium is missing');

let dir: string;
let child: ChildProcess | undefined;
let url = '';
let browser: Browser | undefined;

interface SurveyHooks {
  view(): { re: string; im: string; spacing: string; width: number; height: number; level: number; frame: { w: number; h: number } };
  idle(): boolean;
  places(): number;
}
/** What the callbacks run in the page see (this project compiles without the DOM types). */
interface PageElement {
  textContent: string | null;
  complete: boolean;
  naturalWidth: number;
  width: number;
  height: number;
  getContext(kind: '2d'): { getImageData(x: number, y: number, w: number, h: number): { data: Uint8ClampedArray } };
}
type WithSurvey = typeof globalThis & { survey: SurveyHooks; document: { getElementById(id: string): PageElement }; location: { hash: string } };

beforeAll(async () => {
  if (!haveChromium) return;
  dir = tempDir('quadatlas-survey-page-');
  const sheet = path.join(dir, 'base.json');
  writeFileSync(sheet, JSON.stringify({ iterations: 'auto', samples: 4 }));
  child = spawn(process.execPath, [CLI, 'survey', sheet, '--workers', '2', '--out-dir', path.join(dir, 'prints')], { stdio: ['ignore', 'pipe', 'inherit'] });
  url = await new Promise<string>((resolve) => {
    let out = '';
    child!.stdout!.on('data', (d: Buffer) => {
      out += d.toString();
      if (out.includes('\n')) resolve(out.split('\n')[0]!);
    });
  });
  const { chromium } = await import('playwright-core');
  browser = await chromium.launch({
    executablePath: CHROMIUM,
    args: [
      '--headless',
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--force-color-profile=srgb',
    ],
  });
}, 60_000);

afterAll(async () => {
  await browser?.close();
  if (child !== undefined && child.exitCode === null) {
    await new Promise((r) => {
      child!.once('exit', r);
      child!.kill('SIGTERM');
    });
  }
  if (dir !== undefined) rmSync(dir, { recursive: true, force: true });
});

async function open(fragment = '', size = { width: 960, height: 600 }): Promise<Page> {
  const page = await browser!.newPage({ viewport: size, acceptDownloads: true });
  page.on('pageerror', (e) => {
    throw e;
  });
  await page.goto(`${url}${fragment}`);
  return page;
}

async function settled(page: Page, timeout = 90_000): Promise<void> {
  await page.waitForTimeout(300);
  await page.waitForFunction(() => (globalThis as WithSurvey).survey?.idle() === true, null, { timeout, polling: 100 });
}

/** The canvas's pixels (RGBA) as the page drew them. */
async function canvasPixels(page: Page): Promise<{ width: number; height: number; data: Buffer }> {
  const got = await page.evaluate(() => {
    const c = (globalThis as WithSurvey).document.getElementById('canvas');
    const d = c.getContext('2d')!.getImageData(0, 0, c.width, c.height).data;
    let s = '';
    for (let k = 0; k < d.length; k += 8192) s += String.fromCharCode(...d.subarray(k, k + 8192));
    return { width: c.width, height: c.height, data: btoa(s) };
  });
  return { width: got.width, height: got.height, data: Buffer.from(got.data, 'base64') };
}

function distinct(data: Buffer): number {
  const seen = new Set<number>();
  for (let p = 0; p < data.length; p += 4) seen.add(data.readUInt32BE(p));
  return seen.size;
}

describe.skipIf(!haveChromium)('survey page', () => {
  it('loads, draws tiles, and a click on the period-3 nucleus shows period 3 and angles 1/7, 2/7', async () => {
    const page = await open();
    await settled(page);
    const first = await canvasPixels(page);
    expect(distinct(first.data), 'tiles drawn (a blank canvas has one colour)').toBeGreaterThan(500);
    // Recentre on the nucleus by the address, then click the pixel at its centre.
    await page.evaluate(() => {
      (globalThis as WithSurvey).location.hash = 're=-0.12256116687665361998&im=0.74486176661974423659&span=0.4';
    });
    await settled(page);
    const v = await page.evaluate(() => (globalThis as WithSurvey).survey.view());
    const box = (await page.locator('#plane').boundingBox())!;
    await page.mouse.click(box.x + v.width / 2, box.y + v.height / 2);
    await page.waitForFunction(() => (globalThis as WithSurvey).document.getElementById('point-facts')!.textContent!.includes('period'), null, { timeout: 30_000 });
    const facts = await page.locator('#point-facts').innerText();
    // The period-3 "rabbit" component: external angles 1/7 and 2/7 (Douady and Hubbard; from memory).
    expect(facts).toMatch(/period\s+3\b/);
    expect(facts).toMatch(/angles\s+1\/7, 2\/7/);
    await expect(page.locator('#to-nucleus').isVisible()).resolves.toBe(true);
    // The Julia inset of the clicked c arrives beside the facts.
    await page.waitForFunction(
      () => {
        const img = (globalThis as WithSurvey).document.getElementById('julia');
        return img.complete && img.naturalWidth === 240;
      },
      null,
      { timeout: 30_000 },
    );
    expect(await page.locator('#julia-cmd').innerText()).toMatch(/^quadatlas julia --c -0\.122\d*,0\.744\d*$/);
    // Recentre on the nucleus: the view centre becomes the nucleus the probe reported, exactly.
    await page.click('#to-nucleus');
    await settled(page);
    const at = await page.evaluate(() => (globalThis as WithSurvey).survey.view());
    expect(new Decimal(at.re).eq('-0.12256116687665361998') && new Decimal(at.im).eq('0.74486176661974423659')).toBe(true);
    await page.close();
  }, 240_000);

  it('keeps the readout digits right at a span of 1e-20, from the decimal centre', async () => {
    const re = '-1.7400623825793399052343';
    const im = '0.0281753397792110489924';
    const page = await open(`#re=${re}&im=${im}&span=1e-20`);
    await page.waitForFunction(
      () => (globalThis as WithSurvey).survey?.view !== undefined && (globalThis as WithSurvey).document.getElementById('centre-re')!.textContent !== '',
      null,
      { timeout: 20_000 },
    );
    const v = await page.evaluate(() => (globalThis as WithSurvey).survey.view());
    // The view centre is the address's centre, digit for digit.
    expect(new Decimal(v.re).eq(re) && new Decimal(v.im).eq(im)).toBe(true);
    const spacing = new Decimal(v.spacing);
    expect(spacing.times(v.width).minus('1e-20').abs().div('1e-20').lt('1e-12')).toBe(true);
    const box = (await page.locator('#plane').boundingBox())!;
    const places = Math.max(2, -Math.floor(Decimal.log10(spacing).toNumber()) + 1);
    expect(places).toBeGreaterThanOrEqual(23);
    const seen: string[] = [];
    for (const [i, j] of [
      [123, 77],
      [124, 77],
      [v.width - 1, v.height - 1],
    ] as const) {
      await page.mouse.move(box.x + i + 0.5, box.y + j + 0.5);
      const shownRe = await page.locator('#pointer-re').innerText();
      const shownIm = await page.locator('#pointer-im').innerText();
      // c at the centre of pixel (i, j): centre + ((i + 1/2 - W/2) s, (H/2 - j - 1/2) s), in decimal.js, rounded half away from zero.
      const D = Decimal.clone({ precision: 200, rounding: Decimal.ROUND_HALF_UP });
      const wantRe = new D(v.re)
        .plus(
          new D(i)
            .plus(0.5)
            .minus(v.width / 2)
            .times(v.spacing),
        )
        .toFixed(places);
      const wantIm = new D(v.im).plus(new D(v.height / 2).minus(j).minus(0.5).times(v.spacing)).toFixed(places);
      expect(shownRe, `re at pixel ${i},${j}`).toBe(wantRe);
      expect(shownIm, `im at pixel ${i},${j}`).toBe(wantIm);
      seen.push(shownRe);
    }
    // Neighbouring pixels read differently: a double readout (16 digits) could not tell them apart.
    expect(seen[0]).not.toBe(seen[1]);
    expect(Number(seen[0])).toBe(Number(seen[1]));
    await page.close();
  }, 60_000);

  it('saves a sheet that plate renders to the view on screen, pixel for pixel, and leaves the screenshot', async () => {
    const page = await open('', { width: 1200, height: 720 });
    await settled(page);
    const box = (await page.locator('#plane').boundingBox())!;
    // Zoom in twice about a point on the boundary above the main cardioid and move a little: the view is no longer the frame.
    for (let k = 0; k < 2; k++) {
      await page.mouse.move(box.x + box.width * 0.55, box.y + box.height * 0.2);
      await page.mouse.wheel(0, -120);
      await page.waitForTimeout(250);
    }
    await page.mouse.move(box.x + 300, box.y + 300);
    await page.mouse.down();
    await page.mouse.move(box.x + 340, box.y + 270, { steps: 5 });
    await page.mouse.up();
    await settled(page);
    const [download] = await Promise.all([page.waitForEvent('download'), page.click('#save')]);
    const sheetFile = path.join(dir, 'saved.json');
    await download.saveAs(sheetFile);
    await settled(page);
    const v = await page.evaluate(() => (globalThis as WithSurvey).survey.view());
    const sheet = JSON.parse(readFileSync(sheetFile, 'utf8')) as {
      view: { re: string; im: string; span: string };
      pixels: { width: number; height: number };
      output: { file: string };
    };
    expect(new Decimal(sheet.view.re).eq(v.re) && new Decimal(sheet.view.im).eq(v.im)).toBe(true);
    expect(new Decimal(sheet.view.span).eq(new Decimal(v.spacing).times(v.width))).toBe(true);
    expect(sheet.pixels).toEqual({ width: v.width, height: v.height });
    expect(v.frame).toEqual({ w: v.width, h: v.height });
    expect(await page.locator('#command').innerText()).toMatch(/^quadatlas plate survey-\d{8}-\d{6}\.json$/);
    const shown = await canvasPixels(page);
    const out = path.join(dir, 'saved.png');
    const r = runCli(['plate', sheetFile, '--out', out, '--workers', '2']);
    expect(r.status, r.stderr).toBe(0);
    const plate = PNG.sync.read(readFileSync(out));
    expect([plate.width, plate.height]).toEqual([shown.width, shown.height]);
    let differ = 0;
    for (let p = 0; p < plate.width * plate.height * 4; p++) if (plate.data[p] !== shown.data[p]) differ++;
    expect(differ, 'channels that differ between the plate and the screen').toBe(0);
    // The screenshot for the README: the period-3 bulb and its neighbours, the probe panel filled in at its nucleus.
    await page.evaluate(() => {
      (globalThis as WithSurvey).location.hash = 're=-0.1225611668766536&im=0.7448617666197442&span=0.62';
    });
    await settled(page);
    await page.mouse.click(box.x + v.width / 2, box.y + v.height / 2);
    await page.waitForFunction(() => (globalThis as WithSurvey).document.getElementById('point-facts')!.textContent!.includes('angles'), null, { timeout: 30_000 });
    await page.mouse.move(box.x + v.width * 0.3, box.y + v.height * 0.62);
    mkdirSync(path.join(ROOT, 'docs/images'), { recursive: true });
    await page.screenshot({ path: path.join(ROOT, 'docs/images/survey.png') });
    await page.close();
  }, 300_000);
});
