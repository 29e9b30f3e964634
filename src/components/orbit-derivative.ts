/**
 * z = F^k(0, c) = f_c^k(0) and its derivative D_c F^k in doubles
 * (z <- z^2 + c, D <- 2 z D + 1 from z = 0, D = 0): the step that parameter
 * rays (inward and outward) and equipotentials all take Newton on.
 */

/** Writes [Re z, Im z, Re D, Im D] into `out` and returns it. */
export function orbitWithDerivative(cr: number, ci: number, k: number, out: Float64Array): Float64Array {
  let zr = 0;
  let zi = 0;
  let dr = 0;
  let di = 0;
  for (let q = 0; q < k; q += 1) {
    const ndr = 2 * (zr * dr - zi * di) + 1;
    di = 2 * (zr * di + zi * dr);
    dr = ndr;
    const nzr = zr * zr - zi * zi + cr;
    zi = 2 * zr * zi + ci;
    zr = nzr;
  }
  out[0] = zr;
  out[1] = zi;
  out[2] = dr;
  out[3] = di;
  return out;
}
