/**
 * Parquet row groups encoded by hyparquet-writer's incremental ParquetWriter,
 * the bytes handed out after each group and at the end: the encoder behind
 * table-stream.ts's Parquet tables, run in a worker thread
 * (workers/parquet-worker.ts) so that encoding a group (dictionaries,
 * statistics, snappy: about 15 us a listing row) does not hold up the thread
 * that orders the rows.
 */
import type { TableColumn } from './table-file.js';

/** A cell as its Parquet column takes it: strings as they are, numbers parsed, empty numeric cells null. */
export function typedCell(v: string, type: TableColumn['type']): string | number | null {
  if (type === 'string') return v;
  if (v === '') return null;
  return Number(v);
}

/**
 * A string column's cells as UTF-8 byte arrays: when every cell is ASCII (the
 * listing's decimals, fractions and addresses), one encoding of the joined
 * cells and a view per cell instead of one encoder call per cell.
 */
export function utf8Cells(values: readonly string[]): Uint8Array[] {
  const joined = values.join('');
  const bytes = new TextEncoder().encode(joined);
  if (bytes.length !== joined.length) return values.map((v) => new TextEncoder().encode(v));
  const out = new Array<Uint8Array>(values.length);
  let at = 0;
  for (let i = 0; i < values.length; i++) {
    const n = values[i]!.length;
    out[i] = bytes.subarray(at, at + n);
    at += n;
  }
  return out;
}

export interface ParquetGroups {
  /** Encodes one row group; the bytes written since the last call. */
  group(rows: readonly (readonly string[])[]): Promise<Uint8Array>;
  /** Writes the footer; the last bytes. */
  finish(): Promise<Uint8Array>;
}

/** A Parquet encoder for `columns`; its first bytes (the magic number) come with the first group. */
export async function parquetGroups(columns: readonly TableColumn[]): Promise<ParquetGroups> {
  const { ByteWriter, ParquetWriter, schemaFromColumnData } = await import('hyparquet-writer');
  const kind = (c: TableColumn): 'STRING' | 'INT32' | 'DOUBLE' => (c.type === 'string' ? 'STRING' : c.type === 'int' ? 'INT32' : 'DOUBLE');
  const schema = schemaFromColumnData({ columnData: columns.map((c) => ({ name: c.name, data: [], type: kind(c) })) });
  const writer = new ByteWriter();
  const take = (): Uint8Array => {
    const bytes = new Uint8Array(writer.buffer, 0, writer.index).slice();
    writer.index = 0;
    return bytes;
  };
  const pq = new ParquetWriter({ writer, schema });
  return {
    async group(rows) {
      // string columns: bytes encoded in bulk, no min/max statistics (decimal strings order by text, which no reader can use)
      const columnData = columns.map((c, i) =>
        c.type === 'string'
          ? { name: c.name, data: utf8Cells(rows.map((r) => r[i] ?? '')), statistics: false }
          : { name: c.name, data: rows.map((r) => typedCell(r[i] ?? '', c.type)) },
      );
      await pq.write({ columnData, rowGroupSize: rows.length });
      return take();
    },
    async finish() {
      await pq.finish();
      return take();
    },
  };
}
