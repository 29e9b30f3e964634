// Render a small plate of the whole set into memory (no files, no worker
// threads) and encode it as PNG bytes in a Buffer.
import { PNG } from 'pngjs';
import { createTileScratch, DEFAULT_COLOUR_SETTINGS, DEFAULT_ESCAPE_RADIUS, doubleGrid, renderTile } from 'quadatlas';

const width = 160;
const height = 120;
const grid = doubleGrid({ centerRe: '-0.75', centerIm: '0', span: '3.2', width, height, rotation: 0 });
const job = {
  grid,
  iterations: 1000,
  escapeRadius: DEFAULT_ESCAPE_RADIUS,
  periodTolerance: Math.min(1e-6, Math.max(grid.spacing * 1e-3, 1e-15)),
  samples: 4,
  depth: 8,
  colour: DEFAULT_COLOUR_SETTINGS,
  dpi: 72,
  withData: false,
};
// One tile covering the whole image; renderPlate spreads many tiles over threads instead.
const side = Math.max(width, height);
const { pixels, stats } = renderTile(job, { index: 0, x0: 0, y0: 0, w: width, h: height }, createTileScratch(side));

const png = new PNG({ width, height, colorType: 2, inputColorType: 2, inputHasAlpha: false });
png.data = Buffer.from(pixels.buffer, pixels.byteOffset, pixels.byteLength);
const bytes = PNG.sync.write(png, { colorType: 2, inputColorType: 2, inputHasAlpha: false });

console.log(`rgb bytes: ${pixels.length}`);
console.log(`png bytes: ${bytes.length}`);
console.log(`escaped ${stats.escaped}, interior ${stats.interior}, undecided ${stats.undecided}`);
console.log(`periods: ${JSON.stringify(stats.periods)}`);
