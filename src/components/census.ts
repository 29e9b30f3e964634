/**
 * The census of a period: every hyperbolic component of exact period p,
 * located by landing the parameter rays of all period-p external angles on
 * their nuclei (methods.md C5(c) with D1 and D4; see land-rays.ts).
 *
 * Checks built in (methods.md C5 "counting checks"): rays land in pairs, so
 * every component except the main cardioid must receive exactly two of the
 * 2 N(p) angles; a component that receives one or three is re-landed in the
 * careful mode, and what is still unpaired after that is reported. Only the
 * angles in (0, 1/2) are traced: the set is symmetric about the real axis,
 * and the ray of 1 - t is the mirror image of the ray of t.
 *
 * The result never depends on worker count or chunk order: records are
 * written by angle index and grouped after sorting.
 */
import { Worker } from 'node:worker_threads';
import { landRays, RAY_RECORD } from './land-rays.js';

/** One component found by the census; c = nucleus, angles are numerators over 2^p - 1 (lower first). */
export interface CensusComponent {
  readonly period: number;
  readonly reHi: number;
  readonly reLo: number;
  readonly imHi: number;
  readonly imLo: number;
  /** |size estimate| (Hunt-Ott). */
  readonly size: number;
  /** Numerators of the external angles that landed here, ascending (two for every component but the cardioid). */
  readonly angles: readonly number[];
  /** The nucleus is on the real axis. */
  readonly real: boolean;
}

export interface CensusResult {
  readonly period: number;
  /** Components sorted by their lower external angle. */
  readonly components: readonly CensusComponent[];
  /** Rays traced (angles in (0, 1/2), re-landings included). */
  readonly raysTraced: number;
  /** Rays that failed to land even in careful mode. */
  readonly raysLost: number;
  /** Components that did not receive exactly two rays after re-landing. */
  readonly unpaired: number;
  /** Rays re-landed in careful mode. */
  readonly relanded: number;
}

export interface CensusOptions {
  /** worker_threads to use; 0 runs in this thread (default). */
  readonly workers?: number;
  /** Called after each chunk with (rays landed, rays to land). */
  readonly onProgress?: (done: number, total: number) => void;
}

/** Largest period the census accepts (angles are numerators below 2^p fitting a double exactly). */
export const MAX_CENSUS_PERIOD = 30;

/** The proper divisors of p. */
export function properDivisors(p: number): number[] {
  const d: number[] = [];
  for (let q = 1; q < p; q += 1) if (p % q === 0) d.push(q);
  return d;
}

/**
 * Numerators n of the angles n/(2^p - 1) of exact period p under doubling
 * (methods.md D1), ascending; with `upperHalf`, only those below 1/2.
 * An angle has a lower period k | p exactly when (2^p-1)/(2^k-1) divides n.
 */
export function periodicNumerators(p: number, upperHalf: boolean): Float64Array {
  const den = 2 ** p - 1;
  const steps = properDivisors(p).map((k) => den / (2 ** k - 1));
  const end = upperHalf ? (den - 1) / 2 : den - 1;
  const out: number[] = [];
  for (let n = p === 1 ? 0 : 1; n <= end; n += 1) {
    let lower = false;
    for (const s of steps) {
      if (n % s === 0) {
        lower = true;
        break;
      }
    }
    if (!lower) out.push(n);
  }
  return Float64Array.from(out);
}

/** Runs the census of exact period p. */
export async function census(period: number, options: CensusOptions = {}): Promise<CensusResult> {
  if (period === 1) {
    return {
      period,
      components: [{ period: 1, reHi: 0, reLo: 0, imHi: 0, imLo: 0, size: 1, angles: [0], real: true }],
      raysTraced: 0,
      raysLost: 0,
      unpaired: 0,
      relanded: 0,
    };
  }
  const den = 2 ** period - 1;
  const nums = periodicNumerators(period, true);
  const records = await landAll(period, nums, false, options);
  let groups = groupRecords(period, nums, records);
  let anomalies = groups.filter((g) => g.angles.length !== 2);
  const lost = countLost(records);
  let relanded = 0;
  if (anomalies.length > 0 || lost > 0) {
    const redo = new Set<number>();
    for (const g of anomalies) for (const a of g.angles) redo.add(a < den / 2 ? a : den - a);
    for (let i = 0; i < nums.length; i += 1) if (records[i * RAY_RECORD + 5] === 0) redo.add(nums[i]!);
    const redoNums = Float64Array.from([...redo].sort((a, b) => a - b));
    const again = await landAll(period, redoNums, true, {});
    relanded = redoNums.length;
    const index = new Map<number, number>();
    nums.forEach((n, i) => index.set(n, i));
    redoNums.forEach((n, j) => {
      const i = index.get(n)!;
      records.set(again.subarray(j * RAY_RECORD, (j + 1) * RAY_RECORD), i * RAY_RECORD);
    });
    groups = groupRecords(period, nums, records);
    anomalies = groups.filter((g) => g.angles.length !== 2);
  }
  return {
    period,
    components: groups,
    raysTraced: nums.length + relanded,
    raysLost: countLost(records),
    unpaired: anomalies.length,
    relanded,
  };
}

