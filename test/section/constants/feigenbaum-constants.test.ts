/**
 * Feigenbaum's constants from the renormalisation fixed point
 * (docs/methods.md E9), checked
 * against OEIS and against an independent computation with mpmath (Debian
 * python3-mpmath, installed by .ci/run) that shares nothing with ours but
 * the equation: a plain power series in |x|^Z (not Chebyshev), Gauss-Legendre
 * collocation points in |x|^Z (not Chebyshev points), mpmath.findroot for the
 * fixed point and mpmath's lu_solve for the inverse iteration of delta.
 */
import { describe, expect, it } from 'vitest';
import { Decimal } from 'decimal.js';
import { agreeingDigits, constantsAt, constantsPlan } from '../../../src/section/constants/feigenbaum-constants.js';
import { collocationPoints, fixedPointDefect, solveFixedPoint } from '../../../src/section/constants/fixed-point.js';
import { haveMpmath, runMpmath } from '../../oracles/mpmath.js';
import { requireInCi } from '../../helpers/require-in-ci.js';

const D = Decimal.clone({ precision: 160 });
const CI = process.env['CI'] === 'true';

/** Both truncations of the plan for `digits`, and the digits they agree on. */
function constants(order: number, digits: number): { alpha: string; delta: string } {
  const plan = constantsPlan(order, digits);
  const [a, b] = plan.terms.map((n) => constantsAt(order, n, plan.bits, digits + 4));
  return { alpha: agreeingDigits(a!.alpha, b!.alpha).text, delta: agreeingDigits(a!.delta, b!.delta).text };
}

/** |a - b| < 10^-places. */
function agreesTo(a: string, b: string, places: number): boolean {
  return new D(a).minus(new D(b)).abs().lt(new D(10).pow(-places));
}

/**
 * The independent reference: alpha and delta of order Z from `terms` power-series terms at `digits` digits;
 * `near` picks delta among the pencil's eigenvalues (a rough value: 4.67 for Z = 2, 7.28 for Z = 4, docs/methods.md E8).
 */
function mpmathConstants(order: number, terms: number, digits: number, near: string): { alpha: string; delta: string } {
  const program = `import sys
from mpmath import mp, mpf, matrix, lu_solve, findroot, nstr
Z, n, digits = ${order}, ${terms}, ${digits}
near = mpf('${near}')
mp.dps = digits + n // 2 + 30
# g(x) = 1 + sum_{k=1..m} a_k |x|^(Z k) (plain power series), collocated at the Gauss-Legendre points of [0, 1] in y = |x|^Z.
def points(m):
    # Gauss-Legendre nodes by Newton from cos(pi (i - 1/4) / (m + 1/2)) (the classical starting values).
    ys = []
    for i in range(1, m + 1):
        t = mp.cos(mp.pi * (i - mpf(1) / 4) / (m + mpf(1) / 2))
        for _ in range(100):
            p0, p1 = mpf(1), t
            for k in range(2, m + 1):
                p0, p1 = p1, ((2 * k - 1) * t * p1 - (k - 1) * p0) / k
            if m == 1:
                p0 = mpf(1)
            dp = m * (t * p1 - p0) / (t * t - 1)
            step = p1 / dp
            t -= step
            if abs(step) < mpf(10) ** (-mp.dps + 5):
                break
        ys.append((1 + t) / 2)
    return [y ** (mpf(1) / Z) for y in ys]
def ev(a, v):
    y = abs(v) ** Z
    s, p, d = mpf(1), mpf(1), mpf(0)
    for k, c in enumerate(a, 1):
        d += k * c * p
        p *= y
        s += c * p
    sg = 1 if v >= 0 else -1
    return s, d * Z * abs(v) ** (Z - 1) * sg
def solve(m, a0):
    xs = points(m)
    def F(*a):
        s = ev(a, 1)[0]
        return [s * ev(a, x)[0] - ev(a, ev(a, s * x)[0])[0] for x in xs]
    def J(*a):
        s = ev(a, 1)[0]
        rows = []
        for x in xs:
            gx = ev(a, x)[0]
            u = s * x
            gu, dgu = ev(a, u)
            ggu, dggu = ev(a, gu)
            rows.append([x ** (Z * j) * s + gx - (abs(gu) ** (Z * j) + dggu * (abs(u) ** (Z * j) + dgu * x)) for j in range(1, m + 1)])
        return matrix(rows)
    r = findroot(F, a0, J=J, tol=mpf(10) ** (-(digits + 20)), maxsteps=60)
    return [r[i] for i in range(m)]
a = [mpf(-1.5)]
m = 1
while m < n:
    m = min(n, m + 3)
    a = solve(m, a + [mpf(0)] * (m - len(a)))
s = ev(a, 1)[0]
alpha = -1 / s
# delta: the linearised doubling operator T h = (1/s) [h(g(s x)) + g'(g(s x)) h(s x)] on h = sum_{j=0..n} b_j |x|^(Z j)
# at x = 0 and the collocation points; Rayleigh-quotient-free inverse iteration at the given shift.
xs = [mpf(0)] + points(n)
B = matrix(n + 1, n + 1)
M = matrix(n + 1, n + 1)
for i, x in enumerate(xs):
    u = s * x
    gu, dgu = ev(a, u)
    dggu = ev(a, gu)[1]
    for j in range(n + 1):
        B[i, j] = abs(x) ** (Z * j)
        M[i, j] = (abs(gu) ** (Z * j) + dggu * abs(u) ** (Z * j)) / s
lam, shift = near, near
v = matrix([1] * (n + 1))
for it in range(60):
    # inverse iteration at the fixed shift until the estimate settles to 8 digits, then Rayleigh-style shift updates
    w = lu_solve(M - shift * B, B * v)
    k = max(range(n + 1), key=lambda i: abs(w[i]))
    new = shift + v[k] / w[k]
    v = w / w[k]
    settled = abs(new - lam) < mpf(10) ** (-(digits + 15))
    if abs(new - lam) < mpf(10) ** -8:
        shift = new
    lam = new
    if settled:
        break
print(nstr(alpha, digits + 10, strip_zeros=False))
print(nstr(lam, digits + 10, strip_zeros=False))
`;
  const [alpha, delta] = runMpmath(program).trim().split('\n');
  return { alpha: alpha!, delta: delta! };
}

