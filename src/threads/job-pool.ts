/**
 * mapOnWorkers' contract (one reply per job message, replies placed by index)
 * over workers that outlive one map: a caller that maps many times (the
 * sliced census lists every slice) starts its threads once.
 */
import { Worker } from 'node:worker_threads';

export class JobPool<Job, Reply> {
  private readonly workers: Worker[];

  constructor(script: URL, size: number) {
    this.workers = Array.from({ length: Math.max(1, size) }, () => new Worker(script));
  }

  /**
   * Runs jobs 0 .. count - 1, each reply passed to onReply with its index; one
   * map at a time. Each worker holds up to `inFlight` jobs (it answers them in
   * the order it got them), so it does not wait for this thread between jobs.
   */
  async map(count: number, makeJob: (index: number) => { message: Job; transfer?: ArrayBuffer[] }, onReply: (index: number, reply: Reply) => void, inFlight = 2): Promise<void> {
    let next = 0;
    const used = this.workers.slice(0, Math.max(1, Math.min(this.workers.length, count)));
    await Promise.all(
      used.map(
        (w) =>
          new Promise<void>((resolve, reject) => {
            const held: number[] = [];
            const detach = (): void => {
              w.off('message', onMessage);
              w.off('error', onError);
              w.off('exit', onExit);
            };
            const fill = (): void => {
              while (held.length < inFlight && next < count) {
                const index = next++;
                held.push(index);
                const { message, transfer } = makeJob(index);
                w.postMessage(message, transfer ?? []);
              }
              if (held.length === 0) {
                detach();
                resolve();
              }
            };
            const onMessage = (reply: Reply): void => {
              try {
                onReply(held.shift()!, reply);
              } catch (err) {
                detach();
                reject(err as Error);
                return;
              }
              fill();
            };
            const onError = (err: Error): void => {
              detach();
              reject(err);
            };
            const onExit = (code: number): void => {
              detach();
              reject(new Error(`worker exited with code ${code} before its jobs were done`));
            };
            w.on('message', onMessage);
            w.on('error', onError);
            w.on('exit', onExit);
            fill();
          }),
      ),
    );
  }

  async close(): Promise<void> {
    await Promise.all(this.workers.map((w) => w.terminate()));
  }
}
