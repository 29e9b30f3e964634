import { hypot2 } from './hypot2.js';

/**
 * Exterior distance estimate (docs/methods.md A2; Peitgen & Saupe (eds.), The
 * Science of Fractal Images (1988) p. 198; Wikibooks "Fractals/Iterations in
 * the complex plane/demm"; bounds from Milnor, Dynamics in One Complex
 * Variable, App. G): re-run the orbit of 0 for `iterations` steps carrying the
 * c-derivative, updated BEFORE z (d_{k+1} = 2 z_k d_k + 1, d_0 = 0), then
 * b = 2 |z_n| ln|z_n| / |d_n| in c units, with z_n = (zRe, zIm) the escaped
 * iterate reported by the escape loop (the re-run repeats the loop's z
 * arithmetic, so it reaches the same z_n). Roughly b/4 < dist(c, M) < b, and
 * the estimate sharpens as the escape radius grows.
 *
 * Recomputing in a second pass keeps the hot loop free of the derivative;
 * only escaped samples pay for it. Returns 0 if |d_n| overflowed. A
 * WebAssembly SIMD twin of this pass over each batch's escaped samples (2 and
 * 4 vectors of f64x2, the orbits sorted by n so that lanes stop together)
 * was tried and dropped: on the whole-set plate it was no faster than this
 * loop (the orbits are short, n about 10, and copying in and out cost what
 * the lanes saved); so was running two orbits interleaved in one JS loop.
 */
export function exteriorDistance(cRe: number, cIm: number, iterations: number, zRe: number, zIm: number): number {
  const mod2 = zRe * zRe + zIm * zIm;
  return exteriorDistanceFromLog(cRe, cIm, iterations, mod2, Math.log(mod2));
}

/**
 * exteriorDistance given |z_n|^2 = zRe * zRe + zIm * zIm and its natural
 * logarithm, for callers that also need that logarithm (the smooth count
 * does): the same operations, so the same double.
 */
export function exteriorDistanceFromLog(cRe: number, cIm: number, iterations: number, modulus2: number, logModulus2: number): number {
  let x = 0,
    y = 0,
    x2 = 0,
    y2 = 0,
    dr = 0,
    di = 0;
  for (let j = 0; j < iterations; j++) {
    const t = 2 * (x * dr - y * di) + 1;
    di = 2 * (x * di + y * dr);
    dr = t;
    y = 2 * x * y + cIm;
    x = x2 - y2 + cRe;
    x2 = x * x;
    y2 = y * y;
  }
  const d = hypot2(dr, di);
  if (!(d < Infinity)) return 0;
  return (Math.sqrt(modulus2) * logModulus2) / d;
}
