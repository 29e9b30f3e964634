/**
 * How a plate is cut for rendering.
 *
 * Conventions (tested): the image is cut into bands of whole tile rows
 * ("strips"), each strip into square tiles of `tileSize` pixels, the last
 * tile of a row and the last strip possibly smaller. A tile owns its top and
 * left edges: pixel (i, j) belongs to the tile with x0 <= i < x0 + w and
 * y0 <= j < y0 + h. Tiles are numbered row-major over the whole image; the
 * numbering never changes the pixels (every pixel depends only on its own
 * coordinates and the sheet), so any order or worker count gives the same bytes.
 */
export interface Tile {
  readonly index: number;
  readonly x0: number;
  readonly y0: number;
  readonly w: number;
  readonly h: number;
}

export interface Strip {
  readonly y0: number;
  readonly h: number;
  readonly tiles: readonly Tile[];
}

export function planStrips(width: number, height: number, tileSize: number, stripRows: number): Strip[] {
  const strips: Strip[] = [];
  const perRow = Math.ceil(width / tileSize);
  const rowsPerStrip = Math.max(1, Math.floor(stripRows / tileSize));
  const tileRows = Math.ceil(height / tileSize);
  for (let tr = 0; tr < tileRows; tr += rowsPerStrip) {
    const tiles: Tile[] = [];
    const last = Math.min(tileRows, tr + rowsPerStrip);
    for (let r = tr; r < last; r++) {
      const y0 = r * tileSize;
      const h = Math.min(tileSize, height - y0);
      for (let c = 0; c < perRow; c++) {
        const x0 = c * tileSize;
        tiles.push({ index: r * perRow + c, x0, y0, w: Math.min(tileSize, width - x0), h });
      }
    }
    const y0 = tr * tileSize;
    strips.push({ y0, h: Math.min(height, last * tileSize) - y0, tiles });
  }
  return strips;
}
