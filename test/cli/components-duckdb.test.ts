import { describe, expect, it } from 'vitest';
import path from 'node:path';
import { readFileSync } from 'node:fs';
import { DuckDBInstance } from '@duckdb/node-api';
import { runCli, tempDir } from '../helpers/run-cli.js';

/**
 * A listing written to Parquet is read back by DuckDB (its npm package, a
 * reader outside the project): the row count is OEIS A000740(19), the real
 * rows OEIS A000048(19), and the first rows equal the CSV listing's. Period
 * 19 runs the census in slices (docs/methods.md C8).
 */
describe('components --out FILE.parquet read back by DuckDB', () => {
  it('period 19: 262143 rows (A000740), 13797 real (A000048), first rows as in the CSV listing', async () => {
    const dir = tempDir();
    const file = path.join(dir, 'p19.parquet');
    const r = runCli(['components', '--period', '19', '--out', file]);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stderr).toMatch(/us per component/);
    const db = await (await DuckDBInstance.create(':memory:')).connect();
    const q = async (sql: string) => (await db.runAndReadAll(sql)).getRowObjects();
    const count = await q(`select count(*) as n, count(distinct angle_lo) as lows, sum(case when nucleus_im = '0' then 1 else 0 end) as real from read_parquet('${file}')`);
    expect(count[0]).toEqual({ n: 262143n, lows: 262143n, real: 13797n });
    const csvFile = path.join(dir, 'p19-real.csv');
    const csv = runCli(['components', '--period', '19', '--real', '--out', csvFile]);
    expect(csv.status, csv.stderr).toBe(0);
    const lines = readFileSync(csvFile, 'utf8').trim().split('\n');
    expect(lines.length).toBe(13797 + 1);
    const head = lines[0]!.split(',');
    const first = lines[1]!.split(',');
    const rows = await q(`select * from read_parquet('${file}') where nucleus_im = '0' limit 1`);
    const got = rows[0]!;
    head.forEach((name, i) => {
      const v = got[name];
      expect(v === null ? '' : String(v), name).toBe(first[i]);
    });
  }, 300_000);
});
