/**
 * Renders one share of a pyramid's tiles over a PyramidPool. Tile numbers are
 * generated on the fly and at most two per worker are in flight, so memory
 * does not depend on the base size; tiles already on disk are skipped by the
 * workers, which is what makes an interrupted run resumable.
 */
import { addStats, emptyStats, type TileStats } from './plate-job.js';
import type { PyramidSpec } from '../view/pyramid-spec.js';
import type { PyramidPool } from './pyramid-pool.js';
import type { Shard } from './pyramid-shard.js';

export interface PyramidShareOptions {
  readonly pool: PyramidPool;
  readonly key: string;
  readonly spec: PyramidSpec;
  readonly dir: string;
  readonly tileCount: number;
  readonly shard: Shard;
  readonly onProgress?: (done: number, total: number) => void;
}

export interface PyramidShareResult {
  /** Tiles of this share. */
  readonly share: number;
  readonly rendered: number;
  readonly skipped: number;
  /** Bytes of the tiles this run wrote. */
  readonly bytes: number;
  readonly stats: TileStats;
}

/** Number of tiles t < total with t mod count == index. */
export function shareSize(total: number, shard: Shard): number {
  return total > shard.index ? Math.floor((total - 1 - shard.index) / shard.count) + 1 : 0;
}

export async function renderPyramidShare(o: PyramidShareOptions): Promise<PyramidShareResult> {
  const share = shareSize(o.tileCount, o.shard);
  const stats = emptyStats();
  let rendered = 0;
  let skipped = 0;
  let bytes = 0;
  let failure: unknown;
  const inFlight = new Set<Promise<void>>();
  const limit = 2 * o.pool.size;
  o.onProgress?.(0, share);
  for (let t = o.shard.index; t < o.tileCount && failure === undefined; t += o.shard.count) {
    const p: Promise<void> = o.pool.render(o.key, o.spec, o.dir, t).then(
      (r) => {
        if (r.skipped) skipped++;
        else {
          rendered++;
          bytes += r.bytes;
          addStats(stats, r.stats);
        }
        o.onProgress?.(rendered + skipped, share);
      },
      (err: unknown) => {
        failure ??= err;
      },
    );
    const tracked = p.finally(() => inFlight.delete(tracked));
    inFlight.add(tracked);
    if (inFlight.size >= limit) await Promise.race(inFlight);
  }
  await Promise.all(inFlight);
  if (failure !== undefined) throw failure;
  return { share, rendered, skipped, bytes, stats };
}
