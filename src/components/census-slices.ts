/**
 * The census in slices, for large periods: bounded working memory, the
 * components handed over in the order of their lower angle as they are
 * found (docs/census.md, docs/methods.md C8).
 *
 * The lower half of the angle circle, numerators 0 .. H - 1 with
 * H = (2^p)/2, is cut into K slices [a_j, a_(j+1)). Slice j also takes the
 * mirror range of lower angles n >= H with den - 1 - n in [a_j, a_(j+1))
 * (den = 2^p - 1): a pair (lo, hi) traced for its own component (lower angle
 * lo < H) and for its mirror image (lower angle den - hi) then falls into
 * one slice unless its arc straddles a slice boundary, which only the few
 * wide pairs do. Each slice is one ordinary census (census.ts, with its
 * distinctness check and careful re-landing); its components below H go out
 * at once, those above H to a temporary file, handed over after the last
 * slice in reverse slice order (each file ascending), which is ascending
 * overall.
 *
 * Distinctness across slices (census.ts checks it within one): every slice
 * writes its nuclei, sorted by real part, as a run to a temporary file; at
 * the end the runs are merged and swept in order of real part, each nucleus
 * compared with the earlier ones within 1e-3 of its size (the census rule:
 * two nuclei closer than 1e-3 of the smaller size are one), so memory holds
 * one read buffer per run and the nuclei within 1e-3 in real part.
 */