// OEIS A006891 (alpha) and A006890 (delta), 40 digits; Briggs, Math. Comp. 57 (1991) 435-439 (docs/checks.md).
const ALPHA_OEIS = '2.502907875095892822283902873218215786381';
const DELTA_OEIS = '4.669201609102990671853203820466201617258';

describe('Feigenbaum constants of order 2 from the fixed point', () => {
  const digits = CI ? 100 : 50;
  const ours = constants(2, digits);

  it('constantsAt at two truncations agrees on the requested digits', () => {
    expect(ours.alpha.length).toBeGreaterThanOrEqual(2 + digits);
    expect(ours.delta.length).toBeGreaterThanOrEqual(2 + digits);
  });

  it('alpha and delta match OEIS A006891 and A006890 to 40 digits', () => {
    expect(ours.alpha.slice(0, ALPHA_OEIS.length)).toBe(ALPHA_OEIS);
    expect(ours.delta.slice(0, DELTA_OEIS.length)).toBe(DELTA_OEIS);
  });

  it.runIf(requireInCi(haveMpmath, 'python3-mpmath'))(
    `alpha and delta match an independent mpmath power-series computation to ${digits} places`,
    () => {
      // mpmath reference: power series and Gauss-Legendre points, 44 terms give about 60 digits, 75 about 105 (measured).
      const ref = mpmathConstants(2, CI ? 75 : 44, digits, '4.67');
      expect(agreesTo(ref.alpha, ALPHA_OEIS, 39)).toBe(true);
      expect(agreesTo(ours.alpha, ref.alpha, digits)).toBe(true);
      expect(agreesTo(ours.delta, ref.delta, digits)).toBe(true);
    },
    240_000,
  );
});

describe('Feigenbaum constants of order 4 from the fixed point', () => {
  const ours = constants(4, 50);

  it('|alpha| matches OEIS A195102 (1.690302971405244853...)', () => {
    expect(ours.alpha.slice(0, 20)).toBe('1.690302971405244853');
  });

  it('delta starts 7.28468621707 (docs/checks.md, Briggs 1991 table of orders) and matches mpmath to 50 places', () => {
    expect(ours.delta.slice(0, 13)).toBe('7.28468621707');
    if (!requireInCi(haveMpmath, 'python3-mpmath')) return;
    // mpmath reference as above; 60 power-series terms give about 60 digits at order 4 (measured; 54 give only 49).
    const ref = mpmathConstants(4, 60, 50, '7.28');
    expect(agreesTo(ours.alpha, ref.alpha, 50)).toBe(true);
    expect(agreesTo(ours.delta, ref.delta, 50)).toBe(true);
  }, 240_000);
});

