import type { ColourSettings } from '../colour/colour-settings.js';
import type { Legend, PixelRect } from '../colour/legend.js';
import type { DeepJob } from '../plane/deep/job.js';
import type { DoubleGrid } from '../view/view.js';
import type { JuliaJob } from './julia-job.js';

/**
 * Everything a worker needs to render any tile of a plate: plain data only
 * (it crosses the worker boundary by structured clone once, at start-up).
 */
export interface PlateJob {
  readonly grid: DoubleGrid;
  readonly iterations: number;
  readonly escapeRadius: number;
  /** Periodicity tolerance in z units (docs/methods.md A4), tied to the pixel spacing. */
  readonly periodTolerance: number;
  /** Samples per refined pixel (a square number; 1 turns refinement off). */
  readonly samples: number;
  readonly depth: 8 | 16;
  readonly colour: ColourSettings;
  readonly dpi: number;
  /** Whether to return the per-pixel data arrays (for --data). */
  readonly withData: boolean;
  /** Period labels (sprites in plate pixels), composited under the legend; empty for none. */
  readonly labels?: readonly Legend[];
  /**
   * Where an inset legend may fall (legendBounds), present only for an inset
   * legend: tiles meeting it also return their linear-light colours, so the
   * main thread can composite the legend once the histogram is complete.
   */
  readonly legendBounds?: PixelRect;
  /** Present when the plate uses the deep arithmetic (perturbation around a reference orbit). */
  readonly deep?: DeepJob;
  /** Present for a plate of the dynamical plane of one c (`quadatlas julia`): the grid is then in z. */
  readonly julia?: JuliaJob;
}

/** Per-tile counts, summed over tiles by the main thread (order-independent). */
export interface TileStats {
  escaped: number;
  interior: number;
  undecided: number;
  /**
   * Decided pixels (escaped or interior) whose centre's distance estimate b is
   * below AREA_SURE_DISTANCE_PIXELS pixel spacings, or could not be computed:
   * their square may meet the boundary of the set (docs/methods.md A7).
   */
  nearBoundary: number;
  /** Pixels that received extra samples. */
  refined: number;
  /** Kernel samples taken (centre samples, apron included, plus refinement samples). */
  samples: number;
  /** periods[p] = number of interior pixels of period p. */
  periods: Record<number, number>;
  /** Deep arithmetic: iterations stepped one at a time, and covered by bilinear-approximation skips. */
  stepped: number;
  skipped: number;
  /** Deep arithmetic: bilinear-approximation skips applied (each one operation). */
  skips: number;
}

export function emptyStats(): TileStats {
  return { escaped: 0, interior: 0, undecided: 0, nearBoundary: 0, refined: 0, samples: 0, periods: {}, stepped: 0, skipped: 0, skips: 0 };
}

export function addStats(into: TileStats, from: TileStats): void {
  into.escaped += from.escaped;
  into.interior += from.interior;
  into.undecided += from.undecided;
  into.nearBoundary += from.nearBoundary;
  into.refined += from.refined;
  into.samples += from.samples;
  into.stepped += from.stepped;
  into.skipped += from.skipped;
  into.skips += from.skips;
  for (const [p, n] of Object.entries(from.periods)) {
    const k = Number(p);
    into.periods[k] = (into.periods[k] ?? 0) + n;
  }
}
