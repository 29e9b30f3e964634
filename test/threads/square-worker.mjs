// A test worker for JobPool: answers each { n, waitMs } with n * n + 1 after waiting, one
// message after the other (as the listing worker does), so replies come in the order sent.
import { parentPort } from 'node:worker_threads';

let queue = Promise.resolve();
parentPort.on('message', (m) => {
  queue = queue.then(async () => {
    await new Promise((r) => setTimeout(r, m.waitMs));
    parentPort.postMessage(m.n * m.n + 1);
  });
});
