import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { findJuliaCycle } from '../../src/dynamic/julia-cycle.js';
import { juliaTrap } from '../../src/dynamic/julia-trap.js';
import { createJuliaSampleSet, sampleJulia } from '../../src/dynamic/sample-julia.js';
import { sampleJuliaDeep, type JuliaReferences } from '../../src/dynamic/sample-julia-deep.js';
import { computeJuliaReference } from '../../src/precise/julia-reference-orbit.js';

const R = 65536;
const C = { re: '-0.12256116687665', im: '0.74486176661974' };
const cRe = Number(C.re),
  cIm = Number(C.im);

/** alpha = (1 - sqrt(1 - 4c)) / 2 (Milnor) to 60 digits by mpmath, the outside reference. */
function alpha(): { re: string; im: string } {
  const r = spawnSync(
    'python3',
    ['-c', `from mpmath import mp, mpc, sqrt, nstr\nmp.dps = 80\nc = mpc('${C.re}', '${C.im}')\na = (1 - sqrt(1 - 4*c)) / 2\nprint(nstr(a.real, 60)); print(nstr(a.imag, 60))`],
    { encoding: 'utf8' },
  );
  if (r.status !== 0) throw new Error(r.stderr);
  const [re, im] = r.stdout.trim().split('\n');
  return { re: re!, im: im! };
}

function refs(centre: { re: string; im: string }, bits: number, iterations: number): JuliaReferences {
  const a = computeJuliaReference(centre, C, bits, iterations, R);
  const b = computeJuliaReference({ re: '0', im: '0' }, C, bits, iterations, R);
  return { centreRe: a.re, centreIm: a.im, criticalRe: b.re, criticalIm: b.im };
}

const cycle = findJuliaCycle(cRe, cIm);
const trap = juliaTrap(cycle, cRe, cIm, R);

