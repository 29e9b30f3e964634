import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { logistic } from '../../src/section/families/logistic.js';
import { classifyOrbit } from '../../src/section/orbit.js';
import { preciseOrbit } from '../../src/section/precise-orbit.js';
import { runCli, tempDir } from '../helpers/run-cli.js';

/** mpmath (python3-mpmath, .ci/run installs it) as the outside reference for high-precision values. */
function mpmath(code: string): string[] {
  const r = spawnSync('python3', ['-c', `from mpmath import mp, sin, pi, mpf\nmp.dps = 140\n${code}`], { encoding: 'utf8' });
  if (r.status !== 0) throw new Error(`python3 mpmath failed: ${r.stderr}`);
  return r.stdout.trim().split('\n');
}

/** |a - b| in units of 10^-61, for decimal strings "0.ddd" in [0, 1). */
function offBy(a: string, b: string): bigint {
  const units = (s: string): bigint => BigInt(s.replace('.', '').padEnd(62, '0').slice(0, 62));
  const d = units(a) - units(b);
  return d < 0n ? -d : d;
}

/** Half a unit of the D-th digit after the point, in units of 10^-61: the rounding of a printed value. */
const HALF_UNIT = (D: number): bigint => 5n * 10n ** BigInt(60 - D);

describe('classifyOrbit (logistic family) against exact algebra', () => {
  it('r = 2.5 settles on the fixed point 1 - 1/r = 0.6 with multiplier 2 - r; Lyapunov ln|2 - r| (exact)', () => {
    const c = classifyOrbit(logistic, 2.5, 0.2);
    expect(c.kind).toBe('cycle');
    expect(c.period).toBe(1);
    expect(c.cycle[0]).toBeCloseTo(0.6, 14);
    expect(c.multiplier).toBeCloseTo(-0.5, 12);
    expect(c.stability).toBe('attracting');
    expect(c.lyapunov).toBeCloseTo(Math.log(0.5), 6);
  });

  it('r = 3.2 settles on the 2-cycle (r + 1 +- sqrt((r - 3)(r + 1))) / (2r); Lyapunov (1/2) ln|4 + 2r - r^2| (exact)', () => {
    const r = 3.2;
    const c = classifyOrbit(logistic, r, 0.2);
    expect(c.kind).toBe('cycle');
    expect(c.period).toBe(2);
    const root = Math.sqrt((r - 3) * (r + 1));
    const expected = [(r + 1 - root) / (2 * r), (r + 1 + root) / (2 * r)];
    expect([...c.cycle].sort()).toEqual(expected.map((e) => expect.closeTo(e, 12)));
    // The 2-cycle's multiplier is 4 + 2r - r^2 (exact algebra), so the exponent is half its log.
    expect(c.multiplier).toBeCloseTo(4 + 2 * r - r * r, 10);
    expect(c.lyapunov).toBeCloseTo(0.5 * Math.log(Math.abs(4 + 2 * r - r * r)), 6);
  });

  it('r = 1 + sqrt(8) + 0.001 (just past the period-3 onset, docs/checks) settles on an attracting 3-cycle', () => {
    const c = classifyOrbit(logistic, 1 + Math.sqrt(8) + 0.001, 0.2);
    expect(c.kind).toBe('cycle');
    expect(c.period).toBe(3);
    expect(c.stability).toBe('attracting');
    expect(Math.abs(c.multiplier)).toBeLessThan(1);
    // A cycle: f maps each point to the next.
    for (let i = 0; i < 3; i++) expect(logistic.f(c.cycle[i]!, 1 + Math.sqrt(8) + 0.001)).toBeCloseTo(c.cycle[(i + 1) % 3]!, 9);
  });

  it('r = 4: no attracting cycle, Lyapunov ln 2 within 0.01 (conjugacy to the doubling map)', () => {
    const c = classifyOrbit(logistic, 4, 0.3);
    expect(c.kind).toBe('none');
    expect(Math.abs(c.lyapunov - Math.LN2)).toBeLessThan(0.01);
  });
});

