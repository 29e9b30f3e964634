/**
 * worker_threads entry for the census: receives { period, nums, careful },
 * lands those rays (land-rays.ts) and posts back { records } (transferred).
 */
import { parentPort } from 'node:worker_threads';
import { landRays, RAY_RECORD } from '../components/land-rays.js';

interface CensusChunk {
  period: number;
  nums: Float64Array;
  careful: boolean;
}

parentPort?.on('message', (m: CensusChunk) => {
  const records = landRays(m.period, m.nums, m.careful, new Float64Array(m.nums.length * RAY_RECORD));
  parentPort?.postMessage({ records }, [records.buffer as ArrayBuffer]);
});
