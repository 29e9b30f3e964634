// Issue 15's sharding check at a larger period: period 19 in four shards (each a census in one piece over its
// angle range), merged, equals the single run (a census in slices, docs/methods.md C8) row for row, with
// OEIS A000740(19) = 262143 rows. Two different decompositions of the circle must give the same table.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { tempDir } from '../helpers/run-cli.js';
import { runWithEnv } from './pyramid-helpers.js';

describe('components --shard at period 19', () => {
  it('four shards merged equal the sliced single run row for row (262143 rows, OEIS A000740)', () => {
    const dir = tempDir();
    const shards = path.join(dir, 'shards');
    for (let i = 0; i < 4; i++) {
      const r = runWithEnv(['components', '--period', '19', '--shard', `${i}/4`, '--out', `${shards}/`, '--workers', '2']);
      expect(r.status, r.stderr).toBe(0);
    }
    const merged = path.join(dir, 'merged.csv');
    const m = runWithEnv(['components', 'merge', shards, '--out', merged]);
    expect(m.status, m.stderr).toBe(0);
    const single = path.join(dir, 'single.csv');
    const s = runWithEnv(['components', '--period', '19', '--out', single, '--workers', '2']);
    expect(s.status, s.stderr).toBe(0);
    expect(s.stderr).toMatch(/2 slices/);
    const a = readFileSync(merged, 'utf8').trim().split('\n');
    const b = readFileSync(single, 'utf8').trim().split('\n');
    expect(a.length).toBe(262143 + 1);
    // the size estimate's last digits depend on the orbit rounding only, not on the decomposition: rows are equal
    expect(a).toEqual(b);
  }, 600_000);
});
