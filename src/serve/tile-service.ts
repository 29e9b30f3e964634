/**
 * Tiles on demand for the survey page, by the plates' own path: the frame at
 * a level becomes a sheet (the survey's base sheet with that view), the sheet
 * becomes a plate job through render/sheet-job.ts exactly as `plate` builds
 * it (so the deep arithmetic computes one reference orbit and table per
 * frame and level, shared by its tiles), and the tile is rendered by the
 * plate tile worker and encoded as an 8-bit PNG. A tile is therefore the
 * crop of `plate` of that sheet at the tile's rectangle, byte for byte
 * (test/serve/survey-tiles.test.ts).
 *
 * Memory is bounded: at most MAX_JOBS prepared jobs, a byte budget for the
 * encoded tiles (least recently used first out), and the pool's queue bound
 * for the tiles in flight.
 */
import { encodePngTile } from '../io/iiif-tile-file.js';
import type { PlateJob } from '../render/plate-job.js';
import { sheetArithmetic, sheetJob } from '../render/sheet-job.js';
import { UserError } from '../check/user-error.js';
import { doubleGrid } from '../view/view.js';
import { resolveIterations, type Sheet } from '../view/sheet.js';
import { spanAtLevel, tileRect, type Frame, type TileRequest } from './survey-params.js';
import { juliaSheetJob } from '../render/render-julia.js';
import { parseJuliaSheet, type JuliaSheet } from '../view/julia-sheet.js';
import { TilePool } from './tile-pool.js';

/** Prepared jobs kept (a deep job holds its reference orbit and table). */
export const MAX_JOBS = 8;
/** Deep jobs hold 16 bytes (orbit) + about 170 (table) an iteration; refuse a frame beyond this many iterations. */
export const MAX_SURVEY_ITERATIONS = 2_000_000;

/** The sheet a frame at a level stands for: the base sheet with that view and size, 8 bits, no legend, no labels. */
export function frameSheet(base: Sheet, frame: Frame, level: number): Sheet {
  return {
    ...base,
    view: { re: frame.re, im: frame.im, span: spanAtLevel(frame.span, level), rotation: 0 },
    width: frame.width,
    height: frame.height,
    depth: 8,
    labels: 0,
    colour: { ...base.colour, legend: 'none' },
  };
}

/** The survey's base sheet: the given sheet made fit for tiles (8 bits, no legend, no labels, no rotation). */
export function surveyBase(sheet: Sheet): Sheet {
  return { ...sheet, depth: 8, labels: 0, colour: { ...sheet.colour, legend: 'none' }, view: { ...sheet.view, rotation: 0 }, output: { ...sheet.output, data: null } };
}

/** Iterations of the Julia inset: enough for the sets near the boundary a click lands on, cheap at inset size. */
export const JULIA_INSET_ITERATIONS = 2000;

/**
 * The Julia sheet of the page's inset for c: the whole filled Julia set
 * (centre 0, span 3.6) at size x size pixels, with the base sheet's colouring
 * and samples, in doubles. `quadatlas julia` of this sheet gives the same bytes.
 */
export function juliaInsetSheet(base: Sheet, c: { re: string; im: string }, size: number): JuliaSheet {
  return parseJuliaSheet({
    kind: 'julia',
    c: { re: c.re, im: c.im },
    view: { re: '0', im: '0', span: '3.6' },
    pixels: { width: size, height: size },
    iterations: JULIA_INSET_ITERATIONS,
    samples: base.samples,
    arithmetic: 'double',
    colour: base.colour,
  });
}

class Lru<V> {
  private readonly map = new Map<string, { value: V; bytes: number }>();
  private total = 0;
  constructor(
    private readonly maxBytes: number,
    private readonly maxEntries: number,
  ) {}
  get(key: string): V | undefined {
    const e = this.map.get(key);
    if (e === undefined) return undefined;
    this.map.delete(key);
    this.map.set(key, e);
    return e.value;
  }
  set(key: string, value: V, bytes: number): void {
    const old = this.map.get(key);
    if (old !== undefined) {
      this.total -= old.bytes;
      this.map.delete(key);
    }
    this.map.set(key, { value, bytes });
    this.total += bytes;
    for (const [k, e] of this.map) {
      if (this.total <= this.maxBytes && this.map.size <= this.maxEntries) break;
      this.map.delete(k);
      this.total -= e.bytes;
    }
  }
  get bytes(): number {
    return this.total;
  }
  get size(): number {
    return this.map.size;
  }
}

export interface TileServiceOptions {
  readonly workers: number;
  /** Tiles waiting for a worker before new ones are shed. */
  readonly maxQueue: number;
  /** Byte budget of the encoded-tile cache. */
  readonly cacheBytes: number;
}

