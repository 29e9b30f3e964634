/**
 * Even functions of order Z as Chebyshev series in y = |x|^Z:
 * g(x) = sum_k c_k T_k(2 |x|^Z - 1), so that [0, 1] in y maps onto [-1, 1],
 * g(0) = sum_k c_k (-1)^k and g(1) = sum_k c_k. Values are BigInt fixed point
 * at `bits` fractional bits (value = n * 2^-bits).
 *
 * Chebyshev rather than monomials in y: collocation at Chebyshev points of a
 * monomial basis has a Vandermonde condition number that grows about
 * (1 + sqrt 2)^(2N) and would cost guard bits in every solve; the Chebyshev
 * matrix stays well conditioned, so the solves carry a fixed guard.
 */

/** The basis at one point v: T_k(t) for k < n, t = 2|v|^Z - 1, and g(v), g'(v) for the given coefficients. */
export interface SeriesPoint {
  readonly basis: bigint[];
  readonly value: bigint;
  readonly slope: bigint;
}

/** |v|^Z and |v|^(Z-1) sgn(v) at `bits`. */
function powers(v: bigint, order: number, shift: bigint): { w: bigint; d: bigint } {
  const a = v < 0n ? -v : v;
  let p = 1n << shift;
  for (let k = 1; k < order; k++) p = (p * a) >> shift;
  const w = (p * a) >> shift;
  return { w, d: v < 0n ? -p : p };
}

/** T_k(2|v|^Z - 1), k < n, and the value and slope of the series c at v. */
export function seriesAt(v: bigint, c: readonly bigint[], order: number, bits: number): SeriesPoint {
  const n = c.length;
  const shift = BigInt(bits);
  const one = 1n << shift;
  const { w, d } = powers(v, order, shift);
  const t = 2n * w - one;
  const basis = new Array<bigint>(n);
  basis[0] = one;
  if (n > 1) basis[1] = t;
  for (let k = 2; k < n; k++) basis[k] = ((2n * t * basis[k - 1]!) >> shift) - basis[k - 2]!;
  // T_k'(t) = k U_{k-1}(t); U by the same recurrence from U_0 = 1, U_1 = 2t.
  let value = 0n;
  let slopeT = 0n;
  let u0 = one;
  let u1 = 2n * t;
  for (let k = 0; k < n; k++) {
    value += c[k]! * basis[k]!;
    if (k >= 1) {
      const uk1 = k === 1 ? u0 : k === 2 ? u1 : 0n;
      if (k >= 3) {
        const u2 = ((2n * t * u1) >> shift) - u0;
        u0 = u1;
        u1 = u2;
        slopeT += BigInt(k) * c[k]! * u2;
      } else slopeT += BigInt(k) * c[k]! * uk1;
    }
  }
  value >>= shift;
  slopeT >>= shift;
  // dt/dv = 2 Z |v|^(Z-1) sgn v
  const slope = (slopeT * 2n * BigInt(order) * d) >> shift;
  return { basis, value, slope };
}

/** g(v) alone (Clenshaw's recurrence: no basis array). */
export function seriesValue(v: bigint, c: readonly bigint[], order: number, bits: number): bigint {
  const shift = BigInt(bits);
  const one = 1n << shift;
  const t = 2n * powers(v, order, shift).w - one;
  let b1 = 0n;
  let b2 = 0n;
  for (let k = c.length - 1; k >= 1; k--) {
    const b0 = c[k]! + ((2n * t * b1) >> shift) - b2;
    b2 = b1;
    b1 = b0;
  }
  return c[0]! + ((t * b1) >> shift) - b2;
}
