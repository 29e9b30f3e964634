/**
 * Where a traced dynamic ray of rational angle lands. The ray of a periodic
 * angle (odd denominator, period p under doubling) lands at a periodic point
 * of f_c whose period divides p; a preperiodic angle (2^l theta periodic)
 * lands at a point z with f^l(z) periodic (Douady-Hubbard landing theorem;
 * Milnor, "Dynamics in One Complex Variable", §18). The trace stops at
 * potential 2^-48 ln R, which near a weakly repelling point can still be far
 * from it (the rabbit's rays end about 0.01 from alpha, |f'(alpha)| = 1.11),
 * so the landing point is found by Newton on g(z) = f^(l+p)(z) - f^l(z)
 * from the ray's end, as the parameter rays of figures are finished
 * (docs/figures.md, "Rays").
 *
 * A root is taken only when Newton settles, the point is repelling
 * (|(f^p)'| > 1 at f^l(z): a parabolic landing point is a multiple root of g
 * where Newton crawls) and it lies near the ray's end: within ten times the
 * distance the ray moved over its last p levels (the remaining distance to
 * a repelling point shrinks geometrically, by 1/|(f^p)'| a period, so it is
 * at most d / (|(f^p)'| - 1) for the last step d). Otherwise null: the ray is
 * drawn as traced.
 */

/** Most iterates of g: longer periods lose the double's precision in f^(l+p) anyway. */
export const MAX_LANDING_ITERATES = 64;

/** The preperiod l and period p of num/den (lowest terms) under doubling mod 1, or null beyond MAX_LANDING_ITERATES. */
export function anglePeriod(num: number, den: number): { preperiod: number; period: number } | null {
  let l = 0;
  let q = den;
  while (q % 2 === 0) {
    q /= 2;
    l += 1;
  }
  if (q === 1) return { preperiod: l, period: 1 }; // 0, or dyadic: doubling ends on the fixed angle 0 (the ray to beta)
  let p = 1;
  let r = 2 % q;
  while (r !== 1) {
    r = (2 * r) % q;
    p += 1;
    if (l + p > MAX_LANDING_ITERATES) return null;
  }
  return l + p > MAX_LANDING_ITERATES ? null : { preperiod: l, period: p };
}

/** f^n(z) and its derivative in z, as [re, im, dre, dim]. */
function iterate(zr: number, zi: number, cr: number, ci: number, n: number): [number, number, number, number] {
  let x = zr;
  let y = zi;
  let dr = 1;
  let di = 0;
  for (let j = 0; j < n; j += 1) {
    const t = 2 * (x * dr - y * di);
    di = 2 * (x * di + y * dr);
    dr = t;
    const u = x * x - y * y + cr;
    y = 2 * x * y + ci;
    x = u;
  }
  return [x, y, dr, di];
}

/**
 * The landing point of the ray of angle num/den traced as `points`
 * (re, im, ... from outside inwards, `sharpness` points a level), or null.
 */
export function rayLanding(cr: number, ci: number, num: number, den: number, points: readonly number[], sharpness: number): [number, number] | null {
  const kind = anglePeriod(num, den);
  if (kind === null) return null;
  const { preperiod: l, period: p } = kind;
  const n = points.length / 2;
  if (n < p * sharpness + 1) return null;
  const endR = points[2 * n - 2]!;
  const endI = points[2 * n - 1]!;
  const backR = points[2 * (n - 1 - p * sharpness)]!;
  const backI = points[2 * (n - 1 - p * sharpness) + 1]!;
  const lastStep = Math.hypot(endR - backR, endI - backI);
  let zr = endR;
  let zi = endI;
  let settled = false;
  let last = Number.POSITIVE_INFINITY;
  for (let it = 0; it < 60; it += 1) {
    const [ar, ai, adr, adi] = iterate(zr, zi, cr, ci, l);
    const [br, bi, bdr, bdi] = iterate(ar, ai, cr, ci, p);
    // g = f^p(f^l z) - f^l z, g' = ((f^p)'(f^l z) - 1) (f^l)'(z)
    const gr = br - ar;
    const gi = bi - ai;
    const mr = bdr - 1;
    const mi = bdi;
    const dr = mr * adr - mi * adi;
    const di = mr * adi + mi * adr;
    const dm = dr * dr + di * di;
    if (!(dm > 0) || !Number.isFinite(dm)) return null;
    const sr = (gr * dr + gi * di) / dm;
    const si = (gi * dr - gr * di) / dm;
    zr -= sr;
    zi -= si;
    last = Math.hypot(sr, si);
    if (last <= 1e-15 * (1 + Math.hypot(zr, zi))) {
      settled = true;
      break;
    }
  }
  // rounding can leave Newton stepping to and fro by an ulp or two (as in figure/equipotentials.ts)
  if (!settled && last <= 1e-12 * (1 + Math.hypot(zr, zi))) settled = true;
  if (!settled) return null;
  const [ar, ai] = iterate(zr, zi, cr, ci, l);
  const [, , mdr, mdi] = iterate(ar, ai, cr, ci, p);
  if (!(Math.hypot(mdr, mdi) > 1)) return null;
  if (!(Math.hypot(zr - endR, zi - endI) <= 10 * lastStep + 1e-12 * (1 + Math.hypot(zr, zi)))) return null;
  return [zr, zi];
}