import { closeSync, mkdtempSync, openSync, readSync, rmSync, writeSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { census, type CensusComponent } from './census.js';
import { CensusStatisticsAccumulator, type CensusStatistics } from './census-statistics.js';
import { lavaursStream } from './lavaurs-stream.js';

/** Components per slice (both halves), about: 2^17 keeps a slice's census near 60 MB. */
export const SLICE_COMPONENTS = 2 ** 17;

export interface SlicedCensusOptions {
  readonly workers?: number;
  /** Components per slice (default SLICE_COMPONENTS; small values for tests). */
  readonly sliceComponents?: number;
  /** Called as rays land: (rays landed, rays to land) over the whole census. */
  readonly onProgress?: (done: number, total: number) => void;
  /** Receives the components, in ascending order of lower angle, block by block; the next block waits for the last one's promise (the next slice lands meanwhile). */
  readonly onComponents: (components: readonly CensusComponent[]) => Promise<void>;
  /** Folder for the temporary files (default: the system's). */
  readonly tempDir?: string;
  /** Called once the pairs are known: the number of components, of slices and of rays to land. */
  readonly onPlan?: (components: number, slices: number, rays: number) => void;
}

export interface SlicedCensusResult {
  readonly period: number;
  readonly count: number;
  readonly slices: number;
  readonly raysTraced: number;
  readonly raysLost: number;
  readonly unpaired: number;
  readonly relanded: number;
  /** Pairs of nuclei from different slices found closer than 1e-3 of the smaller size (0 for a sound census). */
  readonly crossDuplicates: number;
  readonly statistics: CensusStatistics;
  /** Seconds in pairing, landing (the slices' censuses), and the cross-slice sweep. */
  readonly seconds: { readonly pairing: number; readonly landing: number; readonly distinctness: number };
}

/** Doubles per component in the upper-half files: reHi, reLo, imHi, imLo, size, lower angle, upper angle, real. */
const COMPONENT_DOUBLES = 8;
/** Doubles per nucleus in the runs: reHi, reLo, imHi, imLo, size. */
const RUN_DOUBLES = 5;

/** Runs the census of `period` in slices; see the file comment. */
export async function censusSlices(period: number, options: SlicedCensusOptions): Promise<SlicedCensusResult> {
  if (!(Number.isInteger(period) && period >= 2)) throw new RangeError(`censusSlices: period ${period} below 2`);
  const t0 = performance.now();
  const den = 2 ** period - 1;
  const half = (den + 1) / 2;
  // only the pairs the census traces (lo + hi <= den, i.e. lo < half), as 32-bit numerators: 8 bytes a pair
  const pairs = lavaursStream(period, { lowerHalf: true });
  const { lo, hi } = pairs;
  const n = lo.length;
  let symmetric = 0;
  for (let i = 0; i < n; i += 1) if (lo[i]! + hi[i]! === den) symmetric += 1;
  // every pair stands for its own component and, unless symmetric (real), its mirror image
  const components = 2 * n - symmetric;
  const tPairs = performance.now();
  const k = Math.max(1, Math.ceil(components / (options.sliceComponents ?? SLICE_COMPONENTS)));
  const bounds = Float64Array.from({ length: k + 1 }, (_, j) => Math.floor((j * half) / k));
  const sliceOf = (a: number): number => {
    let l = 0;
    let h = k - 1;
    while (l < h) {
      const mid = (l + h + 1) >> 1;
      if (bounds[mid]! <= a) l = mid;
      else h = mid - 1;
    }
    return l;
  };
  const sliceOfLower = (a: number): number => (a < half ? sliceOf(a) : sliceOf(den - 1 - a));
  // Each pair goes to the slice of its own component (lower angle lo) and to that of its mirror
  // image (lower angle den - hi). The pairs ascend in lo, so slice j's own pairs are the index
  // range [first[j], first[j + 1]); only the few whose mirror falls in another slice (an arc across
  // a slice boundary) are listed, by slice, in `crossing`. The slice numbers are recomputed in the
  // fill pass rather than stored (4 bytes a pair each).
  const first = new Int32Array(k + 1);
  for (let j = 0; j <= k; j += 1) {
    let l = 0;
    let h = n;
    while (l < h) {
      const mid = (l + h) >> 1;
      if (lo[mid]! < bounds[j]!) l = mid + 1;
      else h = mid;
    }
    first[j] = l;
  }
  if (first[k] !== n) throw new Error(`censusSlices(${period}): a pair with lower angle at or above one half`);
  const mirrorSlice = (i: number): number => {
    const a = lo[i]!;
    const b = hi[i]!;
    if (a + b === den) return -1;
    const m = sliceOfLower(den - b);
    return m === sliceOf(a) ? -1 : m;
  };
  const crossStart = new Int32Array(k + 1);
  for (let i = 0; i < n; i += 1) {
    const m = mirrorSlice(i);
    if (m >= 0) crossStart[m + 1] += 1;
  }
  for (let j = 0; j < k; j += 1) crossStart[j + 1] = crossStart[j]! + crossStart[j + 1]!;
  const crossing = new Int32Array(crossStart[k]!);
  const fill = crossStart.slice(0, k);
  for (let i = 0; i < n; i += 1) {
    const m = mirrorSlice(i);
    if (m >= 0) crossing[fill[m]!++] = i;
  }
  /** Slice j's pairs, ascending: those crossing into it (their lower angles lie in earlier slices), then its own range. */
  const slicePairs = (j: number): Int32Array => {
    const cross = crossing.subarray(crossStart[j]!, crossStart[j + 1]!);
    const list = new Int32Array(cross.length + first[j + 1]! - first[j]!);
    list.set(cross);
    for (let i = first[j]!, o = cross.length; i < first[j + 1]!; i += 1, o += 1) list[o] = i;
    return list;
  };
  const totalRays = n + crossing.length;
  options.onPlan?.(components, k, totalRays);

  const dir = mkdtempSync(path.join(options.tempDir ?? os.tmpdir(), 'quadatlas-census-'));
  const stats = new CensusStatisticsAccumulator(period);
  let count = 0;
  let raysTraced = 0;
  let raysLost = 0;
  let unpaired = 0;
  let relanded = 0;
  let landed = 0;
  const runsPath = path.join(dir, 'runs.f64');
  const runs = openSync(runsPath, 'w+');
  const runStart: number[] = [0];
  let pending: Promise<void> = Promise.resolve();
  try {
    for (let j = 0; j < k; j += 1) {
      const slice = slicePairs(j);
      const r = await census(period, {
        pairs,
        slice: { pairs: slice, keep: (n) => sliceOfLower(n) === j },
        statistics: stats,
        workers: options.workers ?? 0,
        onProgress: (d) => options.onProgress?.(landed + d, totalRays),
      });
      landed += slice.length;
      raysTraced += r.raysTraced;
      raysLost += r.raysLost;
      unpaired += r.unpaired;
      relanded += r.relanded;
      count += r.components.length;
      const split = r.components.findIndex((c) => c.angles[0]! >= half);
      const low = split < 0 ? r.components : r.components.slice(0, split);
      const high = split < 0 ? [] : r.components.slice(split);
      writeComponents(path.join(dir, `upper-${j}.f64`), high);
      writeRun(runs, r.components, runStart);
      // the caller lists this slice while the next one lands (one hand-over in flight at a time)
      if (low.length > 0) {
        await pending;
        pending = options.onComponents(low);
        pending.catch(() => {}); // awaited before the next hand-over and at the end
      }
    }
    await pending;
    for (let j = k - 1; j >= 0; j -= 1) {
      const high = readComponents(path.join(dir, `upper-${j}.f64`), period);
      if (high.length > 0) await options.onComponents(high);
    }
    const tLanded = performance.now();
    const crossDuplicates = sweepRuns(runs, runStart);
    const tSwept = performance.now();
    return {
      period,
      count,
      slices: k,
      raysTraced,
      raysLost,
      unpaired,
      relanded,
      crossDuplicates,
      statistics: stats.result(),
      seconds: { pairing: (tPairs - t0) / 1000, landing: (tLanded - tPairs) / 1000, distinctness: (tSwept - tLanded) / 1000 },
    };
  } finally {
    await pending.catch(() => {});
    closeSync(runs);
    rmSync(dir, { recursive: true, force: true });
  }
}

function writeComponents(file: string, comps: readonly CensusComponent[]): void {
  const a = new Float64Array(comps.length * COMPONENT_DOUBLES);
  comps.forEach((c, i) => {
    a.set([c.reHi, c.reLo, c.imHi, c.imLo, c.size, c.angles[0]!, c.angles[1] ?? -1, c.real ? 1 : 0], i * COMPONENT_DOUBLES);
  });
  const fd = openSync(file, 'w');
  try {
    writeAll(fd, a);
  } finally {
    closeSync(fd);
  }
}

function readComponents(file: string, period: number): CensusComponent[] {
  const fd = openSync(file, 'r');
  try {
    const out: CensusComponent[] = [];
    const buf = new Float64Array(4096 * COMPONENT_DOUBLES);
    for (;;) {
      const got = readSync(fd, new Uint8Array(buf.buffer)) / 8;
      if (got === 0) break;
      for (let o = 0; o + COMPONENT_DOUBLES <= got; o += COMPONENT_DOUBLES) {
        const hi = buf[o + 6]!;
        out.push({
          period,
          reHi: buf[o]!,
          reLo: buf[o + 1]!,
          imHi: buf[o + 2]!,
          imLo: buf[o + 3]!,
          size: buf[o + 4]!,
          angles: hi < 0 ? [buf[o + 5]!] : [buf[o + 5]!, hi],
          real: buf[o + 7] === 1,
        });
      }
    }
    return out;
  } finally {
    closeSync(fd);
  }
}

function writeAll(fd: number, a: Float64Array): void {
  const bytes = new Uint8Array(a.buffer, a.byteOffset, a.byteLength);
  let off = 0;
  while (off < bytes.length) off += writeSync(fd, bytes, off, bytes.length - off);
}

/** Appends the slice's nuclei, sorted by real part (hi, then lo), as one run. */
function writeRun(fd: number, comps: readonly CensusComponent[], runStart: number[]): void {
  const order = comps.map((_, i) => i).sort((x, y) => comps[x]!.reHi - comps[y]!.reHi || comps[x]!.reLo - comps[y]!.reLo);
  const a = new Float64Array(comps.length * RUN_DOUBLES);
  order.forEach((i, n) => {
    const c = comps[i]!;
    a.set([c.reHi, c.reLo, c.imHi, c.imLo, c.size], n * RUN_DOUBLES);
  });
  writeAll(fd, a);
  runStart.push(runStart[runStart.length - 1]! + comps.length);
}

/**
 * The sweep on runs given in memory (each a list of nuclei sorted by real
 * part), through a temporary file as the census writes them: pairs closer
 * than 1e-3 of the smaller size. For tests and for `components merge`.
 */
export function closeNucleiInRuns(runs: readonly (readonly CensusComponent[])[], tempDir = os.tmpdir()): number {
  const dir = mkdtempSync(path.join(tempDir, 'quadatlas-runs-'));
  const fd = openSync(path.join(dir, 'runs.f64'), 'w+');
  try {
    const runStart: number[] = [0];
    for (const r of runs) writeRun(fd, r, runStart);
    return sweepRuns(fd, runStart);
  } finally {
    closeSync(fd);
    rmSync(dir, { recursive: true, force: true });
  }
}

/** Records read per run at a time in the sweep. */
const RUN_BUFFER = 2048;

/**
 * Merges the runs by real part and counts pairs of nuclei closer than 1e-3 of
 * the smaller size: each nucleus is compared with the earlier ones whose real
 * part lies within 1e-3 of its own size (any such pair is within that of both).
 */
function sweepRuns(fd: number, runStart: readonly number[]): number {
  const n = runStart.length - 1;
  const bufs = Array.from({ length: n }, () => new Float64Array(RUN_BUFFER * RUN_DOUBLES));
  const next = runStart.slice(0, n); // next record of each run to read into its buffer
  const fill = new Int32Array(n); // records in each buffer
  const at = new Int32Array(n); // position in each buffer
  const refill = (r: number): boolean => {
    const left = runStart[r + 1]! - next[r]!;
    if (left <= 0) return false;
    const m = Math.min(RUN_BUFFER, left);
    const bytes = new Uint8Array(bufs[r]!.buffer, 0, m * RUN_DOUBLES * 8);
    let off = 0;
    while (off < bytes.length) off += readSync(fd, bytes, off, bytes.length - off, next[r]! * RUN_DOUBLES * 8 + off);
    next[r] = next[r]! + m;
    fill[r] = m;
    at[r] = 0;
    return true;
  };
  // a binary heap of runs by their current record's real part (hi, then lo: the runs' order)
  const heap: number[] = [];
  const less = (x: number, y: number): boolean => {
    const bx = bufs[x]!;
    const by = bufs[y]!;
    const ox = at[x]! * RUN_DOUBLES;
    const oy = at[y]! * RUN_DOUBLES;
    return bx[ox]! < by[oy]! || (bx[ox] === by[oy] && bx[ox + 1]! < by[oy + 1]!);
  };
  const up = (i: number): void => {
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (!less(heap[i]!, heap[p]!)) return;
      [heap[i], heap[p]] = [heap[p]!, heap[i]!];
      i = p;
    }
  };
  const down = (i: number): void => {
    for (;;) {
      const l = 2 * i + 1;
      const r = l + 1;
      let m = i;
      if (l < heap.length && less(heap[l]!, heap[m]!)) m = l;
      if (r < heap.length && less(heap[r]!, heap[m]!)) m = r;
      if (m === i) return;
      [heap[i], heap[m]] = [heap[m]!, heap[i]!];
      i = m;
    }
  };
  for (let r = 0; r < n; r += 1) if (refill(r)) (heap.push(r), up(heap.length - 1));
  // the window: recent nuclei, ascending in real part (a growing array trimmed from the front)
  let win = new Float64Array(1024 * RUN_DOUBLES);
  let head = 0;
  let tail = 0;
  let duplicates = 0;
  while (heap.length > 0) {
    const r = heap[0]!;
    const b = bufs[r]!;
    const o = at[r]! * RUN_DOUBLES;
    const reHi = b[o]!,
      reLo = b[o + 1]!,
      imHi = b[o + 2]!,
      imLo = b[o + 3]!,
      size = b[o + 4]!;
    const reach = 1e-3 * size;
    // drop window entries beyond the largest reach any later nucleus can have (sizes are at most 1, the cardioid's)
    while (head < tail && reHi - win[head * RUN_DOUBLES]! > 2e-3) head += 1;
    for (let w = tail - 1; w >= head; w -= 1) {
      const q = w * RUN_DOUBLES;
      const dre = reHi - win[q]! + (reLo - win[q + 1]!);
      if (dre > reach) break;
      const dim = imHi - win[q + 2]! + (imLo - win[q + 3]!);
      if (Math.hypot(dre, dim) <= 1e-3 * Math.min(size, win[q + 4]!)) duplicates += 1;
    }
    if (tail * RUN_DOUBLES === win.length) {
      const keep = tail - head;
      const grown = keep * 2 * RUN_DOUBLES > win.length ? new Float64Array(win.length * 2) : win;
      grown.set(win.subarray(head * RUN_DOUBLES, tail * RUN_DOUBLES));
      win = grown;
      head = 0;
      tail = keep;
    }
    win.set([reHi, reLo, imHi, imLo, size], tail * RUN_DOUBLES);
    tail += 1;
    at[r] = at[r]! + 1;
    if (at[r]! >= fill[r]! && !refill(r)) {
      const last = heap.pop()!;
      if (heap.length > 0) {
        heap[0] = last;
        down(0);
      }
    } else down(0);
  }
  return duplicates;
}
