import { describe, expect, it } from 'vitest';
import { probeSize, raiseLimit } from '../../src/plane/probe-rule.js';

// Synthetic probes: n pixels with known escape counts (escaped by limit L when count <= L),
// so the undecided count at each limit is exact arithmetic.
function undecidedOf(counts: readonly number[]): (limit: number) => number {
  return (limit) => counts.filter((c) => !(c <= limit)).length;
}

describe('raiseLimit (docs/methods.md B9)', () => {
  it('does not stop while every probe pixel is undecided, and stops one doubling after the last change: 2 x 8192 for counts near 2700', () => {
    const counts = Array.from({ length: 192 }, (_, k) => 2660 + (k % 20));
    const asked: number[] = [];
    const out = raiseLimit(192, 7_665_010, (l) => (asked.push(l), undecidedOf(counts)(l)));
    expect(asked).toEqual([1024, 2048, 4096, 8192]);
    expect(out.levels.map((l) => l.undecided)).toEqual([192, 192, 0, 0]);
    expect(out).toMatchObject({ limit: 16384, stop: 'stable' });
  });

  it('allows floor(0.001 n) pixels decided over a doubling: 3 of 3072 is stable, 4 is not', () => {
    // most pixels escape at 100; k late ones between 1024 and 2048
    const probe = (k: number): number[] => [...Array.from({ length: 3072 - k }, () => 100), ...Array.from({ length: k }, () => 1500)];
    const three = raiseLimit(3072, 1e7, undecidedOf(probe(3)));
    expect(three.levels.map((l) => l.limit)).toEqual([1024, 2048]);
    expect(three.limit).toBe(4096);
    const four = raiseLimit(3072, 1e7, undecidedOf(probe(4)));
    expect(four.levels.map((l) => l.limit)).toEqual([1024, 2048, 4096]);
    expect(four.limit).toBe(8192);
  });

  it('stops at the ceiling when nothing is ever decided, and never asks beyond it', () => {
    const asked: number[] = [];
    const out = raiseLimit(10, 5000, (l) => (asked.push(l), 10));
    expect(asked).toEqual([1024, 2048, 4096, 5000]);
    expect(out).toMatchObject({ limit: 5000, stop: 'ceiling' });
    expect(raiseLimit(10, 500, () => 10)).toMatchObject({ limit: 500, stop: 'ceiling', levels: [{ limit: 500, undecided: 10 }] });
  });

  it('caps margin x limit at the ceiling', () => {
    expect(raiseLimit(4, 3000, () => 0)).toMatchObject({ limit: 3000, stop: 'stable' });
  });
});

describe('probeSize', () => {
  it('keeps plates of at most 64 pixels a side and shrinks larger ones to 64 on the longer side', () => {
    expect(probeSize(16, 12, 64)).toEqual({ width: 16, height: 12 });
    expect(probeSize(960, 720, 64)).toEqual({ width: 64, height: 48 });
    expect(probeSize(100, 4000, 64)).toEqual({ width: 2, height: 64 });
    expect(probeSize(10000, 1, 64)).toEqual({ width: 64, height: 1 });
  });
});
