/**
 * worker_threads entry for component listings: receives a block of census
 * components (list-components.ts) and posts back their rows, in order.
 */
import { parentPort } from 'node:worker_threads';
import { jobRows, type ListJob } from '../components/list-components.js';

parentPort?.on('message', (job: ListJob) => {
  void jobRows(job).then((rows) => parentPort?.postMessage(rows));
});
