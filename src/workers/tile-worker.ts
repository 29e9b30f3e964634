/**
 * Worker entry point: receives the plate job once, then renders tiles one at
 * a time and sends each back with its arrays in the transfer list.
 */
import { parentPort } from 'node:worker_threads';
import { createTileScratch, renderTile, type TileScratch } from '../render/render-tile.js';
import type { PlateJob } from '../render/plate-job.js';
import { pickEscapeLoop } from '../render/pick-escape-loop.js';
import type { FromWorker, ToWorker } from '../render/tile-messages.js';

const port = parentPort;
if (port === null) throw new Error('tile-worker must run in a worker thread');

let job: PlateJob | undefined;
let scratch: TileScratch | undefined;
const loop = pickEscapeLoop();

port.on('message', (message: ToWorker) => {
  try {
    if (message.type === 'init') {
      job = message.job;
      scratch = undefined;
      return;
    }
    if (job === undefined) throw new Error('tile before init');
    const { tile } = message;
    const side = Math.max(tile.w, tile.h);
    if (scratch === undefined || scratch.maxTile < side) scratch = createTileScratch(side);
    // No legend here: an inset legend needs the whole plate's histogram, so render-plate.ts composites it.
    const r = renderTile(job, tile, scratch, loop, null);
    const reply: FromWorker = { type: 'tile-done', tile, ...r };
    const transfer: ArrayBuffer[] = [r.pixels.buffer as ArrayBuffer];
    for (const a of [r.linear, r.period, r.smooth, r.distance, r.interior, r.basin]) if (a !== undefined) transfer.push(a.buffer as ArrayBuffer);
    port.postMessage(reply, transfer);
  } catch (err) {
    const reply: FromWorker = { type: 'failed', message: err instanceof Error ? (err.stack ?? err.message) : String(err) };
    port.postMessage(reply);
  }
});