function countLost(records: Float64Array): number {
  let lost = 0;
  for (let i = 5; i < records.length; i += RAY_RECORD) if (records[i] === 0) lost += 1;
  return lost;
}

/** Groups landed rays (and their mirror images) by nucleus; sorted by lower angle. */
function groupRecords(period: number, nums: Float64Array, rec: Float64Array): CensusComponent[] {
  const den = 2 ** period - 1;
  interface Entry { re: number; reHi: number; reLo: number; imHi: number; imLo: number; size: number; angle: number }
  const entries: Entry[] = [];
  for (let i = 0; i < nums.length; i += 1) {
    const o = i * RAY_RECORD;
    if (rec[o + 5] !== 1) continue;
    const e = { reHi: rec[o]!, reLo: rec[o + 1]!, imHi: rec[o + 2]!, imLo: rec[o + 3]!, size: rec[o + 4]! };
    entries.push({ ...e, re: e.reHi + e.reLo, angle: nums[i]! });
    entries.push({ ...e, re: e.reHi + e.reLo, imHi: -e.imHi, imLo: -e.imLo, angle: den - nums[i]! });
  }
  entries.sort((a, b) => a.re - b.re || a.reLo - b.reLo || a.imHi - b.imHi || a.angle - b.angle);
  interface Group { e: Entry; angles: number[] }
  const groups: Group[] = [];
  for (const e of entries) {
    let hit: Group | null = null;
    const reach = 1e-3 * e.size;
    for (let j = groups.length - 1; j >= 0; j -= 1) {
      const g = groups[j]!;
      const dre = e.reHi - g.e.reHi + (e.reLo - g.e.reLo);
      if (dre > reach) break;
      const dim = e.imHi - g.e.imHi + (e.imLo - g.e.imLo);
      if (Math.hypot(dre, dim) <= 1e-3 * Math.min(e.size, g.e.size)) {
        hit = g;
        break;
      }
    }
    if (hit === null) groups.push({ e, angles: [e.angle] });
    else hit.angles.push(e.angle);
  }
  const out: CensusComponent[] = groups.map((g) => {
    const angles = g.angles.sort((a, b) => a - b);
    const im = g.e.imHi + g.e.imLo;
    const real = Math.abs(im) <= 1e-3 * g.e.size;
    return {
      period,
      reHi: g.e.reHi,
      reLo: g.e.reLo,
      imHi: real ? 0 : g.e.imHi,
      imLo: real ? 0 : g.e.imLo,
      size: g.e.size,
      angles,
      real,
    };
  });
  out.sort((a, b) => (a.angles[0] ?? 0) - (b.angles[0] ?? 0));
  return out;
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
  const url = censusWorkerUrl();
  const pool = Array.from({ length: Math.min(workers, chunks.length) }, () => new Worker(url));
  let next = 0;
  try {
    await Promise.all(
      pool.map(
        (w) =>
          new Promise<void>((resolve, reject) => {
            const send = (): void => {
              if (next >= chunks.length) {
                resolve();
                return;
              }
              const [s, e] = chunks[next]!;
              next += 1;
              w.once('message', (m: { records: Float64Array }) => {
                out.set(m.records, s * RAY_RECORD);
                done += e - s;
                options.onProgress?.(done, nums.length);
                send();
              });
              w.postMessage({ period, nums: nums.slice(s, e), careful });
            };
            w.once('error', reject);
            send();
          }),
      ),
    );
  } finally {
    await Promise.all(pool.map((w) => w.terminate()));
  }
  return out;
}

/** The built worker script: beside this file in dist/, or in dist/ when running from src/ (tests). */
export function censusWorkerUrl(): URL {
  const here = import.meta.url;
  return here.endsWith('.ts') ? new URL('../../dist/src/components/census-worker.js', here) : new URL('./census-worker.js', here);
}
