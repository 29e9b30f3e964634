/**
 * worker_threads entry for component listings: receives blocks of census
 * components (list-components.ts) and posts back their rows, in order, one
 * block after the other (JobPool may send the next block before this one is
 * answered, and takes the replies in the order it sent the blocks).
 */
import { parentPort } from 'node:worker_threads';
import { jobRows, type ListJob } from '../components/list-components.js';

let queue: Promise<void> = Promise.resolve();

parentPort?.on('message', (job: ListJob) => {
  queue = queue.then(async () => {
    const rows = await jobRows(job);
    parentPort?.postMessage(rows);
  });
});
