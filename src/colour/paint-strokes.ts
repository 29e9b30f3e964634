/**
 * Marks drawn over a plate (orbits, cycles, rays): polylines and discs in
 * plate pixels (x right, y down, pixel (i, j) covers [i, i+1) x [j, j+1)),
 * painted into a tile's linear-light buffer. Coverage of a pixel is the
 * box-filtered area estimate clamp(w/2 + 1/2 - d, 0, 1) from the distance d
 * of its centre to the shape (a standard distance-field approximation), so a
 * pixel's value depends on its own coordinates and the shapes only, never on
 * the tiling. Composited with the "over" operator in linear light (Porter &
 * Duff, SIGGRAPH 1984).
 */
export interface Stroke {
  /** 'line': a polyline through points (x0, y0, x1, y1, ...); 'disc': a filled disc at (points[0], points[1]); 'ring': a circle there of radius points[2]. */
  readonly shape: 'line' | 'disc' | 'ring';
  readonly points: readonly number[];
  /** Line width (line, ring) or radius (disc), in pixels. */
  readonly size: number;
  /** Linear-light RGB. */
  readonly colour: readonly [number, number, number];
  readonly alpha: number;
}

function segmentDistance(px: number, py: number, ax: number, ay: number, bx: number, by: number): number {
  const dx = bx - ax,
    dy = by - ay;
  const len2 = dx * dx + dy * dy;
  let t = len2 > 0 ? ((px - ax) * dx + (py - ay) * dy) / len2 : 0;
  t = t < 0 ? 0 : t > 1 ? 1 : t;
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

/**
 * Paints the strokes, in order, over the tile (x0, y0, w, h) of `linear` (3
 * values a pixel, row-major). A polyline's coverage is the largest over its
 * segments, so joints are not painted twice.
 */
export function paintStrokes(strokes: readonly Stroke[], x0: number, y0: number, w: number, h: number, linear: Float64Array): void {
  const cover = new Float64Array(w * h);
  for (const s of strokes) {
    cover.fill(0);
    const reach = s.size + 1;
    const pts = s.points;
    const ring = s.shape === 'ring' ? (pts[2] ?? 0) : 0;
    const n = s.shape === 'line' ? pts.length / 2 - 1 : 1;
    let touched = false;
    for (let seg = 0; seg < n; seg++) {
      const ax = pts[2 * seg]!,
        ay = pts[2 * seg + 1]!;
      const bx = s.shape === 'line' ? pts[2 * seg + 2]! : ax;
      const by = s.shape === 'line' ? pts[2 * seg + 3]! : ay;
      const i0 = Math.max(x0, Math.floor(Math.min(ax, bx) - reach - ring));
      const i1 = Math.min(x0 + w - 1, Math.ceil(Math.max(ax, bx) + reach + ring));
      const j0 = Math.max(y0, Math.floor(Math.min(ay, by) - reach - ring));
      const j1 = Math.min(y0 + h - 1, Math.ceil(Math.max(ay, by) + reach + ring));
      for (let j = j0; j <= j1; j++) {
        for (let i = i0; i <= i1; i++) {
          const d = segmentDistance(i + 0.5, j + 0.5, ax, ay, bx, by);
          let c: number;
          if (s.shape === 'disc') c = s.size + 0.5 - d;
          else if (s.shape === 'ring') c = s.size / 2 + 0.5 - Math.abs(d - ring);
          else c = s.size / 2 + 0.5 - d;
          if (c <= 0) continue;
          const q = (j - y0) * w + (i - x0);
          const v = c > 1 ? 1 : c;
          if (v > cover[q]!) cover[q] = v;
          touched = true;
        }
      }
    }
    if (!touched) continue;
    for (let q = 0; q < w * h; q++) {
      const v = cover[q]!;
      if (v === 0) continue;
      const a = s.alpha * v;
      const o = 3 * q;
      linear[o] = linear[o]! + (s.colour[0] - linear[o]!) * a;
      linear[o + 1] = linear[o + 1]! + (s.colour[1] - linear[o + 1]!) * a;
      linear[o + 2] = linear[o + 2]! + (s.colour[2] - linear[o + 2]!) * a;
    }
  }
}
