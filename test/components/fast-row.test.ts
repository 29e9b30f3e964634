// The listing's double-double fast path (src/components/fast-row.ts, docs/methods.md C7):
// its rows equal the BigInt path's (the implementation before it) for periods 8..12, and
// the printed nucleus digits of a sample agree with Newton run independently in decimal.js
// at 60 digits; roots of the satellites of the main cardioid agree with the exact
// parametrisation of its boundary, c = mu/2 - mu^2/4 at mu = e^{2 pi i r/q} (exact algebra,
// docs/checks.md).
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { census } from '../../src/components/census.js';
import { componentRows, listItem } from '../../src/components/list-components.js';
import { formatDD } from '../../src/components/fast-row.js';
import { landRays, RAY_RECORD } from '../../src/components/land-rays.js';
import type { ComponentInfo } from '../../src/components/component-info.js';
import { haveMpmath, runMpmath } from '../oracles/mpmath.js';
import { requireInCi } from '../helpers/require-in-ci.js';

const D = Decimal.clone({ precision: 60 });

/** The period-p nucleus near (re, im) by Newton on F_p(c) = f_c^p(0) in decimal.js at 60 digits. */
function nucleusDecimal(p: number, re: string, im: string): { re: Decimal; im: Decimal } {
  let cr = new D(re);
  let ci = new D(im);
  for (let it = 0; it < 8; it++) {
    let zr = new D(0);
    let zi = new D(0);
    let dr = new D(0);
    let di = new D(0);
    for (let k = 0; k < p; k++) {
      const ndr = zr.mul(dr).sub(zi.mul(di)).mul(2).add(1);
      di = zr.mul(di).add(zi.mul(dr)).mul(2);
      dr = ndr;
      const nzr = zr.mul(zr).sub(zi.mul(zi)).add(cr);
      zi = zr.mul(zi).mul(2).add(ci);
      zr = nzr;
    }
    const m = dr.mul(dr).add(di.mul(di));
    cr = cr.sub(zr.mul(dr).add(zi.mul(di)).div(m));
    ci = ci.sub(zi.mul(dr).sub(zr.mul(di)).div(m));
  }
  return { re: cr, im: ci };
}

/** x to `digits` after the point, as the listing prints (round half even; exact 0 is "0"). */
function fixed(x: Decimal, digits: number): string {
  return x.isZero() ? '0' : x.toFixed(digits, Decimal.ROUND_HALF_EVEN);
}

/** The [a, b, c] JSON lines a Python program with mpmath prints. */
function mpmathTriples(program: string): Array<[number, number, number]> {
  return runMpmath(program)
    .trim()
    .split('\n')
    .map((l) => JSON.parse(l) as [number, number, number]);
}

const lost: Array<{ period: number; row: ComponentInfo }> = [];

