/**
 * The census of a period: every hyperbolic component of exact period p,
 * located by landing a parameter ray of each of its period-p external angle
 * pairs on its nucleus (docs/methods.md C5(c) with D1, D2 and D4; see land-rays.ts).
 *
 * The pairs come from Lavaurs' algorithm (lavaurs-sweep.ts), so one ray per
 * component is traced: the lower angle of each pair. The set is symmetric
 * about the real axis, so only pairs with lo + hi <= 2^p - 1 are traced (the
 * others are mirror images; lo + hi = 2^p - 1 exactly for real components).
 *
 * Checks built in (docs/methods.md C5 "counting checks"): the located nuclei and
 * their mirror images are sorted and compared with their neighbours, so a
 * nucleus reached by two pairs is counted once; a pair whose ray was lost,
 * whose nucleus another pair also reached, or whose nucleus is real when the
 * pair is not symmetric (or the reverse) is re-landed in the careful mode, and
 * what is still wrong after that is reported as `unpaired`. The count is the
 * number of distinct nuclei located. (Until December 2026 both rays of every
 * pair were traced and grouped; that took twice the time.)
 *
 * The result never depends on worker count or chunk order: records are
 * written by pair index and grouped after sorting.
 */
import { mapOnWorkers } from '../threads/map-on-workers.js';
import { landRays, RAY_RECORD } from './land-rays.js';
import { lavaursStream, type LavaursPairs } from './lavaurs-stream.js';
import type { LavaursSweep } from './lavaurs-sweep.js';
import { periodicNumerators, properDivisors } from './periodic-angles.js';
import { builtWorkerUrl } from '../threads/built-worker.js';
import { CensusStatisticsAccumulator, type CensusStatistics } from './census-statistics.js';

/** One component found by the census; c = nucleus, angles are numerators over 2^p - 1 (lower first). */
export interface CensusComponent {
  readonly period: number;
  readonly reHi: number;
  readonly reLo: number;
  readonly imHi: number;
  readonly imLo: number;
  /** |size estimate| (Hunt-Ott). */
  readonly size: number;
  /** Numerators of the external angles of the root, ascending (two for every component but the cardioid): the lower one landed here, its partner is Lavaurs'. */
  readonly angles: readonly number[];
  /** The nucleus is on the real axis. */
  readonly real: boolean;
}

export interface CensusResult {
  readonly period: number;
  /** Components sorted by their lower external angle. */
  readonly components: readonly CensusComponent[];
  /** Rays traced (one per pair with lo + hi <= 2^p - 1, re-landings included). */
  readonly raysTraced: number;
  /** Rays that failed to land even in careful mode. */
  readonly raysLost: number;
  /** Pairs still lost, sharing a nucleus with another pair, or off/on the real axis against their symmetry after re-landing. */
  readonly unpaired: number;
  /** Rays re-landed in careful mode. */
  readonly relanded: number;
  /** Count, real, primitive and satellite components, sizes and areas, gathered as the components were listed (census-statistics.ts). */
  readonly statistics: CensusStatistics;
}

export interface CensusOptions {
  /** worker_threads to use; 0 runs in this thread (default). */
  readonly workers?: number;
  /** Called after each chunk with (rays landed, rays to land). */
  readonly onProgress?: (done: number, total: number) => void;
  /**
   * Only the components whose lower angle's numerator n lies in [from, to)
   * (a shard, census-shard.ts): only the pairs of those components and of
   * their mirror images are landed; the statistics are the slice's.
   */
  readonly angleRange?: { readonly from: number; readonly to: number };
  /** The period's Lavaurs pairs, when the caller already has them (census-slices.ts: one pairing for every slice); all of them or only those with lo + hi <= 2^p - 1. */
  readonly pairs?: LavaursSweep | LavaursPairs;
  /**
   * Only these pairs (indices into `pairs`, each with lo + hi <= 2^p - 1) are
   * landed, and only the components whose lower angle `keep` accepts are
   * listed (census-slices.ts); replaces angleRange.
   */
  readonly slice?: { readonly pairs: Int32Array; readonly keep: (lowerAngle: number) => boolean };
  /** Add the statistics to this accumulator (shared over slices) instead of a fresh one. */
  readonly statistics?: CensusStatisticsAccumulator;
}

/** Rounds of careful re-landing at most (each round only lands suspects not landed carefully before). */
const CAREFUL_ROUNDS = 4;

/** Largest period the census accepts (angles are numerators below 2^p fitting a double exactly). */
export const MAX_CENSUS_PERIOD = 30;

