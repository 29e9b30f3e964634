/**
 * A certificate for a nucleus of period p: a proof, in exact integer
 * arithmetic, that a small disk about a given centre holds exactly one zero
 * of F_p(c) = f_c^p(0) (f_c(z) = z^2 + c), that this zero is simple, and that
 * it has exact period p.
 *
 * Method (Krawczyk's test in the complex plane; docs/certificates.md): with
 * X = D(m, R) and any Y != 0, if
 *   |Y F_p(m)| + R sup_{c in X} |1 - Y F_p'(c)| <= R  and  sup |1 - Y F_p'| < 1,
 * then g(c) = c - Y F_p(c) maps X into itself and contracts it, so X holds
 * exactly one zero of F_p, and that zero lies within |Y F_p(m)| + kappa R of
 * m. The supremum is bounded by evaluating the recurrences
 *   d <- 2 z d + 1,  z <- z^2 + c   (z_0 = 0, d_0 = 0; docs/methods.md A2)
 * in midpoint-radius ball arithmetic over X with every radius rounded up
 * (src/precise/ball.ts). Exact period: F_{p/q} excludes 0 on X for every
 * prime q dividing p; a zero of F_d with d | p, d < p is a zero of one of
 * these (d divides some p/q, and f^d(0) = 0 gives f^{kd}(0) = 0).
 *
 * Sources: R. Krawczyk, "Newton-Algorithmen zur Bestimmung von Nullstellen
 * mit Fehlerschranken", Computing 4 (1969) 187-201; R. E. Moore, "A test for
 * existence of solutions to nonlinear systems", SIAM J. Numer. Anal. 14
 * (1977) 611-615; S. M. Rump, Acta Numerica 19 (2010) 287-449 (ball
 * arithmetic). Y = 1 / F_p'(m) computed approximately; any Y would do, a
 * poor one only makes the test fail.
 */
import { excludesZero, modulusUp, shiftUp } from '../../precise/ball.js';

/** The result of {@link certifyNucleusFixed}; lengths are in units of 2^-bits. */
export interface NucleusCertificate {
  readonly ok: boolean;
  /** The zero lies in the closed disk D(m, radius) (an upper bound). */
  readonly radius: bigint;
  /** The zero is the only zero of F_p in D(m, unique). */
  readonly unique: bigint;
  /** sup over D(m, unique) of |1 - Y F_p'| (upper bound, in units). */
  readonly kappa: bigint;
  /** Why the test failed (null when ok). */
  readonly reason: string | null;
}

/** The primes dividing p, ascending. */
export function primeDivisors(p: number): number[] {
  const out: number[] = [];
  let n = p;
  for (let q = 2; q * q <= n; q += 1) {
    if (n % q === 0) {
      out.push(q);
      while (n % q === 0) n /= q;
    }
  }
  if (n > 1) out.push(n);
  return out;
}

interface BallOrbit {
  zr: bigint;
  zi: bigint;
  zrad: bigint;
  dr: bigint;
  di: bigint;
  drad: bigint;
  /** 0 is excluded from the ball of z_{p/q} for every prime q | p. */
  periodOk: boolean;
}

/**
 * Balls of F_p and F_p' over the disk D(c, rho) (units of 2^-bits), and the
 * exact-period test at the steps p/q. The loop is written out for speed: it
 * is the census's inner loop.
 */
export function ballOrbit(period: number, cr: bigint, ci: bigint, rho: bigint, bits: number): BallOrbit {
  const sh = BigInt(bits);
  const sh1 = sh - 1n;
  const one = 1n << sh;
  const half = one >> 1n;
  const up = one - 1n;
  const checks = primeDivisors(period).map((q) => period / q);
  let zr = 0n;
  let zi = 0n;
  let zrad = 0n;
  let dr = 0n;
  let di = 0n;
  let drad = 0n;
  let periodOk = true;
  for (let k = 1; k <= period; k += 1) {
    const a2 = zr * zr;
    const b2 = zi * zi;
    const mz = modulusUp(zr, zi);
    // d <- 2 z d + 1: midpoint error < 1 unit; radius 2(|z| rd + |d| rz + rz rd)
    const md = modulusUp(dr, di);
    const ndr = ((zr * dr - zi * di + half) >> sh1) + one;
    const ndi = (zr * di + zi * dr + half) >> sh1;
    drad = ((mz * drad + md * zrad + zrad * drad + up) >> sh1) + 1n;
    dr = ndr;
    di = ndi;
    // z <- z^2 + c: radius 2|z| rz + rz^2 + rho
    const nzr = ((a2 - b2 + half) >> sh) + cr;
    zi = ((zr * zi + (half >> 1n)) >> sh1) + ci;
    zr = nzr;
    zrad = ((2n * mz * zrad + zrad * zrad + up) >> sh) + rho + 1n;
    if (periodOk && k < period && checks.includes(k) && !excludesZero(zr, zi, zrad)) periodOk = false;
  }
  return { zr, zi, zrad, dr, di, drad, periodOk };
}

/**
 * Krawczyk's test for the period-p nucleus near m = (cr + i ci) 2^-bits.
 * The disk radius is chosen from the residual: R = 2 |Y F_p(m)| + 64 units.
 * `bits` must resolve the component (about -log2(size) + 40) and the
 * residual (about -log2 |Y F_p(m)| + 32).
 */
export function certifyNucleusFixed(period: number, cr: bigint, ci: bigint, bits: number): NucleusCertificate {
  const sh = BigInt(bits);
  const one = 1n << sh;
  const fail = (reason: string): NucleusCertificate => ({ ok: false, radius: 0n, unique: 0n, kappa: 0n, reason });
  const at = ballOrbit(period, cr, ci, 0n, bits);
  // Y = 1 / F_p'(m), approximately (any Y works)
  const den = at.dr * at.dr + at.di * at.di;
  if (den === 0n) return fail("F_p' vanishes at the centre");
  const shift2 = 2n * sh;
  const yr = (at.dr << shift2) / den;
  const yi = (-at.di << shift2) / den;
  const my = modulusUp(yr, yi);
  // eta >= |Y F_p(m)| = |Y| |F_p(m)|
  const eta = shiftUp(my * (modulusUp(at.zr, at.zi) + at.zrad), sh);
  const R = 2n * eta + 64n;
  const ball = ballOrbit(period, cr, ci, R, bits);
  if (!ball.periodOk) return fail(`F_${period}/q does not provably exclude 0 near the centre (a lower period?)`);
  // kappa >= sup |1 - Y F_p'(X)| = |1 - Y mid| + |Y| rad
  const er = one - ((yr * ball.dr - yi * ball.di) >> sh);
  const ei = -((yr * ball.di + yi * ball.dr) >> sh);
  const kappa = modulusUp(er, ei) + 2n + shiftUp(my * ball.drad, sh);
  if (kappa >= one) return fail(`no contraction: sup |1 - Y F'| is about ${Number((kappa * 1000n) / one) / 1000}`);
  const reach = eta + shiftUp(kappa * R, sh);
  if (reach > R) return fail('the Krawczyk image does not fit in the disk');
  return { ok: true, radius: reach, unique: R, kappa, reason: null };
}
