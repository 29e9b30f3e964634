/**
 * Proves closed disks pairwise disjoint, in exact integers: a sweep over the
 * disks sorted by their left edge re - r, comparing each with the later
 * disks whose left edge is not beyond its right edge, and for those
 * comparing (dre^2 + dim^2) > (r1 + r2)^2 exactly. Disks whose real
 * projections are apart are disjoint; so no overlapping pair is skipped.
 */

/** A disk with centre (re + i im) 2^-bits and radius r 2^-bits (common bits). */
export interface IntDisk {
  readonly re: bigint;
  readonly im: bigint;
  readonly r: bigint;
}

/** The first overlapping pair (indices into disks), or null when all are pairwise disjoint. */
export function firstOverlap(disks: readonly IntDisk[]): [number, number] | null {
  const order = Array.from(disks.keys());
  const left = disks.map((d) => d.re - d.r);
  order.sort((a, b) => (left[a]! < left[b]! ? -1 : left[a]! > left[b]! ? 1 : a - b));
  for (let k = 0; k < order.length; k += 1) {
    const a = disks[order[k]!]!;
    const right = a.re + a.r;
    for (let j = k + 1; j < order.length; j += 1) {
      if (left[order[j]!]! > right) break;
      const b = disks[order[j]!]!;
      const dre = a.re - b.re;
      const dim = a.im - b.im;
      const rr = a.r + b.r;
      if (dre * dre + dim * dim <= rr * rr) return [order[k]!, order[j]!];
    }
  }
  return null;
}
