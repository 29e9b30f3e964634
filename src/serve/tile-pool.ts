/**
 * A fixed pool of tile workers (the plates' own workers/tile-worker.ts) that
 * serves tiles of many plate jobs: each request names its job, and a worker
 * is sent that job (one structured clone; the deep reference orbit and table
 * travel as shared buffers) only when it last rendered another. Requests wait
 * in a bounded queue; one not yet started can be withdrawn (the page has
 * moved on). A worker that dies is replaced, and only its tile fails.
 */
import { Worker } from 'node:worker_threads';
import type { PlateJob } from '../render/plate-job.js';
import type { FromWorker, TileDoneMessage, ToWorker } from '../render/tile-messages.js';
import { builtWorkerUrl } from '../threads/built-worker.js';
import type { Tile } from '../view/tile-plan.js';

interface Request {
  readonly jobKey: string;
  readonly job: PlateJob;
  readonly tile: Tile;
  resolve: (r: TileDoneMessage) => void;
  reject: (e: Error) => void;
}

interface Slot {
  worker: Worker;
  jobKey: string | null;
  current: Request | null;
}

/** Thrown when the queue is full: the server answers 503 (shed). */
export class QueueFull extends Error {
  override readonly name = 'QueueFull';
}

/** Thrown to a request withdrawn before a worker took it. */
export class Withdrawn extends Error {
  override readonly name = 'Withdrawn';
}

export class TilePool {
  private readonly slots: Slot[] = [];
  private readonly queue: Request[] = [];
  private closed = false;

  constructor(
    size: number,
    private readonly maxQueue: number,
  ) {
    for (let i = 0; i < Math.max(1, size); i++) this.slots.push(this.spawn());
  }

  /** Requests waiting for a worker. */
  get queued(): number {
    return this.queue.length;
  }

  /**
   * Renders `tile` of `job` (`jobKey` names the job: equal keys, equal jobs).
   * Rejects with QueueFull at once when maxQueue requests already wait.
   * `signal` withdraws the request while it still waits.
   */
  render(jobKey: string, job: PlateJob, tile: Tile, signal?: AbortSignal): Promise<TileDoneMessage> {
    if (this.closed) return Promise.reject(new Error('tile pool closed'));
    if (this.queue.length >= this.maxQueue) return Promise.reject(new QueueFull(`more than ${this.maxQueue} tiles waiting`));
    return new Promise((resolve, reject) => {
      const request: Request = { jobKey, job, tile, resolve, reject };
      this.queue.push(request);
      signal?.addEventListener(
        'abort',
        () => {
          const k = this.queue.indexOf(request);
          if (k >= 0) {
            this.queue.splice(k, 1);
            reject(new Withdrawn('withdrawn'));
          }
        },
        { once: true },
      );
      this.pump();
    });
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const r of this.queue.splice(0)) r.reject(new Error('tile pool closed'));
    await Promise.all(this.slots.map((s) => s.worker.terminate()));
  }

  private spawn(): Slot {
    const worker = new Worker(builtWorkerUrl('tile-worker'));
    const slot: Slot = { worker, jobKey: null, current: null };
    worker.on('message', (m: FromWorker) => this.onMessage(slot, m));
    worker.on('error', (e) => this.replace(slot, e));
    worker.on('exit', (code) => {
      if (!this.closed && code !== 0) this.replace(slot, new Error(`tile worker exited with code ${code}`));
    });
    return slot;
  }

  /** Fails the slot's tile and puts a fresh worker in its place. */
  private replace(slot: Slot, e: Error): void {
    if (this.closed) return;
    const k = this.slots.indexOf(slot);
    if (k < 0) return;
    slot.current?.reject(e);
    slot.current = null;
    void slot.worker.terminate();
    this.slots[k] = this.spawn();
    this.pump();
  }

  private pump(): void {
    for (;;) {
      const idle = this.slots.filter((s) => s.current === null);
      if (idle.length === 0 || this.queue.length === 0) return;
      const request = this.queue.shift()!;
      // A worker that holds the job already saves a clone of it.
      const slot = idle.find((s) => s.jobKey === request.jobKey) ?? idle[0]!;
      if (slot.jobKey !== request.jobKey) {
        const init: ToWorker = { type: 'init', job: request.job };
        slot.worker.postMessage(init);
        slot.jobKey = request.jobKey;
      }
      slot.current = request;
      const msg: ToWorker = { type: 'tile', tile: request.tile };
      slot.worker.postMessage(msg);
    }
  }

  private onMessage(slot: Slot, m: FromWorker): void {
    const request = slot.current;
    slot.current = null;
    if (m.type === 'failed') request?.reject(new Error(`tile worker failed: ${m.message.split('\n')[0]}`));
    else request?.resolve(m);
    this.pump();
  }
}
