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
export async function tableBytes(file: string, columns: readonly TableColumn[], rows: readonly (readonly string[])[], comment?: string): Promise<string | Uint8Array> {
  const lower = file.toLowerCase();
  if (lower.endsWith('.csv'))
    return [...(comment === undefined ? [] : [comment]), columns.map((c) => c.name).join(','), ...rows.map((r) => r.map(csvCell).join(','))].join('\n') + '\n';
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

/** Writes the table; `comment`, a whole line, goes before a CSV file's header (a shard's record of itself). */
export async function writeTableFile(file: string, columns: readonly TableColumn[], rows: readonly (readonly string[])[], comment?: string): Promise<void> {
  await writeFileAtomic(file, await tableBytes(file, columns, rows, comment));
}

/** The cells of one CSV line as tableBytes writes them (quoted cells with doubled quotes). */
export function csvCells(line: string): string[] {
  const cells: string[] = [];
  let i = 0;
  for (;;) {
    if (line[i] === '"') {
      let v = '';
      i += 1;
      for (;;) {
        const q = line.indexOf('"', i);
        if (q < 0) throw new Error('unterminated quote');
        v += line.slice(i, q);
        if (line[q + 1] === '"') {
          v += '"';
          i = q + 2;
        } else {
          i = q + 1;
          break;
        }
      }
      cells.push(v);
    } else {
      const c = line.indexOf(',', i);
      cells.push(line.slice(i, c < 0 ? line.length : c));
      i = c < 0 ? line.length : c;
    }
    if (i >= line.length) return cells;
    i += 1; // the comma
  }
}
