/**
 * The messages the pyramid scheduler (src/render/pyramid-pool.ts) and the
 * pyramid tile workers (src/workers/pyramid-worker.ts) exchange. A worker
 * renders, encodes and writes the tile itself, so only small records cross
 * the thread boundary.
 */
import type { TileStats } from './plate-job.js';
import type { PyramidSpec } from '../view/pyramid-spec.js';

export interface PyramidTileMessage {
  readonly type: 'tile';
  /** Identifies the (spec, dir) pair; a worker keeps its derived setup per key. */
  readonly key: string;
  readonly spec: PyramidSpec;
  /** The pyramid's output folder (tiles go below dir/tiles). */
  readonly dir: string;
  readonly index: number;
}

export interface PyramidTileDoneMessage {
  readonly type: 'tile-done';
  readonly index: number;
  /** True when the tile was already on disk and was left alone. */
  readonly skipped: boolean;
  /** Size of the tile file in bytes. */
  readonly bytes: number;
  readonly stats: TileStats;
}

export interface PyramidTileFailedMessage {
  readonly type: 'tile-failed';
  readonly index: number;
  readonly message: string;
}

export type FromPyramidWorker = PyramidTileDoneMessage | PyramidTileFailedMessage;
