/**
 * The rows of a listing: for each census component, its nucleus refined to
 * the digits asked (Newton from the census' double-double position) and its
 * component information (root, size, shape, parent, angles, address). The
 * nucleus and root are first tried in double-double with an error bound
 * (fast-row.ts, docs/methods.md C7), falling back to BigInt Newton (nucleus.ts,
 * boundary-point.ts) wherever that cannot vouch for the digits. Rows
 * are independent, so blocks of them go to worker threads and come back in
 * their places: the listing is the same for any number of workers.
 */
import { builtWorkerUrl } from '../threads/built-worker.js';
import { mapOnWorkers } from '../threads/map-on-workers.js';
import { JobPool } from '../threads/job-pool.js';
import type { CensusComponent } from './census.js';
import { componentInfo, mersenneAngle, type ComponentInfo } from './component-info.js';
import { findNucleus, type ComplexDecimal } from './nucleus.js';
import { componentRoot, type Attachment } from './boundary-point.js';
import { NewtonError } from './newton-error.js';
import { fastNucleus, fastRoot, fastSize } from './fast-row.js';
import { satelliteAttachment } from './census-statistics.js';
import { listingRow } from './component-json.js';

/** The BigInt walk's parent agrees with the one the angles give (else the walk reached another component's root). */
function sameAttachment(found: Attachment | null, expected: { k: number; r: number; q: number } | null): boolean {
  if (found === null || expected === null) return found === expected;
  return found.period === expected.k && found.num === expected.r && found.den === expected.q;
}

/** One census component as a worker receives it. */
export interface ListItem {
  readonly re: string;
  readonly im: string;
  /** The census' double-double nucleus (re hi, re lo, im hi, im lo) and size estimate: the fast path's start. */
  readonly dd: readonly [number, number, number, number];
  readonly size: number;
  readonly real: boolean;
  readonly angles: readonly number[];
}

/** A block of rows for one worker. */
export interface ListJob {
  readonly period: number;
  readonly digits: number;
  readonly items: readonly ListItem[];
  /** Skip the double-double fast path (the BigInt path alone, as before December 2026; for tests). */
  readonly bigint?: boolean;
  /** Post the rows' cells (listingRow) instead of the rows: less to copy between threads. */
  readonly cells?: boolean;
}

/** The root of a row whose root Newton could not reach: empty cells (the CLI counts them on stderr). */
export const NO_ROOT: ComplexDecimal = { re: '', im: '' };

/** Rows per block handed to a worker (larger blocks: fewer messages; the rows do not depend on it). */
const BLOCK = 512;

/** Listing workers kept across calls of listRowCells (the sliced census lists slice after slice). */
export type ListingPool = JobPool<ListJob, string[][]>;

/** A pool of `workers` listing threads; close it when done. */
export function listingPool(workers: number): ListingPool {
  return new JobPool<ListJob, string[][]>(builtWorkerUrl('listing-worker'), workers);
}

/** The rows of a block, as rows or (job.cells) as their cells: what the worker posts back. */
export async function jobRows(job: ListJob): Promise<ComponentInfo[] | string[][]> {
  const rows = await componentRows(job);
  return job.cells === true ? rows.map(listingRow) : rows;
}

/** Places after the point at which a component's nucleus and root are known to a millionth of its size. */
const SIZE_PLACES = 6;

/**
 * Digits after the point for one row: the listing's D, or more for a
 * component smaller than 10^(SIZE_PLACES - D), so that its nucleus and root
 * are printed to a millionth of its size (docs/census.md "Digits"): from
 * period 18 the components near -2 are smaller than 10^-20, and at D = 20
 * their nucleus and root would print as the same number.
 */
export function rowDigits(digits: number, size: number): number {
  if (!(size > 0 && Number.isFinite(size))) return digits;
  return Math.max(digits, Math.ceil(-Math.log10(size)) + SIZE_PLACES);
}

