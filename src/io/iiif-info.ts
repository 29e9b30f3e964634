/**
 * The IIIF Image API 3.0 side of a pyramid: the path of every tile in the
 * static level-0 file tree, and the image information document (info.json).
 *
 * Paths follow the Image API 3.0 URI syntax
 * `{region}/{size}/{rotation}/{quality}.{format}` (section 2.1) in canonical
 * form (section 4.7): region `full` when the tile is the whole image, else
 * `x,y,w,h` in base pixels; size `max` when the tile is the image at full size,
 * else `w,h`; rotation `0`; quality `default`. These are the URLs
 * OpenSeadragon 6's IIIFTileSource builds for a version 3 level-0 service.
 */
import type { PyramidPlan, PyramidTile } from '../view/pyramid-plan.js';
import type { TileFormat } from '../view/pyramid-spec.js';

export const IIIF_CONTEXT = 'http://iiif.io/api/image/3/context.json';
export const IIIF_PROTOCOL = 'http://iiif.io/api/image';

/** The tile's path below the image's base (the folder holding info.json). */
export function iiifTilePath(plan: PyramidPlan, tile: PyramidTile, format: TileFormat): string {
  const { x, y, w, h } = tile.region;
  const region = x === 0 && y === 0 && w === plan.width && h === plan.height ? 'full' : `${x},${y},${w},${h}`;
  const size = tile.w === plan.width && tile.h === plan.height ? 'max' : `${tile.w},${tile.h}`;
  return `${region}/${size}/0/default.${format}`;
}

export interface IiifInfo {
  readonly '@context': string;
  readonly id: string;
  readonly type: 'ImageService3';
  readonly protocol: string;
  readonly profile: 'level0';
  readonly width: number;
  readonly height: number;
  readonly sizes: ReadonlyArray<{ readonly width: number; readonly height: number }>;
  readonly tiles: ReadonlyArray<{ readonly width: number; readonly height: number; readonly scaleFactors: readonly number[] }>;
  readonly preferredFormats?: readonly string[];
  readonly extraFormats?: readonly string[];
}

/**
 * The image information document (Image API 3.0 section 5): the required
 * fields, `tiles` with one entry for all scale factors, `sizes` for the levels
 * that are whole images in one tile (section 5.4), and for PNG tiles
 * `extraFormats` / `preferredFormats` (section 5.5), which OpenSeadragon reads
 * to ask for .png instead of its default .jpg. `id` is the base URI of the
 * image (no trailing slash).
 */
export function iiifInfo(plan: PyramidPlan, id: string, format: TileFormat): IiifInfo {
  const T = plan.tileSize;
  const sizes = plan.levels.filter((l) => l.cols === 1 && l.rows === 1).map((l) => ({ width: l.width, height: l.height }));
  const info: IiifInfo = {
    '@context': IIIF_CONTEXT,
    id: id.replace(/\/+$/, ''),
    type: 'ImageService3',
    protocol: IIIF_PROTOCOL,
    profile: 'level0',
    width: plan.width,
    height: plan.height,
    sizes,
    tiles: [{ width: T, height: T, scaleFactors: plan.levels.map((l) => l.scale).reverse() }],
  };
  return format === 'png' ? { ...info, preferredFormats: ['png'], extraFormats: ['png'] } : info;
}
