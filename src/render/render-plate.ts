/**
 * Renders a plate strip by strip over a worker pool and hands finished rows
 * to the sinks, top to bottom. Memory is bounded by three strips (two queued
 * on the workers and one being written), never the whole image, except under
 * an inset legend:
 *
 * The inset legend lists the periods present in the whole view
 * (presentPeriods of the plate's histogram), which is known only once every
 * tile is done; strips stream out in order. We hold back the strips that the
 * legend may cover (legendBounds) until the histogram is complete, then
 * composite the legend in linear light onto the held tiles, encode them with
 * the same coordinate-seeded dither the workers use, and write them. A
 * deterministic low-resolution pre-pass was the alternative and was dropped:
 * it costs a second render of the view and still misses components smaller
 * than its pixels, so its legend could disagree with the plate's own
 * histogram. With a bottom corner (the default) only the last strips wait;
 * with a top corner every strip does, so the whole encoded plate is held in
 * memory (render-sheet.ts checks that it fits before rendering). The
 * histogram is a sum over tiles, so the legend, and the bytes, do not depend
 * on the worker count or the order tiles finish in.
 */
import { encodePixels } from '../colour/encode-pixels.js';
import { layoutLegend, paintLegendRect, presentPeriods } from '../colour/legend.js';
import { figureFont } from '../figure/figure-font.js';
import type { RasterSink } from '../io/raster-sink.js';
import { planStrips, type Strip } from '../view/tile-plan.js';
import type { TileDoneMessage } from './tile-messages.js';
import { addStats, emptyStats, type PlateJob, type TileStats } from './plate-job.js';
import { WorkerPool } from './worker-pool.js';

/** A sink for one per-pixel data array, written as rows (an NPY file). */
export interface DataSink {
  writeRows(values: ArrayBufferView, rowCount: number): Promise<void>;
  finish(): Promise<void>;
  abort(): Promise<void>;
}

export interface PlateSinks {
  readonly image: RasterSink;
  readonly period?: DataSink;
  readonly smooth?: DataSink;
  readonly distance?: DataSink;
  readonly interior?: DataSink;
  /** Julia plates: the interior class of each pixel (-1 outside). */
  readonly basin?: DataSink;
}

export interface RenderOptions {
  readonly workers: number;
  readonly tileSize: number;
  /** Bytes one strip may hold (pixels plus data); sets the strip height. */
  readonly stripBudget: number;
  readonly onProgress?: (tilesDone: number, tilesTotal: number) => void;
}

export const DEFAULT_TILE_SIZE = 64;
/** Strips queued on the workers at once (the one finishing and the next). */
const AHEAD = 2;
/** At most this many tile rows per strip, so writing overlaps rendering even for plates that would fit one strip. */
const MAX_TILE_ROWS_PER_STRIP = 4;
export const DEFAULT_STRIP_BUDGET = 96 * 1024 * 1024;

/** Bytes a strip holds per pixel: encoded RGB plus, with data, int32 + 2 x float64 + uint8 (and an int32 class on Julia plates). */
export function bytesPerPixel(job: PlateJob): number {
  return 3 * (job.depth / 8) + (job.withData ? 21 + (job.julia !== undefined ? 4 : 0) : 0);
}

/** Strip height in rows for a width and budget (a whole number of tiles, at least one). */
export function stripRows(width: number, job: PlateJob, tileSize: number, budget: number): number {
  const rows = Math.floor(budget / (width * bytesPerPixel(job)));
  return Math.max(tileSize, Math.min(MAX_TILE_ROWS_PER_STRIP * tileSize, Math.floor(rows / tileSize) * tileSize));
}

interface StripBuffers {
  pixels: Uint8Array | Uint16Array;
  period?: Int32Array;
  smooth?: Float64Array;
  distance?: Float64Array;
  interior?: Uint8Array;
  basin?: Int32Array;
}

function allocate(job: PlateJob, width: number, rows: number): StripBuffers {
  const n = width * rows;
  const b: StripBuffers = { pixels: job.depth === 16 ? new Uint16Array(n * 3) : new Uint8Array(n * 3) };
  if (job.withData) {
    b.period = new Int32Array(n);
    b.smooth = new Float64Array(n);
    b.distance = new Float64Array(n);
    b.interior = new Uint8Array(n);
    if (job.julia !== undefined) b.basin = new Int32Array(n);
  }
  return b;
}

/** Copies an encoded tile's pixels into its place in the strip. */
function placePixels(b: StripBuffers, strip: Strip, width: number, tile: Strip['tiles'][number], pixels: Uint8Array | Uint16Array): void {
  const { x0, y0, w, h } = tile;
  for (let j = 0; j < h; j++) b.pixels.set(pixels.subarray(j * w * 3, (j + 1) * w * 3), ((y0 - strip.y0 + j) * width + x0) * 3);
}

