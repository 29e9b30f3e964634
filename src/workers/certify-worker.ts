/**
 * worker_threads entry for the census certificate: receives
 * { period, centres, bits } and posts back certify-chunk.ts's result.
 */
import { parentPort } from 'node:worker_threads';
import { certifyChunk } from '../components/certify/certify-chunk.js';

interface CertifyJob {
  period: number;
  centres: Float64Array;
  bits: number;
}

parentPort?.on('message', (m: CertifyJob) => {
  parentPort?.postMessage(certifyChunk(m.period, m.centres, m.bits));
});
