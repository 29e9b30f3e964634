import { describe, expect, it } from 'vitest';
import { hypot2 } from '../../src/plane/hypot2.js';

/** A small deterministic generator (mulberry32), so a failure names a reproducible argument. */
function generator(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = Math.imul(s ^ (s >>> 15), 1 | s);
    t ^= t + Math.imul(t ^ (t >>> 7), 61 | t);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Pairs over the whole double range (exponents -1074 .. 1023, both signs) and near 1, where plate values lie. */
function pairs(count: number): Array<[number, number]> {
  const rnd = generator(20261203);
  const wide = (): number => (rnd() - 0.5) * 2 ** (Math.floor(rnd() * 2100) - 1075);
  const out: Array<[number, number]> = [];
  for (let i = 0; i < count; i++) out.push(i % 2 === 0 ? [wide(), wide()] : [rnd() * 4 - 2, rnd() * 4 - 2]);
  return out;
}

describe('hypot2', () => {
  // Reference: the running engine's own Math.hypot (V8 MathHypot), which hypot2 must match bit for bit.
  it('hypot2(a, b) is Object.is-equal to Math.hypot(a, b) for 400000 random pairs', () => {
    let mismatches = 0;
    for (const [a, b] of pairs(400000)) if (!Object.is(hypot2(a, b), Math.hypot(a, b))) mismatches++;
    expect(mismatches).toBe(0);
  });

  it('hypot2 matches Math.hypot on zeros, infinities, NaN, subnormals and the overflow edge', () => {
    const special = [0, -0, 1, -1, 3, 4, NaN, Infinity, -Infinity, 5e-324, -5e-324, 2.2250738585072014e-308, Number.MAX_VALUE, -Number.MAX_VALUE, 1e154, 1e-162];
    for (const a of special) for (const b of special) expect(Object.is(hypot2(a, b), Math.hypot(a, b)), `${a}, ${b}`).toBe(true);
  });

  it('the random pairs tell apart the naive sqrt(a^2 + b^2), so the first check can fail', () => {
    // Negative control: a formula that is not the builtin's differs somewhere on the same inputs.
    const naive = (a: number, b: number): number => Math.sqrt(a * a + b * b);
    const differs = pairs(400000).filter(([a, b]) => !Object.is(naive(a, b), Math.hypot(a, b))).length;
    expect(differs).toBeGreaterThan(0);
  });
});