describe('Feigenbaum constants of order 3 (the class of |x|^3)', () => {
  it.runIf(requireInCi(haveMpmath, 'python3-mpmath'))('delta(3) agrees with the mpmath cascade of x -> r - |x|^3 (periods to 2^11, Aitken) to 2e-6', () => {
    // An independent route: superstable parameters of r - |x|^3 by mpmath Newton in r, their ratios delta_n and
    // Aitken's extrapolation of the last three (docs/methods.md E2, E3); it gives 6.0846894 against our 6.0846891.
    const out = runMpmath(`from mpmath import mp, mpf, sign
mp.dps = 60
def F(r, n):
    x, d = mpf(0), mpf(0)
    for _ in range(2 ** n):
        x, d = r - abs(x) ** 3, 1 - 3 * abs(x) ** 2 * sign(x) * d
    return x, d
rs, ds = [mpf(0), mpf(1)], []
for n in range(2, 12):
    r = rs[-1] + (rs[-1] - rs[-2]) / (ds[-1] if ds else 6)
    for _ in range(100):
        x, d = F(r, n)
        r -= x / d
        if abs(x / d) < mpf(10) ** -50: break
    rs.append(r)
    ds.append((rs[-2] - rs[-3]) / (rs[-1] - rs[-2]))
a = ds[-1] - (ds[-1] - ds[-2]) ** 2 / (ds[-1] - 2 * ds[-2] + ds[-3])
print(mp.nstr(ds[-1], 20))
print(mp.nstr(a, 20))`);
    const [last, aitken] = out.trim().split('\n').map(Number);
    const ours = Number(constants(3, 20).delta);
    expect(Math.abs(aitken! - ours)).toBeLessThan(2e-6);
    expect(Math.abs(last! - ours)).toBeLessThan(2e-6);
    // The orders differ: a cascade of order 3 is far from delta(2) and delta(4).
    expect(Math.abs(aitken! - 4.6692)).toBeGreaterThan(1);
    expect(Math.abs(aitken! - 7.2847)).toBeGreaterThan(1);
  });
});

describe('every supported order', () => {
  it('constantsAt settles at every order 2..16 and two truncations agree on 12 digits (order 5 once failed at 6 terms of its continuation)', () => {
    for (let z = 2; z <= 16; z++) {
      const c = constants(z, 12);
      expect(c.alpha.replace('.', '').length, `alpha order ${z}`).toBeGreaterThanOrEqual(13);
      expect(c.delta.replace('.', '').length, `delta order ${z}`).toBeGreaterThanOrEqual(13);
    }
  }, 120_000);
});

describe('fixedPointDefect of the returned g', () => {
  /** Points off the collocation set: midpoints between neighbouring collocation points, and an irrational grid. */
  function offPoints(order: number, terms: number): number[] {
    const xs = [1, ...collocationPoints(order, terms - 1), 0];
    const mids = xs.slice(1).map((x, i) => (x + xs[i]!) / 2);
    const grid = Array.from({ length: 25 }, (_, i) => ((i + 1) * Math.SQRT2) % 1);
    return [...mids, ...grid];
  }

  for (const [order, digits] of [
    [2, 100],
    [4, 50],
    [6, 50],
  ] as const) {
    it(`solveFixedPoint(order ${order}) for ${digits} digits leaves s g(x) - g(g(s x)) below 10^-${digits + 2} off the collocation points`, () => {
      const plan = constantsPlan(order, digits);
      const sol = solveFixedPoint(order, plan.terms[0], plan.bits);
      expect(fixedPointDefect(sol, offPoints(order, plan.terms[0]))).toBeLessThan(10 ** -(digits + 2));
    });
  }

  it('fixedPointDefect catches a truncation too short for the digits (negative control)', () => {
    const plan = constantsPlan(2, 100);
    const sol = solveFixedPoint(2, 30, plan.bits);
    expect(fixedPointDefect(sol, offPoints(2, 30))).toBeGreaterThan(1e-102);
  });
});

describe('agreeingDigits', () => {
  it('agreeingDigits keeps the common prefix and counts its significant digits', () => {
    expect(agreeingDigits('2.50290787', '2.50290799')).toEqual({ text: '2.502907', significant: 7 });
    expect(agreeingDigits('4.6692', '5.6692')).toEqual({ text: '', significant: 0 });
    expect(agreeingDigits('1.5', '1.6')).toEqual({ text: '1', significant: 1 });
  });
});
