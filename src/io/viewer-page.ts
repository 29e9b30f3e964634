/**
 * The viewer page of a pyramid: index.html in the pyramid's folder, with
 * OpenSeadragon (BSD-3-Clause; its licence is copied beside it) in
 * viewer/. It needs no network, and works both from a web server and from
 * file://: the page reads the image information from tiles/info.js (a
 * script, where file:// would block fetching info.json), sets the service's
 * `id` from its own location, and draws with the 2-D canvas drawer (the WebGL
 * drawer cannot upload images from a file:// page and stays black). See
 * ecosystem.md section 4.
 *
 * The page shows the view's parameters and, under the pointer, the parameter
 * c, with as many decimals as the current zoom resolves.
 */
import { mkdir, readdir, readFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import path from 'node:path';
import { firstPeriods, legendSvg } from '../colour/legend.js';
import { figureFont } from '../figure/figure-font.js';
import type { Sheet } from '../view/sheet.js';
import { INFO_GLOBAL, TILES_FOLDER } from './iiif-tree.js';
import { writeFileAtomic } from './write-file-atomic.js';

export const VIEWER_FOLDER = 'viewer';

/** OpenSeadragon's build folder (openseadragon.min.js, images/) and its licence file. */
function openSeadragonFiles(): { build: string; licence: string } {
  const main = createRequire(import.meta.url).resolve('openseadragon');
  const build = path.dirname(main);
  return { build, licence: path.resolve(build, '../../LICENSE.txt') };
}

function escapeHtml(s: string): string {
  return s.replace(/[&<>"']/g, (ch) => `&#${ch.charCodeAt(0)};`);
}

/** JSON safe inside a <script> element. */
function scriptJson(value: unknown): string {
  return JSON.stringify(value).replace(/</g, '\\u003c');
}

export interface ViewerFacts {
  readonly sheet: Sheet;
  readonly tileSize: number;
  readonly format: string;
  readonly version: string;
}

export function viewerHtml(f: ViewerFacts): string {
  const { sheet } = f;
  const title = sheet.title === '' ? 'quadatlas pyramid' : sheet.title;
  const im = sheet.view.im.startsWith('-') ? `- ${sheet.view.im.slice(1)}` : `+ ${sheet.view.im.replace(/^\+/, '')}`;
  const view = {
    re: sheet.view.re,
    im: sheet.view.im,
    span: sheet.view.span,
    rotation: sheet.view.rotation,
    width: sheet.width,
    height: sheet.height,
  };
  const legend =
    sheet.colour.legend === 'none' ? '' : `<details id="legend"><summary>period legend</summary>${legendSvg(firstPeriods(sheet.colour.legendPeriods), figureFont())}</details>`;
  const rows: Array<[string, string]> = [
    ['centre', `${sheet.view.re} ${im} i`],
    ['span', `${sheet.view.span} (width in c)`],
    ['rotation', `${sheet.view.rotation}°`],
    ['base size', `${sheet.width} × ${sheet.height} pixels`],
    ['iterations', String(sheet.iterations)],
    ['samples', `${sheet.samples} per refined pixel`],
    ['tiles', `${f.tileSize} px, ${f.format}`],
  ];
  return `<!doctype html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<link rel="icon" href="data:,">
<title>${escapeHtml(title)}</title>
<style>
html, body { margin: 0; height: 100%; background: #111; color: #eee; font: 13px/1.4 system-ui, sans-serif; }
#view { position: absolute; inset: 0; }
#panel { position: absolute; right: 8px; top: 8px; max-width: 26em; padding: 8px 10px; background: rgba(0, 0, 0, 0.72); border-radius: 4px; }
#panel h1 { font-size: 14px; margin: 0 0 4px; }
#panel dl { display: grid; grid-template-columns: auto 1fr; gap: 0 10px; margin: 4px 0; }
#panel dt { color: #aaa; }
#panel dd { margin: 0; font-family: ui-monospace, monospace; overflow-wrap: anywhere; }
#pointer { font-family: ui-monospace, monospace; white-space: pre; }
#status:empty { display: none; }
#status { color: #f99; }
#legend { margin-top: 4px; cursor: pointer; }
#legend svg { display: block; width: 12em; height: auto; margin-top: 4px; }
</style>
</head>
<body>
<div id="view"></div>
<div id="panel">
<h1>${escapeHtml(title)}</h1>
${sheet.note === '' ? '' : `<p>${escapeHtml(sheet.note)}</p>\n`}<dl>
${rows.map(([k, v]) => `<dt>${k}</dt><dd>${escapeHtml(v)}</dd>`).join('\n')}
</dl>
<div id="pointer">c = (move the pointer over the image)</div>
<div id="status"></div>
${legend}
</div>
<script src="${VIEWER_FOLDER}/openseadragon.min.js"></script>
<script src="${TILES_FOLDER}/info.js"></script>
<script>
"use strict";
const view = ${scriptJson(view)};
// Pixel (i, j) of the base image samples c at its cell centre; j grows downwards,
// the imaginary part upwards; rotation turns the image about its centre (src/view/view.ts).
const quarter = view.rotation % 90 === 0;
const q = (((view.rotation / 90) % 4) + 4) % 4;
const turn = (view.rotation * Math.PI) / 180;
const cos = quarter ? [1, 0, -1, 0][q] : Math.cos(turn);
const sin = quarter ? [0, 1, 0, -1][q] : Math.sin(turn);
const spacing = Number(view.span) / view.width;
function cAt(x, y) {
  const u = (x - view.width / 2) * spacing;
  const v = (view.height / 2 - y) * spacing;
  return [Number(view.re) + (u * cos - v * sin), Number(view.im) + (u * sin + v * cos)];
}
const info = Object.assign({}, window.${INFO_GLOBAL}, { id: new URL('${TILES_FOLDER}', location.href).href });
const viewer = OpenSeadragon({ id: 'view', prefixUrl: '${VIEWER_FOLDER}/images/', tileSources: [info], drawer: 'canvas', showNavigator: false });
window.quadatlasViewer = viewer;
window.quadatlasTileFailures = 0;
const status = document.getElementById('status');
viewer.addHandler('tile-load-failed', (e) => {
  window.quadatlasTileFailures += 1;
  status.textContent = window.quadatlasTileFailures + ' tile(s) failed to load';
});
const pointer = document.getElementById('pointer');
function show(position) {
  const vp = viewer.viewport.pointFromPixel(position, true);
  const img = viewer.viewport.viewportToImageCoordinates(vp);
  const screenPixel = spacing / viewer.viewport.viewportToImageZoom(viewer.viewport.getZoom(true));
  const digits = Math.min(100, Math.max(2, Math.ceil(-Math.log10(screenPixel)) + 1));
  const c = cAt(img.x, img.y);
  const imText = (c[1] < 0 ? '- ' : '+ ') + Math.abs(c[1]).toFixed(digits);
  pointer.textContent = 'c = ' + c[0].toFixed(digits) + ' ' + imText + ' i\\npixel ' + img.x.toFixed(1) + ', ' + img.y.toFixed(1);
}
new OpenSeadragon.MouseTracker({ element: viewer.canvas, moveHandler: (e) => show(e.position) });
</script>
</body>
</html>
`;
}

/** Writes index.html and copies OpenSeadragon (script, button images, licence) into dir/viewer. */
export async function writeViewer(dir: string, facts: ViewerFacts): Promise<string[]> {
  const { build, licence } = openSeadragonFiles();
  const target = path.join(dir, VIEWER_FOLDER);
  const written: string[] = [];
  const copy = async (from: string, to: string): Promise<void> => {
    await mkdir(path.dirname(to), { recursive: true });
    await writeFileAtomic(to, await readFile(from));
    written.push(to);
  };
  await copy(path.join(build, 'openseadragon.min.js'), path.join(target, 'openseadragon.min.js'));
  await copy(licence, path.join(target, 'LICENSE.txt'));
  for (const name of (await readdir(path.join(build, 'images'))).sort()) {
    if (name.endsWith('.png')) await copy(path.join(build, 'images', name), path.join(target, 'images', name));
  }
  const page = path.join(dir, 'index.html');
  await writeFileAtomic(page, viewerHtml(facts));
  written.push(page);
  return written;
}