/** Runs the census of exact period p. */
export async function census(period: number, options: CensusOptions = {}): Promise<CensusResult> {
  const range = options.angleRange ?? { from: 0, to: 2 ** period - 1 };
  const inRange = options.slice?.keep ?? ((n: number): boolean => n >= range.from && n < range.to);
  if (period === 1) {
    const stats = options.statistics ?? new CensusStatisticsAccumulator(1);
    const cardioid = inRange(0);
    if (cardioid) stats.add([0], true, 1);
    return {
      period,
      components: cardioid ? [{ period: 1, reHi: 0, reLo: 0, imHi: 0, imLo: 0, size: 1, angles: [0], real: true }] : [],
      raysTraced: 0,
      raysLost: 0,
      unpaired: 0,
      relanded: 0,
      statistics: stats.result(),
    };
  }
  const den = 2 ** period - 1;
  // only the pairs with lo + hi <= den are traced: the stream's lower half holds just those
  const pairs = options.pairs ?? lavaursStream(period, { lowerHalf: true });
  // One pair of each mirror couple: lo + hi < den (upper half plane) or = den (real).
  let keep: ArrayLike<number>;
  if (options.slice !== undefined) keep = options.slice.pairs;
  else {
    const chosen: number[] = [];
    // (a pair stands for its own component, lower angle lo, and unless real for its mirror image, lower angle den - hi)
    for (let i = 0; i < pairs.lo.length; i += 1) {
      const a = pairs.lo[i]!;
      const b = pairs.hi[i]!;
      if (a + b <= den && (inRange(a) || (a + b < den && inRange(den - b)))) chosen.push(i);
    }
    keep = chosen;
  }
  const lo = Float64Array.from(keep, (i) => pairs.lo[i]!);
  const hi = Float64Array.from(keep, (i) => pairs.hi[i]!);
  const records = await landAll(period, lo, false, options);
  let found = distinctNuclei(period, lo, hi, records);
  let relanded = 0;
  // Re-land suspects in careful mode until none is left that was not landed carefully: a careful
  // re-landing can move a ray onto the nucleus a fast-landed pair took wrongly (period 21, pairs
  // 699029/699030 and 699033/699034 over 2^21 - 1), which only the next round catches.
  const careful = new Uint8Array(lo.length);
  for (let round = 0; round < CAREFUL_ROUNDS; round += 1) {
    const todo = found.suspects.filter((i) => careful[i] === 0);
    if (todo.length === 0) break;
    const redo = Float64Array.from(todo, (i) => lo[i]!);
    const again = await landAll(period, redo, true, { workers: options.workers ?? 0 });
    relanded += redo.length;
    todo.forEach((i, j) => {
      careful[i] = 1;
      records.set(again.subarray(j * RAY_RECORD, (j + 1) * RAY_RECORD), i * RAY_RECORD);
    });
    found = distinctNuclei(period, lo, hi, records);
  }
  const stats = options.statistics ?? new CensusStatisticsAccumulator(period);
  const components = found.components(stats, inRange);
  return {
    period,
    components,
    raysTraced: lo.length + relanded,
    raysLost: countLost(records),
    unpaired: found.suspects.length,
    relanded,
    statistics: stats.result(),
  };
}

function countLost(records: Float64Array): number {
  let lost = 0;
  for (let i = 5; i < records.length; i += RAY_RECORD) if (records[i] === 0) lost += 1;
  return lost;
}

/**
 * The distinct nuclei among the landed rays and their mirror images: sorted
 * by real part (to within about 1e-15 · 2^(p - 20) buckets), each compared with
 * every neighbour whose real part may lie within reach; two are the same when
 * closer than 1e-3 of the smaller size estimate. `suspects` are the pairs
 * (indices into lo) whose ray was lost, whose nucleus is shared with another
 * pair, or whose realness disagrees with the pair's symmetry (lo + hi = den
 * exactly for real components); shared nuclei are counted once.
 * `components()` builds the component list (kept lazy: the census calls this
 * again after re-landing suspects).
 */
