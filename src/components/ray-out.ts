/**
 * The external angle and potential of a parameter c outside the Mandelbrot
 * set, by tracing its parameter ray outward (docs/methods.md D5).
 *
 * With z_n = F^n(0, c), the Böttcher coordinate gives Phi_M(c) = phi_c(c)
 * and arg phi_c(z_n) = 2 pi 2^(n-1) theta, so once |z_n| is large arg z_n
 * reads 2^(n-1) theta mod 1 = 0.b_n b_(n+1) ... (binary digits of theta).
 * The digits above b_n are lost by the doubling; they are recovered by
 * moving c outward along its ray: at level k the point is pushed, by Newton
 * in c on log F^k(0, c) = log t, until |F^k| = RADIUS^2 with arg F^k held;
 * then |F^(k-1)| is about RADIUS and the sign of Im F^(k-1) gives the digit
 * b_(k-1) (arg F^(k-1) = 2 pi 0.b_(k-1) b_k ...: in the lower half plane
 * exactly when b_(k-1) = 1). This is the inward tracer of D4
 * (src/components/trace-ray.ts) run backwards; the digits are read as the
 * ray crosses the dyadic sectors.
 *
 * Potential: G(c) = lim 2^-(n-1) log |z_n| (z_1 = c), read at |z_n| > 1e100.
 */
import { orbitWithDerivative } from './orbit-derivative.js';

/** Escape radius of the levels: |F^k| runs from RADIUS to RADIUS^2 on each level. */
const RADIUS = 2 ** 24;
const LOG_R2 = 2 * Math.log(RADIUS);

export interface RayOut {
  /** Binary digits of the angle after the point, as far as they were computed. */
  digits: string;
  /** How many leading digits are certain: no sign read within the error of the real axis, and the same digits from a finer trace and from c moved by its rounding. */
  certain: number;
  /** The angle as a double (turns). */
  turns: number;
  /** Potential G(c). */
  potential: number;
  /** Escape level k0 (first n with |z_n| > RADIUS). */
  level: number;
}

/** z = F^k(0, c) and D_c F^k in double; [zr, zi, dr, di]. */
function iterate(cr: number, ci: number, k: number): [number, number, number, number] {
  const o = orbitWithDerivative(cr, ci, k, scratch);
  return [o[0]!, o[1]!, o[2]!, o[3]!];
}

const scratch = new Float64Array(4);

/** Turns of (re, im) in [0, 1). */
function turnsOf(re: number, im: number): number {
  const t = Math.atan2(im, re) / (2 * Math.PI);
  return t < 0 ? t + 1 : t;
}

/**
 * External angle of c to `bits` binary digits (null when c's orbit stays
 * within RADIUS for `maxLevel` iterations: c is inside the set or too close).
 * `sharpness` sub-steps per level.
 */
export function externalAngleOf(cr0: number, ci0: number, bits: number, maxLevel: number, sharpness = 8): RayOut | null {
  const first = traceOut(cr0, ci0, bits, maxLevel, sharpness);
  if (first === null) return null;
  // The certain count is cut to the prefix on which independent reads agree (a claim of 64 of 64
  // from the sign margins alone was contradicted by them): a trace with 4x the sub-steps (the
  // tracing error), and the same trace from c moved by 8 units in the last place two ways (the
  // rounding of c and of the orbit, a few units each, seen through D_c F and the sector crossings).
  let certain = first.certain;
  const u = 8 * 2 ** -52;
  const others = [
    traceOut(cr0, ci0, bits, maxLevel, 4 * sharpness),
    traceOut(cr0 + u * Math.abs(cr0), ci0 - u * Math.abs(ci0), bits, maxLevel, sharpness),
    traceOut(cr0 - u * Math.abs(cr0), ci0 + u * Math.abs(ci0), bits, maxLevel, sharpness),
  ];
  for (const o of others) certain = Math.min(certain, o === null ? 0 : agreeingPrefix(first.digits, o.digits));
  return { ...first, certain };
}

/** Length of the common prefix of two digit strings. */
export function agreeingPrefix(a: string, b: string): number {
  let i = 0;
  while (i < a.length && i < b.length && a[i] === b[i]) i += 1;
  return i;
}

