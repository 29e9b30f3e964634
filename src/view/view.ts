/**
 * A view of the c-plane: what a plate shows.
 *
 * Conventions (tested in test/view/view.test.ts):
 * - The centre and the span are decimal strings end to end; they are parsed
 *   into doubles only by {@link doubleGrid}, once the view is known to fit
 *   double precision.
 * - `span` is the width of the image in c units; pixels are square, so the
 *   spacing between pixel centres is span / width.
 * - Pixel (i, j) samples the centre of its cell: continuous pixel coordinate
 *   (i + 0.5, j + 0.5). j grows downwards, the imaginary part grows upwards.
 * - `rotation` (degrees, counter-clockwise) turns the image about its centre.
 */
import { rotationCosSin } from '../plane/rotation.js';
export interface View {
  readonly centerRe: string;
  readonly centerIm: string;
  readonly span: string;
  readonly width: number;
  readonly height: number;
  readonly rotation: number;
}

/** The double-precision form of a view used by the shallow kernels. */
export interface DoubleGrid {
  readonly centerRe: number;
  readonly centerIm: number;
  /** c units between neighbouring pixel centres. */
  readonly spacing: number;
  readonly cos: number;
  readonly sin: number;
  readonly width: number;
  readonly height: number;
}

/**
 * Relative pixel spacing below which doubles no longer resolve the view well:
 * neighbouring pixels must differ by many ulps of |c| for the escape-time
 * iteration to tell them apart (double precision runs out near a span of
 * 1e-13 at about a thousand pixels; docs/methods.md B). Common practice, not a
 * published figure: 2^-42 leaves ~11 bits of headroom per pixel.
 */
export const DOUBLE_MIN_RELATIVE_SPACING = 2 ** -42;

export function doubleGrid(view: View): DoubleGrid {
  const { cos, sin } = rotationCosSin(view.rotation);
  return {
    centerRe: Number(view.centerRe),
    centerIm: Number(view.centerIm),
    spacing: Number(view.span) / view.width,
    cos,
    sin,
    width: view.width,
    height: view.height,
  };
}

/** True when doubles resolve every pixel of the view (see DOUBLE_MIN_RELATIVE_SPACING). */
export function fitsDouble(grid: DoubleGrid): boolean {
  const reach = Math.max(1, Math.abs(grid.centerRe), Math.abs(grid.centerIm));
  return grid.spacing / reach >= DOUBLE_MIN_RELATIVE_SPACING && Number.isFinite(grid.spacing);
}

/**
 * Writes the parameter c at continuous pixel coordinate (x, y) into out
 * ([re, im]); the centre of pixel (i, j) is (i + 0.5, j + 0.5).
 */
export function pixelToC(grid: DoubleGrid, x: number, y: number, out: Float64Array): Float64Array {
  const u = (x - grid.width / 2) * grid.spacing;
  const v = (grid.height / 2 - y) * grid.spacing;
  out[0] = grid.centerRe + (u * grid.cos - v * grid.sin);
  out[1] = grid.centerIm + (u * grid.sin + v * grid.cos);
  return out;
}

/**
 * pixelToC over n samples at (xs[k], ys[k]), the same arithmetic; with
 * `offsets`, c minus the view centre (deep views, where c is no double).
 */
export function pixelsToC(grid: DoubleGrid, xs: ArrayLike<number>, ys: ArrayLike<number>, n: number, outRe: Float64Array, outIm: Float64Array, offsets = false): void {
  const re0 = offsets ? 0 : grid.centerRe;
  const im0 = offsets ? 0 : grid.centerIm;
  for (let k = 0; k < n; k++) {
    const u = (xs[k]! - grid.width / 2) * grid.spacing;
    const v = (grid.height / 2 - ys[k]!) * grid.spacing;
    outRe[k] = offsets ? u * grid.cos - v * grid.sin : re0 + (u * grid.cos - v * grid.sin);
    outIm[k] = offsets ? u * grid.sin + v * grid.cos : im0 + (u * grid.sin + v * grid.cos);
  }
}

/** The continuous pixel coordinates of c (the inverse of pixelToC). */
export function cToPixel(grid: DoubleGrid, re: number, im: number): [number, number] {
  const u = re - grid.centerRe;
  const v = im - grid.centerIm;
  return [grid.width / 2 + (u * grid.cos + v * grid.sin) / grid.spacing, grid.height / 2 - (-u * grid.sin + v * grid.cos) / grid.spacing];
}
