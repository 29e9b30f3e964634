/**
 * Renders one tile of a plate: a pure function of the job and the tile's
 * rectangle, so that any tiling and any number of workers give the same
 * bytes.
 *
 * 1. One sample at the centre of every pixel of the tile and of a one-pixel
 *    apron around it (the apron samples are the neighbours' own centre
 *    samples, computed again here from the same coordinates, so they are
 *    bit-identical to what the neighbouring tile computes). The apron only
 *    feeds step 2, so a plate of one sample per pixel samples the tile alone.
 * 2. Adaptive refinement (docs/methods.md F1): a pixel gets `samples` stratified,
 *    jittered samples when one of its 8 neighbours differs in kind (escaped,
 *    interior, undecided) or period, when its distance estimate is below
 *    REFINE_DISTANCE_PIXELS pixels, or when its colour differs from a 4-neighbour
 *    by more than REFINE_COLOUR_STEP in any linear channel. The jitter comes
 *    from an integer hash of the absolute pixel coordinates, never from a
 *    random generator.
 * 3. Colours are averaged in linear light with a box filter over the pixel
 *    (a wider Mitchell–Netravali filter was considered; the box keeps a pixel
 *    a function of its own cell, which the tiling and the data arrays rely on),
 *    then the legend (if inset) is composited and the result encoded to 8 or
 *    16 bits with coordinate-seeded dither.
 */
import { createSrgb8Encoder, encodePixels, type Srgb8Encoder } from '../colour/encode-pixels.js';
import { paintLegendRect, type Legend } from '../colour/legend.js';
import { shadeSamples } from '../colour/shade-samples.js';
import { PERIOD_UNDECIDED } from '../plane/sample-set.js';
import { paintStrokes } from '../colour/paint-strokes.js';
import { shadeJuliaSamples } from '../colour/shade-julia.js';
import { createJuliaSampleSet, sampleJulia, type JuliaSampleSet } from '../dynamic/sample-julia.js';
import { sampleJuliaDeep } from '../dynamic/sample-julia-deep.js';
import { createSampleScratch, sampleParameters, type SampleScratch } from '../plane/sample-parameters.js';
import type { EscapeLoop } from '../plane/escape-loop.js';
import { sampleDeep, type DeepStats } from '../plane/deep/sample-deep.js';
import type { Tile } from '../view/tile-plan.js';
import { emptyStats, type PlateJob, type TileStats } from './plate-job.js';
import { pixelsToC } from '../view/view.js';

/** Refine where the distance estimate is below this many pixels (docs/methods.md F1: "DE < ~2 px"). */
export const REFINE_DISTANCE_PIXELS = 2;
/**
 * A decided pixel counts as wholly on its centre's side of the boundary when
 * its distance estimate b is at least this many pixel spacings: the true
 * distance is at least b/4 (docs/methods.md A2, A6), and b/4 >= 2 sqrt 2 / 4
 * = 1/sqrt 2 spacings, half the pixel's diagonal, puts the whole square in
 * the disk that misses the boundary (docs/methods.md A7).
 */
export const AREA_SURE_DISTANCE_PIXELS = 2 * Math.SQRT2;
/** Refine where a linear channel steps by more than this to a 4-neighbour. */
export const REFINE_COLOUR_STEP = 0.02;

export interface TileResult {
  pixels: Uint8Array | Uint16Array;
  /** Linear-light RGB before any legend, w * h * 3, only for tiles meeting job.legendBounds. */
  linear?: Float64Array;
  period?: Int32Array;
  smooth?: Float64Array;
  distance?: Float64Array;
  interior?: Uint8Array;
  /** Julia plates with data: the interior class of each pixel (-1 outside). */
  basin?: Int32Array;
  stats: TileStats;
}

/** Reusable buffers for tiles up to `maxTile` pixels a side. */
export interface TileScratch {
  readonly maxTile: number;
  /** Continuous pixel coordinates of the centre samples (pixel (i, j) spans [i, i+1) x [j, j+1)). */
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  /** Parameters (double path) or offsets from the reference (deep path) of a batch. */
  readonly cr: Float64Array;
  readonly ci: Float64Array;
  /** Centre samples; `basin` is written by the Julia kernel only (the c-plane path leaves it 0). */
  readonly centre: JuliaSampleSet;
  readonly centreLinear: Float64Array;
  readonly refineXs: Float64Array;
  readonly refineYs: Float64Array;
  readonly refined: JuliaSampleSet;
  readonly refinedLinear: Float64Array;
  readonly linear: Float64Array;
  readonly flags: Uint8Array;
  /** Interior pixels of a tile per period below its length (zero between tiles; larger periods are counted in the stats directly). */
  readonly periodCounts: Int32Array;
  /** The kernel's own scratch, sized for the larger of the apron and a refinement batch. */
  readonly kernel: SampleScratch;
  /** The WebAssembly 8-bit encoder of this thread (same bytes as the JS one), or undefined without WebAssembly SIMD. */
  readonly encoder: Srgb8Encoder | undefined;
}

