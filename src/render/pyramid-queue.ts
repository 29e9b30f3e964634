/**
 * Queue mode: the tiles of a pyramid as jobs on a BullMQ queue in Redis.
 * `pyramid --queue` puts every tile not yet on disk on the queue and waits
 * for them; `quadatlas worker --queue`, on any number of machines that see
 * the same folder, takes them. Job ids are `<pyramid key>-<tile number>`, so
 * putting the same tile on the queue twice while it waits or runs does
 * nothing; finished jobs are removed, because the tile file on disk (checked
 * by the worker before rendering) is the lasting record of a finished tile.
 * A failed job is retried with exponential back-off (BullMQ `attempts`).
 */
import type { Job } from 'bullmq';
import { Received, UserError } from '../check/user-error.js';

export const QUEUE_NAME = 'quadatlas-tiles';
/** Attempts per tile before its failure is reported. */
export const TILE_ATTEMPTS = 3;
/** How long to wait for Redis before giving up. */
export const REDIS_TIMEOUT_MS = 3000;

export interface RedisTarget {
  readonly host: string;
  readonly port: number;
  readonly db: number;
}

export interface TileJobData {
  readonly dir: string;
  readonly index: number;
  readonly key: string;
}

export interface TileJobResult {
  readonly index: number;
  readonly skipped: boolean;
  readonly bytes: number;
  readonly worker: string;
}

/** redis://HOST:PORT or redis://HOST:PORT/DB (port 6379 when left out). */
export function parseRedisUrl(text: string, field = '--queue'): RedisTarget {
  let url: URL;
  try {
    url = new URL(text);
  } catch {
    throw new UserError(field, 'a Redis URL redis://HOST:PORT (e.g. redis://127.0.0.1:6379)', text);
  }
  const db = url.pathname === '' || url.pathname === '/' ? 0 : Number(url.pathname.slice(1));
  if (url.protocol !== 'redis:' || url.hostname === '' || !Number.isInteger(db) || db < 0 || db > 15 || url.search !== '' || url.username !== '') {
    throw new UserError(field, 'a Redis URL redis://HOST:PORT or redis://HOST:PORT/DB (DB 0-15)', text);
  }
  return { host: url.hostname.replace(/^\[|\]$/g, ''), port: url.port === '' ? 6379 : Number(url.port), db };
}

export function connectionOptions(t: RedisTarget): { host: string; port: number; db: number; connectTimeout: number } {
  return { host: t.host, port: t.port, db: t.db, connectTimeout: REDIS_TIMEOUT_MS };
}

/**
 * Connects once and sends PING (RESP, Redis protocol spec: inline command,
 * reply "+PONG"), failing within REDIS_TIMEOUT_MS and never retrying, so a
 * wrong URL is reported at once. A bare socket rather than a client library:
 * it leaves no timer or reconnect behind to hold the process open.
 */
export async function checkRedis(t: RedisTarget, field = '--queue'): Promise<void> {
  const { connect } = await import('node:net');
  const problem = await new Promise<string | undefined>((resolve) => {
    const socket = connect({ host: t.host, port: t.port });
    let reply = '';
    const done = (p: string | undefined): void => {
      clearTimeout(timer);
      socket.destroy();
      resolve(p);
    };
    const timer = setTimeout(() => done(`no answer within ${REDIS_TIMEOUT_MS / 1000} s`), REDIS_TIMEOUT_MS);
    socket.on('error', (err: NodeJS.ErrnoException) => done(err.code ?? err.message));
    socket.on('connect', () => socket.write(t.db === 0 ? 'PING\r\n' : `SELECT ${t.db}\r\nPING\r\n`));
    socket.on('data', (chunk: Buffer) => {
      reply += chunk.toString('latin1');
      if (reply.startsWith('-')) done(`refused: ${reply.split('\r\n')[0]!.slice(1)}`);
      else if (reply.includes('+PONG\r\n')) done(undefined);
    });
    socket.on('end', () => done(`closed the connection${reply === '' ? '' : `: ${reply.split('\r\n')[0]}`}`));
  });
  if (problem !== undefined) throw new UserError(field, 'a reachable Redis server', new Received(`redis://${t.host}:${t.port} (${problem})`));
}

export function tileJobId(key: string, index: number): string {
  return `${key}-${index}`;
}

