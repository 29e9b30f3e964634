/**
 * A dynamic external ray of z -> z^2 + c: the curve of points z whose
 * Böttcher coordinate phi_c(z) has argument 2 pi theta, traced inward from
 * outside (after T. Kawahira, "An algorithm to draw external rays of the
 * Mandelbrot set" (2009), transposed from the parameter plane to the
 * dynamical plane, where c is fixed and the unknown is z).
 *
 * phi_c(f(z)) = phi_c(z)^2 and phi_c(z) = z + O(1/z), so the point of the ray
 * at potential 2^-t ln R (t = k + j / S) solves
 *   f^{k+1}(z) = R^{2^{1 - j/S}} e^{2 pi i 2^{k+1} theta},
 * whose right side lies between R and R^2 in modulus, where phi_c is close to
 * the identity (error O(|c| / R)). Each point is found by Newton in z,
 * z <- z - (f^{k+1}(z) - target) / (f^{k+1})'(z), from the previous point;
 * S sub-steps per level keep the start inside Newton's basin. The angle is
 * kept exact: theta = num / den with 2^k theta = (2^k num mod den) / den.
 * Doubles limit the depth: at level k the point is 2^-k ln R above the
 * Julia set in potential; about 50 levels is as far as doubles go.
 */
export interface RayOptions {
  /** Levels traced (potential down to 2^-depth ln R). */
  readonly depth: number;
  /** Sub-steps per level (Kawahira's sharpness). */
  readonly sharpness: number;
  /** Radius R where the trace starts. */
  readonly radius: number;
}

export const DEFAULT_RAY_OPTIONS: RayOptions = { depth: 40, sharpness: 8, radius: 256 };

/** The ray of angle num/den (0 <= num < den, den < 2^31) as points (re, im, re, im, ...), from radius R inward. */
export function dynamicRay(cRe: number, cIm: number, num: number, den: number, options: RayOptions = DEFAULT_RAY_OPTIONS): number[] {
  const { depth, sharpness, radius } = options;
  const logR = Math.log(radius);
  const out: number[] = [];
  let a = (2 * Math.PI * num) / den;
  let zr = radius * Math.cos(a),
    zi = radius * Math.sin(a);
  out.push(zr, zi);
  let doubled = num % den;
  for (let k = 0; k < depth; k++) {
    doubled = (2 * doubled) % den;
    a = (2 * Math.PI * doubled) / den;
    for (let j = 1; j <= sharpness; j++) {
      const mod = Math.exp(logR * 2 ** (1 - j / sharpness));
      const tr = mod * Math.cos(a),
        ti = mod * Math.sin(a);
      let ok = false;
      for (let step = 0; step < 64; step++) {
        let x = zr,
          y = zi,
          dx = 1,
          dy = 0;
        for (let m = 0; m <= k; m++) {
          const t = 2 * (x * dx - y * dy);
          dy = 2 * (x * dy + y * dx);
          dx = t;
          const u = x * x - y * y + cRe;
          y = 2 * x * y + cIm;
          x = u;
        }
        const er = x - tr,
          ei = y - ti;
        const den2 = dx * dx + dy * dy;
        if (!(den2 > 0) || !Number.isFinite(den2)) break;
        const sr = (er * dx + ei * dy) / den2;
        const si = (ei * dx - er * dy) / den2;
        zr -= sr;
        zi -= si;
        if (Math.hypot(sr, si) <= 1e-15 * (1 + Math.hypot(zr, zi))) {
          ok = true;
          break;
        }
      }
      if (!ok || !Number.isFinite(zr) || !Number.isFinite(zi)) return out;
      out.push(zr, zi);
    }
  }
  return out;
}

/** Parses a ray angle "p/q" (or a decimal in [0, 1), read exactly as a fraction) into [num, den] in lowest terms. */
export function rayAngle(text: string): [number, number] | null {
  const t = text.trim();
  let num: number, den: number;
  const frac = /^(\d+)\/(\d+)$/.exec(t);
  if (frac) {
    num = Number(frac[1]);
    den = Number(frac[2]);
  } else {
    const dec = /^0?\.(\d{1,9})$|^0$/.exec(t);
    if (!dec) return null;
    const digits = dec[1] ?? '';
    num = digits === '' ? 0 : Number(digits);
    den = 10 ** digits.length;
  }
  if (!(den >= 1) || den >= 2 ** 31 || num >= den) return null;
  const g = gcd(num, den);
  return [num / g, den / g];
}

function gcd(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return a;
}