/** The rows of one block, in order (the worker's work; also run in-thread for small listings). */
export async function componentRows(block: ListJob): Promise<ComponentInfo[]> {
  const rows: ComponentInfo[] = [];
  for (const c of block.items) {
    const digits = rowDigits(block.digits, c.size);
    const job = digits === block.digits ? block : { ...block, digits };
    const fast = job.bigint === true ? null : fastNucleus(job.period, [...c.dd], c.size, c.real, job.digits);
    // primitive or satellite, and where a satellite hangs, is read from the angles (census-statistics.ts); the numerics must agree
    const expected = c.angles.length === 2 ? satelliteAttachment(job.period, c.angles[0]!, c.angles[1]!) : null;
    const known = fast === null ? null : fastRoot(job.period, fast.c, job.digits, expected);
    if (fast !== null && known !== null) {
      rows.push(
        await componentInfo(
          job.period,
          fast.decimal,
          job.digits,
          c.angles.map((n) => mersenneAngle(n, job.period)),
          known,
          fastSize(job.period, fast.c),
        ),
      );
      continue;
    }
    const nucleus = c.real
      ? { ...findNucleus(job.period, { re: c.re, im: '0' }, job.digits).nucleus, im: '0' }
      : findNucleus(job.period, { re: c.re, im: c.im }, job.digits).nucleus;
    const angles = c.angles.map((n) => mersenneAngle(n, job.period));
    let root: { root: ComplexDecimal; parent: Attachment | null };
    try {
      root = componentRoot(job.period, nucleus, job.digits);
      if (!sameAttachment(root.parent, expected)) root = { root: NO_ROOT, parent: null };
    } catch (err) {
      // a root C3's walk cannot reach (seen from period 22): the row keeps its nucleus, its root cells stay empty (NO_ROOT)
      if (!(err instanceof NewtonError)) throw err;
      root = { root: NO_ROOT, parent: null };
    }
    rows.push(await componentInfo(job.period, nucleus, job.digits, angles, root));
  }
  return rows;
}

/** A census component as a worker receives it. */
export function listItem(c: CensusComponent): ListItem {
  return {
    re: (c.reHi + c.reLo).toPrecision(17),
    im: (c.imHi + c.imLo).toPrecision(17),
    dd: [c.reHi, c.reLo, c.imHi, c.imLo],
    size: c.size,
    real: c.real,
    angles: [...c.angles],
  };
}

/**
 * The rows of `comps`, in their order, computed on `workers` threads in
 * blocks of BLOCK. With `onRows`, each block is handed over as soon as it and
 * every block before it are done (in order, one call at a time) and nothing
 * is kept: the result is then empty.
 */
export async function listComponents(
  period: number,
  comps: readonly CensusComponent[],
  digits: number,
  workers: number,
  onProgress?: (done: number, total: number) => void,
  onRows?: (rows: ComponentInfo[]) => Promise<void>,
): Promise<ComponentInfo[]> {
  return listBlocks<ComponentInfo>(period, comps, digits, workers, false, onProgress, onRows);
}

/**
 * listComponents with each row as its cells (listingRow), made in the
 * workers, handed over block by block in order; nothing is kept.
 */
export async function listRowCells(
  period: number,
  comps: readonly CensusComponent[],
  digits: number,
  workers: number,
  onRows: (rows: string[][]) => Promise<void>,
  pool?: ListingPool,
): Promise<void> {
  await listBlocks<string[]>(period, comps, digits, workers, true, undefined, onRows, pool);
}

async function listBlocks<T>(
  period: number,
  comps: readonly CensusComponent[],
  digits: number,
  workers: number,
  cells: boolean,
  onProgress?: (done: number, total: number) => void,
  onRows?: (rows: T[]) => Promise<void>,
  pool?: ListingPool,
): Promise<T[]> {
  const blocks = Math.ceil(comps.length / BLOCK);
  const jobOf = (b: number): ListJob => ({ period, digits, items: comps.slice(b * BLOCK, (b + 1) * BLOCK).map(listItem), ...(cells ? { cells } : {}) });
  const out: T[][] = new Array<T[]>(blocks);
  let done = 0;
  let next = 0;
  let chain: Promise<void> = Promise.resolve();
  const arrived = (b: number, rows: T[]): void => {
    out[b] = rows;
    done += rows.length;
    onProgress?.(done, comps.length);
    if (onRows === undefined) return;
    while (next < blocks && out[next] !== undefined) {
      const ready = out[next]!;
      out[next] = [];
      next += 1;
      chain = chain.then(() => onRows(ready));
      chain.catch(() => {}); // awaited below; marked handled so a failed write waits for the end of the map
    }
  };
  if (pool !== undefined && blocks > 1) {
    await pool.map(
      blocks,
      (b) => ({ message: jobOf(b) }),
      (b, rows) => arrived(b, rows as T[]),
    );
  } else if (workers <= 1 || blocks <= 1) {
    for (let b = 0; b < blocks; b++) {
      arrived(b, (await jobRows(jobOf(b))) as T[]);
      await chain;
    }
  } else {
    await mapOnWorkers<ListJob, T[]>(builtWorkerUrl('listing-worker'), blocks, (b) => ({ message: jobOf(b) }), workers, arrived);
  }
  await chain;
  return onRows === undefined ? out.flat() : [];
}
