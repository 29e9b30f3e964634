import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, describe, expect, it } from 'vitest';
import { benchBase, compareWithBase, spread } from '../../bench/base-checkout.js';

const built = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-base-'));
mkdirSync(path.join(built, 'dist/src/cli'), { recursive: true });
writeFileSync(path.join(built, 'dist/src/cli/main.js'), '');
const unbuilt = mkdtempSync(path.join(os.tmpdir(), 'quadatlas-base-'));
afterAll(() => {
  rmSync(built, { recursive: true, force: true });
  rmSync(unbuilt, { recursive: true, force: true });
});

function context(root: string): { root: string; notes: string[]; note(text: string): void } {
  const notes: string[] = [];
  return { root, notes, note: (text: string) => notes.push(text) };
}

describe('benchBase', () => {
  it('names the checkout of QUADATLAS_BENCH_BASE only when it is set and built', () => {
    expect(benchBase({})).toBeUndefined();
    expect(benchBase({ QUADATLAS_BENCH_BASE: '' })).toBeUndefined();
    expect(benchBase({ QUADATLAS_BENCH_BASE: unbuilt })).toBeUndefined();
    expect(benchBase({ QUADATLAS_BENCH_BASE: built })).toBe(built);
  });
});

describe('compareWithBase', () => {
  it('runs base and this checkout in pairs, base first, and gives faster = base seconds / ours per pair', () => {
    const c = context('/this/checkout');
    const calls: string[] = [];
    // seconds chosen so the ratios are exact: 6/2 = 3, 4/4 = 1, 5/2 = 2.5 (median 2.5, min 1, max 3)
    const base = [6, 4, 5];
    const ours = [2, 4, 2];
    const r = compareWithBase(
      c,
      3,
      (root) => {
        calls.push(root);
        const k = calls.filter((x) => x === root).length - 1;
        return { root, seconds: root === built ? base[k]! : ours[k]! };
      },
      (t) => t.seconds,
      { QUADATLAS_BENCH_BASE: built },
    );
    expect(calls).toEqual([built, '/this/checkout', built, '/this/checkout', built, '/this/checkout']);
    expect(r).toBeDefined();
    expect(r!.before.map((t) => t.seconds)).toEqual(base);
    expect(r!.after.map((t) => t.seconds)).toEqual(ours);
    expect(r!.faster).toEqual({ median: 2.5, min: 1, max: 3 });
    expect(c.notes).toHaveLength(1);
    expect(c.notes[0]).toContain(built);
    expect(c.notes[0]).toContain('3 paired runs');
  });

  it('measures nothing and notes why when no built base is named', () => {
    for (const env of [{}, { QUADATLAS_BENCH_BASE: unbuilt }]) {
      const c = context('/this/checkout');
      let called = 0;
      const r = compareWithBase(
        c,
        1,
        () => {
          called += 1;
          return 1;
        },
        (t) => t,
        env,
      );
      expect(r).toBeUndefined();
      expect(called).toBe(0);
      expect(c.notes).toEqual(['QUADATLAS_BENCH_BASE unset (or not built): the comparison with the previous commit was skipped']);
    }
  });
});

describe('spread', () => {
  it('gives the median (upper middle of an even count), least and greatest', () => {
    expect(spread([3, 1, 2])).toEqual({ median: 2, min: 1, max: 3 });
    expect(spread([4, 1, 3, 2])).toEqual({ median: 3, min: 1, max: 4 });
    expect(spread([7])).toEqual({ median: 7, min: 7, max: 7 });
  });
});