export function distinctNuclei(
  period: number,
  lo: Float64Array,
  hi: Float64Array,
  rec: Float64Array,
): { components: (stats?: CensusStatisticsAccumulator, keep?: (lowerAngle: number) => boolean) => CensusComponent[]; suspects: number[] } {
  const den = 2 ** period - 1;
  const suspect = new Uint8Array(lo.length);
  // Entries: 2i for pair i, 2i + 1 for its mirror image (absent for real pairs).
  const entries = new Int32Array(2 * lo.length);
  let count = 0;
  for (let i = 0; i < lo.length; i += 1) {
    const o = i * RAY_RECORD;
    if (rec[o + 5] !== 1) {
      suspect[i] = 1;
      continue;
    }
    const symmetric = lo[i]! + hi[i]! === den;
    const real = Math.abs(rec[o + 2]! + rec[o + 3]!) <= 1e-3 * rec[o + 4]!;
    if (symmetric !== real) suspect[i] = 1;
    entries[count++] = 2 * i;
    if (!symmetric) entries[count++] = 2 * i + 1;
  }
  // Order by real part, in buckets of width 1/scale, ties by entry: one packed
  // double per entry, sorted natively (a comparator sort took 3x as long).
  const ebits = Math.max(1, Math.ceil(Math.log2(2 * lo.length + 1)));
  const scale = 2 ** (52 - ebits) / 3;
  const key = new Float64Array(count);
  for (let k = 0; k < count; k += 1) {
    const e = entries[k]!;
    const re = rec[(e >> 1) * RAY_RECORD]! + rec[(e >> 1) * RAY_RECORD + 1]!;
    key[k] = Math.floor((Math.min(0.5, Math.max(-2.5, re)) + 2.5) * scale) * 2 ** ebits + e;
  }
  key.sort();
  const order = new Int32Array(count);
  const bucket = new Float64Array(count);
  for (let k = 0; k < count; k += 1) {
    bucket[k] = Math.floor(key[k]! / 2 ** ebits);
    order[k] = key[k]! - bucket[k]! * 2 ** ebits;
  }
  const first = new Uint8Array(2 * lo.length).fill(1);
  for (let k = 1; k < order.length; k += 1) {
    const e = order[k]!;
    const oe = (e >> 1) * RAY_RECORD;
    const se = rec[oe + 4]!;
    const sign = (e & 1) === 1 ? -1 : 1;
    const reach = rec[oe]! + rec[oe + 1]! - 1e-3 * se - 2 / scale;
    for (let j = k - 1; j >= 0; j -= 1) {
      // every entry at j or before lies in a bucket ending below `reach`: none is within reach
      if ((bucket[j]! + 1) / scale - 2.5 < reach) break;
      const g = order[j]!;
      const og = (g >> 1) * RAY_RECORD;
      const dre = rec[oe]! - rec[og]! + (rec[oe + 1]! - rec[og + 1]!);
      const gsign = (g & 1) === 1 ? -1 : 1;
      const dim = sign * rec[oe + 2]! - gsign * rec[og + 2]! + (sign * rec[oe + 3]! - gsign * rec[og + 3]!);
      if (Math.hypot(dre, dim) <= 1e-3 * Math.min(se, rec[og + 4]!)) {
        first[e] = 0;
        suspect[e >> 1] = 1;
        suspect[g >> 1] = 1;
      }
    }
  }
  const components = (stats?: CensusStatisticsAccumulator, keep?: (lowerAngle: number) => boolean): CensusComponent[] => {
    // Components in the order of their lower angle (distinct numerators below 2^p).
    const lower = (e: number): number => ((e & 1) === 1 ? den - hi[e >> 1]! : lo[e >> 1]!);
    let byAngle: Int32Array;
    if (period + ebits <= 52) {
      const ak = new Float64Array(count);
      let n = 0;
      for (let k = 0; k < count; k += 1) if (first[order[k]!] === 1) ak[n++] = lower(order[k]!) * 2 ** ebits + order[k]!;
      const sorted = ak.subarray(0, n).sort();
      byAngle = Int32Array.from(sorted, (v) => v % 2 ** ebits);
    } else {
      byAngle = order.filter((e) => first[e] === 1).sort((a, b) => lower(a) - lower(b));
    }
    const list: CensusComponent[] = [];
    for (const e of byAngle) {
      const o = (e >> 1) * RAY_RECORD;
      const mirror = (e & 1) === 1;
      const a = lo[e >> 1]!;
      const b = hi[e >> 1]!;
      const real = a + b === den && Math.abs(rec[o + 2]! + rec[o + 3]!) <= 1e-3 * rec[o + 4]!;
      const angles = mirror ? [den - b, den - a] : [a, b];
      if (keep !== undefined && !keep(angles[0]!)) continue;
      stats?.add(angles, real, rec[o + 4]!);
      list.push({
        period,
        reHi: rec[o]!,
        reLo: rec[o + 1]!,
        imHi: real ? 0 : mirror ? -rec[o + 2]! : rec[o + 2]!,
        imLo: real ? 0 : mirror ? -rec[o + 3]! : rec[o + 3]!,
        size: rec[o + 4]!,
        angles,
        real,
      });
    }
    return list;
  };
  const suspects: number[] = [];
  for (let i = 0; i < lo.length; i += 1) if (suspect[i] === 1) suspects.push(i);
  return { components, suspects };
}

/** Lands all angles, in this thread or in worker_threads, chunk by chunk. */
async function landAll(period: number, nums: Float64Array, careful: boolean, options: CensusOptions): Promise<Float64Array> {
  const out = new Float64Array(nums.length * RAY_RECORD);
  const workers = Math.max(0, Math.floor(options.workers ?? 0));
  const chunk = Math.max(16, Math.min(1024, Math.ceil(nums.length / Math.max(1, workers * 16))));
  const chunks: Array<[number, number]> = [];
  for (let s = 0; s < nums.length; s += chunk) chunks.push([s, Math.min(nums.length, s + chunk)]);
  let done = 0;
  if (workers === 0 || nums.length < 256) {
    for (const [s, e] of chunks) {
      landRays(period, nums.subarray(s, e), careful, out.subarray(s * RAY_RECORD, e * RAY_RECORD));
      done += e - s;
      options.onProgress?.(done, nums.length);
    }
    return out;
  }
  await mapOnWorkers<{ period: number; nums: Float64Array; careful: boolean }, { records: Float64Array }>(
    builtWorkerUrl('census-worker'),
    chunks.length,
    (i) => ({ message: { period, nums: nums.slice(chunks[i]![0], chunks[i]![1]), careful } }),
    workers,
    (i, m) => {
      const [s, e] = chunks[i]!;
      out.set(m.records, s * RAY_RECORD);
      done += e - s;
      options.onProgress?.(done, nums.length);
    },
  );
  return out;
}
