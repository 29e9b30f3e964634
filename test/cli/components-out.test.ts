// components --out FILE: the listing as CSV, JSON or Parquet. The Parquet
// file is read back by hyparquet (an independent reader, npm), and its rows
// must equal the CSV rows; the row count is OEIS A000740(p).
import { mkdirSync, readFileSync } from 'node:fs';
import path from 'node:path';
import { parquetMetadata, parquetReadObjects } from 'hyparquet';
import { describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';

describe('components --out', () => {
  it('writes period 7 as Parquet that hyparquet reads: A000740(7) = 63 rows, typed columns, the same cells as the CSV', async () => {
    const dir = tempDir();
    const pq = path.join(dir, 'p7.parquet');
    const csv = path.join(dir, 'p7.csv');
    expect(runCli(['components', '--period', '7', '--out', pq]).status).toBe(0);
    expect(runCli(['components', '--period', '7', '--out', csv]).status).toBe(0);
    const bytes = readFileSync(pq);
    const file = bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength);
    expect(parquetMetadata(file).num_rows).toBe(63n);
    const rows = (await parquetReadObjects({ file })) as Array<Record<string, unknown>>;
    const lines = readFileSync(csv, 'utf8').trim().split('\n');
    const head = lines[0]!.split(',');
    expect(Object.keys(rows[0]!)).toEqual(head);
    for (let i = 0; i < rows.length; i++) {
      const cells = lines[i + 1]!.split(',');
      head.forEach((name, k) => {
        const v = rows[i]![name];
        expect(v === null ? '' : String(v), `${name} of row ${i}`).toBe(name === 'size' || name === 'orientation_deg' ? String(Number(cells[k])) : cells[k]);
      });
    }
    expect(rows.every((r) => r['period'] === 7)).toBe(true);
    expect(typeof rows[0]!['size']).toBe('number');
    // A000048(7) = 9 real components (a real nucleus prints nucleus_im as exactly 0).
    expect(rows.filter((r) => /^-?0(\.0+)?$/.test(String(r['nucleus_im']))).length).toBe(9);
  });

  it('refuses another extension, --count with --out and a directory, in one line', () => {
    const dir = tempDir();
    const folder = path.join(dir, 'rows.csv');
    mkdirSync(folder);
    for (const [args, pattern] of [
      [['--out', path.join(dir, 'x.txt')], /\.csv, \.json or \.parquet/],
      [['--count', '--out', path.join(dir, 'x.csv')], /--count/],
      [['--out', folder], /existing directory/],
    ] as const) {
      const r = runCli(['components', '--period', '4', ...args]);
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(pattern);
    }
  });
});
