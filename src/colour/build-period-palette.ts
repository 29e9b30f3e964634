import { linearToOklab, maxChromaInGamut, oklabToLinear, oklchToOklab } from './oklab.js';
import { luminance, simulateVision, VISION_KINDS } from './vision-simulation.js';

/**
 * The period palette: categorical colours for the periods of attracting cycles
 * inside the set (period 1 = main cardioid, 2 = the disk left of it, ...).
 *
 * How it is built (once, at import, deterministically; never mutated):
 * 1. Candidates: OKLCh colours on a grid of lightness levels inside the band
 *    [PERIOD_LIGHTNESS_MIN, PERIOD_LIGHTNESS_MAX] and hues every 7.5 degrees,
 *    each at two chroma levels (55% and 90% of the largest chroma inside the
 *    sRGB gamut at that L and h, capped at 0.19), so every colour is in gamut
 *    by construction.
 * 2. Period 1 takes a fixed seed (a clear sea-green); then each period p in
 *    turn takes the candidate that maximises its weighted minimum distance to
 *    the colours already chosen, where the distance between two colours is
 *    the smallest OKLab distance over four views: normal vision and
 *    protanopia, deuteranopia and tritanopia simulated with the severity-1.0
 *    matrices of Machado, Oliveira & Fernandes (IEEE TVCG 2009;
 *    vision-simulation.ts), and, among the first PERIOD_GREYSCALE_DISTINCT
 *    periods, also their difference in greyscale lightness (OKLab L of the
 *    luminance grey). Result, held by test/colour/period-palette-vision.test.ts:
 *    periods 1..12 stay at least 0.06 apart in every view (3 just-noticeable
 *    differences of 0.02, the JND CSS Color 4 uses for deltaEOK), and periods
 *    1..5 at least 0.06 apart in greyscale lightness. Keeping normal vision
 *    alone was dropped in this change: its palette put periods 5 and 8 0.019
 *    apart for protanopia and periods 2 and 4 0.020 apart in greyscale.
 *    Periods that meet in the plane
 *    (q = p - 1, p - 2, and q a divisor of p: a period-q component carries
 *    period-kq bulbs on its boundary) count at full distance; other pairs at
 *    NEIGHBOUR_RELIEF times their distance, so they matter less but still
 *    repel. Ties break toward the lower candidate index, so the table is the
 *    same everywhere. This is farthest-point sampling (Gonzalez 1985,
 *    "Clustering to minimize the maximum intercluster distance") with
 *    weights; a golden-angle hue walk was tried and dropped because p and 2p
 *    landed close in hue for several p.
 * 3. Periods above PERIOD_PALETTE_SIZE reuse the table cyclically:
 *    colour(p) = colour(((p - 1) mod N) + 1).
 *
 * The lightness band is light (0.60..0.88) so interior islands read against
 * the exterior gradients, which keep most of their length darker than 0.6,
 * and against the dark edge ink at the boundary.
 */
import { PERIOD_GREYSCALE_DISTINCT, PERIOD_PALETTE_SIZE } from './period-palette-size.js';

const LIGHTNESS_LEVELS = [0.6, 0.67, 0.74, 0.81, 0.88];
const HUE_STEP = 7.5;
const CHROMA_FRACTIONS = [0.55, 0.9];
const CHROMA_CAP = 0.19;
const NEIGHBOUR_RELIEF = 1.25;
/** Period 1's seed colour in OKLCh. */
const SEED = [0.74, 0.12, 170] as const;

/** True when periods p and q (q < p) are likely to touch in the plane. */
export function periodsAdjacent(p: number, q: number): boolean {
  return p - q <= 2 || p % q === 0;
}

/**
 * How a colour looks in each view the palette must keep apart: normal vision
 * and the three simulated dichromacies (OKLab of the simulated colour), then
 * the greyscale lightness (OKLab L of the luminance grey). 13 numbers.
 */
