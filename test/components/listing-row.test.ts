// listingRow builds the listing's cells without componentJson: its cells must be the ones the
// JSON values print as (String of each value, as the CSV has always printed them), for random
// orientations (including -0 and values that round to -0.000000) and sizes, satellites and
// primitive components. The reference is JavaScript's own Number -> string conversion.
import { describe, expect, it } from 'vitest';
import { componentJson, listingRow } from '../../src/components/component-json.js';
import { mersenneAngle, type ComponentInfo } from '../../src/components/component-info.js';

function info(orientation: number, size: number, satellite: boolean): ComponentInfo {
  return {
    period: 5,
    nucleus: { re: '-1.98553175672794', im: '0' },
    root: { re: '-1.985424253', im: '0' },
    parent: satellite ? { period: 1, nucleus: { re: '0', im: '0' }, num: 2, den: 5 } : null,
    size,
    log10Size: Math.log10(size),
    orientation,
    shape: satellite ? 'disk' : 'cardioid',
    angles: [
      { num: 15n, den: 31n },
      { num: 16n, den: 31n },
    ],
    address: [1, 2, 4, 5],
  };
}

describe('listingRow', () => {
  it('prints the cells of componentJson, value for value', () => {
    let seed = 12345;
    const rand = (): number => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31) * 2 - 1;
    const orientations = [0, -0, -1e-9, 1e-9, Math.PI, -Math.PI, 5e-7 * (Math.PI / 180), -5e-7 * (Math.PI / 180)];
    for (let i = 0; i < 20000; i++) orientations.push(rand() * Math.PI * (i % 7 === 0 ? 1e-6 : 1));
    orientations.forEach((o, i) => {
      const r = info(o, 10 ** (rand() * 30 - 31), i % 2 === 0);
      const j = componentJson(r);
      const cells = listingRow(r);
      expect(cells[5]).toBe(String(j['size']));
      expect(cells[6]).toBe(String(j['orientationDegrees']));
      expect(cells[9]).toBe(i % 2 === 0 ? '2/5' : '');
      expect(cells.slice(10)).toEqual([...(j['externalAngles'] as string[]), String(j['internalAddress'])]);
    });
  });
});

describe('mersenneAngle', () => {
  it('reduces n/(2^p - 1): num (2^p - 1) = n den exactly and gcd(num, den) = 1, in BigInt (periods 2 to 60)', () => {
    const gcd = (a: bigint, b: bigint): bigint => (b === 0n ? a : gcd(b, a % b));
    let seed = 7;
    const rand = (): number => (seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31;
    for (let p = 2; p <= 60; p++) {
      const d = 2n ** BigInt(p) - 1n;
      // multiples of the divisors 2^k - 1 (k | p) are the ones that reduce
      const ns = [0, 1, Number(d) - 1, ...Array.from({ length: 40 }, () => Math.floor(rand() * Number(d)))];
      for (let k = 1; k < p; k++) if (p % k === 0) ns.push(Number(d / (2n ** BigInt(k) - 1n)) * Math.max(1, Math.floor(rand() * (2 ** k - 1))));
      for (const n of ns) {
        if (!Number.isSafeInteger(n)) continue;
        const a = mersenneAngle(n, p);
        expect(a.num * d).toBe(BigInt(n) * a.den);
        expect(gcd(a.num, a.den)).toBe(n === 0 ? a.den : 1n);
      }
    }
  });
});
