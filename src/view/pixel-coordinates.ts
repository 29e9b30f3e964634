import { Decimal } from 'decimal.js';
import { pixelToC, type DoubleGrid, type View } from './view.js';

/**
 * The coordinates of pixel centres, written beside a plate's data arrays so
 * that every value can be placed without re-deriving the view (docs/data.md).
 * Pixel (i, j) has its centre at continuous coordinate (i + 0.5, j + 0.5); j
 * grows downwards, Im c upwards (src/view/view.ts).
 */

/** Re c and Im c of the centres of pixel row j, as the double kernels sample them. */
export function pixelCentreRow(grid: DoubleGrid, j: number, outRe: Float64Array, outIm: Float64Array): void {
  const c = new Float64Array(2);
  for (let i = 0; i < grid.width; i++) {
    pixelToC(grid, i + 0.5, j + 0.5, c);
    outRe[i] = c[0]!;
    outIm[i] = c[1]!;
  }
}

/**
 * Offsets of the centres of pixel row j from the view centre, in units of
 * the pixel spacing: c(i, j) = centre + spacing * (offsetRe + i offsetIm).
 * For deep views, where c itself does not fit a double.
 */
export function pixelOffsetRow(grid: Pick<DoubleGrid, 'width' | 'height' | 'cos' | 'sin'>, j: number, outRe: Float64Array, outIm: Float64Array): void {
  const v = grid.height / 2 - (j + 0.5);
  for (let i = 0; i < grid.width; i++) {
    const u = i + 0.5 - grid.width / 2;
    outRe[i] = u * grid.cos - v * grid.sin;
    outIm[i] = u * grid.sin + v * grid.cos;
  }
}

/** The grid record (grid.json): the view as decimal strings and the affine map (i, j) -> c. */
export interface GridRecord {
  readonly centre: { readonly re: string; readonly im: string };
  readonly span: string;
  readonly rotation: number;
  readonly width: number;
  readonly height: number;
  /** c units between neighbouring pixel centres (span / width), to the digits of the span plus 20. */
  readonly spacing: string;
  readonly map: string;
  /**
   * [[a, b, e], [c, d, f]]: offsetRe = a i + b j + e, offsetIm = c i + d j + f,
   * in units of the spacing; c(i, j) = centre + spacing * (offsetRe + i offsetIm).
   */
  readonly offsets: readonly [readonly [number, number, number], readonly [number, number, number]];
  /** Which files hold the per-pixel coordinates. */
  readonly coordinates: string;
  /** distance.npy holds distances in units of 2^distanceExponent c units (0 for double views). */
  readonly distanceExponent: number;
}

export function gridRecord(view: View, grid: Pick<DoubleGrid, 'cos' | 'sin'>, deep: boolean, distanceExponent = 0): GridRecord {
  const digits = new Decimal(view.span).precision(true) + 20;
  const spacing = new Decimal(view.span).div(view.width).toSignificantDigits(digits).toString();
  const { cos, sin } = grid;
  const e0 = 0.5 - view.width / 2;
  const f0 = view.height / 2 - 0.5;
  return {
    centre: { re: view.centerRe, im: view.centerIm },
    span: view.span,
    rotation: view.rotation,
    width: view.width,
    height: view.height,
    spacing,
    map: 'c(i, j) = centre + spacing * (offsetRe + i offsetIm), offsetRe = a i + b j + e, offsetIm = c i + d j + f; i the column, j the row (downwards), pixel centres',
    offsets: [
      [cos, sin, cos * e0 - sin * f0],
      [sin, -cos, sin * e0 + cos * f0],
    ],
    distanceExponent,
    coordinates: deep ? 'offset_re.npy, offset_im.npy (float64, units of the spacing)' : 're.npy, im.npy (float64, c as the double kernels sample it)',
  };
}
