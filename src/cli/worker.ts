/**
 * `quadatlas worker --queue redis://HOST:PORT`: takes pyramid tiles from the
 * queue that `quadatlas pyramid --queue` fills, renders each on a pool of
 * threads and writes it into the pyramid's folder (which must be reachable
 * under the same path on every machine). Runs until SIGTERM or SIGINT (then
 * finishes the tiles in hand and exits 0), or until idle for --idle-exit
 * seconds.
 */
import type { Command } from 'commander';
import os from 'node:os';
import { pyramidKey, readPyramidSpec } from '../io/iiif-manifest.js';
import type { PyramidSpec } from '../view/pyramid-spec.js';
import { PyramidPool } from '../render/pyramid-pool.js';
import { checkRedis, connectionOptions, parseRedisUrl, QUEUE_NAME, type TileJob, type TileJobResult } from '../render/pyramid-queue.js';
import { addOptions, type OptionSpec } from './option-spec.js';
import { UserError } from '../check/user-error.js';
import { optionalInteger } from '../check/fields.js';

export const WORKER_OPTIONS: readonly OptionSpec[] = [
  { flags: '--queue <url>', description: 'the Redis queue to take tiles from, redis://host:port (required, no default)' },
  { flags: '--workers <n>', description: 'tiles rendered at once, one thread each (default: all cores)' },
  { flags: '--idle-exit <seconds>', description: 'exit after this long with nothing to do (default: run until SIGTERM)' },
  { flags: '--json', description: 'print a JSON summary on stdout when the worker stops (default: a line on stderr)' },
];

/**
 * Test hook: tile numbers listed in QUADATLAS_FAIL_ONCE (comma-separated)
 * fail on their first attempt, so the retry path can be tested end to end.
 */
function failOnce(): Set<number> {
  const v = process.env['QUADATLAS_FAIL_ONCE'];
  return new Set(
    v === undefined
      ? []
      : v
          .split(',')
          .filter((x) => x.trim() !== '')
          .map(Number),
  );
}

export async function runWorker(values: Record<string, unknown>): Promise<Record<string, unknown>> {
  if (typeof values['queue'] !== 'string') throw new UserError('--queue', 'a Redis URL redis://HOST:PORT', values['queue']);
  const target = parseRedisUrl(values['queue']);
  const threads = optionalInteger(values['workers'], '--workers', 1, 256) ?? os.availableParallelism();
  const idleExit = optionalInteger(values['idleExit'], '--idle-exit', 1, 7 * 24 * 3600);
  await checkRedis(target);
  const started = Date.now();
  const name = `${os.hostname()}:${process.pid}`;
  const pool = new PyramidPool(threads);
  const specs = new Map<string, { key: string; spec: PyramidSpec }>();
  const failing = failOnce();
  let rendered = 0;
  let skipped = 0;
  let failed = 0;
  let active = 0;
  let lastActivity = Date.now();

  const processTile = async (job: TileJob): Promise<TileJobResult> => {
    const { dir, index, key } = job.data;
    if (failing.has(index) && job.attemptsMade === 0) throw new Error(`tile ${index} made to fail once (QUADATLAS_FAIL_ONCE)`);
    let known = specs.get(dir);
    if (known === undefined || known.key !== key) {
      const spec = await readPyramidSpec(dir);
      if (spec === undefined) throw new Error(`${dir} holds no pyramid.json (is the folder shared with this machine?)`);
      known = { key: pyramidKey(dir, spec), spec };
      specs.set(dir, known);
      if (known.key !== key) throw new Error(`${dir} holds a different pyramid than the one queued (key ${known.key}, job ${key})`);
    }
    const r = await pool.render(key, known.spec, dir, index);
    if (r.skipped) skipped++;
    else rendered++;
    return { index, skipped: r.skipped, bytes: r.bytes, worker: name };
  };

  const { Worker } = await import('bullmq');
  const worker = new Worker<TileJob['data'], TileJobResult>(
    QUEUE_NAME,
    async (job) => {
      active++;
      try {
        return await processTile(job);
      } finally {
        active--;
        lastActivity = Date.now();
      }
    },
    { connection: connectionOptions(target), concurrency: threads },
  );
  worker.on('failed', () => {
    failed++;
  });
  worker.on('error', (err) => process.stderr.write(`quadatlas worker: ${err.message}\n`));
  process.stderr.write(`quadatlas worker ${name}: taking tiles from ${values['queue']} with ${threads} threads\n`);

  await new Promise<void>((resolve) => {
    const stop = (): void => {
      clearInterval(idleTimer);
      process.off('SIGTERM', stop);
      process.off('SIGINT', stop);
      resolve();
    };
    process.on('SIGTERM', stop);
    process.on('SIGINT', stop);
    const idleTimer = setInterval(() => {
      if (idleExit !== undefined && active === 0 && Date.now() - lastActivity > idleExit * 1000) stop();
    }, 250);
  });
  // Finish the tiles in hand, then let go of the queue and the threads.
  await worker.close();
  await pool.close();
  const summary = {
    worker: name,
    tiles: { rendered, skipped, failedAttempts: failed },
    seconds: (Date.now() - started) / 1000,
    peakMemoryMiB: Math.round(process.resourceUsage().maxRSS / 1024),
  };
  process.stderr.write(`quadatlas worker ${name}: stopped after ${rendered} tiles rendered, ${skipped} already there, ${failed} failed attempts\n`);
  return summary;
}

export function register(program: Command): void {
  const cmd = program.command('worker').description('take pyramid tile jobs from a shared Redis queue (cluster mode)');
  addOptions(cmd, WORKER_OPTIONS);
  cmd.action(async (values: Record<string, unknown>) => {
    const summary = await runWorker(values);
    if (values['json'] === true) process.stdout.write(`${JSON.stringify(summary, null, 2)}\n`);
  });
}
