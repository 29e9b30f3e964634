import { describe, expect, it } from 'vitest';
import { lavaursPairs } from '../../src/components/lavaurs.js';

describe('lavaursPairs', () => {
  it('lavaursPairs(6) gives 1, 3, 6, 15, 27 pairs for periods 2..6 (docs/methods.md D2 [checked]; A000740)', () => {
    const pairs = lavaursPairs(6);
    expect([2, 3, 4, 5, 6].map((p) => pairs.filter((x) => x.period === p).length)).toEqual([1, 3, 6, 15, 27]);
  });
  it('period 4 pairs are (1/15,2/15) (1/5,4/15) (2/5,3/5) (7/15,8/15) (11/15,4/5) (13/15,14/15) (docs/methods.md D2)', () => {
    const p4 = lavaursPairs(4)
      .filter((x) => x.period === 4)
      .map((x) => [x.lo, x.hi]);
    expect(p4).toEqual([
      [1, 2],
      [3, 4],
      [6, 9],
      [7, 8],
      [11, 12],
      [13, 14],
    ]); // over 15
  });
  it('period 5 includes (13/31, 18/31) and (14/31, 17/31) (docs/methods.md D2)', () => {
    const p5 = lavaursPairs(5)
      .filter((x) => x.period === 5)
      .map((x) => `${x.lo}/${x.hi}`);
    expect(p5).toContain('13/18');
    expect(p5).toContain('14/17');
  });
});
