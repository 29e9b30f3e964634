/**
 * Feigenbaum worker entry point: computes one truncation of the
 * renormalisation fixed point (constantsAt) per job, posting each Newton
 * step as progress and the constants as decimal strings at the end.
 */
import { parentPort } from 'node:worker_threads';
import { constantsAt } from '../section/constants/feigenbaum-constants.js';
import type { FeigenbaumJob, FromFeigenbaumWorker } from '../render/feigenbaum-messages.js';

const port = parentPort;
if (port === null) throw new Error('feigenbaum-worker must run in a worker thread');

port.on('message', (job: FeigenbaumJob) => {
  const post = (m: FromFeigenbaumWorker): void => port.postMessage(m);
  try {
    const r = constantsAt(job.order, job.terms, job.bits, job.places, (step) => post({ type: 'step', step }));
    post({ type: 'done', terms: r.terms, alpha: r.alpha, delta: r.delta });
  } catch (err) {
    const e = err as Error;
    post({ type: 'failed', name: e.name, message: e.message });
  }
});
