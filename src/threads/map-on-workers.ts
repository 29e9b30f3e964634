/**
 * Hands a list of jobs to a few worker threads running one script, one job
 * per worker at a time, and reports each reply with the index of its job.
 * The worker script answers every job message with exactly one message.
 * Replies arrive in any order; callers place results by index, so the output
 * never depends on the number of workers or on timing.
 */
import { Worker } from 'node:worker_threads';

export async function mapOnWorkers<Job, Reply>(
  script: URL,
  count: number,
  makeJob: (index: number) => { message: Job; transfer?: ArrayBuffer[] },
  workers: number,
  onReply: (index: number, reply: Reply) => void,
): Promise<void> {
  const pool = Array.from({ length: Math.max(1, Math.min(workers, count)) }, () => new Worker(script));
  let next = 0;
  try {
    await Promise.all(
      pool.map(
        (w) =>
          new Promise<void>((resolve, reject) => {
            let current = -1;
            const send = (): void => {
              if (next >= count) {
                resolve();
                return;
              }
              current = next++;
              const { message, transfer } = makeJob(current);
              w.postMessage(message, transfer ?? []);
            };
            w.on('message', (reply: Reply) => {
              try {
                onReply(current, reply);
              } catch (err) {
                reject(err as Error);
                return;
              }
              send();
            });
            w.on('error', reject);
            // After the last reply the promise is settled and this is a no-op (terminate() exits workers too).
            w.on('exit', (code) => reject(new Error(`worker exited with code ${code} before its jobs were done`)));
            send();
          }),
      ),
    );
  } finally {
    await Promise.all(pool.map((w) => w.terminate()));
  }
}
