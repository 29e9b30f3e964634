/**
 * The labelled points of a figure from a CSV file (`plate --marks FILE.csv`):
 * one point a row, `re,im,label`, re and im decimal numbers as written, the
 * label the rest of the row (RFC 4180 quoting: a label holding a comma is
 * written in double quotes, a quote inside doubled). A first row
 * `re,im,label` is a header; blank rows and rows starting with `#` are
 * skipped. A bad row is refused in one line naming the file and the row.
 */
import { Received, UserError } from '../check/user-error.js';
import { MAX_MARKS, parsePin, type FigurePin } from './sheet.js';

/** The fields of one CSV row (RFC 4180), or null when a quote is left open or stray. */
export function csvFields(row: string): string[] | null {
  const fields: string[] = [];
  let i = 0;
  for (;;) {
    let field = '';
    if (row[i] === '"') {
      i += 1;
      for (;;) {
        if (i >= row.length) return null;
        if (row[i] === '"') {
          if (row[i + 1] === '"') {
            field += '"';
            i += 2;
            continue;
          }
          i += 1;
          break;
        }
        field += row[i];
        i += 1;
      }
      if (i < row.length && row[i] !== ',') return null;
    } else {
      const end = row.indexOf(',', i);
      field = end < 0 ? row.slice(i) : row.slice(i, end);
      if (field.includes('"')) return null;
      i = end < 0 ? row.length : end;
    }
    fields.push(field.trim());
    if (i >= row.length) return fields;
    i += 1; // the comma
  }
}

export function parseMarksCsv(text: string, file: string): FigurePin[] {
  const pins: FigurePin[] = [];
  const rows = text.replace(/^\uFEFF/, '').split(/\r?\n/);
  for (const [k, raw] of rows.entries()) {
    const row = raw.trim();
    if (row === '' || row.startsWith('#')) continue;
    const where = `${file} row ${k + 1}`;
    const fields = csvFields(row);
    if (pins.length === 0 && fields !== null && fields.join(',').toLowerCase() === 're,im,label') continue;
    const expected = 'a row re,im,label: two decimal numbers and a label of one line (e.g. -0.75,0,root)';
    if (fields === null || fields.length !== 3) throw new UserError(where, expected, new Received(JSON.stringify(row)));
    try {
      pins.push(parsePin({ re: fields[0], im: fields[1], label: fields[2] }, where));
    } catch (err) {
      if (err instanceof UserError) throw new UserError(where, expected, new Received(JSON.stringify(row)));
      throw err;
    }
    if (pins.length > MAX_MARKS) throw new UserError(file, `at most ${MAX_MARKS} points`, new Received(`more rows (row ${k + 1})`));
  }
  if (pins.length === 0) throw new UserError(file, 'at least one row re,im,label', new Received('no rows'));
  return pins;
}
