/**
 * Runs the truncations of a constants plan (src/section/constants/) on
 * worker threads, one truncation per worker, or one after the other in this
 * thread for one worker. Each truncation is a deterministic computation of
 * its own, so the answers never depend on the worker count.
 */
import { Worker } from 'node:worker_threads';
import { constantsAt, truncationProgress, type ConstantsPlan } from '../section/constants/feigenbaum-constants.js';
import type { NewtonStep } from '../section/constants/fixed-point.js';
import type { FeigenbaumJob, FromFeigenbaumWorker } from './feigenbaum-messages.js';
import { builtWorkerUrl } from '../threads/built-worker.js';

export interface TruncationResult {
  readonly terms: number;
  readonly alpha: string;
  readonly delta: string;
}

/** Progress of the whole plan: the fraction of the estimated work done (0..1) and the last step. */
export type ConstantsProgress = (fraction: number, step: NewtonStep) => void;

function runOnWorker(job: FeigenbaumJob, onStep: (s: NewtonStep) => void): Promise<TruncationResult> {
  return new Promise((resolve, reject) => {
    const w = new Worker(builtWorkerUrl('feigenbaum-worker'));
    let settled = false;
    const finish = (f: () => void): void => {
      if (settled) return;
      settled = true;
      void w.terminate();
      f();
    };
    w.on('message', (m: FromFeigenbaumWorker) => {
      if (m.type === 'step') onStep(m.step);
      else if (m.type === 'done') finish(() => resolve({ terms: m.terms, alpha: m.alpha, delta: m.delta }));
      else finish(() => reject(Object.assign(new Error(m.message), { name: m.name })));
    });
    w.on('error', (e) => finish(() => reject(e)));
    w.on('exit', (code) => finish(() => reject(new Error(`feigenbaum worker exited with code ${code} before its truncation was done`))));
    w.postMessage(job);
  });
}

/** Both truncations of the plan, fewer terms first. */
export async function constantsOnWorkers(plan: ConstantsPlan, workers: number, places: number, onProgress?: ConstantsProgress): Promise<TruncationResult[]> {
  // Each truncation weighs as its N^3 (the factorisations); its own share from its last Newton step.
  const weights = plan.terms.map((n) => n ** 3);
  const total = weights.reduce((a, b) => a + b, 0);
  const done = plan.terms.map(() => 0);
  const tracker =
    (i: number) =>
    (step: NewtonStep): void => {
      done[i] = Math.max(done[i]!, truncationProgress(step, plan.bits));
      onProgress?.(done.reduce((a, d, j) => a + d * weights[j]!, 0) / total, step);
    };
  const jobs: FeigenbaumJob[] = plan.terms.map((terms) => ({ type: 'truncation', order: plan.order, terms, bits: plan.bits, places }));
  if (workers <= 1) {
    return jobs.map((job, i) => {
      const r = constantsAt(job.order, job.terms, job.bits, job.places, tracker(i));
      return { terms: r.terms, alpha: r.alpha, delta: r.delta };
    });
  }
  return Promise.all(jobs.map((job, i) => runOnWorker(job, tracker(i))));
}
