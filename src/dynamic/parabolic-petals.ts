/**
 * The attracting petals of a parabolic cycle of z -> z^2 + c, at its point
 * w_0 (Leau-Fatou flower theorem; J. Milnor, Dynamics in One Complex Variable,
 * 3rd ed., section 10).
 *
 * Let the cycle w_0 .. w_{k-1} have multiplier e^{2 pi i s/q}. Then
 * g = f^{kq} fixes w_0 with g(w_0 + u) = w_0 + u + a u^{q+1} + O(u^{q+2}),
 * a != 0. The q attracting directions v at w_0 are those with a v^q real and
 * negative. In the approximate Fatou coordinate W = -1 / (q a u^q), g acts as
 * W -> W + 1 + O(|W|^{-1/q}), so for a large enough R the region
 * Re W > R (one component per attracting direction) is mapped into itself
 * and every orbit in it converges to w_0: those regions are our petals. f
 * permutes the k q petals of the cycle cyclically (one critical point), and
 * f^k turns the directions at w_0 by the multiplier's angle, so the petal in
 * sector m at w_0 is P_{k t} with t = m s^{-1} mod q in the order P_j = f^j(P_0).
 *
 * a is read off a truncated power series: with z = w_i + S(u),
 * f(z) = w_{i+1} + 2 w_i S + S^2, so S <- 2 w_i S + S^2 (degree <= q + 1)
 * applied k q times to S = u gives g. R is chosen by checking invariance
 * numerically on the petal boundaries (and doubled until it holds).
 */
export interface ParabolicPetals {
  readonly q: number;
  /** The leading coefficient a of g(w_0 + u) - w_0 - u. */
  readonly aRe: number;
  readonly aIm: number;
  /** Petal boundary Re W = fatouRadius. */
  readonly fatouRadius: number;
  /** Every petal lies in |u| < petalRadius (so the test starts with a cheap bound). */
  readonly petalRadius: number;
  /** Argument of the attracting direction of sector 0 at w_0. */
  readonly direction0: number;
  /** sectorPetal[m] = index j (a multiple of k) of the petal in sector m at w_0. */
  readonly sectorPetal: readonly number[];
}

/** Series coefficients of g(w_0 + u) - w_0 to degree q + 1 (re, im interleaved). */
export function returnSeries(cr: number, ci: number, pointsRe: readonly number[], pointsIm: readonly number[], q: number): Float64Array {
  const k = pointsRe.length;
  const D = q + 1;
  let s = new Float64Array(2 * (D + 1));
  let t = new Float64Array(2 * (D + 1));
  s[2] = 1;
  for (let step = 0; step < k * q; step++) {
    const wr = pointsRe[step % k]!,
      wi = pointsIm[step % k]!;
    t.fill(0);
    for (let d = 1; d <= D; d++) {
      t[2 * d] = 2 * (wr * s[2 * d]! - wi * s[2 * d + 1]!);
      t[2 * d + 1] = 2 * (wr * s[2 * d + 1]! + wi * s[2 * d]!);
    }
    for (let i = 1; i <= D; i++) {
      const ar = s[2 * i]!,
        ai = s[2 * i + 1]!;
      if (ar === 0 && ai === 0) continue;
      for (let j = 1; i + j <= D; j++) {
        const br = s[2 * j]!,
          bi = s[2 * j + 1]!;
        t[2 * (i + j)] += ar * br - ai * bi;
        t[2 * (i + j) + 1] += ar * bi + ai * br;
      }
    }
    [s, t] = [t, s];
  }
  void cr;
  void ci;
  return s;
}

function modInverse(s: number, q: number): number {
  for (let x = 0; x < q; x++) if ((s * x) % q === 1 % q) return x;
  return 0;
}

/** Which sector (0..q-1) of w_0 the offset u points into. */
export function sectorOf(ur: number, ui: number, direction0: number, q: number): number {
  let t = (Math.atan2(ui, ur) - direction0) / ((2 * Math.PI) / q);
  t = Math.round(t);
  return ((t % q) + q) % q;
}