describe('preciseOrbit at r = 4 from x_0 = sin^2(pi/7): x_n = sin^2(2^n pi/7) (exact conjugacy), over the steps it trusts', () => {
  it('every trusted printed digit is right, the count covers the steps asked, and the estimate is D ln 10 / ln 2', () => {
    const D = 30;
    const N = 120;
    const lines = mpmath(`print(mp.nstr(sin(pi/7)**2, 130, strip_zeros=False))\nfor n in range(${N + 1}):\n    print(mp.nstr(sin(2**n*pi/7)**2, 60, strip_zeros=False))`);
    const x0 = lines[0]!;
    const ref = lines.slice(1);
    const c = classifyOrbit(logistic, 4, Number(x0));
    // x_0 lies on the repelling 3-cycle sin^2(pi/7), sin^2(2pi/7), sin^2(4pi/7); |multiplier| = 2^3 (tent-map conjugacy).
    expect(c.kind).toBe('on-cycle');
    expect(c.period).toBe(3);
    expect(Math.abs(c.multiplier)).toBeCloseTo(8, 9);
    const po = preciseOrbit(logistic, '4', x0, N, D, c.lyapunov);
    expect(po.trustedSteps).toBe(N + 1);
    expect(po.estimate!).toBeCloseTo((D * Math.LN10) / Math.LN2, 0);
    for (let n = 0; n < po.trustedSteps; n++) {
      expect(offBy(po.values[n]!, ref[n]!) <= HALF_UNIT(D), `n = ${n}: ${po.values[n]} vs ${ref[n]}`).toBe(true);
      expect(po.agree[n]).toBe(D);
    }
  });

  it('with too few guard digits the count shrinks, the trusted rows stay right, and the next rows soon go wrong', () => {
    const D = 30;
    const lines = mpmath(`print(mp.nstr(sin(pi/7)**2, 130, strip_zeros=False))\nfor n in range(80):\n    print(mp.nstr(sin(2**n*pi/7)**2, 60, strip_zeros=False))`);
    // 6 guard digits: about 6 / log10(2) = 20 steps before the 30th digit goes (rounding error doubles each step).
    const po = preciseOrbit(logistic, '4', lines[0]!, 79, D, Math.LN2, 6);
    expect(po.workingDigits).toBe(36);
    expect(po.trustedSteps).toBeGreaterThan(10);
    expect(po.trustedSteps).toBeLessThan(40);
    for (let n = 0; n < po.trustedSteps; n++) expect(offBy(po.values[n]!, lines[n + 1]!) <= HALF_UNIT(D), `n = ${n}`).toBe(true);
    // The first row whose printed value is wrong by more than rounding comes within 10 steps of the count.
    const wrong = po.values.findIndex((v, n) => offBy(v, lines[n + 1]!) > HALF_UNIT(D) + 1n);
    expect(wrong).toBeGreaterThanOrEqual(po.trustedSteps - 1);
    expect(wrong).toBeLessThan(po.trustedSteps + 10);
    // The per-row agreement falls about one digit every ln 10 / ln 2 = 3.3 steps after that.
    expect(po.agree[po.trustedSteps + 33]!).toBeLessThan(D - 5);
  });
});

describe('quadatlas section orbit / cobweb', () => {
  it('writes the orbit figure with one labelled series per r, and the cobweb with the graph, diagonal and staircase', () => {
    const dir = tempDir();
    const r = runCli(['section', 'orbit', '--r', '2.8,3.2,3.5,3.9', '--out', path.join(dir, 'o.svg'), '--json']);
    expect(r.status, r.stderr).toBe(0);
    const j = JSON.parse(r.stdout) as { rows: unknown[]; orbits: Array<{ classification: { kind: string; period: number } }> };
    expect(j.rows).toHaveLength(4 * 61);
    expect(j.orbits.map((o) => [o.classification.kind, o.classification.period])).toEqual([
      ['cycle', 1],
      ['cycle', 2],
      ['cycle', 4],
      ['none', 0],
    ]);
    const svg = readFileSync(path.join(dir, 'o.svg'), 'utf8');
    // each series label is an outline carrying its string (no <text>: figure/outline-lettering.ts)
    expect(svg).not.toMatch(/<text[\s>]/);
    for (const v of ['2.8', '3.2', '3.5', '3.9']) expect(svg).toContain(`aria-label="r = ${v}"`);
    const c = runCli(['section', 'cobweb', '--r', '3.83', '--out', path.join(dir, 'c.svg'), '--csv']);
    expect(c.status, c.stderr).toBe(0);
    expect(c.stdout.split('\n')[0]).toBe('n,x');
    const cob = readFileSync(path.join(dir, 'c.svg'), 'utf8');
    expect(cob).toContain('stroke-dasharray');
    expect((cob.match(/<circle/g) ?? []).length).toBe(1 + 3);
    const png = runCli(['section', 'cobweb', '--r', '3.83', '--out', path.join(dir, 'c.png')]);
    expect(png.status, png.stderr).toBe(0);
    expect(readFileSync(path.join(dir, 'c.png')).subarray(1, 4).toString()).toBe('PNG');
  });

  it('refuses bad input in one line naming the field, exit 2', () => {
    const cases: Array<[string[], RegExp]> = [
      [['section', 'orbit', '--r', '4.5'], /--r/],
      [['section', 'orbit', '--r', '-0.1'], /--r/],
      [['section', 'orbit', '--r', 'x'], /--r/],
      [['section', 'orbit', '--r', '3', '--x0', '1.5'], /--x0/],
      [['section', 'orbit', '--r', '3', '--iterations', '2000000'], /--iterations/],
      [['section', 'orbit', '--r', '3', '--digits', '20', '--iterations', '200000'], /--iterations/],
      [['section', 'cobweb', '--r', '3,3.5'], /--r/],
      [['section', 'cobweb', '--r', '3', '--out', 'x.pdf'], /--out/],
    ];
    for (const [args, field] of cases) {
      const r = runCli(args);
      expect(r.status, r.stderr).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toMatch(field);
    }
  });
});
