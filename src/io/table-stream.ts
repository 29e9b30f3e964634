/**
 * A table written as its rows arrive, so memory holds one batch, not the
 * table: CSV line by line, JSON one object at a time (the bytes of
 * table-file.ts' `tableBytes` for the same rows), Parquet by row groups
 * through hyparquet-writer's incremental ParquetWriter (groups of
 * PARQUET_GROUP rows, whatever the batches, so the file does not depend on
 * how the rows were chunked). Files are written under a temporary name and
 * renamed by `close`; `abort` removes the temporary file.
 */
import { open, rename, rm, type FileHandle } from 'node:fs/promises';
import { releaseTemp, tempPathFor } from './temp-path.js';
import type { TableColumn } from './table-file.js';
import { Worker } from 'node:worker_threads';
import { builtWorkerUrl } from '../threads/built-worker.js';
import { typedCell } from './parquet-groups.js';

/** Rows per Parquet row group: a group of 65536 listing rows took about 400 MB while hyparquet-writer encoded it, 16384 about 100 MB. */
export const PARQUET_GROUP = 16384;

export interface TableStream {
  /** Appends rows (cells as strings, as writeTableFile takes them). */
  write(rows: readonly (readonly string[])[]): Promise<void>;
  /** Ends the table and (for a file) renames it into place. */
  close(): Promise<void>;
  /** Drops the temporary file. */
  abort(): Promise<void>;
}

function csvCell(v: string): string {
  return /[",\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

/** Text sink: a file handle or a Node writable (stdout), waiting on backpressure. */
interface TextSink {
  write(text: string): Promise<void>;
}

function writableSink(out: NodeJS.WritableStream): TextSink {
  return {
    write: (text) =>
      new Promise<void>((resolve, reject) => {
        if (out.write(text, (err) => (err ? reject(err) : undefined))) resolve();
        else out.once('drain', () => resolve());
      }),
  };
}

/** A CSV (or, with `json`, JSON) table streamed to `out` (stdout): no temporary name. */
export function textTableStream(out: NodeJS.WritableStream, columns: readonly TableColumn[], format: 'csv' | 'json', comment?: string): TableStream {
  return textStream(
    writableSink(out),
    columns,
    format,
    comment,
    async () => {},
    async () => {},
  );
}

function textStream(
  sink: TextSink,
  columns: readonly TableColumn[],
  format: 'csv' | 'json',
  comment: string | undefined,
  end: () => Promise<void>,
  abort: () => Promise<void>,
): TableStream {
  let started = false;
  let any = false;
  const start = async (): Promise<void> => {
    if (started) return;
    started = true;
    if (format === 'csv') await sink.write(`${comment === undefined ? '' : `${comment}\n`}${columns.map((c) => c.name).join(',')}\n`);
  };
  return {
    async write(rows) {
      await start();
      if (rows.length === 0) return;
      let text: string;
      if (format === 'csv') text = rows.map((r) => `${r.map(csvCell).join(',')}\n`).join('');
      else {
        // each element as JSON.stringify(array, null, 2) prints it: the object's lines indented by two more spaces
        const parts = rows.map((r) => {
          const o = Object.fromEntries(columns.map((c, i) => [c.name, typedCell(r[i] ?? '', c.type)]));
          return `  ${JSON.stringify(o, null, 2).replace(/\n/g, '\n  ')}`;
        });
        text = `${any ? ',\n' : '[\n'}${parts.join(',\n')}`;
        any = true;
      }
      await sink.write(text);
    },
    async close() {
      await start();
      if (format === 'json') await sink.write(any ? '\n]\n' : '[]\n');
      await end();
    },
    abort,
  };
}

/** A table streamed to `file` (.csv, .json or .parquet by its extension), under a temporary name until `close`. */
export async function openTableStream(file: string, columns: readonly TableColumn[], comment?: string): Promise<TableStream> {
  const tmp = tempPathFor(file);
  const fh = await open(tmp, 'wx');
  let closed = false;
  const finish = async (): Promise<void> => {
    await fh.sync();
    await fh.close();
    closed = true;
    await rename(tmp, file);
    releaseTemp(tmp);
  };
  const abort = async (): Promise<void> => {
    if (!closed) await fh.close().catch(() => {});
    closed = true;
    await rm(tmp, { force: true });
    releaseTemp(tmp);
  };
  const lower = file.toLowerCase();
  if (lower.endsWith('.csv') || lower.endsWith('.json')) {
    const sink: TextSink = { write: async (text) => void (await fh.write(text)) };
    return textStream(sink, columns, lower.endsWith('.csv') ? 'csv' : 'json', comment, finish, abort);
  }
  return parquetStream(fh, columns, finish, abort);
}

async function parquetStream(fh: FileHandle, columns: readonly TableColumn[], finish: () => Promise<void>, abort: () => Promise<void>): Promise<TableStream> {
  // the groups are encoded in a worker thread (parquet-groups.ts), one at a time, while the rows of the next arrive
  const worker = new Worker(builtWorkerUrl('parquet-worker'));
  worker.unref();
  const replies: Array<(m: { ok?: boolean; bytes?: Uint8Array; error?: string }) => void> = [];
  worker.on('message', (m: { ok?: boolean; bytes?: Uint8Array; error?: string }) => replies.shift()?.(m));
  const ask = (message: unknown): Promise<Uint8Array | null> =>
    new Promise((resolve, reject) => {
      replies.push((m) => (m.error !== undefined ? reject(new Error(`Parquet encoder: ${m.error}`)) : resolve(m.bytes ?? null)));
      worker.postMessage(message);
    });
  await ask({ columns });
  let inflight: Promise<void> = Promise.resolve();
  const group = async (rows: readonly (readonly string[])[]): Promise<void> => {
    await inflight;
    inflight = ask({ rows }).then(async (bytes) => void (bytes !== null && (await fh.write(bytes))));
    inflight.catch(() => {}); // awaited by the next group or by close
  };
  let buffer: (readonly string[])[] = [];
  const stop = async (): Promise<void> => {
    await worker.terminate();
  };
  return {
    async write(rows) {
      for (const r of rows) {
        buffer.push(r);
        if (buffer.length === PARQUET_GROUP) {
          const full = buffer;
          buffer = [];
          await group(full);
        }
      }
    },
    async close() {
      if (buffer.length > 0) await group(buffer);
      buffer = [];
      await inflight;
      const last = await ask({ finish: true });
      if (last !== null) await fh.write(last);
      await stop();
      await finish();
    },
    async abort() {
      await inflight.catch(() => {});
      await stop();
      await abort();
    },
  };
}
