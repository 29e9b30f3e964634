/**
 * Pixel offsets for the deep kernel: c - C for a block of pixel centres, in
 * tile units 2^unitExponent (see sample-deep.ts).
 *
 * The plate's geometry is given once: `origin`, the offset of the centre of
 * pixel (0, 0) of the whole plate from the reference C, and the steps
 * between neighbouring pixel centres along x (i) and y (j, downwards), all
 * in tile units; a rotation is just non-axis steps. Offsets are computed as
 * origin + i stepX + j stepY from the plate's pixel indices (not from a
 * tile corner), so a pixel gets the same bits whatever tiling or worker
 * computes it. `origin` comes from exact decimals (referenceOffset in
 * precise/reference-orbit.ts); the double rounding of these few terms moves
 * a pixel by about 1e-16 of the span, far below a pixel.
 */
export interface DeepGeometry {
  readonly originRe: number;
  readonly originIm: number;
  readonly stepXRe: number;
  readonly stepXIm: number;
  readonly stepYRe: number;
  readonly stepYIm: number;
}

/**
 * Writes the offsets of the pixels (x0 + i, y0 + j), i < width, j < height,
 * row-major into outRe/outIm (length >= width * height); returns the
 * largest |offset| component written (a bound for the table's deltaMax).
 */
export function fillDeepOffsets(g: DeepGeometry, x0: number, y0: number, width: number, height: number, outRe: Float64Array, outIm: Float64Array): number {
  let max = 0;
  for (let j = 0; j < height; j++) {
    const y = y0 + j;
    for (let i = 0; i < width; i++) {
      const x = x0 + i;
      const re = g.originRe + x * g.stepXRe + y * g.stepYRe;
      const im = g.originIm + x * g.stepXIm + y * g.stepYIm;
      const k = j * width + i;
      outRe[k] = re;
      outIm[k] = im;
      max = Math.max(max, Math.abs(re), Math.abs(im));
    }
  }
  return max;
}
