/**
 * A fixed pool of tile workers (worker_threads). Tiles are handed out as
 * workers become free; results come back with their arrays transferred.
 * The order in which tiles finish never matters to the output: the caller
 * places each tile by its coordinates.
 */
import { Worker } from 'node:worker_threads';
import type { Tile } from '../view/tile-plan.js';
import type { FromWorker, TileDoneMessage, ToWorker } from './tile-messages.js';
import type { PlateJob } from './plate-job.js';
import { builtWorkerUrl } from '../threads/built-worker.js';

interface Pending {
  tile: Tile;
  resolve: (r: TileDoneMessage) => void;
  reject: (e: Error) => void;
}

export class WorkerPool {
  private readonly workers: Worker[] = [];
  private readonly idle: Worker[] = [];
  private readonly queue: Pending[] = [];
  private readonly busy = new Map<Worker, Pending>();
  private failure: Error | undefined;

  constructor(size: number, job: PlateJob) {
    const url = builtWorkerUrl('tile-worker');
    for (let i = 0; i < size; i++) {
      const w = new Worker(url);
      w.on('message', (m: FromWorker) => this.onMessage(w, m));
      w.on('error', (e) => this.fail(e));
      w.on('exit', (code) => {
        if (code !== 0 && this.busy.has(w)) this.fail(new Error(`tile worker exited with code ${code}`));
      });
      const init: ToWorker = { type: 'init', job };
      w.postMessage(init);
      this.workers.push(w);
      this.idle.push(w);
    }
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
      const w = this.idle.pop()!;
      const p = this.queue.shift()!;
      this.busy.set(w, p);
      const msg: ToWorker = { type: 'tile', tile: p.tile };
      w.postMessage(msg);
    }
  }

  private onMessage(w: Worker, m: FromWorker): void {
    const p = this.busy.get(w);
    this.busy.delete(w);
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
    for (const p of [...this.busy.values(), ...this.queue]) p.reject(e);
    this.busy.clear();
    this.queue.length = 0;
  }
}