function views(lab: ArrayLike<number>): Float64Array {
  const v = new Float64Array(13);
  const lin = oklabToLinear(lab[0]!, lab[1]!, lab[2]!, [0, 0, 0]);
  for (let c = 0; c < 3; c++) lin[c] = Math.min(1, Math.max(0, lin[c]!));
  v[0] = lab[0]!;
  v[1] = lab[1]!;
  v[2] = lab[2]!;
  const t = [0, 0, 0];
  VISION_KINDS.forEach((kind, i) => {
    simulateVision(kind, lin[0]!, lin[1]!, lin[2]!, t);
    linearToOklab(t[0]!, t[1]!, t[2]!, t);
    v[3 + 3 * i] = t[0]!;
    v[4 + 3 * i] = t[1]!;
    v[5 + 3 * i] = t[2]!;
  });
  const y = luminance(lin[0]!, lin[1]!, lin[2]!);
  v[12] = linearToOklab(y, y, y, t)[0]!;
  return v;
}

/**
 * The difference the palette maximises between two colours: the smallest
 * OKLab distance over the four views, and, when both periods are among the
 * first PERIOD_GREYSCALE_DISTINCT, also their greyscale lightness difference.
 */
function viewDistance(a: Float64Array, b: Float64Array, grey: boolean): number {
  let d = Infinity;
  for (let o = 0; o < 12; o += 3) {
    const x = Math.hypot(a[o]! - b[o]!, a[o + 1]! - b[o + 1]!, a[o + 2]! - b[o + 2]!);
    if (x < d) d = x;
  }
  if (grey) d = Math.min(d, Math.abs(a[12]! - b[12]!));
  return d;
}

/**
 * Builds the table by the rule above (about 0.3 s). The renderer does not run
 * this: it reads the table built once into period-palette-table.ts by
 * scripts/period-palette-table.mjs; a test holds the two equal.
 */
export function buildPeriodPalette(): { lab: Float64Array; linear: Float64Array } {
  const cands: Float64Array[] = [];
  const candViews: Float64Array[] = [];
  for (const L of LIGHTNESS_LEVELS) {
    for (let h = 0; h < 360; h += HUE_STEP) {
      const cmax = Math.min(CHROMA_CAP, maxChromaInGamut(L, h));
      for (const f of CHROMA_FRACTIONS) {
        const lab = Float64Array.from(oklchToOklab(L, f * cmax, h, [0, 0, 0]) as number[]);
        cands.push(lab);
        candViews.push(views(lab));
      }
    }
  }
  const lab = new Float64Array(3 * PERIOD_PALETTE_SIZE);
  oklchToOklab(SEED[0], SEED[1], SEED[2], lab);
  const chosen: Float64Array[] = [views(lab)];
  for (let p = 2; p <= PERIOD_PALETTE_SIZE; p++) {
    let best = -1;
    let bestScore = -Infinity;
    for (let k = 0; k < cands.length; k++) {
      const v = candViews[k]!;
      let score = Infinity;
      for (let r = 1; r < p && score > bestScore; r++) {
        const d = viewDistance(v, chosen[r - 1]!, p <= PERIOD_GREYSCALE_DISTINCT) * (periodsAdjacent(p, r) ? 1 : NEIGHBOUR_RELIEF);
        if (d < score) score = d;
      }
      if (score > bestScore) {
        bestScore = score;
        best = k;
      }
    }
    lab.set(cands[best]!, 3 * (p - 1));
    chosen.push(candViews[best]!);
  }
  const linear = new Float64Array(3 * PERIOD_PALETTE_SIZE);
  const t = [0, 0, 0];
  for (let i = 0; i < PERIOD_PALETTE_SIZE; i++) {
    oklabToLinear(lab[3 * i]!, lab[3 * i + 1]!, lab[3 * i + 2]!, t);
    // Clip the last ulps: candidates were chosen inside the gamut by bisection.
    for (let ch = 0; ch < 3; ch++) linear[3 * i + ch] = Math.min(1, Math.max(0, t[ch]!));
  }
  return { lab, linear };
}