describe('listing rows in double-double', () => {
  it('equal the BigInt rows for periods 8..12', async () => {
    for (let p = 8; p <= 12; p++) {
      const items = (await census(p)).components.map(listItem);
      const fast = await componentRows({ period: p, digits: 20, items });
      const slow = await componentRows({ period: p, digits: 20, items, bigint: true });
      expect(fast.length, `period ${p}`).toBe(items.length);
      // the size estimate runs on the orbit of the double-double nucleus in the fast path and of the
      // printed 20-digit nucleus in the BigInt path: the same recurrence on orbits that round apart in
      // the last bits, so size and orientation agree to 1e-12 relative, everything else exactly
      // rows whose BigInt walk reached another component's root (its parent disagreeing with the
      // angles, so the row is left without a root) are checked apart, against mpmath, below
      const estimate = (r: (typeof fast)[number]) => ({ ...r, size: 0, log10Size: 0, orientation: 0 });
      const kept = slow.map((r, i) => (r.root.re === '' ? null : i)).filter((i): i is number => i !== null);
      for (const i of slow.keys()) if (slow[i]!.root.re === '') lost.push({ period: p, row: fast[i]! });
      expect(
        kept.map((i) => estimate(fast[i]!)),
        `period ${p}`,
      ).toEqual(kept.map((i) => estimate(slow[i]!)));
      fast.forEach((r, i) => {
        expect(Math.abs(r.size / slow[i]!.size - 1), `period ${p} row ${i} size`).toBeLessThan(1e-12);
        expect(Math.abs(r.orientation - slow[i]!.orientation), `period ${p} row ${i} orientation`).toBeLessThan(1e-12);
      });
    }
  }, 120_000);

  it('give the rows the BigInt walk loses (periods 11, 12) roots that mpmath confirms: a multiplier-1 cycle of exact period p, 1/64 to 8 sizes from the nucleus', () => {
    // the walk from the nucleus along internal angle 0 crossed into a neighbour and met its root (a
    // parent the angles deny); mpmath 40-digit Newton on (F^p(w,c) - w, D_z F^p(w,c) - 1) from the row's root
    // and w = 1/(2 lambda) (lambda the nucleus orbit's multiplier, docs/methods.md C7) must land on the
    // printed root, on a cycle of exact period p
    if (!requireInCi(haveMpmath, 'python3-mpmath')) return;
    expect(lost.length, 'rows the BigInt walk loses at periods 8..12 (6 when written)').toBeGreaterThan(0);
    const program = [
      'from mpmath import mp, mpc, mpf, matrix, lu_solve',
      'mp.dps = 40',
      'import json, sys',
      `rows = json.loads('${JSON.stringify(lost.map((l) => ({ p: l.period, n: [l.row.nucleus.re, l.row.nucleus.im], r: [l.row.root.re, l.row.root.im], s: l.row.size })))}')`,
      'for row in rows:',
      '    p = row["p"]; c0 = mpc(mpf(row["n"][0]), mpf(row["n"][1]))',
      '    z = c0; lam = mpc(1)',
      '    for k in range(1, p):',
      '        lam = 2 * z * lam; z = z * z + c0',
      '    w = 1 / (2 * lam); c = mpc(mpf(row["r"][0]), mpf(row["r"][1]))',
      '    for it in range(60):',
      '        z = w; dz = mpc(1); dc = mpc(0); dzz = mpc(0); dcz = mpc(0)',
      '        for k in range(p):',
      '            dcz = 2 * (z * dcz + dc * dz); dzz = 2 * (z * dzz + dz * dz); dc = 2 * z * dc + 1; dz = 2 * z * dz; z = z * z + c',
      '        J = matrix([[dz - 1, dc], [dzz, dcz]]); F = matrix([z - w, dz - 1])',
      '        d = lu_solve(J, F); w -= d[0]; c -= d[1]',
      '        if abs(d[1]) < mpf(10) ** -38: break',
      '    z = w; close = mpf(1)',
      '    for j in range(1, p):',
      '        z = z * z + c; close = min(close, abs(z - w))',
      '    print(json.dumps([float(abs(c - mpc(mpf(row["r"][0]), mpf(row["r"][1])))), float(abs(c - c0) / row["s"]), float(close)]))',
    ].join('\n');
    const out = mpmathTriples(program);
    expect(out.length).toBe(lost.length);
    for (const [moved, sizes, close] of out) {
      expect(moved, 'mpmath root minus printed root').toBeLessThan(1e-19);
      expect(sizes).toBeGreaterThan(1 / 64);
      expect(sizes).toBeLessThan(8);
      expect(close, 'no lower period: min |f^j(w) - w| over j < p').toBeGreaterThan(1e-6);
    }
  });

  it('give four period-24 satellites of period-12 parents (three real near the tip, one at -0.227 + 1.117i) roots on their parents that mpmath confirms', async () => {
    // pairs found by listing period 24 (7 of its 9 rows without a root before December 2026, mirrors included; the two
    // 1/3 bulbs of real period-8 components near -1.998, 8289921/8290686 and 8355712/8355967, still have none); each root must
    // solve the parent's system F^k(w) = w, D_z F^k(w) = e^(2 pi i r/q) in mpmath at 40 digits (Newton from the printed
    // root and w = (mu/2)/lambda, docs/methods.md C7) and move by less than the 20 printed digits
    if (!requireInCi(haveMpmath, 'python3-mpmath')) return;
    const p = 24;
    const pairs: Array<[number, number]> = [
      [4125680, 4129775],
      [8325135, 8452080],
      [8361990, 8415225],
      [8378370, 8398845],
    ];
    const rec = new Float64Array(pairs.length * RAY_RECORD);
    landRays(
      p,
      Float64Array.from(pairs, (x) => x[0]),
      true,
      rec,
    );
    const items = pairs.map(([a, b], i) =>
      listItem({
        period: p,
        reHi: rec[i * 6]!,
        reLo: rec[i * 6 + 1]!,
        imHi: rec[i * 6 + 2]!,
        imLo: rec[i * 6 + 3]!,
        size: rec[i * 6 + 4]!,
        angles: [a, b],
        real: a + b === 2 ** p - 1,
      }),
    );
    const rows = await componentRows({ period: p, digits: 20, items });
    for (const r of rows) expect(r.root.re, 'a root').not.toBe('');
    const data = rows.map((r) => ({ k: r.parent!.period, r: r.parent!.num, q: r.parent!.den, root: r.root, parent: r.parent!.nucleus }));
    const program = [
      'from mpmath import mp, mpc, mpf, matrix, lu_solve, exp, pi',
      'mp.dps = 40',
      'import json',
      `rows = json.loads('${JSON.stringify(data)}')`,
      'for r in rows:',
      '    k = r["k"]; mu = exp(2j * pi * mpf(r["r"]) / r["q"])',
      '    c = mpc(mpf(r["root"]["re"]), mpf(r["root"]["im"])); c0 = mpc(mpf(r["parent"]["re"]), mpf(r["parent"]["im"]))',
      '    z = c0; lam = mpc(1)',
      '    for j in range(1, k):',
      '        lam = 2 * z * lam; z = z * z + c0',
      '    w = (mu / 2) / lam',
      '    for it in range(80):',
      '        z = w; dz = mpc(1); dc = mpc(0); dzz = mpc(0); dcz = mpc(0)',
      '        for j in range(k):',
      '            dcz = 2 * (z * dcz + dc * dz); dzz = 2 * (z * dzz + dz * dz); dc = 2 * z * dc + 1; dz = 2 * z * dz; z = z * z + c',
      '        d = lu_solve(matrix([[dz - 1, dc], [dzz, dcz]]), matrix([z - w, dz - mu])); w -= d[0]; c -= d[1]',
      '        if abs(d[1]) < mpf(10) ** -36: break',
      '    print(float(abs(c - mpc(mpf(r["root"]["re"]), mpf(r["root"]["im"])))))',
    ].join('\n');
    const moved = runMpmath(program).trim().split('\n').map(Number);
    expect(moved.length).toBe(4);
    for (const m of moved) expect(m).toBeLessThan(1e-19);
  }, 60_000);

  it('print nucleus digits that decimal.js confirms, and main-cardioid satellite roots on c = mu/2 - mu^2/4', async () => {
    const p = 13;
    const comps = (await census(p)).components;
    const sample = comps.filter((_, i) => i % 40 === 0);
    const rows = await componentRows({ period: p, digits: 20, items: sample.map(listItem) });
    for (const r of rows) {
      const n = nucleusDecimal(p, r.nucleus.re, r.nucleus.im);
      expect(r.nucleus.re).toBe(fixed(n.re, 20));
      if (r.nucleus.im !== '0') expect(r.nucleus.im).toBe(fixed(n.im, 20));
    }
    const all = await componentRows({ period: p, digits: 20, items: comps.slice(0, 3).map(listItem) });
    const satellites = all.filter((r) => r.parent?.period === 1);
    expect(satellites.length).toBeGreaterThan(0);
    for (const r of satellites) {
      const a = D.acos(-1)
        .mul(2 * r.parent!.num)
        .div(r.parent!.den);
      const [mr, mi] = [D.cos(a), D.sin(a)];
      // mu/2 - mu^2/4
      const re = mr.div(2).sub(mr.mul(mr).sub(mi.mul(mi)).div(4));
      const im = mi.div(2).sub(mr.mul(mi).div(2));
      expect(r.root.re).toBe(fixed(re, 20));
      expect(r.root.im).toBe(fixed(im, 20));
    }
  }, 120_000);

  it('print components smaller than 1e-14 to a millionth of their size, nucleus and root confirmed by mpmath (period 18 near -2)', async () => {
    // at 20 digits the nucleus and root of the period-18 components near -2 (size about 1e-20,
    // 2^(6 - 4p) as docs/census.md says) printed as one number; mpmath (python3-mpmath, 60 digits)
    // runs Newton on F^p(0, c) from the printed nucleus and on (F^p(w,c) - w, D_z F^p(w,c) - 1)
    // from the printed root: each must move less than a millionth of the size
    if (!requireInCi(haveMpmath, 'python3-mpmath')) return;
    const p = 18;
    const comps = [...(await census(p)).components].sort((a, b) => a.reHi - b.reHi).slice(0, 3);
    const rows = await componentRows({ period: p, digits: 20, items: comps.map(listItem) });
    for (const r of rows) {
      expect(r.size).toBeLessThan(1e-14);
      expect(r.root.re, 'root printed apart from the nucleus').not.toBe(r.nucleus.re);
      const places = r.nucleus.re.split('.')[1]!.length;
      expect(10 ** -places).toBeLessThanOrEqual(1e-6 * r.size);
    }
    const program = [
      'from mpmath import mp, mpc, mpf, matrix, lu_solve',
      'mp.dps = 60',
      'import json',
      `rows = json.loads('${JSON.stringify(rows.map((r) => ({ n: [r.nucleus.re, r.nucleus.im], r: [r.root.re, r.root.im], s: r.size })))}')`,
      `p = ${p}`,
      'for row in rows:',
      '    c0 = mpc(mpf(row["n"][0]), mpf(row["n"][1])); c = c0',
      '    for it in range(30):',
      '        z = mpc(0); d = mpc(0)',
      '        for k in range(p):',
      '            d = 2 * z * d + 1; z = z * z + c',
      '        c -= z / d',
      '    z = c; lam = mpc(1)',
      '    for k in range(1, p):',
      '        lam = 2 * z * lam; z = z * z + c',
      '    nucleus_moved = abs(c - c0)',
      '    w = 1 / (2 * lam); r0 = mpc(mpf(row["r"][0]), mpf(row["r"][1])); b = r0',
      '    for it in range(60):',
      '        z = w; dz = mpc(1); dc = mpc(0); dzz = mpc(0); dcz = mpc(0)',
      '        for k in range(p):',
      '            dcz = 2 * (z * dcz + dc * dz); dzz = 2 * (z * dzz + dz * dz); dc = 2 * z * dc + 1; dz = 2 * z * dz; z = z * z + b',
      '        J = matrix([[dz - 1, dc], [dzz, dcz]]); F = matrix([z - w, dz - 1])',
      '        dd = lu_solve(J, F); w -= dd[0]; b -= dd[1]',
      '        if abs(dd[1]) < mpf(10) ** -55: break',
      '    print(json.dumps([float(nucleus_moved / row["s"]), float(abs(b - r0) / row["s"]), float(abs(b - c) / row["s"])]))',
    ].join('\n');
    const out = mpmathTriples(program);
    expect(out.length).toBe(3);
    for (const [nucleusMoved, rootMoved, apart] of out) {
      expect(nucleusMoved, 'mpmath nucleus minus printed, in sizes').toBeLessThan(1e-6);
      expect(rootMoved, 'mpmath root minus printed, in sizes').toBeLessThan(1e-6);
      // the root of a primitive component lies about s/4 from its nucleus (docs/methods.md C7)
      expect(apart).toBeGreaterThan(0.1);
      expect(apart).toBeLessThan(1);
    }
  }, 120_000);

  it('refuses to print digits a rounding boundary lies within the error bound of', () => {
    // 0.125 + 2^-60 lies 2^-60 above the half-unit boundary 0.125 of 2 digits (exact binary fractions)
    expect(formatDD(0.125, 2 ** -60, 2 ** -70, 2)).toBe('0.13');
    expect(formatDD(0.125, 2 ** -60, 2 ** -55, 2)).toBeNull();
    // an interval across 0 would print "-0.00" at one end and "0.00" at the other
    expect(formatDD(2 ** -80, 0, 2 ** -70, 2)).toBeNull();
    expect(formatDD(0, 0, 0, 5)).toBe('0');
  });
});
