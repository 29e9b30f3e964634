/**
 * The real-slice strip under the survey page's plane: the logistic
 * bifurcation diagram over the same range of c as the view (the axis linear
 * in c, r = 1 + sqrt(1 - 4c); docs/methods.md E7 for the density image), so a
 * column of the strip sits under the column of the plane with the same re c.
 * The state x runs from 1 at the top to 0 at the bottom. Ink is mixed from
 * the page's paper and ink colours; columns outside -2 <= c <= 1/4 (where
 * the logistic map has no bounded orbit in [0, 1] or no meaning) are left
 * in a flat grey. Doubles only: the page asks for it while the view is wider
 * than about 1e-12.
 */
import { diagramColumns } from '../section/density-diagram.js';
import { logistic } from '../section/families/logistic.js';

const PAPER = [244, 241, 234] as const;
const INK = [31, 42, 46] as const;
const OUTSIDE = [200, 196, 186] as const;

/** Samples per column and steps: a strip of ~800 columns takes a few tens of milliseconds. */
export const STRIP_SAMPLES = 4;
export const STRIP_TRANSIENT = 600;
export const STRIP_ITERATIONS = 300;

/** 8-bit RGB, width x height, row-major. */
export function realStrip(from: number, to: number, width: number, height: number): Uint8Array {
  const settings = { width, height, samples: STRIP_SAMPLES, transient: STRIP_TRANSIENT, iterations: STRIP_ITERATIONS, stateTop: 1, stateBottom: 0 };
  const spacing = (to - from) / width;
  const out = new Uint8Array(width * height * 3);
  const column = new Uint16Array(height);
  const acc = new Float64Array(height);
  for (let i = 0; i < width; i++) {
    const c = from + (i + 0.5) * spacing;
    const inside = c >= -2 && c <= 0.25;
    if (inside) diagramColumns(logistic, { kind: 'c', from, to }, settings, i, i + 1, column, acc);
    for (let j = 0; j < height; j++) {
      const p = 3 * (j * width + i);
      if (!inside) {
        out.set(OUTSIDE, p);
        continue;
      }
      const paper = column[j]! / 65535;
      for (let ch = 0; ch < 3; ch++) out[p + ch] = Math.round(INK[ch]! + (PAPER[ch]! - INK[ch]!) * paper);
    }
  }
  return out;
}
