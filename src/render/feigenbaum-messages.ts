/**
 * The messages the constants pool (src/render/feigenbaum-pool.ts) and the
 * Feigenbaum workers (src/workers/feigenbaum-worker.ts) exchange: one job is
 * one truncation of the fixed point; the reply carries decimal strings only.
 */
import type { NewtonStep } from '../section/constants/fixed-point.js';

export interface FeigenbaumJob {
  readonly type: 'truncation';
  readonly order: number;
  readonly terms: number;
  readonly bits: number;
  /** Digits after the point of the written alpha and delta. */
  readonly places: number;
}

export interface FeigenbaumStepMessage {
  readonly type: 'step';
  readonly step: NewtonStep;
}

export interface FeigenbaumDoneMessage {
  readonly type: 'done';
  readonly terms: number;
  readonly alpha: string;
  readonly delta: string;
}

export interface FeigenbaumFailedMessage {
  readonly type: 'failed';
  readonly name: string;
  readonly message: string;
}

export type FromFeigenbaumWorker = FeigenbaumStepMessage | FeigenbaumDoneMessage | FeigenbaumFailedMessage;
