/**
 * A fixed pool of pyramid workers (worker_threads). Each request names a
 * pyramid (spec and folder) and a tile number; the worker renders, encodes
 * and writes the tile and answers with a small record. A failed tile rejects
 * only its own promise (queue mode retries it); a worker thread that dies is
 * replaced.
 */
import { Worker } from 'node:worker_threads';
import type { FromPyramidWorker, PyramidTileDoneMessage, PyramidTileMessage } from './pyramid-messages.js';
import type { PyramidSpec } from '../view/pyramid-spec.js';
import { builtWorkerUrl } from '../threads/built-worker.js';

interface Pending {
  readonly message: PyramidTileMessage;
  readonly resolve: (r: PyramidTileDoneMessage) => void;
  readonly reject: (e: Error) => void;
}

export class PyramidPool {
  private readonly idle: Worker[] = [];
  private readonly queue: Pending[] = [];
  private readonly busy = new Map<Worker, Pending>();
  private readonly all = new Set<Worker>();
  private closed = false;

  constructor(readonly size: number) {
    for (let i = 0; i < size; i++) this.spawn();
  }

  /** Renders tile `index` of the pyramid `spec` into `dir` (skipped when already there). */
  render(key: string, spec: PyramidSpec, dir: string, index: number): Promise<PyramidTileDoneMessage> {
    if (this.closed) return Promise.reject(new Error('pyramid pool is closed'));
    return new Promise((resolve, reject) => {
      this.queue.push({ message: { type: 'tile', key, spec, dir, index }, resolve, reject });
      this.pump();
    });
  }

  /** Tiles waiting for a free worker plus tiles being rendered. */
  get load(): number {
    return this.queue.length + this.busy.size;
  }

  async close(): Promise<void> {
    this.closed = true;
    for (const p of this.queue) p.reject(new Error('pyramid pool closed'));
    this.queue.length = 0;
    await Promise.all([...this.all].map((w) => w.terminate()));
  }

  private spawn(): void {
    const w = new Worker(builtWorkerUrl('pyramid-worker'));
    this.all.add(w);
    w.on('message', (m: FromPyramidWorker) => this.onMessage(w, m));
    w.on('error', (e) => this.lost(w, e));
    w.on('exit', (code) => this.lost(w, new Error(`pyramid worker exited with code ${code}`)));
    this.idle.push(w);
  }

  private lost(w: Worker, e: Error): void {
    if (!this.all.delete(w)) return;
    const p = this.busy.get(w);
    this.busy.delete(w);
    const at = this.idle.indexOf(w);
    if (at >= 0) this.idle.splice(at, 1);
    p?.reject(e);
    if (!this.closed) {
      this.spawn();
      this.pump();
    }
  }

  private pump(): void {
    while (this.idle.length > 0 && this.queue.length > 0) {
      const w = this.idle.pop()!;
      const p = this.queue.shift()!;
      this.busy.set(w, p);
      w.postMessage(p.message);
    }
  }

  private onMessage(w: Worker, m: FromPyramidWorker): void {
    const p = this.busy.get(w);
    this.busy.delete(w);
    this.idle.push(w);
    if (p !== undefined) {
      if (m.type === 'tile-failed') p.reject(new Error(`tile ${m.index} failed: ${m.message}`));
      else p.resolve(m);
    }
    this.pump();
  }
}