const REFINE_BATCH = 4096;

export function createTileScratch(maxTile: number): TileScratch {
  const apron = (maxTile + 2) * (maxTile + 2);
  return {
    maxTile,
    xs: new Float64Array(apron),
    ys: new Float64Array(apron),
    cr: new Float64Array(Math.max(apron, REFINE_BATCH)),
    ci: new Float64Array(Math.max(apron, REFINE_BATCH)),
    centre: createJuliaSampleSet(apron),
    centreLinear: new Float64Array(apron * 3),
    refineXs: new Float64Array(REFINE_BATCH),
    refineYs: new Float64Array(REFINE_BATCH),
    refined: createJuliaSampleSet(REFINE_BATCH),
    refinedLinear: new Float64Array(REFINE_BATCH * 3),
    linear: new Float64Array(maxTile * maxTile * 3),
    flags: new Uint8Array(maxTile * maxTile),
    periodCounts: new Int32Array(1024),
    kernel: createSampleScratch(Math.max(apron, REFINE_BATCH)),
    encoder: createSrgb8Encoder(),
  };
}

/** A well-mixed 32-bit hash of four integers (lowbias32-style finaliser), as a number in [0, 1). */
export function jitter(x: number, y: number, k: number, axis: number): number {
  let h = Math.imul(x | 0, 0x9e3779b1) ^ Math.imul(y | 0, 0x85ebca77) ^ Math.imul(k | 0, 0xc2b2ae3d) ^ Math.imul(axis + 1, 0x27d4eb2f);
  h ^= h >>> 16;
  h = Math.imul(h, 0x7feb352d);
  h ^= h >>> 15;
  h = Math.imul(h, 0x846ca68b);
  h ^= h >>> 16;
  return (h >>> 0) / 4294967296;
}

/**
 * Evaluates the kernel at n samples given by continuous pixel coordinates:
 * the double path maps them to c through the grid (centre + rotated offset);
 * the deep path to offsets from the reference orbit, origin + (x - 1/2) stepX
 * + (y - 1/2) stepY in units of 2^U, the same formula as fillDeepOffsets
 * (src/plane/deep/offsets.ts), so every pixel gets the same bits in any tile.
 */
function evaluate(job: PlateJob, xs: Float64Array, ys: Float64Array, n: number, scratch: TileScratch, out: JuliaSampleSet, deepStats: DeepStats, loop?: EscapeLoop): void {
  const { cr, ci } = scratch;
  const deep = job.deep;
  if (deep !== undefined) {
    const g = deep.geometry;
    for (let k = 0; k < n; k++) {
      const x = xs[k]! - 0.5;
      const y = ys[k]! - 0.5;
      cr[k] = g.originRe + x * g.stepXRe + y * g.stepYRe;
      ci[k] = g.originIm + x * g.stepXIm + y * g.stepYIm;
    }
    sampleDeep(deep.reference, deep.bla, cr, ci, n, { maxIterations: job.iterations, escapeRadius: job.escapeRadius, unitExponent: deep.unitExponent }, out, deepStats);
    return;
  }
  const grid = job.grid;
  const spacing = grid.spacing;
  if (job.julia?.deep !== undefined) {
    // Offsets from the view centre (the reference), in z units.
    pixelsToC(grid, xs, ys, n, cr, ci, true);
    const { cRe, cIm, trap } = job.julia;
    sampleJuliaDeep(cr, ci, n, { cRe, cIm, maxIterations: job.iterations, escapeRadius: job.escapeRadius }, trap, job.julia.deep, out);
    return;
  }
  pixelsToC(grid, xs, ys, n, cr, ci);
  if (job.julia !== undefined) {
    const { cRe, cIm, trap } = job.julia;
    sampleJulia(cr, ci, n, { cRe, cIm, maxIterations: job.iterations, escapeRadius: job.escapeRadius }, trap, out);
    return;
  }
  const settings = { maxIterations: job.iterations, escapeRadius: job.escapeRadius, periodTolerance: job.periodTolerance };
  sampleParameters(cr, ci, n, settings, out, loop, scratch.kernel);
}

