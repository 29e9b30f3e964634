/**
 * Filters one PNG scanline with the filter chosen by the heuristic the PNG
 * specification recommends (W3C PNG 2nd ed., 12.8 "Filter selection"): try
 * all five filter types and keep the one whose output bytes, read as signed
 * differences, have the smallest sum of absolute values.
 *
 * `cur` and `prev` are the unfiltered bytes of this row and the row above
 * (all zeros for the first row), `bpp` the bytes per complete pixel
 * (channels * depth / 8, so a 16-bit sample is compared with the same sample
 * of the left pixel, not its own other byte). Writes the filter type byte and
 * the filtered row to `out` at `offset`; returns the filter type.
 *
 * One pass scores all five filters without storing them; a second writes the
 * winner. (Dropped: five scratch rows, one per filter; same result, more
 * memory traffic.) With `fixed` given, that filter is used without scoring.
 */
export function filterScanline(out: Uint8Array, offset: number, cur: Uint8Array, prev: Uint8Array, bpp: number, fixed?: 0 | 1 | 2 | 3 | 4): number {
  const n = cur.length;
  let best: number;
  if (fixed !== undefined) {
    best = fixed;
  } else {
    let s0 = 0;
    let s1 = 0;
    let s2 = 0;
    let s3 = 0;
    let s4 = 0;
    // A filtered byte d counts as the signed difference d < 128 ? d : 256 - d.
    const lead = Math.min(bpp, n);
    for (let i = 0; i < lead; i++) {
      // No left neighbour: a = c = 0, so Sub = None and Paeth predicts b, like Up.
      const x = cur[i]!;
      const b = prev[i]!;
      const d0 = x < 128 ? x : 256 - x;
      let d = (x - b) & 0xff;
      const d2 = d < 128 ? d : 256 - d;
      s0 += d0;
      s1 += d0;
      s2 += d2;
      d = (x - (b >> 1)) & 0xff;
      s3 += d < 128 ? d : 256 - d;
      s4 += d2;
    }
    for (let i = lead; i < n; i++) {
      const x = cur[i]!;
      const a = cur[i - bpp]!;
      const b = prev[i]!;
      const c = prev[i - bpp]!;
      s0 += x < 128 ? x : 256 - x;
      let d = (x - a) & 0xff;
      s1 += d < 128 ? d : 256 - d;
      d = (x - b) & 0xff;
      s2 += d < 128 ? d : 256 - d;
      d = (x - ((a + b) >> 1)) & 0xff;
      s3 += d < 128 ? d : 256 - d;
      const pa = Math.abs(b - c);
      const pb = Math.abs(a - c);
      const pc = Math.abs(a + b - c - c);
      d = (x - (pa <= pb && pa <= pc ? a : pb <= pc ? b : c)) & 0xff;
      s4 += d < 128 ? d : 256 - d;
    }
    best = 0;
    let bestSum = s0;
    if (s1 < bestSum) ((best = 1), (bestSum = s1));
    if (s2 < bestSum) ((best = 2), (bestSum = s2));
    if (s3 < bestSum) ((best = 3), (bestSum = s3));
    if (s4 < bestSum) best = 4;
  }
  out[offset] = best;
  const o = offset + 1;
  switch (best) {
    case 0:
      out.set(cur, o);
      break;
    case 1:
      for (let i = 0; i < n; i++) out[o + i] = cur[i]! - (i >= bpp ? cur[i - bpp]! : 0);
      break;
    case 2:
      for (let i = 0; i < n; i++) out[o + i] = cur[i]! - prev[i]!;
      break;
    case 3:
      for (let i = 0; i < n; i++) out[o + i] = cur[i]! - (((i >= bpp ? cur[i - bpp]! : 0) + prev[i]!) >> 1);
      break;
    default: {
      // With no left neighbour (a = c = 0) Paeth predicts b.
      const lead = Math.min(bpp, n);
      for (let i = 0; i < lead; i++) out[o + i] = cur[i]! - prev[i]!;
      // Paeth's choice without branches (its outcome follows the image, so branches mispredict):
      // take b over a when pb < pa, then c over that when pc is smaller still; ties keep a, then b,
      // the order of the specification. Distances fit in 10 bits, so the sign masks are exact.
      for (let i = lead; i < n; i++) {
        const a = cur[i - bpp]!;
        const b = prev[i]!;
        const c = prev[i - bpp]!;
        let pa = b - c;
        let pb = a - c;
        let pc = pa + pb;
        pa = (pa ^ (pa >> 31)) - (pa >> 31);
        pb = (pb ^ (pb >> 31)) - (pb >> 31);
        pc = (pc ^ (pc >> 31)) - (pc >> 31);
        const takeB = (pb - pa) >> 31;
        const best = (pb & takeB) | (pa & ~takeB);
        const takeC = (pc - best) >> 31;
        out[o + i] = cur[i]! - ((c & takeC) | (((b & takeB) | (a & ~takeB)) & ~takeC));
      }
    }
  }
  return best;
}

/** The Paeth predictor (PNG spec 9.4; A. W. Paeth, "Image File Compression Made Easy", Graphics Gems II, 1991). */
export function paeth(a: number, b: number, c: number): number {
  const p = a + b - c;
  const pa = Math.abs(p - a);
  const pb = Math.abs(p - b);
  const pc = Math.abs(p - c);
  if (pa <= pb && pa <= pc) return a;
  if (pb <= pc) return b;
  return c;
}
