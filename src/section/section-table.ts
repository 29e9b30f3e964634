/**
 * A table of results with named summary values, and its three written forms:
 * aligned text, CSV (RFC 4180) and JSON.
 *
 * A cell is either a decimal string (anything given, or computed beyond
 * double precision: kept as a string end to end so no digit is lost) or a
 * double quantity, which carries its value and the text the tables show
 * (stated digits, no float noise). JSON writes double quantities as numbers
 * and decimal strings as strings; CSV and text write the shown text.
 * Column names are snake_case (the CSV header); JSON keys are the same words
 * in camelCase.
 */
export interface NumberCell {
  /** The double itself (written to JSON; non-finite values become null). */
  readonly value: number;
  /** What text and CSV show. */
  readonly text: string;
}

/** A decimal string, a double quantity, or '' for an empty cell (null in JSON). */
export type Cell = string | NumberCell;

export interface SectionTable {
  readonly title: string;
  /** snake_case column names. */
  readonly columns: readonly string[];
  readonly rows: ReadonlyArray<readonly Cell[]>;
  /** Named results below the table (e.g. accelerated constants), with an optional note each. */
  readonly summary: ReadonlyArray<{ readonly name: string; readonly value: string; readonly note?: string }>;
  /** Extra structured fields for JSON only (camelCase keys). */
  readonly extra?: Readonly<Record<string, unknown>>;
}

export type TableFormat = 'text' | 'csv' | 'json';

/** A double quantity cell. */
export function numberCell(value: number, text: string): NumberCell {
  return { value, text };
}

/** An integer cell (exact in a double up to 2^53). */
export function integerCell(value: number): NumberCell {
  return { value, text: String(value) };
}

/** "doubling_r" and "windows per period" -> "doublingR", "windowsPerPeriod". */
export function camelCase(name: string): string {
  const words = name.split(/[_\s]+/).filter((w) => w !== '');
  return words.map((w, i) => (i === 0 ? w : w[0]!.toUpperCase() + w.slice(1))).join('');
}

export function formatTable(table: SectionTable, format: TableFormat): string {
  if (format === 'json') return `${JSON.stringify(tableJson(table), null, 2)}\n`;
  if (format === 'csv') return tableCsv(table);
  return tableText(table);
}

function cellText(cell: Cell | undefined): string {
  return cell === undefined ? '' : typeof cell === 'string' ? cell : cell.text;
}

function cellJson(cell: Cell | undefined): string | number | null {
  if (cell === undefined || cell === '') return null;
  if (typeof cell === 'string') return cell;
  return Number.isFinite(cell.value) ? cell.value : null;
}

function tableJson(table: SectionTable): Record<string, unknown> {
  const keys = table.columns.map(camelCase);
  const rows = table.rows.map((row) => Object.fromEntries(keys.map((k, i) => [k, cellJson(row[i])])));
  const summary = Object.fromEntries(table.summary.map((s) => [camelCase(s.name), s.note === undefined ? s.value : { value: s.value, note: s.note }]));
  return { title: table.title, ...table.extra, rows, summary };
}

function csvField(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function tableCsv(table: SectionTable): string {
  const lines = [table.columns.map(csvField).join(',')];
  for (const row of table.rows) lines.push(table.columns.map((_, i) => csvField(cellText(row[i]))).join(','));
  return `${lines.join('\n')}\n`;
}

function tableText(table: SectionTable): string {
  const widths = table.columns.map((c, i) => Math.max(c.length, ...table.rows.map((r) => cellText(r[i]).length)));
  const line = (cells: readonly string[]): string =>
    cells
      .map((c, i) => c.padEnd(widths[i]!))
      .join('  ')
      .trimEnd();
  const out = [table.title, line(table.columns), line(widths.map((w) => '-'.repeat(w)))];
  for (const row of table.rows) out.push(line(table.columns.map((_, i) => cellText(row[i]))));
  if (table.summary.length > 0) {
    out.push('');
    const w = Math.max(...table.summary.map((s) => s.name.length));
    for (const s of table.summary) out.push(`${s.name.padEnd(w)}  ${s.value}${s.note === undefined ? '' : `  (${s.note})`}`);
  }
  return `${out.join('\n')}\n`;
}
