/**
 * Dense LU factorisation with partial pivoting, and its solves, in BigInt
 * fixed point (value = n * 2^-bits). The Newton and inverse-iteration steps
 * of the renormalisation fixed point (docs/methods.md, "Feigenbaum constants
 * from the fixed point") spend nearly all their time here.
 *
 * Products are truncated (a plain shift) rather than rounded: the callers
 * carry guard bits and only the residual, evaluated at full precision,
 * decides how good a solution is, so the cheaper shift costs nothing in the
 * digits kept.
 */

/** An LU factorisation: rows of L (unit diagonal, below) and U (on and above) in place, and the row order. */
export interface FixedLu {
  readonly bits: number;
  readonly rows: bigint[][];
  readonly order: Int32Array;
}

/** Factorises the n x n matrix `a` (rows; overwritten) at `bits` fractional bits. Throws when a pivot vanishes. */
export function luFactor(a: bigint[][], bits: number): FixedLu {
  const n = a.length;
  const shift = BigInt(bits);
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[i] = i;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = a[k]![k]! < 0n ? -a[k]![k]! : a[k]![k]!;
    for (let i = k + 1; i < n; i++) {
      const v = a[i]![k]! < 0n ? -a[i]![k]! : a[i]![k]!;
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (best === 0n) throw new RangeError('luFactor: singular matrix');
    if (p !== k) {
      const t = a[p]!;
      a[p] = a[k]!;
      a[k] = t;
      const o = order[p]!;
      order[p] = order[k]!;
      order[k] = o;
    }
    const rk = a[k]!;
    const pivot = rk[k]!;
    for (let i = k + 1; i < n; i++) {
      const ri = a[i]!;
      if (ri[k] === 0n) continue;
      const f = (ri[k]! << shift) / pivot;
      ri[k] = f;
      for (let j = k + 1; j < n; j++) ri[j] = ri[j]! - ((f * rk[j]!) >> shift);
    }
  }
  return { bits, rows: a, order };
}

/** Solves A x = b with a factorisation of A; b at the factorisation's scale; returns x at that scale. */
export function luSolve(lu: FixedLu, b: readonly bigint[]): bigint[] {
  const n = lu.rows.length;
  const shift = BigInt(lu.bits);
  const x = new Array<bigint>(n);
  for (let i = 0; i < n; i++) {
    const r = lu.rows[i]!;
    let s = b[lu.order[i]!]!;
    for (let j = 0; j < i; j++) s -= (r[j]! * x[j]!) >> shift;
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    const r = lu.rows[i]!;
    let s = x[i]! << shift;
    for (let j = i + 1; j < n; j++) s -= r[j]! * x[j]!;
    x[i] = s / r[i]!;
  }
  return x;
}
