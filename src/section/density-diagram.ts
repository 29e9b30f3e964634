/**
 * The bifurcation diagram as a density image (docs/methods.md E7). Per pixel
 * column: `samples` parameter values, stratified and jittered inside the
 * column (horizontal anti-aliasing); each runs `transient` steps from a fixed
 * start and then `iterations` steps whose states are splatted into the two
 * nearest rows with tent weights (vertical anti-aliasing). The column is
 * normalised to a probability density, expressed relative to the uniform
 * density (1 = spread evenly over the column) and tone-mapped by
 * t = ln(1 + d) / ln(1 + DENSITY_BLACK), clamped to [0, 1]; ink is 1 - t.
 * Accumulation is in float64; the result is 16-bit.
 *
 * Every column depends only on its own index (the jitter is a hash of the
 * column and sample index), so the image is the same for any split of the
 * columns among workers.
 */
import type { UnimodalFamily } from './unimodal-family.js';

/** The parameter axis of the image: linear in the family's parameter, or (logistic) linear in c. */
export interface ParameterAxis {
  readonly kind: 'parameter' | 'c';
  /** Left and right ends, in the axis's own unit (parameter or c). */
  readonly from: number;
  readonly to: number;
}

export interface DiagramSettings {
  readonly width: number;
  readonly height: number;
  readonly samples: number;
  readonly transient: number;
  readonly iterations: number;
  /** State at the top and bottom edges. */
  readonly stateTop: number;
  readonly stateBottom: number;
}

/** A density of this many times the uniform one is drawn fully black. */
export const DENSITY_BLACK = 64;

/** The family parameter at axis fraction u in [0, 1]. */
export function axisParameter(axis: ParameterAxis, u: number): number {
  const v = axis.from + (axis.to - axis.from) * u;
  return axis.kind === 'parameter' ? v : 1 + Math.sqrt(Math.max(0, 1 - 4 * v));
}

/** A hash of two integers to [0, 1) (32-bit integer mix after Wang / murmur3 finaliser). */
export function jitter(a: number, b: number): number {
  let h = (Math.imul(a, 0x9e3779b1) ^ Math.imul(b + 0x7f4a7c15, 0x85ebca6b)) >>> 0;
  h ^= h >>> 16;
  h = Math.imul(h, 0x85ebca6b) >>> 0;
  h ^= h >>> 13;
  h = Math.imul(h, 0xc2b2ae35) >>> 0;
  h ^= h >>> 16;
  return h / 4294967296;
}

/**
 * Fills columns col0 <= i < col1 into `out`, column-major: out[(i - col0) *
 * height + j] is the 16-bit ink of row j (0 = black, 65535 = white).
 * `acc` is scratch of length >= height.
 */
export function diagramColumns(
  family: UnimodalFamily,
  axis: ParameterAxis,
  settings: DiagramSettings,
  col0: number,
  col1: number,
  out: Uint16Array,
  acc: Float64Array,
): Uint16Array {
  const { width, height, samples, transient, iterations, stateTop, stateBottom } = settings;
  const rowsPerState = height / (stateBottom - stateTop);
  const [lo, hi] = family.stateRange;
  const norm = Math.log1p(DENSITY_BLACK);
  for (let i = col0; i < col1; i++) {
    acc.fill(0, 0, height);
    let total = 0;
    for (let s = 0; s < samples; s++) {
      const r = axisParameter(axis, (i + (s + jitter(i, s)) / samples) / width);
      let x = lo + (hi - lo) * (0.2 + 0.6 * jitter(s, 1_000_003));
      for (let k = 0; k < transient; k++) x = family.f(x, r);
      for (let k = 0; k < iterations; k++) {
        x = family.f(x, r);
        // Row coordinate of the state, with row centres at integers.
        const y = (x - stateTop) * rowsPerState - 0.5;
        const j = Math.floor(y);
        const w = y - j;
        if (j >= 0 && j < height) acc[j]! += 1 - w;
        if (j + 1 >= 0 && j + 1 < height) acc[j + 1]! += w;
      }
      total += iterations;
    }
    const scale = total > 0 ? height / total : 0;
    const base = (i - col0) * height;
    for (let j = 0; j < height; j++) {
      const t = Math.min(1, Math.log1p(acc[j]! * scale) / norm);
      out[base + j] = Math.round(65535 * (1 - t));
    }
  }
  return out;
}