/** One outward trace (the digits and the certain count from the sign margins and the tail's error alone). */
function traceOut(cr0: number, ci0: number, bits: number, maxLevel: number, sharpness: number): RayOut | null {
  // escape level and potential
  let zr = 0;
  let zi = 0;
  let k0 = 0;
  let potential = Number.NaN;
  for (let n = 1; n <= maxLevel + 200; n += 1) {
    const t = zr * zr - zi * zi + cr0;
    zi = 2 * zr * zi + ci0;
    zr = t;
    const m = zr * zr + zi * zi;
    if (k0 === 0 && m > RADIUS * RADIUS) {
      k0 = n;
      if (n > maxLevel) return null;
    }
    if (Math.abs(zr) > 1e100 || Math.abs(zi) > 1e100) {
      potential = Math.log(Math.hypot(zr, zi)) / 2 ** (n - 1);
      break;
    }
  }
  if (k0 === 0) return null;
  const [fr, fi, fdr, fdi] = iterate(cr0, ci0, k0);
  // tail: 2^(k0-1) theta mod 1 from arg F^k0; its error from rounding c and the orbit
  const tail = turnsOf(fr, fi);
  const fm = Math.hypot(fr, fi);
  const argError = (Math.hypot(fdr, fdi) * 2 ** -52 * Math.max(1, Math.hypot(cr0, ci0)) + k0 * 2 ** -52 * fm) / fm + Math.hypot(cr0, ci0) / (fm * fm);
  // 6 bits below the estimate: it is an estimate (the orbit's rounding grows with k0), and digits within 64x of it moved under tests
  const tailBits = Math.max(0, Math.min(50, Math.floor(-Math.log2(argError / (2 * Math.PI))) - 6));
  // outward: levels k0 .. 2, reading b_(k-1) at the end of level k
  const head: string[] = [];
  let certain = true;
  let certainCount = 0;
  let cr = cr0;
  let ci = ci0;
  for (let k = k0; k >= 2; k -= 1) {
    const [ar, ai] = iterate(cr, ci, k);
    const ca = Math.atan2(ai, ar);
    let logm = 0.5 * Math.log(ar * ar + ai * ai);
    const du = (LOG_R2 - logm) / sharpness;
    for (let s = 1; s <= sharpness; s += 1) {
      const target = s === sharpness ? LOG_R2 : logm + du;
      // Newton on log F^k(0, c) = target + i ca
      let ok = false;
      let xr = cr;
      let xi = ci;
      for (let it = 0; it < 30; it += 1) {
        const [wr, wi, dr, di] = iterate(xr, xi, k);
        const lr = 0.5 * Math.log(wr * wr + wi * wi) - target;
        let li = Math.atan2(wi, wr) - ca;
        li -= 2 * Math.PI * Math.round(li / (2 * Math.PI));
        // step = (log F - log t) F / F'
        const er = lr * wr - li * wi;
        const ei = lr * wi + li * wr;
        const dm = dr * dr + di * di;
        const sr = (er * dr + ei * di) / dm;
        const si = (ei * dr - er * di) / dm;
        if (!Number.isFinite(sr) || !Number.isFinite(si)) break;
        xr -= sr;
        xi -= si;
        if (Math.abs(lr) + Math.abs(li) < 1e-13 || sr * sr + si * si < 1e-30 * (xr * xr + xi * xi)) {
          ok = true;
          break;
        }
      }
      if (!ok) return null;
      cr = xr;
      ci = xi;
      logm = target;
    }
    const [br, bi] = iterate(cr, ci, k - 1);
    const t = turnsOf(br, bi);
    head.push(t >= 0.5 ? '1' : '0');
    // margin to the real axis in turns against the Böttcher error (|c| / |z|^2) and rounding
    const margin = Math.min(t % 0.5, 0.5 - (t % 0.5));
    if (certain && margin > 1e-9 + Math.hypot(cr, ci) / (br * br + bi * bi)) certainCount += 1;
    else certain = false;
  }
  head.reverse();
  // head[j] = b_(j+1) for j < k0 - 1
  let tailDigits = '';
  let x = tail;
  for (let j = 0; j < 52; j += 1) {
    x *= 2;
    if (x >= 1) {
      tailDigits += '1';
      x -= 1;
    } else tailDigits += '0';
  }
  const digits = (head.join('') + tailDigits).slice(0, bits);
  // The digits are certain when every sign was read clear of the axis: a sign read close to it
  // means c lies near the ray of a dyadic angle m/2^j, on whose two sides the digits above b_j
  // differ (0.x0111... against 0.x1000...), so none is claimed then.
  const certainDigits = certainCount === head.length ? head.length + tailBits : 0;
  let turns = 0;
  for (let j = Math.min(digits.length, 60) - 1; j >= 0; j -= 1) turns = (turns + (digits[j] === '1' ? 1 : 0)) / 2;
  return { digits, certain: Math.min(certainDigits, digits.length), turns, potential, level: k0 };
}
