/**
 * Area coverage of pixels by filled polygons (nonzero winding, as TrueType
 * outlines are filled), for text drawn into plate pixels without any
 * rasteriser that might reach for the machine's fonts. Each pixel row is cut
 * into SUB horizontal sub-scanlines; on each, the spans of nonzero winding
 * are found from the edge crossings and their exact length in every pixel
 * is added, so coverage is exact across x and quantised to 1/SUB in y.
 * Pure arithmetic on doubles in a fixed order: the same bytes everywhere.
 * (The scanline method: J. D. Foley et al., "Computer Graphics: Principles
 * and Practice", polygon scan conversion.)
 */

/** Sub-scanlines per pixel row. */
export const SUB = 16;

/**
 * Adds the coverage (0..1) of pixel (i, j), i < width, j < height, by the
 * union of `polygons` (closed; x, y, x, y, ... in pixels, y down, pixel
 * (i, j) spanning [i, i+1) x [j, j+1)) into out[j * width + i], clamped to 1.
 */
export function fillCoverage(polygons: readonly ArrayLike<number>[], width: number, height: number, out: Float64Array): Float64Array {
  // Edges (x0, y0, x1, y1, direction) bucketed by the pixel rows they cross, so a row looks only at its own.
  const rows: number[][] = Array.from({ length: height }, () => []);
  const edges: number[] = [];
  for (const p of polygons) {
    const n = p.length / 2;
    for (let e = 0; e < n; e++) {
      const f = (e + 1) % n;
      const y0 = p[2 * e + 1]!;
      const y1 = p[2 * f + 1]!;
      if (y0 === y1) continue;
      const lo = Math.max(0, Math.floor(Math.min(y0, y1)));
      const hi = Math.min(height - 1, Math.floor(Math.max(y0, y1)));
      if (hi < lo) continue;
      const id = edges.length;
      edges.push(p[2 * e]!, y0, p[2 * f]!, y1);
      for (let j = lo; j <= hi; j++) rows[j]!.push(id);
    }
  }
  const cover = new Float64Array(width);
  const xs: number[] = [];
  const dirs: number[] = [];
  const order: number[] = [];
  for (let j = 0; j < height; j++) {
    const bucket = rows[j]!;
    if (bucket.length === 0) continue;
    cover.fill(0);
    let any = false;
    for (let s = 0; s < SUB; s++) {
      const y = j + (s + 0.5) / SUB;
      xs.length = 0;
      dirs.length = 0;
      for (const id of bucket) {
        const x0 = edges[id]!;
        const y0 = edges[id + 1]!;
        const x1 = edges[id + 2]!;
        const y1 = edges[id + 3]!;
        if (y < Math.min(y0, y1) || y >= Math.max(y0, y1)) continue;
        xs.push(x0 + ((y - y0) / (y1 - y0)) * (x1 - x0));
        dirs.push(y1 > y0 ? 1 : -1);
      }
      if (xs.length === 0) continue;
      order.length = 0;
      for (let k = 0; k < xs.length; k++) order.push(k);
      order.sort((a, b) => xs[a]! - xs[b]! || dirs[a]! - dirs[b]!);
      // between crossing k and crossing k + 1 the winding is the sum of the directions up to k
      let winding = 0;
      for (let k = 0; k + 1 < order.length; k++) {
        winding += dirs[order[k]!]!;
        if (winding === 0) continue;
        const xa = Math.max(0, xs[order[k]!]!);
        const xb = Math.min(width, xs[order[k + 1]!]!);
        if (!(xb > xa)) continue;
        addSpan(cover, xa, xb);
        any = true;
      }
    }
    if (!any) continue;
    for (let i = 0; i < width; i++) {
      const k = j * width + i;
      out[k] = Math.min(1, out[k]! + cover[i]! / SUB);
    }
  }
  return out;
}

/** Adds the length of [xa, xb) inside each pixel column to cover. */
function addSpan(cover: Float64Array, xa: number, xb: number): void {
  const ia = Math.floor(xa);
  const ib = Math.min(cover.length - 1, Math.floor(xb));
  if (ia === ib) {
    cover[ia]! += xb - xa;
    return;
  }
  cover[ia]! += ia + 1 - xa;
  for (let i = ia + 1; i < ib; i++) cover[i]! += 1;
  if (ib < cover.length) cover[ib]! += xb - ib;
}
