import { describe, expect, it } from 'vitest';
import { axisTicks } from '../../src/figure/axis-ticks.js';

/** A decimal string as an exact rational n / 10^k (BigInt), for comparisons no double can blur. */
function exact(text: string): { n: bigint; k: number } {
  const m = /^(-?)(\d+)(?:\.(\d*))?$/.exec(text)!;
  const frac = m[3] ?? '';
  return { n: BigInt(`${m[1]}${m[2]}${frac}`), k: frac.length };
}

function scaled(text: string, k: number): bigint {
  const e = exact(text);
  return e.n * 10n ** BigInt(k - e.k);
}

describe('axisTicks', () => {
  it('deep axis: every tick value is exactly centre + x * 10^e (exact decimal arithmetic, BigInt)', () => {
    const centre = '-0.745300000000000000000012345678';
    const a = axisTicks('Re c', centre, '3e-25', 600, 6, false);
    expect(a.offset).toEqual({ centre, exponent: -25 });
    expect(a.title).toBe('Re c = \u22120.745300000000000000000012345678 + x \u00d7 1e\u221225');
    expect(a.ticks.length).toBeGreaterThanOrEqual(4);
    const K = 60;
    for (const t of a.ticks) {
      const x = t.label.replace('\u2212', '-');
      expect(scaled(t.value, K)).toBe(scaled(centre, K) + scaled(x, K - 25));
      // position: (value - (centre - span/2)) / span * 600 pixels
      expect(t.at).toBeCloseTo(((Number(x) + 1.5) / 3) * 600, 9);
    }
  });

  it('plain axis: labels are the values, positions from the left edge centre - span/2; Im grows upwards', () => {
    const re = axisTicks('Re c', '-0.75', '3', 1200, 6, false);
    expect(re.offset).toBeNull();
    expect(re.ticks.map((t) => t.label)).toEqual(['\u22122.0', '\u22121.5', '\u22121.0', '\u22120.5', '0.0', '0.5']);
    expect(re.ticks.map((t) => t.at)).toEqual([100, 300, 500, 700, 900, 1100]);
    const im = axisTicks('Im c', '0', '2', 800, 4, true);
    expect(im.ticks.find((t) => t.value === '0.5')!.at).toBe(200);
    expect(im.ticks.find((t) => t.value === '-0.5')!.at).toBe(600);
  });
});
