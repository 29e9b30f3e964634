/**
 * Clips a polyline to a rectangle, segment by segment (Liang and Barsky,
 * "A new concept and method for line clipping", ACM TOG 3(1), 1984):
 * returns the runs of the polyline inside, each as x0, y0, x1, y1, ....
 * Used to keep figure coordinates near the page (a ray starts 65536 c units
 * out); the writers still clip to the plate exactly.
 */
export function clipPolyline(points: ArrayLike<number>, x0: number, y0: number, x1: number, y1: number): number[][] {
  const runs: number[][] = [];
  let run: number[] | null = null;
  for (let i = 0; i + 3 < points.length; i += 2) {
    const ax = points[i]!;
    const ay = points[i + 1]!;
    const dx = points[i + 2]! - ax;
    const dy = points[i + 3]! - ay;
    let t0 = 0;
    let t1 = 1;
    let inside = true;
    for (const [p, q] of [
      [-dx, ax - x0],
      [dx, x1 - ax],
      [-dy, ay - y0],
      [dy, y1 - ay],
    ] as const) {
      if (p === 0) {
        if (q < 0) inside = false;
        continue;
      }
      const r = q / p;
      if (p < 0) t0 = Math.max(t0, r);
      else t1 = Math.min(t1, r);
    }
    if (!inside || t0 > t1) {
      run = null;
      continue;
    }
    const sx = ax + t0 * dx;
    const sy = ay + t0 * dy;
    if (run === null || t0 > 0) {
      run = [sx, sy];
      runs.push(run);
    }
    run.push(ax + t1 * dx, ay + t1 * dy);
    if (t1 < 1) run = null;
  }
  return runs;
}
