/**
 * The certified census of period P: a proof that the census lists every
 * hyperbolic component of exact period P once.
 *
 * Each nucleus gets a Krawczyk certificate (certify-nucleus.ts): a closed
 * disk holding exactly one zero of F_P, simple and of exact period P. The
 * disks are then proved pairwise disjoint (disjoint-disks.ts), so they hold
 * that many distinct zeros of exact period P. By Gleason's lemma the zeros
 * of F_P are simple, and those of exact period P number
 * sum_{d|P} mu(P/d) 2^(d-1) (exact-period-count.ts). When the number of
 * disks equals that sum, every zero of exact period P, i.e. every nucleus of
 * a component of exact period P, lies in exactly one disk: the list is
 * complete and has no repeats. (Nuclei are in one-to-one correspondence with
 * components: Douady-Hubbard, as in docs/certificates.md.)
 *
 * F_P has real coefficients, so the certificate of c is also one of its
 * conjugate: only nuclei with Im c >= 0 are tested, and the conjugates take
 * their radii. Workers certify chunks; results are placed by index, so the
 * outcome does not depend on worker count or order.
 */
import type { CensusResult } from '../census.js';
import { mapOnWorkers } from '../../threads/map-on-workers.js';
import { centreOf, certifyChunk, CENTRE_RECORD } from './certify-chunk.js';
import type { ChunkCertificates } from './certify-chunk.js';
import { firstOverlap } from './disjoint-disks.js';
import type { IntDisk } from './disjoint-disks.js';
import { exactPeriodCount } from './exact-period-count.js';
import { builtWorkerUrl } from '../../threads/built-worker.js';

export interface CensusCertificate {
  readonly period: number;
  /** Every nucleus certified, disks pairwise disjoint, and their number equal to the theorem's count. */
  readonly ok: boolean;
  /** sum_{d|P} mu(P/d) 2^(d-1). */
  readonly expected: bigint;
  /** Components in the census. */
  readonly found: number;
  /** Nuclei whose certificate failed: index into the census components, and why. */
  readonly failures: ReadonlyArray<{ index: number; reason: string }>;
  /** Two census components whose disks were not proved disjoint, or null. */
  readonly overlap: readonly [number, number] | null;
  /** Per census component: the radius in units of 2^-bits (0 where failed). */
  readonly radii: readonly bigint[];
  readonly bits: number;
}

export interface CertifyCensusOptions {
  readonly workers?: number;
  readonly onProgress?: (done: number, total: number) => void;
}

/** Fixed-point bits for the census certificate: the double-double nuclei (about 106 bits) and the smallest component (size about 2^(6-4P)). */
export function censusBits(period: number): number {
  return Math.max(150, 4 * period + 48);
}

export async function certifyCensus(result: CensusResult, options: CertifyCensusOptions = {}): Promise<CensusCertificate> {
  const period = result.period;
  const comps = result.components;
  const bits = censusBits(period);
  // the tested nuclei (Im >= 0) and, for each component, the tested one it mirrors
  const tested: number[] = [];
  const key = (re: number, rl: number, im: number, il: number): string => `${re},${rl},${im},${il}`;
  const index = new Map<string, number>();
  comps.forEach((c, i) => {
    if (c.imHi > 0 || (c.imHi === 0 && c.imLo >= 0)) {
      index.set(key(c.reHi, c.reLo, c.imHi, c.imLo), tested.length);
      tested.push(i);
    }
  });
  const centres = new Float64Array(tested.length * CENTRE_RECORD);
  tested.forEach((ci, t) => {
    const c = comps[ci]!;
    centres.set([c.reHi, c.reLo, c.imHi, c.imLo], t * CENTRE_RECORD);
  });
  const got = await certifyAll(period, centres, bits, options);
  const radii: bigint[] = [];
  const failures: Array<{ index: number; reason: string }> = [];
  const disks: IntDisk[] = [];
  comps.forEach((c, i) => {
    const t = c.imHi > 0 || (c.imHi === 0 && c.imLo >= 0) ? index.get(key(c.reHi, c.reLo, c.imHi, c.imLo)) : index.get(key(c.reHi, c.reLo, -c.imHi, -c.imLo));
    const reason = t === undefined ? 'its conjugate is not in the census' : (got.reasons[t] ?? null);
    const r = t === undefined ? 0n : got.radii[t]!;
    radii.push(reason === null ? r : 0n);
    if (reason !== null) failures.push({ index: i, reason });
    const centre = centreOf(Float64Array.of(c.reHi, c.reLo, c.imHi, c.imLo), 0, bits);
    disks.push({ re: centre.re, im: centre.im, r });
  });
  const overlap = failures.length === 0 ? firstOverlap(disks) : null;
  const expected = exactPeriodCount(period);
  return {
    period,
    ok: failures.length === 0 && overlap === null && BigInt(comps.length) === expected,
    expected,
    found: comps.length,
    failures,
    overlap,
    radii,
    bits,
  };
}

async function certifyAll(period: number, centres: Float64Array, bits: number, options: CertifyCensusOptions): Promise<ChunkCertificates> {
  const n = centres.length / CENTRE_RECORD;
  const workers = Math.max(0, Math.floor(options.workers ?? 0));
  const chunk = Math.max(64, Math.min(4096, Math.ceil(n / Math.max(1, workers * 16))));
  const starts: number[] = [];
  for (let s = 0; s < n; s += chunk) starts.push(s);
  const radii: bigint[] = new Array<bigint>(n).fill(0n);
  const reasons: (string | null)[] = new Array<string | null>(n).fill(null);
  let done = 0;
  const place = (s: number, r: ChunkCertificates): void => {
    r.radii.forEach((v, j) => (radii[s + j] = v));
    r.reasons.forEach((v, j) => (reasons[s + j] = v));
    done += r.radii.length;
    options.onProgress?.(done, n);
  };
  if (workers === 0 || n < 512) {
    for (const s of starts) place(s, certifyChunk(period, centres.subarray(s * CENTRE_RECORD, Math.min(n, s + chunk) * CENTRE_RECORD), bits));
  } else {
    await mapOnWorkers<{ period: number; centres: Float64Array; bits: number }, ChunkCertificates>(
      builtWorkerUrl('certify-worker'),
      starts.length,
      (i) => ({ message: { period, centres: centres.slice(starts[i]! * CENTRE_RECORD, Math.min(n, starts[i]! + chunk) * CENTRE_RECORD), bits } }),
      workers,
      (i, r) => place(starts[i]!, r),
    );
  }
  return { radii, reasons };
}