export interface EnqueueOptions {
  readonly target: RedisTarget;
  readonly dir: string;
  readonly key: string;
  /** Tile numbers to put on the queue (those not yet on disk). */
  readonly indices: readonly number[];
  /** Tiles in the pyramid (tile numbers are below it). */
  readonly tileCount: number;
  /** Whether a tile's file is on disk (the lasting record of a finished tile). */
  readonly onDisk: (index: number) => Promise<boolean>;
  readonly onProgress?: (done: number, total: number) => void;
}

export interface EnqueueResult {
  readonly completed: number;
  readonly skipped: number;
  /** Bytes of the tiles the workers wrote for this run. */
  readonly bytes: number;
  readonly failed: ReadonlyArray<{ readonly index: number; readonly reason: string }>;
  readonly workers: readonly string[];
}

/** Puts the tiles on the queue and resolves when every one has completed or finally failed. */
export async function enqueueAndWait(o: EnqueueOptions): Promise<EnqueueResult> {
  const { Queue, QueueEvents } = await import('bullmq');
  const connection = connectionOptions(o.target);
  const events = new QueueEvents(QUEUE_NAME, { connection });
  const queue = new Queue<TileJobData, TileJobResult>(QUEUE_NAME, { connection });
  const prefix = `${o.key}-`;
  const total = o.indices.length;
  let completed = 0;
  let skipped = 0;
  let bytes = 0;
  const failed: Array<{ index: number; reason: string }> = [];
  const workers = new Set<string>();
  // Per tile: 1 waiting for us, 2 completed, 3 failed. A tile can complete twice (another
  // producer re-queued it after our job finished and was removed), so count each tile once.
  const state = new Uint8Array(o.tileCount);
  for (const i of o.indices) state[i] = 1;
  try {
    await events.waitUntilReady();
    let checkDone = (): void => undefined;
    const finished = new Promise<void>((resolve) => {
      const check = (): void => {
        o.onProgress?.(completed + failed.length, total);
        if (completed + failed.length >= total) resolve();
      };
      events.on('completed', ({ jobId, returnvalue }) => {
        if (!jobId.startsWith(prefix)) return;
        const index = Number(jobId.slice(prefix.length));
        if (state[index] !== 1) return;
        state[index] = 2;
        completed++;
        const r = (typeof returnvalue === 'string' ? JSON.parse(returnvalue) : returnvalue) as TileJobResult | null;
        if (r?.skipped === true) skipped++;
        else if (typeof r?.bytes === 'number') bytes += r.bytes;
        if (typeof r?.worker === 'string') workers.add(r.worker);
        check();
      });
      events.on('failed', ({ jobId, failedReason }) => {
        if (!jobId.startsWith(prefix)) return;
        const index = Number(jobId.slice(prefix.length));
        if (state[index] !== 1) return;
        state[index] = 3;
        failed.push({ index, reason: failedReason });
        check();
      });
      checkDone = check;
      check();
    });
    const jobFor = (index: number) => ({
      name: 'tile',
      data: { dir: o.dir, index, key: o.key },
      opts: { jobId: tileJobId(o.key, index), attempts: TILE_ATTEMPTS, backoff: { type: 'exponential', delay: 500 }, removeOnComplete: true, removeOnFail: true },
    });
    const BATCH = 500;
    for (let at = 0; at < total; at += BATCH) await queue.addBulk(o.indices.slice(at, at + BATCH).map(jobFor));
    // Events can be missed (QueueEvents starts reading the stream a moment after it is
    // ready), so when nothing has happened for a while, look at the disk: a tile file
    // there is finished; a tile with neither file nor job was lost and goes on again.
    let seen = completed + failed.length;
    let quiet = 0;
    let sweeping = false;
    const sweep = setInterval(() => {
      if (sweeping) return;
      if (completed + failed.length !== seen) {
        seen = completed + failed.length;
        quiet = 0;
        return;
      }
      if (++quiet < 4) return;
      sweeping = true;
      void (async () => {
        for (let i = 0; i < state.length; i++) {
          if (state[i] !== 1) continue;
          if (await o.onDisk(i)) {
            state[i] = 2;
            completed++;
          } else if ((await queue.getJob(tileJobId(o.key, i))) === undefined) {
            await queue.add(jobFor(i).name, jobFor(i).data, jobFor(i).opts);
          }
        }
        checkDone();
      })().finally(() => {
        sweeping = false;
        quiet = 0;
      });
    }, 500);
    try {
      await finished;
    } finally {
      clearInterval(sweep);
    }
  } finally {
    await queue.close();
    await events.close();
  }
  return { completed, skipped, bytes, failed, workers: [...workers].sort() };
}

export type TileJob = Job<TileJobData, TileJobResult>;
