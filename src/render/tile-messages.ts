/**
 * The messages the main thread (src/render/) and the tile workers
 * (src/workers/) exchange. Pixel and data arrays travel in transfer lists,
 * never by structured clone.
 */
import type { PlateJob, TileStats } from './plate-job.js';
import type { Tile } from '../view/tile-plan.js';

export interface InitMessage {
  readonly type: 'init';
  readonly job: PlateJob;
}

export interface TileMessage {
  readonly type: 'tile';
  readonly tile: Tile;
}

export type ToWorker = InitMessage | TileMessage;

export interface TileDoneMessage {
  readonly type: 'tile-done';
  readonly tile: Tile;
  readonly pixels: Uint8Array | Uint16Array;
  /** Linear-light colours of a tile under a possible inset legend (render-plate.ts composites the legend). */
  readonly linear?: Float64Array;
  readonly period?: Int32Array;
  readonly smooth?: Float64Array;
  readonly distance?: Float64Array;
  readonly interior?: Uint8Array;
  readonly basin?: Int32Array;
  readonly stats: TileStats;
}

export interface FailedMessage {
  readonly type: 'failed';
  readonly message: string;
}

export type FromWorker = TileDoneMessage | FailedMessage;
