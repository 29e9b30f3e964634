/**
 * Double-double arithmetic (a value is hi + lo with |lo| <= ulp(hi)/2, about
 * 106 bits), written into a caller's Float64Array at an index so that hot
 * loops allocate nothing.
 *
 * Source: T. J. Dekker, "A floating-point technique for extending the
 * available precision", Numer. Math. 18 (1971) 224-242 (split and exact
 * product); D. E. Knuth, TAOCP vol. 2, 4.2.2 (two-sum); Y. Hida, X. S. Li,
 * D. H. Bailey, "Library for double-double and quad-double arithmetic" (2000)
 * for the "sloppy" add used here (error a few units of 2^-104 relative).
 */

const SPLITTER = 134217729; // 2^27 + 1

/** out[i..i+1] = (out[i] + out[i+1]) + (bh + bl). */
export function ddAdd(out: Float64Array, i: number, bh: number, bl: number): void {
  const ah = out[i]!;
  const s = ah + bh;
  const bb = s - ah;
  const e = ah - (s - bb) + (bh - bb) + out[i + 1]! + bl;
  const h = s + e;
  out[i] = h;
  out[i + 1] = e - (h - s);
}

/** out[i..i+1] = (ah + al) * (bh + bl). */
export function ddMulInto(out: Float64Array, i: number, ah: number, al: number, bh: number, bl: number): void {
  const p = ah * bh;
  let t = SPLITTER * ah;
  const ahh = t - (t - ah);
  const ahl = ah - ahh;
  t = SPLITTER * bh;
  const bhh = t - (t - bh);
  const bhl = bh - bhh;
  const e = ahh * bhh - p + ahh * bhl + ahl * bhh + ahl * bhl + (ah * bl + al * bh);
  const h = p + e;
  out[i] = h;
  out[i + 1] = e - (h - p);
}

/** out[i..i+1] = (ah + al)^2. */
export function ddSqrInto(out: Float64Array, i: number, ah: number, al: number): void {
  const p = ah * ah;
  const t = SPLITTER * ah;
  const hh = t - (t - ah);
  const hl = ah - hh;
  const e = hh * hh - p + 2 * hh * hl + hl * hl + 2 * ah * al;
  const h = p + e;
  out[i] = h;
  out[i + 1] = e - (h - p);
}

/**
 * One step of z -> z^2 + c in double-double complex arithmetic: z and c hold
 * (re hi, re lo, im hi, im lo); t is a caller's scratch of 4 entries.
 * re' = re^2 - im^2 + c.re, im' = 2 re im + c.im.
 */
export function ddComplexSquareAdd(z: Float64Array, c: Float64Array, t: Float64Array): void {
  ddSqrInto(t, 0, z[0]!, z[1]!); // re^2
  ddSqrInto(t, 2, z[2]!, z[3]!); // im^2
  ddMulInto(z, 2, z[0]!, z[1]!, z[2]!, z[3]!); // re im -> z.im
  z[2] = 2 * z[2]!;
  z[3] = 2 * z[3]!;
  ddAdd(z, 2, c[2]!, c[3]!);
  z[0] = t[0]!;
  z[1] = t[1]!;
  ddAdd(z, 0, -t[2]!, -t[3]!);
  ddAdd(z, 0, c[0]!, c[1]!);
}
