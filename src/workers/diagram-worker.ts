/**
 * Worker entry for the density diagram: receives a block of columns as plain
 * data, computes it with diagramColumns, and posts the ink back (transferred).
 */
import { parentPort } from 'node:worker_threads';
import { diagramColumns, type DiagramSettings, type ParameterAxis } from '../section/density-diagram.js';
import { FAMILIES } from '../section/families/index.js';
import type { DiagramJob } from '../section/render-diagram.js';

parentPort?.on('message', (job: DiagramJob) => {
  const family = FAMILIES.get(job.family)!;
  const out = new Uint16Array((job.col1 - job.col0) * job.settings.height);
  diagramColumns(family, job.axis, job.settings, job.col0, job.col1, out, new Float64Array(job.settings.height));
  parentPort!.postMessage({ col0: job.col0, out }, [out.buffer]);
});
