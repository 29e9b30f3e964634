/**
 * Pyramid worker entry point: renders one tile at a time (renderTile on the
 * level's plate job), encodes it and writes it to its IIIF path through a
 * temporary name. A tile already on disk is skipped, which makes reruns
 * resume and duplicate deliveries (queue mode) harmless.
 */
import path from 'node:path';
import { parentPort } from 'node:worker_threads';
import { iiifTilePath } from '../io/iiif-info.js';
import { encodeTile, tileFileSize, writeTileFile } from '../io/iiif-tile-file.js';
import { emptyStats, type PlateJob } from '../render/plate-job.js';
import { pickEscapeLoop } from '../render/pick-escape-loop.js';
import { levelJob, pyramidSetup, type PyramidSetup } from '../render/pyramid-job.js';
import { pyramidTileAt } from '../view/pyramid-plan.js';
import { createTileScratch, renderTile, type TileScratch } from '../render/render-tile.js';
import type { FromPyramidWorker, PyramidTileMessage } from '../render/pyramid-messages.js';

const port = parentPort;
if (port === null) throw new Error('pyramid-worker must run in a worker thread');

interface Cached {
  readonly setup: PyramidSetup;
  readonly jobs: Map<number, PlateJob>;
}

/** Setups by key; a worker rarely sees more than one pyramid, so keep a few. */
const setups = new Map<string, Cached>();
let scratch: TileScratch | undefined;
const loop = pickEscapeLoop();

function cachedSetup(m: PyramidTileMessage): Cached {
  let c = setups.get(m.key);
  if (c === undefined) {
    if (setups.size >= 4) setups.delete(setups.keys().next().value!);
    c = { setup: pyramidSetup(m.spec), jobs: new Map() };
    setups.set(m.key, c);
  }
  return c;
}

async function handle(m: PyramidTileMessage): Promise<FromPyramidWorker> {
  const { setup, jobs } = cachedSetup(m);
  const { plan, spec } = setup;
  const tile = pyramidTileAt(plan, m.index);
  const file = path.join(m.dir, 'tiles', iiifTilePath(plan, tile, spec.format));
  const existing = await tileFileSize(file);
  if (existing > 0) return { type: 'tile-done', index: m.index, skipped: true, bytes: existing, stats: emptyStats() };
  let job = jobs.get(tile.scale);
  if (job === undefined) {
    job = levelJob(setup, tile.scale);
    jobs.set(tile.scale, job);
  }
  if (scratch === undefined || scratch.maxTile < plan.tileSize) scratch = createTileScratch(plan.tileSize);
  const r = renderTile(job, { index: tile.index, x0: tile.x0, y0: tile.y0, w: tile.w, h: tile.h }, scratch, loop, null);
  const bytes = await encodeTile(r.pixels as Uint8Array, tile.w, tile.h, spec.format, spec.quality);
  await writeTileFile(file, bytes);
  return { type: 'tile-done', index: m.index, skipped: false, bytes: bytes.length, stats: r.stats };
}

port.on('message', (m: PyramidTileMessage) => {
  handle(m).then(
    (reply) => port.postMessage(reply),
    (err: unknown) => {
      const reply: FromPyramidWorker = { type: 'tile-failed', index: m.index, message: err instanceof Error ? (err.stack ?? err.message) : String(err) };
      port.postMessage(reply);
    },
  );
});
