/**
 * Equipotentials of the dynamical plane: level curves of the Green's
 * function G_c(z) = lim 2^-n ln|f_c^n(z)| of the filled Julia set's
 * complement, traced exactly by the tracer of equipotentials.ts. The
 * Böttcher coordinate phi_c conjugates f_c to w -> w^2 near infinity and
 * G_c = ln|phi_c| (Milnor, "Dynamics in One Complex Variable", section 9,
 * docs/methods.md D8), so each point of the
 * level G solves
 *   f_c^(k-1)(z) = e^(2^(k-1) (G + 2 pi i theta)),
 * the parameter plane's equation with F^k(0, c) replaced by f_c^(k-1)(z)
 * (the same power of the Böttcher coordinate), by Newton in z with the
 * derivative (f^n)' = prod 2 f^j(z). The start is the dynamic ray of angle 0
 * (dynamic-ray.ts) traced to the level above G.
 */
import { dynamicRay } from '../dynamic/dynamic-ray.js';
import { RAY_RADIUS } from '../components/trace-ray.js';
import type { LevelMap } from './equipotentials.js';

/** G_c(z) by iteration: ln|f^n(z)| / 2^n once |f^n(z)| > 1e10 (0 when z has not escaped within `limit`). */
export function juliaPotentialAt(zr: number, zi: number, cr: number, ci: number, limit: number): number {
  let x = zr;
  let y = zi;
  for (let n = 0; n <= limit; n += 1) {
    const m = x * x + y * y;
    if (m > 1e20) return (0.5 * Math.log(m)) / 2 ** n;
    const t = x * x - y * y + cr;
    y = 2 * x * y + ci;
    x = t;
  }
  return 0;
}

/** The level map of f_c in z: w = f_c^(k-1)(z) and dw/dz. */
export function juliaLevelMap(cr: number, ci: number): LevelMap {
  return {
    iterate: (zr, zi, k, out) => {
      let x = zr;
      let y = zi;
      let dr = 1;
      let di = 0;
      for (let q = 1; q < k; q += 1) {
        const ndr = 2 * (x * dr - y * di);
        di = 2 * (x * di + y * dr);
        dr = ndr;
        const t = x * x - y * y + cr;
        y = 2 * x * y + ci;
        x = t;
      }
      out[0] = x;
      out[1] = y;
      out[2] = dr;
      out[3] = di;
      return out;
    },
    start: (G, k) => {
      if (k === 1) return [Math.exp(G), 0];
      // the ray's last point has potential 2^-(k-2) ln R: the level above G (equipotentialLevel)
      const sharpness = 8;
      const ray = dynamicRay(cr, ci, 0, 1, { depth: k - 2, sharpness, radius: RAY_RADIUS });
      if (ray.length !== 2 * (1 + (k - 2) * sharpness)) return null;
      return [ray[ray.length - 2]!, ray[ray.length - 1]!];
    },
  };
}
