// JobPool (src/threads/job-pool.ts) with up to k jobs held by each worker: every reply reaches
// onReply with the index of the job it answers, whatever the number of workers, jobs in
// flight and the order in which the workers finish (random waits). The reference is the
// function itself, n -> n^2 + 1, computed here.
import { describe, expect, it } from 'vitest';
import { JobPool } from '../../src/threads/job-pool.js';

describe('JobPool', () => {
  it('places each reply by its job index for 1 to 3 workers and 1 to 3 jobs in flight, over two maps', async () => {
    let seed = 99;
    const rand = (): number => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    for (const workers of [1, 2, 3]) {
      const pool = new JobPool<{ n: number; waitMs: number }, number>(new URL('./square-worker.mjs', import.meta.url), workers);
      try {
        for (const inFlight of [1, 2, 3]) {
          for (const count of [1, 7, 40]) {
            const got = new Array<number | undefined>(count);
            await pool.map(
              count,
              (i) => ({ message: { n: i + 1000 * workers, waitMs: Math.floor(rand() * 4) } }),
              (i, reply) => {
                expect(got[i], `job ${i} answered twice`).toBeUndefined();
                got[i] = reply;
              },
              inFlight,
            );
            expect(got).toEqual(Array.from({ length: count }, (_, i) => (i + 1000 * workers) ** 2 + 1));
          }
        }
      } finally {
        await pool.close();
      }
    }
  }, 60_000);
});
