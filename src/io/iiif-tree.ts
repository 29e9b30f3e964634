/**
 * The finished file tree of a pyramid: checking that every tile the plan
 * promises is on disk, and writing the image information (info.json, and
 * info.js, the same document as a script, because a page opened from file://
 * may not fetch JSON).
 */
import path from 'node:path';
import { iiifTilePath, type IiifInfo } from './iiif-info.js';
import type { TileFormat } from '../view/pyramid-spec.js';
import { tileFileSize } from './iiif-tile-file.js';
import { writeFileAtomic } from './write-file-atomic.js';
import { pyramidTileAt, type PyramidPlan } from '../view/pyramid-plan.js';

export const TILES_FOLDER = 'tiles';
/** The global name info.js assigns (read by the viewer page). */
export const INFO_GLOBAL = 'quadatlasTileInfo';

export interface TreeCheck {
  readonly missing: number;
  /** Path (below dir) of the first missing tile, when any. */
  readonly firstMissing?: string;
  readonly bytes: number;
}

/** Stats every tile of the plan (a few dozen at a time); a missing or empty file counts as missing. */
export async function checkTileTree(dir: string, plan: PyramidPlan, format: TileFormat): Promise<TreeCheck> {
  let missing = 0;
  let firstMissing: string | undefined;
  let firstIndex = Infinity;
  let bytes = 0;
  let next = 0;
  const lane = async (): Promise<void> => {
    while (next < plan.tileCount) {
      const t = next++;
      const rel = path.join(TILES_FOLDER, iiifTilePath(plan, pyramidTileAt(plan, t), format));
      const size = await tileFileSize(path.join(dir, rel));
      if (size > 0) bytes += size;
      else {
        missing++;
        if (t < firstIndex) {
          firstIndex = t;
          firstMissing = rel;
        }
      }
    }
  };
  await Promise.all(Array.from({ length: 32 }, lane));
  return firstMissing === undefined ? { missing, bytes } : { missing, firstMissing, bytes };
}

/** Writes tiles/info.json and tiles/info.js, each atomically. */
export async function writeIiifInfo(dir: string, info: IiifInfo): Promise<void> {
  const json = JSON.stringify(info, null, 2);
  await writeFileAtomic(path.join(dir, TILES_FOLDER, 'info.json'), `${json}\n`);
  await writeFileAtomic(path.join(dir, TILES_FOLDER, 'info.js'), `window.${INFO_GLOBAL} = ${json};\n`);
}
