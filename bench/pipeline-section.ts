/**
 * Where a plate's time goes, measured in this process on one thread so the
 * two sides are counted exactly (docs/architecture.md, "a plate"):
 *
 * - inside: the escape loop itself (the WebAssembly kernel, or the JS loop),
 *   timed around every call the tile renderer makes to it;
 * - outside: everything else the plate costs, on every thread: the rest of
 *   renderTile (coordinates, closed-form interior, cycle confirmation,
 *   smooth count and distance, shading, refinement flags, encoding to sRGB
 *   with dither) plus the PNG filter and deflate of the whole image with the
 *   filter, zlib level and strategy 8-bit plates use (pngCompression: Paeth,
 *   level 6, Z_RLE), done synchronously here.
 *
 * The plate is the 1600 x 1600 whole-set view (centre -0.75, span 3), 3000
 * iterations, 1 sample, default colours. Times are CPU time of the process
 * (process.cpuUsage), which on a busy machine varies less than wall time.
 * Median of five runs, with min and max.
 */
import { deflateSync } from 'node:zlib';
import type { EscapeLoop } from '../src/plane/escape-loop.js';
import { pickEscapeLoop } from '../src/render/pick-escape-loop.js';
import { createTileScratch, renderTile } from '../src/render/render-tile.js';
import { sheetArithmetic, sheetIterations, sheetJob } from '../src/render/sheet-job.js';
import { adler32 } from '../src/io/adler32.js';
import { filterScanline } from '../src/io/png-filter.js';
import { pngCompression } from '../src/io/png-sink.js';
import { parseSheet } from '../src/view/sheet.js';
import { planStrips } from '../src/view/tile-plan.js';
import { doubleGrid } from '../src/view/view.js';
import type { BenchContext, BenchRow, BenchSection } from './bench-section.js';

const SIDE = 1600;
const RUNS = 5;

interface Split {
  inside: number;
  tiles: number;
  png: number;
  /** The filter and Adler-32: the part of `png` the PNG sink still does on the main thread (deflate runs on zlib's pool). */
  mainThread: number;
}

/** CPU seconds of the process since `t0` (user + system): steadier than wall time on a shared machine; the work here runs on this one thread. */
function seconds(t0: NodeJS.CpuUsage): number {
  const d = process.cpuUsage(t0);
  return (d.user + d.system) / 1e6;
}

function once(loop: EscapeLoop): Split {
  const sheet = parseSheet({
    kind: 'plate',
    schema: 1,
    view: { re: '-0.75', im: '0', span: '3' },
    pixels: { width: SIDE, height: SIDE },
    iterations: 3000,
    samples: 1,
    output: { file: 'out/pipeline.png' },
  });
  const grid = doubleGrid({ centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, width: SIDE, height: SIDE, rotation: 0 });
  const arith = sheetArithmetic(sheet);
  const { job } = sheetJob(sheet, grid, sheetIterations(sheet, arith).iterations, arith, { depth: 8, withData: false, labels: [] });
  let inside = 0;
  const timed: EscapeLoop = (cr, ci, n, maxIterations, r2, t2, out) => {
    const t0 = process.cpuUsage();
    loop(cr, ci, n, maxIterations, r2, t2, out);
    inside += seconds(t0);
  };
  const image = new Uint8Array(SIDE * SIDE * 3);
  const scratch = createTileScratch(64);
  const t0 = process.cpuUsage();
  for (const strip of planStrips(SIDE, SIDE, 64, 256)) {
    for (const tile of strip.tiles) {
      const r = renderTile(job, tile, scratch, timed, null);
      for (let j = 0; j < tile.h; j++) image.set(r.pixels.subarray(j * tile.w * 3, (j + 1) * tile.w * 3), ((tile.y0 + j) * SIDE + tile.x0) * 3);
    }
  }
  const tiles = seconds(t0);
  const t1 = process.cpuUsage();
  const stride = SIDE * 3;
  const filtered = new Uint8Array(SIDE * (stride + 1));
  let prev = new Uint8Array(stride);
  const { filter, level, strategy } = pngCompression(8);
  for (let y = 0; y < SIDE; y++) {
    const cur = image.subarray(y * stride, (y + 1) * stride);
    filterScanline(filtered, y * (stride + 1), cur, prev, 3, filter);
    prev = cur;
  }
  adler32(filtered);
  const mainThread = seconds(t1);
  deflateSync(filtered, { level, strategy });
  return { inside, tiles, png: seconds(t1), mainThread };
}

function stats(values: number[]): { median: number; min: number; max: number } {
  const s = [...values].sort((a, b) => a - b);
  return { median: s[Math.floor(s.length / 2)]!, min: s[0]!, max: s[s.length - 1]! };
}

export const pipelineSection: BenchSection = {
  name: 'pipeline',
  title: 'a plate outside its escape loop: 1600x1600 whole set, 3000 it., 1 sample, one thread (outside / inside)',
  run(context: BenchContext): BenchRow[] {
    const loop = pickEscapeLoop();
    once(loop); // warm-up (JIT, tables)
    const runs: Split[] = [];
    for (let r = 0; r < RUNS; r++) runs.push(once(loop));
    const inside = stats(runs.map((r) => r.inside));
    const rest = stats(runs.map((r) => r.tiles - r.inside));
    const png = stats(runs.map((r) => r.png));
    const mainThread = stats(runs.map((r) => r.mainThread));
    const ratio = stats(runs.map((r) => (r.tiles - r.inside + r.png) / r.inside));
    context.note(`outside / inside per run: median ${ratio.median.toFixed(3)}, min ${ratio.min.toFixed(3)}, max ${ratio.max.toFixed(3)} (target <= 0.5)`);
    context.note('outside = renderTile minus the loop, plus the PNG filter and deflate of the whole image as 8-bit plates do them (Paeth, level 6, Z_RLE); median of 5 runs');
    const row = (label: string, s: { median: number; min: number; max: number }): BenchRow => ({ label, figures: { median_s: s.median, min_s: s.min, max_s: s.max } });
    return [
      row('inside: escape loop', inside),
      row('outside: rest of the tile renderer', rest),
      row('outside: PNG filter + Adler-32 + deflate', png),
      row('  of which on the main thread in a plate: filter + Adler-32', mainThread),
      { label: 'outside / inside', figures: { median_s: ratio.median, min_s: ratio.min, max_s: ratio.max } },
    ];
  },
};
