/**
 * A certificate for a component's root: a proof that a small box about
 * (w~, c~) holds exactly one solution (w, c) of
 *   F^k(w, c) = w,  D_z F^k(w, c) = t,
 * a parameter c where a cycle of exact period k has multiplier t.
 * - Primitive components: k = p and t = 1. The Jacobian
 *   [[D_z - 1, D_c], [D_zz, D_cz]] (docs/methods.md C3) is non-singular there.
 * - Satellites of a period-k parent at internal angle j/q: t = e^{2 pi i j/q}
 *   on the parent's k-cycle (the period-p system is singular at a
 *   satellite's root, p = kq; the parent's is not). t enters as a ball whose
 *   radius is itself certified (Krawczyk on t^q = 1 at the polished root of
 *   unity; the root of unity in it is e^{2 pi i j/q} because the disk is far
 *   smaller than the spacing 2 sin(pi/q) of the q-th roots of unity and its
 *   centre has argument 2 pi j/q to double accuracy).
 * By Douady and Hubbard's theory the parameter where the parent's multiplier
 * is e^{2 pi i j/q} is the root of its j/q satellite, and a primitive
 * component's root is where its cycle has multiplier 1; that the solution is
 * the root of the component at hand (and not of a neighbour) is taken from
 * where the walk of boundary-point.ts started, not proved.
 *
 * Method: Krawczyk's test in C^2 (Krawczyk 1969; Moore 1977; see
 * docs/certificates.md): with X = D(w~, R_w) x D(c~, R_c), an approximate
 * inverse Y of the Jacobian at the centre and M >= sup_X |I - Y J| entrywise,
 * if |Y G(x~)|_i + sum_j M_ij R_j <= R_i for both i, X holds exactly one
 * solution. The cycle has exact period k when F^{k/q'}(w) - w excludes 0 on
 * X for every prime q' | k.
 */
import { approxInverse, badd, bexcludesZero, bmul, bsub, bsup, btwice, exactBall, ZERO_BALL } from '../../precise/ball-complex.js';
import type { Ball } from '../../precise/ball-complex.js';
import { shiftUp } from '../../precise/ball.js';
import { bitsForDigits, fixedScale, fromDecimal, toNumber } from '../../precise/fixed.js';
import { log2SizeAt } from '../nucleus.js';
import { componentRootFixed, unitRoot } from '../boundary-point.js';
import type { ComplexDecimal } from '../nucleus.js';
import { primeDivisors } from './certify-nucleus.js';
import { radiusText } from './radius-text.js';

export interface RootCertificate {
  readonly ok: boolean;
  /** c lies within this of c~ (units of 2^-bits, upper bound). */
  readonly radiusC: bigint;
  readonly radiusW: bigint;
  readonly reason: string | null;
}

interface Jet {
  g1: Ball;
  g2: Ball;
  j: [[Ball, Ball], [Ball, Ball]];
  periodOk: boolean;
}

/** G = (F^k - w, D_z F^k - t) and its Jacobian over the balls w, c (docs/methods.md C3 and A6 recurrences). */
function jet(k: number, w: Ball, c: Ball, t: Ball, bits: number): Jet {
  const one = exactBall(1n << BigInt(bits), 0n);
  let z = w;
  let dz = one;
  let dc = ZERO_BALL;
  let dzz = ZERO_BALL;
  let dcz = ZERO_BALL;
  const checks = primeDivisors(k).map((q) => k / q);
  let periodOk = true;
  for (let n = 1; n <= k; n += 1) {
    const z2 = btwice(z);
    dcz = btwice(badd(bmul(z, dcz, bits), bmul(dc, dz, bits)));
    dzz = btwice(badd(bmul(z, dzz, bits), bmul(dz, dz, bits)));
    dc = badd(bmul(z2, dc, bits), one);
    dz = bmul(z2, dz, bits);
    z = badd(bmul(z, z, bits), c);
    if (n < k && checks.includes(n) && !bexcludesZero(bsub(z, w))) periodOk = false;
  }
  return {
    g1: bsub(z, w),
    g2: bsub(dz, t),
    j: [
      [bsub(dz, one), dc],
      [dzz, dcz],
    ],
    periodOk,
  };
}

/**
 * Krawczyk's test for (w, c) near (w~, c~) (units of 2^-bits) with the
 * multiplier ball t.
 */
