import { describe, expect, it } from 'vitest';
import { addressOfAngle, internalAddress, kneadingSequence } from '../../src/components/internal-address.js';
import { angleOrbit, parseAngle } from '../../src/components/external-angle.js';
import { findMisiurewicz } from '../../src/components/misiurewicz.js';
import { traceRayDD } from '../../src/components/trace-ray.js';

describe('kneadingSequence and internalAddress', () => {
  // docs/methods.md D3 table [checked]; Schleicher, arXiv math/9411238.
  const table: Array<[string, number, string, number[]]> = [
    ['1/7', 3, '11*', [1, 3]],
    ['3/7', 3, '10*', [1, 2, 3]],
    ['1/15', 4, '111*', [1, 4]],
    ['2/5', 4, '101*', [1, 2, 4]],
  ];
  for (const [text, p, knead, address] of table) {
    it(`angle ${text}: kneading ${knead}, internal address ${address.join('-')}`, () => {
      const a = parseAngle(text, 'angle');
      expect(angleOrbit(a)).toEqual({ preperiod: 0, period: p });
      expect(kneadingSequence(a, p)).toBe(knead);
      expect(internalAddress(kneadingSequence(a, p), p)).toEqual(address);
    });
  }
  it('both angles of a pair give the same address (3/7 and 4/7; 1/5 and 4/15)', () => {
    expect(addressOfAngle(parseAngle('4/7', 'a'), 3)).toEqual([1, 2, 3]);
    expect(addressOfAngle(parseAngle('1/5', 'a'), 4)).toEqual(addressOfAngle(parseAngle('4/15', 'a'), 4));
  });
  it('parseAngle rejects 3/2, 1/0, abc with a UserError naming the field', () => {
    for (const bad of ['3/2', '1/0', 'abc', '1/-3']) expect(() => parseAngle(bad, 'angle')).toThrow(/for angle but received/);
  });
});

describe('findMisiurewicz', () => {
  it('the ray of 1/6 lands at c = i and the ray of 1/2 at c = -2 (docs/checks.md Misiurewicz points)', () => {
    const i = findMisiurewicz(1, 2, traceRayDD(1n, 6n, 14, 8), 20);
    expect(Number(i.re)).toBeCloseTo(0, 19);
    expect(i.im).toBe('1.00000000000000000000');
    const two = findMisiurewicz(1, 1, traceRayDD(1n, 2n, 12, 8), 20);
    expect(two.re).toBe('-2.00000000000000000000');
  });
});
