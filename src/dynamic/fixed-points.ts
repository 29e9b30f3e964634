/**
 * The fixed points of z -> z^2 + c: alpha = (1 - sqrt(1 - 4c)) / 2 and
 * beta = (1 + sqrt(1 - 4c)) / 2 with the principal square root (J. Milnor,
 * Dynamics in One Complex Variable, 3rd ed.: beta is where the ray of angle 0
 * lands; alpha is the other one, attracting exactly on the main cardioid),
 * with their multipliers 2 alpha and 2 beta.
 */
export interface FixedPoints {
  readonly alphaRe: number;
  readonly alphaIm: number;
  readonly betaRe: number;
  readonly betaIm: number;
}

/** The principal square root of x + i y (non-negative real part), as [re, im]. */
export function principalSqrt(x: number, y: number): [number, number] {
  const m = Math.hypot(x, y);
  const re = Math.sqrt((m + x) / 2);
  const im = Math.sqrt(Math.max(0, (m - x) / 2));
  return [re, y < 0 ? -im : im];
}

export function fixedPoints(cRe: number, cIm: number): FixedPoints {
  const [sr, si] = principalSqrt(1 - 4 * cRe, -4 * cIm);
  return { alphaRe: (1 - sr) / 2, alphaIm: -si / 2, betaRe: (1 + sr) / 2, betaIm: si / 2 };
}
