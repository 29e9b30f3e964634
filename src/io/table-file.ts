/**
 * A table written to a file by its extension: .csv (header line, one line a
 * row), .json (an array of objects) or .parquet (one row group, typed
 * columns, through hyparquet-writer), always under a temporary name first.
 * Cells are strings; the column types say which Parquet columns are integers
 * or doubles (an empty cell is a null there).
 */
import { writeFileAtomic } from './write-file-atomic.js';

export type ColumnType = 'string' | 'int' | 'double';

export interface TableColumn {
  readonly name: string;
  readonly type: ColumnType;
}

export const TABLE_EXTENSIONS = ['.csv', '.json', '.parquet'] as const;

function csvCell(v: string): string {
  return /[",\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

function typed(v: string, type: ColumnType): string | number | null {
  if (type === 'string') return v;
  if (v === '') return null;
  return Number(v);
}

/** The bytes of the table in the format of `file`'s extension. */
export async function tableBytes(file: string, columns: readonly TableColumn[], rows: readonly (readonly string[])[]): Promise<string | Uint8Array> {
  const lower = file.toLowerCase();
  if (lower.endsWith('.csv')) return [columns.map((c) => c.name).join(','), ...rows.map((r) => r.map(csvCell).join(','))].join('\n') + '\n';
  if (lower.endsWith('.json'))
    return `${JSON.stringify(
      rows.map((r) => Object.fromEntries(columns.map((c, i) => [c.name, typed(r[i] ?? '', c.type)]))),
      null,
      2,
    )}\n`;
  const { parquetWriteBuffer } = await import('hyparquet-writer');
  const columnData = columns.map((c, i) => ({
    name: c.name,
    data: rows.map((r) => typed(r[i] ?? '', c.type)),
    type: c.type === 'string' ? ('STRING' as const) : c.type === 'int' ? ('INT32' as const) : ('DOUBLE' as const),
  }));
  return new Uint8Array(parquetWriteBuffer({ columnData }));
}

export async function writeTableFile(file: string, columns: readonly TableColumn[], rows: readonly (readonly string[])[]): Promise<void> {
  await writeFileAtomic(file, await tableBytes(file, columns, rows));
}
