/**
 * A table of results (rows of decimal strings) with named summary values,
 * and its three written forms: aligned text, CSV (RFC 4180) and JSON.
 * Values stay strings end to end so no digit is lost to a double.
 */
export interface SectionTable {
  readonly title: string;
  readonly columns: readonly string[];
  readonly rows: ReadonlyArray<readonly string[]>;
  /** Named results below the table (e.g. accelerated constants), with an optional note each. */
  readonly summary: ReadonlyArray<{ readonly name: string; readonly value: string; readonly note?: string }>;
  /** Extra structured fields for JSON only. */
  readonly extra?: Readonly<Record<string, unknown>>;
}

export type TableFormat = 'text' | 'csv' | 'json';

export function formatTable(table: SectionTable, format: TableFormat): string {
  if (format === 'json') return `${JSON.stringify(tableJson(table), null, 2)}\n`;
  if (format === 'csv') return tableCsv(table);
  return tableText(table);
}

function tableJson(table: SectionTable): Record<string, unknown> {
  const rows = table.rows.map((row) => Object.fromEntries(table.columns.map((c, i) => [c, row[i] === '' ? null : row[i]])));
  const summary = Object.fromEntries(table.summary.map((s) => [s.name, s.note === undefined ? s.value : { value: s.value, note: s.note }]));
  return { title: table.title, ...table.extra, rows, summary };
}

function csvField(s: string): string {
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

function tableCsv(table: SectionTable): string {
  const lines = [table.columns.map(csvField).join(',')];
  for (const row of table.rows) lines.push(row.map(csvField).join(','));
  return `${lines.join('\n')}\n`;
}

function tableText(table: SectionTable): string {
  const widths = table.columns.map((c, i) => Math.max(c.length, ...table.rows.map((r) => (r[i] ?? '').length)));
  const line = (cells: readonly string[]): string => cells.map((c, i) => c.padEnd(widths[i]!)).join('  ').trimEnd();
  const out = [table.title, line(table.columns), line(widths.map((w) => '-'.repeat(w)))];
  for (const row of table.rows) out.push(line(row));
  if (table.summary.length > 0) {
    out.push('');
    const w = Math.max(...table.summary.map((s) => s.name.length));
    for (const s of table.summary) out.push(`${s.name.padEnd(w)}  ${s.value}${s.note === undefined ? '' : `  (${s.note})`}`);
  }
  return `${out.join('\n')}\n`;
}
