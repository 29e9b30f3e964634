/**
 * How a deep-zoom pyramid is cut into levels and tiles.
 *
 * Conventions (tested in test/render/pyramid-plan.test.ts):
 * - Level k has scale factor s = 2^k (IIIF Image API 3.0, "tiles" /
 *   "scaleFactors"): its image is ceil(W / s) x ceil(H / s) pixels, and its
 *   pixel (i, j) covers base pixels [s i, s i + s) x [s j, s j + s), cut off at
 *   the base image's edge. Scale factors run 1, 2, 4, ... up to the first
 *   level that fits in one tile.
 * - A level is cut into tiles of `tileSize` level pixels, the last column and
 *   row possibly narrower; tile (col, row) covers the base region
 *   x = col T s, y = row T s, w = min(T s, W - x), h = min(T s, H - y) and is
 *   ceil(w / s) x ceil(h / s) pixels, exactly as OpenSeadragon's
 *   IIIFTileSource asks for it.
 * - Tiles are numbered from the coarsest level to the base, row-major within
 *   a level. The number decides only which shard renders a tile, never its
 *   pixels; `pyramidTileAt` finds a tile from its number by arithmetic, so no
 *   list of tiles (which would grow with the base size) is ever built.
 */
export interface PyramidLevel {
  /** Scale factor: base pixels per level pixel along each axis. */
  readonly scale: number;
  readonly width: number;
  readonly height: number;
  readonly cols: number;
  readonly rows: number;
  /** Number of the first tile of this level. */
  readonly first: number;
}

export interface PyramidPlan {
  readonly width: number;
  readonly height: number;
  readonly tileSize: number;
  /** Coarsest level first (largest scale factor), the base (scale 1) last. */
  readonly levels: readonly PyramidLevel[];
  readonly tileCount: number;
}

export interface PyramidTile {
  readonly index: number;
  readonly scale: number;
  readonly col: number;
  readonly row: number;
  /** The tile's rectangle in level pixels. */
  readonly x0: number;
  readonly y0: number;
  readonly w: number;
  readonly h: number;
  /** The base-image region it shows (IIIF region x,y,w,h). */
  readonly region: { readonly x: number; readonly y: number; readonly w: number; readonly h: number };
}

export function planPyramid(width: number, height: number, tileSize: number): PyramidPlan {
  if (!(Number.isInteger(width) && width > 0 && Number.isInteger(height) && height > 0 && Number.isInteger(tileSize) && tileSize > 0)) {
    throw new RangeError(`bad pyramid ${width}x${height} tile ${tileSize}`);
  }
  const scales: number[] = [];
  for (let s = 1; ; s *= 2) {
    scales.push(s);
    if (Math.ceil(width / s) <= tileSize && Math.ceil(height / s) <= tileSize) break;
  }
  const levels: PyramidLevel[] = [];
  let first = 0;
  for (const scale of scales.reverse()) {
    const w = Math.ceil(width / scale);
    const h = Math.ceil(height / scale);
    const cols = Math.ceil(w / tileSize);
    const rows = Math.ceil(h / tileSize);
    levels.push({ scale, width: w, height: h, cols, rows, first });
    first += cols * rows;
  }
  return { width, height, tileSize, levels, tileCount: first };
}

/** The level a scale factor belongs to. */
export function levelOfScale(plan: PyramidPlan, scale: number): PyramidLevel {
  const level = plan.levels.find((l) => l.scale === scale);
  if (level === undefined) throw new RangeError(`no level with scale ${scale}`);
  return level;
}

export function pyramidTileAt(plan: PyramidPlan, index: number): PyramidTile {
  if (!Number.isInteger(index) || index < 0 || index >= plan.tileCount) throw new RangeError(`tile ${index} of ${plan.tileCount}`);
  let level = plan.levels[0]!;
  for (const l of plan.levels) if (l.first <= index) level = l;
  const k = index - level.first;
  const col = k % level.cols;
  const row = Math.floor(k / level.cols);
  const T = plan.tileSize;
  const s = level.scale;
  const x0 = col * T;
  const y0 = row * T;
  const rx = x0 * s;
  const ry = y0 * s;
  return {
    index,
    scale: s,
    col,
    row,
    x0,
    y0,
    w: Math.min(T, level.width - x0),
    h: Math.min(T, level.height - y0),
    region: { x: rx, y: ry, w: Math.min(T * s, plan.width - rx), h: Math.min(T * s, plan.height - ry) },
  };
}