export function certifyCycleParameter(k: number, w: { re: bigint; im: bigint }, c: { re: bigint; im: bigint }, t: Ball, bits: number): RootCertificate {
  const sh = BigInt(bits);
  const one = 1n << sh;
  const fail = (reason: string): RootCertificate => ({ ok: false, radiusC: 0n, radiusW: 0n, reason });
  const at = jet(k, exactBall(w.re, w.im), exactBall(c.re, c.im), t, bits);
  // Y = J(x~)^-1 approximately: [[d, -b], [-c, a]] / (ad - bc)
  const [[a, b], [cc, d]] = at.j;
  const det = bsub(bmul(a, d, bits), bmul(b, cc, bits));
  if (det.re === 0n && det.im === 0n) return fail('the Jacobian is singular at the centre');
  const inv = approxInverse(det.re, det.im, bits);
  const idet = exactBall(inv.re, inv.im);
  const neg = (x: Ball): Ball => ({ re: -x.re, im: -x.im, r: 0n });
  const mid = (x: Ball): Ball => ({ re: x.re, im: x.im, r: 0n });
  const Y: Ball[][] = [
    [bmul(mid(d), idet, bits), bmul(neg(b), idet, bits)],
    [bmul(neg(cc), idet, bits), bmul(mid(a), idet, bits)],
  ].map((row) => row.map(mid));
  const yg = [0, 1].map((i) => badd(bmul(Y[i]![0]!, at.g1, bits), bmul(Y[i]![1]!, at.g2, bits)));
  const eta = yg.map(bsup);
  let R = [2n * eta[0]! + 64n, 2n * eta[1]! + 64n];
  for (let attempt = 0; attempt < 6; attempt += 1) {
    const X = jet(k, exactBall(w.re, w.im, R[0]!), exactBall(c.re, c.im, R[1]!), t, bits);
    if (!X.periodOk) return fail(`F^${k}/q(w) - w does not provably exclude 0 (a lower period?)`);
    const M = [0, 1].map((i) =>
      [0, 1].map((j) => {
        const yj = badd(bmul(Y[i]![0]!, X.j[0][j]!, bits), bmul(Y[i]![1]!, X.j[1][j]!, bits));
        return bsup(bsub(exactBall(i === j ? one : 0n, 0n), yj));
      }),
    );
    const reach = [0, 1].map((i) => eta[i]! + shiftUp(M[i]![0]! * R[0]! + M[i]![1]! * R[1]!, sh));
    if (reach[0]! <= R[0]! && reach[1]! <= R[1]!) return { ok: true, radiusW: reach[0]!, radiusC: reach[1]!, reason: null };
    R = reach.map((x) => 2n * x + 64n);
  }
  return fail('the Krawczyk image does not fit in the box');
}

/**
 * A ball holding e^{2 pi i j/q}, proved by Krawczyk's test on h(t) = t^q - 1
 * about the polished root of unity (boundary-point.ts unitRoot); null when
 * the test fails.
 */
export function unitRootBall(j: number, q: number, bits: number): Ball | null {
  const s = fixedScale(bits);
  const u = unitRoot(j, q, s);
  const one = exactBall(s.one, 0n);
  const power = (x: Ball, n: number): Ball => {
    let p = one;
    for (let i = 0; i < n; i += 1) p = bmul(p, x, bits);
    return p;
  };
  const centre = exactBall(u.re, u.im);
  const h = bsub(power(centre, q), one);
  // Y = 1 / (q u^(q-1)) = u / q (|u| = 1 up to rounding; any Y would do)
  const Y = exactBall(u.re / BigInt(q), u.im / BigInt(q));
  const eta = bsup(bmul(Y, h, bits));
  const R = 2n * eta + 64n;
  const X = exactBall(u.re, u.im, R);
  const dh = bmul(exactBall(BigInt(q) * s.one, 0n), power(X, q - 1), bits);
  const kappa = bsup(bsub(one, bmul(Y, dh, bits)));
  const reach = eta + shiftUp(kappa * R, BigInt(bits));
  if (kappa >= s.one || reach > R) return null;
  // the disk is far smaller than the spacing of the q-th roots of unity, and its centre sits at angle 2 pi j/q
  const angle = Math.atan2(toNumber(u.im, s), toNumber(u.re, s)) / (2 * Math.PI);
  const nearest = ((Math.round(angle * q) % q) + q) % q;
  if (nearest !== ((j % q) + q) % q) return null;
  return exactBall(u.re, u.im, reach);
}

/**
 * Certifies the printed root of the period-p component with this nucleus:
 * recomputes the solution (boundary-point.ts) and runs Krawczyk's test
 * about (w, printed root). The result's radius is rounded up and covers the
 * rounding of the printed root to binary.
 */
export function certifyRootDecimal(
  period: number,
  nucleus: ComplexDecimal,
  root: ComplexDecimal,
  digits: number,
): { ok: boolean; radius: string | null; reason: string | null; satellite: boolean } {
  // a root lies on its component's boundary, about a quarter to a half of the size estimate from the
  // nucleus (docs/methods.md C4); one much farther away belongs to another component
  const probe = fixedScale(bitsForDigits(digits, 32));
  const log2size = log2SizeAt(period, { re: fromDecimal(nucleus.re, probe), im: fromDecimal(nucleus.im, probe) }, probe);
  const far = Math.log2(Math.hypot(Number(root.re) - Number(nucleus.re), Number(root.im) - Number(nucleus.im))) - log2size;
  if (far > 1) return { ok: false, radius: null, reason: `the root found lies 2^${far.toFixed(1)} sizes from the nucleus, so it is not this component's root`, satellite: false };
  const found = componentRootFixed(period, nucleus, digits);
  const bits = found.result.scale.bits + 32;
  const s = fixedScale(bits);
  const up = BigInt(32);
  const w = { re: found.result.w.re << up, im: found.result.w.im << up };
  const c = { re: fromDecimal(root.re, s), im: fromDecimal(root.im, s) };
  const parent = found.parent;
  let t: Ball | null = exactBall(s.one, 0n);
  if (parent !== null) t = unitRootBall(parent.num, parent.den, bits);
  if (t === null) return { ok: false, radius: null, reason: 'the multiplier e^{2 pi i j/q} could not be enclosed', satellite: parent !== null };
  const cert = certifyCycleParameter(parent === null ? period : parent.period, w, c, t, bits);
  if (!cert.ok) return { ok: false, radius: null, reason: cert.reason, satellite: parent !== null };
  return { ok: true, radius: radiusText(cert.radiusC + 1n, bits), reason: null, satellite: parent !== null };
}