export interface TileAnswer {
  readonly png: Buffer;
  readonly rect: { x0: number; y0: number; w: number; h: number };
  readonly cached: boolean;
}

export class TileService {
  private readonly pool: TilePool;
  private readonly jobs = new Lru<{ key: string; job: PlateJob }>(Number.POSITIVE_INFINITY, MAX_JOBS);
  private readonly tiles: Lru<Buffer>;
  /** Tiles being rendered, shared by every request for the same tile. */
  private readonly inFlight = new Map<string, { promise: Promise<Buffer>; waiters: number; abort: AbortController }>();

  constructor(
    private readonly base: Sheet,
    options: TileServiceOptions,
  ) {
    this.pool = new TilePool(options.workers, options.maxQueue);
    this.tiles = new Lru<Buffer>(options.cacheBytes, Number.POSITIVE_INFINITY);
  }

  get cacheBytes(): number {
    return this.tiles.bytes;
  }

  get queued(): number {
    return this.pool.queued;
  }

  /** The plate job of a frame at a level (prepared once, then kept while recently used). */
  job(frame: Frame, level: number): { key: string; job: PlateJob } {
    const sheet = frameSheet(this.base, frame, level);
    const key = JSON.stringify([sheet.view.re, sheet.view.im, sheet.view.span, sheet.width, sheet.height]);
    const known = this.jobs.get(key);
    if (known !== undefined) return known;
    const iterations = resolveIterations(sheet);
    if (iterations > MAX_SURVEY_ITERATIONS)
      throw new UserError('level', `a view needing at most ${MAX_SURVEY_ITERATIONS} iterations in the survey (use plate for deeper ones)`, iterations);
    const prepared = sheetJob(
      sheet,
      doubleGrid({ centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, width: sheet.width, height: sheet.height, rotation: 0 }),
      iterations,
      sheetArithmetic(sheet),
      { depth: 8, withData: false, labels: [] },
    );
    const entry = { key, job: prepared.job };
    this.jobs.set(key, entry, 0);
    return entry;
  }

  /**
   * The tile as PNG. `signal` says the asker has gone: the render is withdrawn
   * when nobody else waits for the same tile and it has not started.
   */
  async tile(t: TileRequest, signal?: AbortSignal): Promise<TileAnswer> {
    const rect = tileRect(t);
    const { key: jobKey, job } = this.job(t.frame, t.level);
    const key = `${jobKey}|${rect.x0},${rect.y0},${rect.w},${rect.h}`;
    const hit = this.tiles.get(key);
    if (hit !== undefined) return { png: hit, rect, cached: true };
    let flight = this.inFlight.get(key);
    if (flight === undefined) {
      const abort = new AbortController();
      const promise = this.pool.render(jobKey, job, { index: 0, ...rect }, abort.signal).then((done) => {
        const png = encodePngTile(done.pixels as Uint8Array, rect.w, rect.h);
        this.tiles.set(key, png, png.length);
        return png;
      });
      const entry = { promise, waiters: 0, abort };
      flight = entry;
      this.inFlight.set(key, entry);
      promise.then(
        () => this.inFlight.delete(key),
        () => this.inFlight.delete(key),
      );
    }
    const mine = flight;
    mine.waiters++;
    const leave = (): void => {
      mine.waiters--;
      if (mine.waiters === 0) mine.abort.abort();
    };
    signal?.addEventListener('abort', leave, { once: true });
    try {
      return { png: await mine.promise, rect, cached: false };
    } finally {
      signal?.removeEventListener('abort', leave);
      if (signal?.aborted !== true) mine.waiters--;
    }
  }

  /** The Julia inset of c as PNG (rendered by the same pool, cached with the tiles). */
  async julia(c: { re: string; im: string }, size: number, signal?: AbortSignal): Promise<Buffer> {
    const key = JSON.stringify(['julia', c.re, c.im, size]);
    const hit = this.tiles.get(key);
    if (hit !== undefined) return hit;
    let known = this.jobs.get(key);
    if (known === undefined) {
      known = { key, job: juliaSheetJob(juliaInsetSheet(this.base, c, size)).job };
      this.jobs.set(key, known, 0);
    }
    const done = await this.pool.render(key, known.job, { index: 0, x0: 0, y0: 0, w: size, h: size }, signal);
    const png = encodePngTile(done.pixels as Uint8Array, size, size);
    this.tiles.set(key, png, png.length);
    return png;
  }

  async close(): Promise<void> {
    await this.pool.close();
  }
}
