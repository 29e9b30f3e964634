// components --shard I/N and components merge: four shards of period 12 merged equal the single run row for row,
// with OEIS A000740(12) = 2010 rows; the shard index also comes from Slurm and Kubernetes variables; incomplete,
// mixed, overlapping or duplicated sets are refused in one line, exit 2, with nothing written.
import { existsSync, mkdirSync, readdirSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { parquetReadObjects } from 'hyparquet';
import { beforeAll, describe, expect, it } from 'vitest';
import { tempDir } from '../helpers/run-cli.js';
import { runWithEnv } from './pyramid-helpers.js';

let shards: string;
let single: string[];

function copySet(names: readonly string[]): string {
  const dir = path.join(tempDir(), 'set');
  mkdirSync(dir);
  for (const n of names) writeFileSync(path.join(dir, n), readFileSync(path.join(shards, n)));
  return dir;
}

function refused(dir: string, pattern: RegExp): void {
  const out = path.join(path.dirname(dir), 'merged.csv');
  const r = runWithEnv(['components', 'merge', dir, '--out', out]);
  expect(r.status, r.stderr).toBe(2);
  expect(r.stderr.trim().split('\n')).toHaveLength(1);
  expect(r.stderr).toMatch(pattern);
  expect(existsSync(out)).toBe(false);
  expect(readdirSync(path.dirname(dir)).filter((n) => n !== 'set')).toEqual([]);
}

beforeAll(() => {
  shards = path.join(tempDir(), 'shards');
  for (let i = 0; i < 4; i++) {
    const r = runWithEnv(['components', '--period', '12', '--shard', `${i}/4`, '--out', `${shards}/`, '--workers', '2']);
    expect(r.status, r.stderr).toBe(0);
  }
  const r = runWithEnv(['components', '--period', '12', '--csv', '--workers', '2']);
  expect(r.status).toBe(0);
  single = r.stdout.trim().split('\n');
}, 120_000);

describe('components --shard and components merge', () => {
  it('four shards of period 12 merged to CSV equal the single run row for row (2010 rows, OEIS A000740); each shard records period, I/N and its angle range', () => {
    const first = readFileSync(path.join(shards, 'components-p12-shard-1-of-4.csv'), 'utf8').split('\n')[0]!;
    // shard 1 of 4 covers lower angles floor(4095/4) = 1023 to floor(2 * 4095 / 4) = 2047, over 2^12 - 1
    expect(JSON.parse(first.replace('# quadatlas components shard ', ''))).toMatchObject({ period: 12, shard: '1/4', angleFrom: '1023/4095', angleTo: '2047/4095' });
    const out = path.join(tempDir(), 'p12.csv');
    const r = runWithEnv(['components', 'merge', shards, '--out', out]);
    expect(r.status, r.stderr).toBe(0);
    const merged = readFileSync(out, 'utf8').trim().split('\n');
    expect(merged.length).toBe(2011);
    expect(merged).toEqual(single);
  });

  it('merges to Parquet, read back by hyparquet with the same cells as the single run', async () => {
    const out = path.join(tempDir(), 'p12.parquet');
    expect(runWithEnv(['components', 'merge', shards, '--out', out]).status).toBe(0);
    const bytes = readFileSync(out);
    const rows = (await parquetReadObjects({ file: bytes.buffer.slice(bytes.byteOffset, bytes.byteOffset + bytes.byteLength) })) as Array<Record<string, unknown>>;
    expect(rows.length).toBe(2010);
    const head = single[0]!.split(',');
    expect(rows.map((row) => head.map((h) => String(row[h] ?? '')).join(','))[5]).toBe(
      single[6]!
        .split(',')
        .map((c, k) => (head[k] === 'size' || head[k] === 'orientation_deg' ? String(Number(c)) : c))
        .join(','),
    );
  });

  it('reads the shard from SLURM_ARRAY_TASK_ID / _COUNT and from JOB_COMPLETION_INDEX with --shards: the same file as --shard 2/4', () => {
    const want = readFileSync(path.join(shards, 'components-p12-shard-2-of-4.csv'), 'utf8');
    const a = path.join(tempDir(), 'slurm');
    expect(runWithEnv(['components', '--period', '12', '--out', `${a}/`], { SLURM_ARRAY_TASK_ID: '2', SLURM_ARRAY_TASK_COUNT: '4' }).status).toBe(0);
    expect(readFileSync(path.join(a, 'components-p12-shard-2-of-4.csv'), 'utf8')).toBe(want);
    const b = path.join(tempDir(), 'k8s');
    expect(runWithEnv(['components', '--period', '12', '--shards', '4', '--out', `${b}/`], { JOB_COMPLETION_INDEX: '2' }).status).toBe(0);
    expect(readFileSync(path.join(b, 'components-p12-shard-2-of-4.csv'), 'utf8')).toBe(want);
  });

  it('refuses a shard spec out of range, --certify with a shard and a shard to Parquet, in one line', () => {
    const dir = tempDir();
    for (const [args, pattern] of [
      [['--shard', '4/4', '--count'], /--shard/],
      [['--shard', '0/4', '--certify', '--count'], /--certify/],
      [['--shard', '0/4', '--out', path.join(dir, 's.parquet')], /a \.csv file or a folder/],
    ] as const) {
      const r = runWithEnv(['components', '--period', '12', ...args]);
      expect(r.status, args.join(' ')).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(pattern);
    }
    expect(readdirSync(dir)).toEqual([]);
  });

  it('--count --json of a shard names the shard and counts its slice; the four slices add up to A000740(12) = 2010', () => {
    let total = 0;
    for (let i = 0; i < 4; i++) {
      const j = JSON.parse(runWithEnv(['components', '--period', '12', '--shard', `${i}/4`, '--count', '--json']).stdout) as { count: number; shard: { shard: string } };
      expect(j.shard.shard).toBe(`${i}/4`);
      total += j.count;
    }
    expect(total).toBe(2010);
  });

  it('refuses incomplete, mixed, overlapping and duplicated sets in one line, exit 2, nothing written', () => {
    const names = [0, 1, 2, 3].map((i) => `components-p12-shard-${i}-of-4.csv`);
    refused(copySet(names.slice(0, 3)), /missing 3\/4/);
    const mixed = copySet(names.slice(0, 3));
    expect(runWithEnv(['components', '--period', '11', '--shard', '3/4', '--out', `${mixed}/`]).status).toBe(0);
    refused(mixed, /one period/);
    // an overlap: shard 1's header claims to start at 1000/4095, inside shard 0's range
    const overlap = copySet(names);
    const f1 = path.join(overlap, names[1]!);
    writeFileSync(f1, readFileSync(f1, 'utf8').replace('"angleFrom":"1023/4095"', '"angleFrom":"1000/4095"'));
    refused(overlap, /gap or an overlap/);
    // one component twice: shard 3's first row given shard 0's first nucleus
    const twice = copySet(names);
    const rowOf = (n: string): string[] => readFileSync(path.join(twice, n), 'utf8').split('\n')[2]!.split(',');
    const [a, b] = [rowOf(names[0]!), rowOf(names[3]!)];
    const f3 = path.join(twice, names[3]!);
    writeFileSync(f3, readFileSync(f3, 'utf8').replace(b.join(','), [b[0], a[1], a[2], ...b.slice(3)].join(',')));
    refused(twice, /distinct nuclei/);
  });
});
