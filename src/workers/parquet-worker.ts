/**
 * worker_threads entry for Parquet tables (io/table-stream.ts): the first
 * message gives the columns, each later one a row group's rows (or `finish`);
 * each is answered with the encoded bytes, transferred.
 */
import { parentPort } from 'node:worker_threads';
import { parquetGroups, type ParquetGroups } from '../io/parquet-groups.js';
import type { TableColumn } from '../io/table-file.js';

type Message = { columns: readonly TableColumn[] } | { rows: readonly (readonly string[])[] } | { finish: true };

let encoder: ParquetGroups | null = null;
let queue: Promise<void> = Promise.resolve();

parentPort?.on('message', (m: Message) => {
  queue = queue.then(async () => {
    try {
      if ('columns' in m) {
        encoder = await parquetGroups(m.columns);
        parentPort?.postMessage({ ok: true });
        return;
      }
      const bytes = 'rows' in m ? await encoder!.group(m.rows) : await encoder!.finish();
      parentPort?.postMessage({ bytes }, [bytes.buffer as ArrayBuffer]);
    } catch (err) {
      parentPort?.postMessage({ error: err instanceof Error ? err.message : String(err) });
    }
  });
});