/** Colours n samples of a batch: the c-plane shading, or the Julia one (basin classes) for a Julia plate. */
function shade(job: PlateJob, samples: JuliaSampleSet, n: number, spacing: number, out: Float64Array): void {
  if (job.julia !== undefined) shadeJuliaSamples(samples, 0, n, spacing, job.colour, job.julia.basin, job.julia.trap.basinPeriod, out);
  else shadeSamples(samples, 0, n, spacing, job.colour, out);
}

function kindOf(period: number): number {
  return period === 0 ? 0 : period === PERIOD_UNDECIDED ? 2 : 1;
}

/**
 * Renders one tile. `legend` is the inset legend laid out for the whole plate
 * (layoutLegend of the job's colour settings), or null.
 */
export function renderTile(job: PlateJob, tile: Tile, scratch: TileScratch, loop?: EscapeLoop, legend: Legend | null = null): TileResult {
  const { grid } = job;
  const { x0, y0, w, h } = tile;
  if (w > scratch.maxTile || h > scratch.maxTile) throw new RangeError(`tile ${w}x${h} exceeds scratch ${scratch.maxTile}`);
  // The apron only feeds the refinement flags; with one sample per pixel there are none, so it is skipped.
  const refine = job.samples > 1;
  const pad = refine ? 1 : 0;
  const aw = w + 2 * pad;
  const ah = h + 2 * pad;
  const n = aw * ah;
  // Distances come in c units (double, and deep above ~1e-271) or in units of 2^U (deeper).
  const spacing = job.deep !== undefined ? job.deep.spacingUnits : grid.spacing;
  const stats = emptyStats();
  const deepStats = { stepped: 0, skipped: 0, skips: 0, rebases: 0, newtonIterations: 0 };

  // 1. Centre samples over the tile and its apron.
  const { xs, ys, centre, centreLinear } = scratch;
  for (let j = 0; j < ah; j++) {
    for (let i = 0; i < aw; i++) {
      const k = j * aw + i;
      xs[k] = x0 - pad + i + 0.5;
      ys[k] = y0 - pad + j + 0.5;
    }
  }
  const pixelCount = w * h;
  const { linear, flags, periodCounts } = scratch;
  evaluate(job, xs, ys, n, scratch, centre, deepStats, loop);
  // Without an apron the centre samples are the tile's pixels in order: shade straight into `linear`.
  shade(job, centre, n, spacing, refine ? centreLinear : linear);

  stats.samples += n;

  // 2. Which pixels need more samples.
  for (let j = 0; j < h; j++) {
    for (let i = 0; i < w; i++) {
      const k = (j + pad) * aw + (i + pad);
      const p = j * w + i;
      if (refine) {
        linear[3 * p] = centreLinear[3 * k]!;
        linear[3 * p + 1] = centreLinear[3 * k + 1]!;
        linear[3 * p + 2] = centreLinear[3 * k + 2]!;
      }
      const period = centre.period[k]!;
      if (period === 0) stats.escaped++;
      else if (period === PERIOD_UNDECIDED) stats.undecided++;
      else {
        stats.interior++;
        if (period < periodCounts.length) periodCounts[period]!++;
        else stats.periods[period] = (stats.periods[period] ?? 0) + 1;
      }
      // NaN (no estimate) fails the comparison and counts as near.
      if (period !== PERIOD_UNDECIDED && !(centre.distance[k]! / spacing >= AREA_SURE_DISTANCE_PIXELS)) stats.nearBoundary++;
      let flag = 0;
      if (refine) {
        const d = centre.distance[k]!;
        if (period !== PERIOD_UNDECIDED && d / spacing < REFINE_DISTANCE_PIXELS) flag = 1;
        const kind = kindOf(period);
        for (let dj = -1; dj <= 1 && flag === 0; dj++) {
          for (let di = -1; di <= 1; di++) {
            const q = k + dj * aw + di;
            const pq = centre.period[q]!;
            if (pq !== period || kindOf(pq) !== kind || centre.basin[q] !== centre.basin[k]) {
              flag = 1;
              break;
            }
            if ((di === 0) !== (dj === 0)) {
              if (
                Math.abs(centreLinear[3 * q]! - centreLinear[3 * k]!) > REFINE_COLOUR_STEP ||
                Math.abs(centreLinear[3 * q + 1]! - centreLinear[3 * k + 1]!) > REFINE_COLOUR_STEP ||
                Math.abs(centreLinear[3 * q + 2]! - centreLinear[3 * k + 2]!) > REFINE_COLOUR_STEP
              ) {
                flag = 1;
                break;
              }
            }
          }
        }
      }
      flags[p] = flag;
    }
  }
  for (let p = 1; p < periodCounts.length; p++) {
    if (periodCounts[p] === 0) continue;
    stats.periods[p] = (stats.periods[p] ?? 0) + periodCounts[p]!;
    periodCounts[p] = 0;
  }

  // 3. Stratified, jittered samples for flagged pixels, averaged in linear light.
  if (refine) {
    const side = Math.round(Math.sqrt(job.samples));
    const K = side * side;
    const perBatch = Math.floor(REFINE_BATCH / K);
    const { refineXs, refineYs, refined, refinedLinear } = scratch;
    const owners: number[] = [];
    const flush = (): void => {
      const m = owners.length * K;
      if (m === 0) return;
      evaluate(job, refineXs, refineYs, m, scratch, refined, deepStats, loop);
      shade(job, refined, m, spacing, refinedLinear);
      stats.samples += m;
      for (let o = 0; o < owners.length; o++) {
        const p = owners[o]!;
        let r = 0,
          g = 0,
          b = 0;
        for (let s = 0; s < K; s++) {
          const q = 3 * (o * K + s);
          r += refinedLinear[q]!;
          g += refinedLinear[q + 1]!;
          b += refinedLinear[q + 2]!;
        }
        linear[3 * p] = r / K;
        linear[3 * p + 1] = g / K;
        linear[3 * p + 2] = b / K;
      }
      owners.length = 0;
    };
    for (let p = 0; p < pixelCount; p++) {
      if (flags[p] === 0) continue;
      stats.refined++;
      const px = x0 + (p % w);
      const py = y0 + Math.floor(p / w);
      const base = owners.length * K;
      for (let b = 0; b < side; b++) {
        for (let a = 0; a < side; a++) {
          const s = b * side + a;
          refineXs[base + s] = px + (a + jitter(px, py, s, 0)) / side;
          refineYs[base + s] = py + (b + jitter(px, py, s, 1)) / side;
        }
      }
      owners.push(p);
      if (owners.length === perBatch) flush();
    }
    flush();
  }

  // 4. Marks (Julia plates) and period labels (and a legend given here; a plate's inset legend is
  // composited by the main thread, see render-plate.ts), in linear light, then encode.
  if (job.julia !== undefined && job.julia.strokes.length > 0) paintStrokes(job.julia.strokes, x0, y0, w, h, linear);
  for (const label of job.labels ?? []) paintLegendRect(label, x0, y0, w, h, linear);
  if (legend !== null) paintLegendRect(legend, x0, y0, w, h, linear);
  const pixels = job.depth === 16 ? new Uint16Array(pixelCount * 3) : new Uint8Array(pixelCount * 3);
  encodePixels(linear, w, h, x0, y0, job.depth, pixels, scratch.encoder);

  stats.stepped = deepStats.stepped;
  stats.skipped = deepStats.skipped;
  stats.skips = deepStats.skips;
  const result: TileResult = { pixels, stats };
  const b = job.legendBounds;
  if (b !== undefined && x0 < b.x + b.width && x0 + w > b.x && y0 < b.y + b.height && y0 + h > b.y) result.linear = linear.slice(0, pixelCount * 3);
  if (job.withData) {
    const period = new Int32Array(pixelCount);
    const smooth = new Float64Array(pixelCount);
    const distance = new Float64Array(pixelCount);
    const interior = new Uint8Array(pixelCount);
    const basin = job.julia !== undefined ? new Int32Array(pixelCount) : undefined;
    for (let j = 0; j < h; j++) {
      for (let i = 0; i < w; i++) {
        const k = (j + pad) * aw + (i + pad);
        const p = j * w + i;
        const per = centre.period[k]!;
        period[p] = per;
        smooth[p] = centre.smooth[k]!;
        distance[p] = centre.distance[k]!;
        interior[p] = kindOf(per);
        if (basin !== undefined) basin[p] = centre.basin[k]!;
      }
    }
    Object.assign(result, { period, smooth, distance, interior, ...(basin === undefined ? {} : { basin }) });
  }
  return result;
}