/** Re W for W = -1/(q a u^q), or -Infinity at u = 0's neighbourhood failure. */
export function fatouReal(ur: number, ui: number, aRe: number, aIm: number, q: number): number {
  // u^q by repeated squaring.
  let pr = 1,
    pi = 0,
    br = ur,
    bi = ui,
    e = q;
  while (e > 0) {
    if (e & 1) {
      const t = pr * br - pi * bi;
      pi = pr * bi + pi * br;
      pr = t;
    }
    e >>= 1;
    if (e > 0) {
      const t = br * br - bi * bi;
      bi = 2 * br * bi;
      br = t;
    }
  }
  const dr = q * (aRe * pr - aIm * pi),
    di = q * (aRe * pi + aIm * pr);
  const den = dr * dr + di * di;
  return -dr / den;
}

function applyReturn(cr: number, ci: number, zr: number, zi: number, steps: number): [number, number] {
  for (let j = 0; j < steps; j++) {
    const u = zr * zr - zi * zi + cr;
    zi = 2 * zr * zi + ci;
    zr = u;
  }
  return [zr, zi];
}

const BOUNDARY = [0, 0.25, -0.25, 0.5, -0.5, 1, -1, 2, -2, 4, -4, 8, -8, 32, -32, 256, -256];

/** The petals at w_0 of a parabolic cycle with rotation s/q (s coprime to q); see above. */
export function parabolicPetals(cr: number, ci: number, pointsRe: readonly number[], pointsIm: readonly number[], q: number, s = 1): ParabolicPetals {
  const k = pointsRe.length;
  const series = returnSeries(cr, ci, pointsRe, pointsIm, q);
  const aRe = series[2 * (q + 1)]!,
    aIm = series[2 * (q + 1) + 1]!;
  const absA = Math.hypot(aRe, aIm);
  const direction0 = (Math.PI - Math.atan2(aIm, aRe)) / q;
  const sinv = modInverse(((s % q) + q) % q, q);
  const sectorPetal: number[] = [];
  for (let m = 0; m < q; m++) sectorPetal.push(k * ((m * sinv) % q));
  const w0r = pointsRe[0]!,
    w0i = pointsIm[0]!;
  let gap = 1;
  for (let j = 1; j < k; j++) gap = Math.min(gap, Math.hypot(pointsRe[j]! - w0r, pointsIm[j]! - w0i));
  const rho = 0.25 * gap;
  let radius = 1 / (q * absA * rho ** q);
  for (let attempt = 0; attempt < 60; attempt++, radius *= 2) {
    let ok = true;
    for (let m = 0; m < q && ok; m++) {
      for (const y of BOUNDARY) {
        // u^q = -1 / (q a W) on W = radius (1 + i y); the root in sector m.
        const Wr = radius,
          Wi = radius * y;
        const dr = q * (aRe * Wr - aIm * Wi),
          di = q * (aRe * Wi + aIm * Wr);
        const den = dr * dr + di * di;
        const vr = -dr / den,
          vi = di / den;
        const mod = Math.hypot(vr, vi) ** (1 / q);
        const base = Math.atan2(vi, vr) / q;
        // Pick the q-th root closest to the sector's direction.
        const target = direction0 + (2 * Math.PI * m) / q;
        const turn = Math.round((target - base) / ((2 * Math.PI) / q));
        const ang = base + (turn * 2 * Math.PI) / q;
        const ur = mod * Math.cos(ang),
          ui = mod * Math.sin(ang);
        const [zr, zi] = applyReturn(cr, ci, w0r + ur, w0i + ui, k * q);
        const nr = zr - w0r,
          ni = zi - w0i;
        if (!(fatouReal(nr, ni, aRe, aIm, q) > radius + 0.5) || sectorOf(nr, ni, direction0, q) !== m) {
          ok = false;
          break;
        }
      }
    }
    if (ok) break;
  }
  const petalRadius = (1 / (q * absA * radius)) ** (1 / q);
  return { q, aRe, aIm, fatouRadius: radius, petalRadius, direction0, sectorPetal };
}
