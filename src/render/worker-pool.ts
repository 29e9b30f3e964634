/**
 * A fixed pool of tile workers (worker_threads). Tiles are handed out as
 * workers become free; results come back with their arrays transferred.
 * The order in which tiles finish never matters to the output: the caller
 * places each tile by its coordinates. Each worker holds up to IN_FLIGHT
 * tiles, so that it starts its next tile at once instead of waiting for the
 * main thread (busy placing tiles and filtering PNG rows) to send one.
 */
import { Worker } from 'node:worker_threads';
import type { Tile } from '../view/tile-plan.js';
import type { FromWorker, TileDoneMessage, ToWorker } from './tile-messages.js';
import type { PlateJob } from './plate-job.js';
import { builtWorkerUrl } from '../threads/built-worker.js';

/** Tiles handed to one worker at a time (a worker answers its tiles in the order it got them). */
const IN_FLIGHT = 2;

interface Pending {
  tile: Tile;
  resolve: (r: TileDoneMessage) => void;
  reject: (e: Error) => void;
}

export class WorkerPool {
  private readonly workers: Worker[] = [];
  /** Workers with room for another tile, once per free place. */
  private readonly idle: Worker[] = [];
  private readonly queue: Pending[] = [];
  private readonly busy = new Map<Worker, Pending[]>();
  private failure: Error | undefined;

  constructor(size: number, job: PlateJob) {
    const url = builtWorkerUrl('tile-worker');
    for (let i = 0; i < size; i++) {
      const w = new Worker(url);
      w.on('message', (m: FromWorker) => this.onMessage(w, m));
      w.on('error', (e) => this.fail(e));
      w.on('exit', (code) => {
        if (code !== 0 && (this.busy.get(w)?.length ?? 0) > 0) this.fail(new Error(`tile worker exited with code ${code}`));
      });
      const init: ToWorker = { type: 'init', job };
      w.postMessage(init);
      this.workers.push(w);
      this.busy.set(w, []);
    }
    // the first tiles go one to each worker before any worker gets a second
    for (let k = 0; k < IN_FLIGHT; k++) for (const w of this.workers) this.idle.push(w);
  }

  render(tile: Tile): Promise<TileDoneMessage> {
    if (this.failure) return Promise.reject(this.failure);
    return new Promise((resolve, reject) => {
      this.queue.push({ tile, resolve, reject });
      this.pump();
    });
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }

  private pump(): void {
    while (this.idle.length > 0 && this.queue.length > 0) {
      const w = this.idle.shift()!;
      const p = this.queue.shift()!;
      this.busy.get(w)!.push(p);
      const msg: ToWorker = { type: 'tile', tile: p.tile };
      w.postMessage(msg);
    }
  }

  private onMessage(w: Worker, m: FromWorker): void {
    const p = this.busy.get(w)?.shift();
    if (m.type === 'failed') {
      this.fail(new Error(`tile worker failed: ${m.message}`));
      return;
    }
    this.idle.push(w);
    p?.resolve(m);
    this.pump();
  }

  private fail(e: Error): void {
    if (this.failure) return;
    this.failure = e;
    for (const p of [...[...this.busy.values()].flat(), ...this.queue]) p.reject(e);
    for (const list of this.busy.values()) list.length = 0;
    this.queue.length = 0;
  }
}
