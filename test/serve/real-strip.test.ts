/**
 * The survey's real-slice strip: the logistic diagram under the same c as the
 * plane. Checked by exact algebra at two parameters where the attractor is
 * known in closed form (x = 1/2 - z/r, r = 1 + sqrt(1 - 4c); docs/methods.md E7):
 * c = -1/2, the attracting fixed point z = (1 - sqrt 3)/2; c = -1, the
 * superstable 2-cycle {0, -1} of z^2 - 1. Ink must sit on those states and
 * nowhere else in the column; columns beyond -2 <= c <= 1/4 stay flat.
 */
import { describe, expect, it } from 'vitest';
import { realStrip } from '../../src/serve/real-strip.js';

const W = 400;
const H = 200;
const FROM = -2.25;
const TO = 0.5;

/** The column whose pixel centre is nearest c, and its rows' darkness (0 paper .. 1 ink). */
function column(img: Uint8Array, c: number): number[] {
  const i = Math.round((c - FROM) / ((TO - FROM) / W) - 0.5);
  const out: number[] = [];
  for (let j = 0; j < H; j++) out.push(1 - (img[3 * (j * W + i)]! - 31) / (244 - 31));
  return out;
}

/** Row of state x: row centres at x = 1 - (j + 1/2) / H. */
const rowOf = (x: number): number => (1 - x) * H - 0.5;

describe('realStrip', () => {
  const img = realStrip(FROM, TO, W, H);

  it('inks the attracting fixed point at c = -1/2 and the 2-cycle at c = -1, and nothing else in those columns', () => {
    const r1 = 1 + Math.sqrt(3);
    const cases: Array<[number, number[]]> = [
      [-0.5, [0.5 - (1 - Math.sqrt(3)) / 2 / r1]],
      [-1, [0.5, 0.5 + 1 / (1 + Math.sqrt(5))]],
    ];
    for (const [c, states] of cases) {
      const col = column(img, c);
      for (const x of states) {
        const j = rowOf(x);
        const near = Math.max(col[Math.floor(j)]!, col[Math.ceil(j)]!);
        expect(near, `ink at x = ${x} for c = ${c}`).toBeGreaterThan(0.5);
      }
      for (let j = 0; j < H; j++) {
        if (states.some((x) => Math.abs(j - rowOf(x)) < 3)) continue;
        expect(col[j]!, `paper at row ${j} for c = ${c}`).toBeLessThan(0.05);
      }
    }
  });

  it('leaves the columns beyond c = -2 and c = 1/4 flat', () => {
    for (const c of [-2.2, 0.4]) {
      const col = column(img, c);
      expect(new Set(col).size).toBe(1);
    }
    // The chaotic band near c = -2 (r near 4) spreads ink over most rows.
    const chaos = column(img, -1.99);
    expect(chaos.filter((d) => d > 0.1).length).toBeGreaterThan(H / 2);
  });
});
