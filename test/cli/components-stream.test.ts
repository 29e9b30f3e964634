// components --out / --csv stream their rows block by block (src/io/table-stream.ts): the
// streamed files must equal, byte for byte, the table built in memory from the same rows
// by table-file.ts (the writer used before streaming); the row count is OEIS A000740(14) = 8127.
// A period beyond the machine's memory is refused in one line with the estimate.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { census } from '../../src/components/census.js';
import { listComponents } from '../../src/components/list-components.js';
import { COLUMN_TYPES, flat, HEADER } from '../../src/cli/components.js';
import { tableBytes } from '../../src/io/table-file.js';
import { runCli, tempDir } from '../helpers/run-cli.js';

const columns = HEADER.map((name) => ({ name, type: COLUMN_TYPES[name] ?? ('string' as const) }));

async function inMemory(period: number, file: string): Promise<string> {
  const comps = (await census(period, { workers: 2 })).components;
  const rows = await listComponents(period, comps, 20, 2);
  return (await tableBytes(file, columns, rows.map(flat))) as string;
}

describe('streamed listings', () => {
  it('period 14 to CSV equals the in-memory table byte for byte (8127 rows, OEIS A000740)', async () => {
    const dir = tempDir();
    const file = path.join(dir, 'p14.csv');
    const r = runCli(['components', '--period', '14', '--out', file, '--workers', '2']);
    expect(r.status, r.stderr).toBe(0);
    const streamed = readFileSync(file, 'utf8');
    expect(streamed.trim().split('\n')).toHaveLength(8127 + 1);
    expect(streamed).toBe(await inMemory(14, file));
  }, 240_000);

  it('--csv on stdout streams the bytes of --out FILE.csv (period 11; spawnSync keeps 1 MB of stdout)', () => {
    const dir = tempDir();
    const file = path.join(dir, 'p11.csv');
    expect(runCli(['components', '--period', '11', '--out', file]).status).toBe(0);
    expect(runCli(['components', '--period', '11', '--csv']).stdout).toBe(readFileSync(file, 'utf8'));
  }, 120_000);

  it('period 9 to JSON equals the in-memory JSON', async () => {
    const dir = tempDir();
    const file = path.join(dir, 'p9.json');
    expect(runCli(['components', '--period', '9', '--out', file]).status).toBe(0);
    expect(readFileSync(file, 'utf8')).toBe(await inMemory(9, file));
  }, 120_000);

  it('refuses a listing beyond memory, with the estimate, in one line', () => {
    // the text table holds every row (the census in slices, with --csv or --out, needs about 5 bytes per component)
    const r = runCli(['components', '--period', '30']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toMatch(/period whose listing fits in memory \(period 30: about [\d.]+ GiB for up to 536870912 components.*this machine has.*--period/);
  });
});