describe('sampleJuliaDeep (perturbation in z) on the rabbit', () => {
  it('agrees with direct double iteration at a span of 1e-7 (same class for >= 99.5% of samples, smooth counts within 1e-3 for >= 99%: the double path rounds z_0 itself)', () => {
    const centre = { re: '-0.27633762', im: '0.47972798' };
    const n = 80;
    const h = 1e-7 / n;
    const dx = new Float64Array(n * n),
      dy = new Float64Array(n * n),
      zx = new Float64Array(n * n),
      zy = new Float64Array(n * n);
    for (let j = 0; j < n; j++)
      for (let i = 0; i < n; i++) {
        const k = j * n + i;
        dx[k] = (i - n / 2 + 0.5) * h;
        dy[k] = (j - n / 2 + 0.5) * h;
        zx[k] = Number(centre.re) + dx[k]!;
        zy[k] = Number(centre.im) + dy[k]!;
      }
    const deep = sampleJuliaDeep(dx, dy, n * n, { cRe, cIm, maxIterations: 4000, escapeRadius: R }, trap, refs(centre, 120, 4000), createJuliaSampleSet(n * n));
    const flat = sampleJulia(zx, zy, n * n, { cRe, cIm, maxIterations: 4000, escapeRadius: R }, trap, createJuliaSampleSet(n * n));
    let same = 0,
      escaped = 0,
      close = 0;
    for (let k = 0; k < n * n; k++) {
      if (deep.period[k] === flat.period[k] && deep.basin[k] === flat.basin[k]) same++;
      if (deep.period[k] === 0 && flat.period[k] === 0) {
        escaped++;
        if (Math.abs(deep.smooth[k]! - flat.smooth[k]!) < 1e-3) close++;
      }
    }
    expect(same / (n * n)).toBeGreaterThan(0.995);
    expect(close / escaped).toBeGreaterThan(0.99);
    expect(new Set(deep.basin)).toEqual(new Set([-1, 0, 1, 2]));
  });

  it("at a span of 1e-30 about alpha the classes shift under f, which acts there as z -> alpha + f'(alpha) (z - alpha) (exact dynamics)", () => {
    const a = alpha();
    const lr = 2 * Number(a.re),
      li = 2 * Number(a.im);
    const n = 60;
    const h = 1e-30 / n;
    const ux = new Float64Array(n * n),
      uy = new Float64Array(n * n),
      vx = new Float64Array(n * n),
      vy = new Float64Array(n * n);
    for (let j = 0; j < n; j++)
      for (let i = 0; i < n; i++) {
        const k = j * n + i;
        ux[k] = (i - n / 2 + 0.5) * h;
        uy[k] = (j - n / 2 + 0.5) * h;
        // f(alpha + u) - alpha = 2 alpha u + u^2; u^2 ~ 1e-60 is far below a pixel.
        vx[k] = lr * ux[k]! - li * uy[k]!;
        vy[k] = lr * uy[k]! + li * ux[k]!;
      }
    const r = refs(a, 180, 6000);
    const here = sampleJuliaDeep(ux, uy, n * n, { cRe, cIm, maxIterations: 6000, escapeRadius: R }, trap, r, createJuliaSampleSet(n * n));
    const image = sampleJuliaDeep(vx, vy, n * n, { cRe, cIm, maxIterations: 6000, escapeRadius: R }, trap, r, createJuliaSampleSet(n * n));
    let checked = 0,
      agree = 0;
    for (let k = 0; k < n * n; k++) {
      if (here.period[k]! <= 0 || image.period[k]! <= 0) continue;
      checked++;
      if (image.basin[k] === (here.basin[k]! + 1) % 3) agree++;
    }
    expect(checked).toBeGreaterThan(1500);
    // Only samples within a pixel or so of the boundary may flip (the image grid is rotated by arg f'(alpha)).
    expect(agree / checked).toBeGreaterThan(0.99);
    // All three immediate basins meet at alpha, at every scale.
    expect(new Set([...here.basin].filter((b) => b >= 0))).toEqual(new Set([0, 1, 2]));
  });

  it('at a span of 1e-30 about alpha, escape counts and classes match mpmath iterating at 90 digits', () => {
    const a = alpha();
    const offsets: Array<[number, number]> = [];
    for (let k = 0; k < 24; k++) offsets.push([Math.cos(k * 2.399963) * (k + 1) * 2e-32, Math.sin(k * 2.399963) * (k + 1) * 2e-32]);
    const dx = Float64Array.from(offsets.map((o) => o[0])),
      dy = Float64Array.from(offsets.map((o) => o[1]));
    const out = sampleJuliaDeep(dx, dy, offsets.length, { cRe, cIm, maxIterations: 6000, escapeRadius: R }, trap, refs(a, 180, 6000), createJuliaSampleSet(offsets.length));
    const script = [
      'from mpmath import mp, mpc, mpf',
      'mp.dps = 90',
      `c = mpc('${C.re}', '${C.im}')`,
      `a = mpc('${a.re}', '${a.im}')`,
      `w0 = mpc(${trap.w0Re}, ${trap.w0Im}); r = mpf(${trap.trapRadius})`,
      `for (x, y) in [${offsets.map((o) => `('${o[0].toExponential(16)}', '${o[1].toExponential(16)}')`).join(', ')}]:`,
      '    z = a + mpc(x, y); n = 0',
      '    while True:',
      `        if abs(z) > ${R}: print("e", n); break`,
      `        if abs(z - w0) < r: print("i", (${trap.classOffset} - n) % 3); break`,
      '        if n == 6000: print("u", 0); break',
      '        z = z*z + c; n += 1',
    ].join('\n');
    const r = spawnSync('python3', ['-c', script], { encoding: 'utf8' });
    expect(r.status, r.stderr).toBe(0);
    const lines = r.stdout
      .trim()
      .split('\n')
      .map((l) => l.split(' '));
    let escaped = 0;
    lines.forEach(([kind, v], k) => {
      if (kind === 'e') {
        escaped++;
        expect(out.period[k]).toBe(0);
        expect(Math.ceil(out.smooth[k]!)).toBe(Number(v));
      } else if (kind === 'i') {
        expect(out.period[k]).toBe(3);
        expect(out.basin[k]).toBe(Number(v));
      }
    });
    expect(escaped).toBeGreaterThan(3);
    expect(escaped).toBeLessThan(offsets.length);
  });
});