function place(b: StripBuffers, strip: Strip, width: number, t: TileDoneMessage): void {
  const { x0, y0, w, h } = t.tile;
  for (let j = 0; j < h; j++) {
    const row = (y0 - strip.y0 + j) * width + x0;
    b.pixels.set(t.pixels.subarray(j * w * 3, (j + 1) * w * 3), row * 3);
    if (b.period && t.period) b.period.set(t.period.subarray(j * w, (j + 1) * w), row);
    if (b.smooth && t.smooth) b.smooth.set(t.smooth.subarray(j * w, (j + 1) * w), row);
    if (b.distance && t.distance) b.distance.set(t.distance.subarray(j * w, (j + 1) * w), row);
    if (b.interior && t.interior) b.interior.set(t.interior.subarray(j * w, (j + 1) * w), row);
    if (b.basin && t.basin) b.basin.set(t.basin.subarray(j * w, (j + 1) * w), row);
  }
}

async function writeStrip(sinks: PlateSinks, b: StripBuffers, rows: number): Promise<void> {
  await sinks.image.writeRows(b.pixels, rows);
  if (sinks.period && b.period) await sinks.period.writeRows(b.period, rows);
  if (sinks.smooth && b.smooth) await sinks.smooth.writeRows(b.smooth, rows);
  if (sinks.distance && b.distance) await sinks.distance.writeRows(b.distance, rows);
  if (sinks.interior && b.interior) await sinks.interior.writeRows(b.interior, rows);
  if (sinks.basin && b.basin) await sinks.basin.writeRows(b.basin, rows);
}

/** Whether a strip meets the rows an inset legend may cover (so it waits for the histogram). */
function underLegend(job: PlateJob, strip: Strip): boolean {
  const b = job.legendBounds;
  return b !== undefined && strip.y0 < b.y + b.height && strip.y0 + strip.h > b.y;
}

/** Renders the whole plate into the sinks (which the caller finishes or aborts). */
export async function renderPlate(job: PlateJob, sinks: PlateSinks, options: RenderOptions): Promise<TileStats> {
  const { width, height } = job.grid;
  const rows = stripRows(width, job, options.tileSize, options.stripBudget);
  const strips = planStrips(width, height, options.tileSize, rows);
  const total = strips.reduce((s, st) => s + st.tiles.length, 0);
  const pool = new WorkerPool(Math.max(1, options.workers), job);
  const stats = emptyStats();
  let done = 0;
  options.onProgress?.(0, total);
  // Tiles of a strip are queued as soon as the strip before it is queued, so
  // workers never wait at a strip boundary; a finished strip is written while
  // the next ones are computed. At most AHEAD strips are queued at once.
  interface Started {
    strip: Strip;
    buffers: StripBuffers;
    /** Tiles that met the legend bounds, with their linear colours, to composite later. */
    held: Array<{ tile: Strip['tiles'][number]; linear: Float64Array }>;
    done: Promise<PromiseSettledResult<void>[]>;
  }
  const start = (strip: Strip): Started => {
    const buffers = allocate(job, width, strip.h);
    const held: Started['held'] = [];
    const results = strip.tiles.map((tile) =>
      pool.render(tile).then((t) => {
        place(buffers, strip, width, t);
        if (t.linear !== undefined) held.push({ tile: t.tile, linear: t.linear });
        addStats(stats, t.stats);
        done++;
        options.onProgress?.(done, total);
      }),
    );
    return { strip, buffers, held, done: Promise.allSettled(results) };
  };
  const throwFirst = (settled: PromiseSettledResult<unknown>[]): void => {
    const bad = settled.find((s): s is PromiseRejectedResult => s.status === 'rejected');
    if (bad) throw bad.reason;
  };
  try {
    let writing: Promise<void> = Promise.resolve();
    const queued = strips.slice(0, AHEAD).map(start);
    let next = queued.length;
    let legendDrawn = false;
    let legend: ReturnType<typeof layoutLegend> = null;
    for (let k = 0; k < strips.length; k++) {
      const hold = underLegend(job, strips[k]!);
      // From the first strip under the legend on, everything is queued at once:
      // the legend waits for every tile.
      if (hold) while (next < strips.length) queued.push(start(strips[next++]!));
      const current = queued.shift()!;
      throwFirst([...(await current.done), ...(await Promise.allSettled([writing]))]);
      if (next < strips.length) queued.push(start(strips[next++]!));
      if (hold) {
        if (!legendDrawn) {
          for (const q of queued) throwFirst(await q.done);
          legend = layoutLegend(job.colour, width, height, job.dpi, presentPeriods(stats.periods, job.colour), figureFont());
          legendDrawn = true;
        }
        if (legend !== null) {
          for (const { tile, linear } of current.held) {
            paintLegendRect(legend, tile.x0, tile.y0, tile.w, tile.h, linear);
            const pixels = job.depth === 16 ? new Uint16Array(tile.w * tile.h * 3) : new Uint8Array(tile.w * tile.h * 3);
            encodePixels(linear, tile.w, tile.h, tile.x0, tile.y0, job.depth, pixels);
            placePixels(current.buffers, current.strip, width, tile, pixels);
          }
        }
      }
      writing = writeStrip(sinks, current.buffers, current.strip.h);
    }
    await writing;
  } finally {
    await pool.close();
  }
  return stats;
}
