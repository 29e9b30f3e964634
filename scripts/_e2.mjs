import { encodePixels } from '../dist/src/colour/encode-pixels.js';
import { createTileScratch, renderTile } from '../dist/src/render/render-tile.js';
import { sheetArithmetic, sheetIterations, sheetJob } from '../dist/src/render/sheet-job.js';
import { parseSheet } from '../dist/src/view/sheet.js';
import { planStrips } from '../dist/src/view/tile-plan.js';
import { doubleGrid } from '../dist/src/view/view.js';
const SIDE = 1600;
const sheet = parseSheet({
  kind: 'plate',
  schema: 1,
  view: { re: '-0.75', im: '0', span: '3' },
  pixels: { width: SIDE, height: SIDE },
  iterations: 3000,
  samples: 1,
  output: { file: 'out/p.png' },
});
const grid = doubleGrid({ centerRe: '-0.75', centerIm: '0', span: '3', width: SIDE, height: SIDE, rotation: 0 });
const arith = sheetArithmetic(sheet);
const { job } = sheetJob(sheet, grid, 3000, arith, { depth: 8, withData: false, labels: [] });
const scratch = createTileScratch(64);
const tiles = planStrips(SIDE, SIDE, 64, 256)
  .flatMap((s) => s.tiles)
  .filter((t, i) => i % 25 === 0);
const lins = tiles.map((t) => {
  renderTile(job, t, scratch);
  return scratch.linear.slice(0, t.w * t.h * 3);
});
let slow = 0,
  total = 0;
for (const l of lins)
  for (const v of l) {
    total++;
    if (!(v > 0.0031308 && v < 0.999)) slow++;
  }
console.log('channels', total, 'outside power segment', slow);
const out = new Uint8Array(64 * 64 * 3);
for (let r = 0; r < 3; r++) {
  const t = process.cpuUsage();
  for (let rep = 0; rep < 25; rep++) lins.forEach((l, i) => encodePixels(l, tiles[i].w, tiles[i].h, tiles[i].x0, tiles[i].y0, 8, out));
  const us = process.cpuUsage(t).user;
  console.log('ns/channel', ((us * 1000) / (25 * total)).toFixed(1));
}
