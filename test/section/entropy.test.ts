// Topological entropy from the kneading determinant (src/section/entropy.ts;
// Milnor-Thurston, LNM 1342 (1988) 465-563). Checks are theorems and exact
// algebra, never values the code produced before.
import { describe, expect, it } from 'vitest';
import { logistic, sine } from '../../src/section/families/index.js';
import { eventualPeriod, kneadingCoefficients, kneadingSequence, topologicalEntropy } from '../../src/section/entropy.js';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { runCli, tempDir } from '../helpers/run-cli.js';

const LN2 = Math.log(2);
const LN_PHI = Math.log((1 + Math.sqrt(5)) / 2);

describe('kneading letters and the series', () => {
  it('r = 4: the critical orbit 1/2 -> 1 -> 0 -> 0 ... reads R L L L ... (exact arithmetic)', () => {
    expect(kneadingSequence(logistic, '4', 8).letters).toBe('RLLLLLLL');
  });

  it('r = 2: the critical point is fixed, so the orbit returns at once (C)', () => {
    expect(kneadingSequence(logistic, '2', 8)).toEqual({ letters: 'C', returned: true });
  });

  it('theta_i = eps_1 ... eps_i with eps = -1 for R (the definition): RLC gives 1 - t - t^2', () => {
    expect(Array.from(kneadingCoefficients('RLC'))).toEqual([1, -1, -1]);
    expect(Array.from(kneadingCoefficients('RRL'))).toEqual([1, -1, 1, 1]);
  });

  it('an eventual period is read from the tail', () => {
    expect(eventualPeriod('RLRL'.repeat(40))).toEqual({ start: 0, period: 2 });
    expect(eventualPeriod(`RRRR${'RLL'.repeat(60)}`)?.period).toBe(3);
  });
});

describe('entropy of the logistic family', () => {
  it('log 2 at full chaos r = 4 (Milnor-Thurston: the full family has entropy log 2)', () => {
    expect(topologicalEntropy(logistic, '4', 500).entropy).toBeCloseTo(LN2, 12);
  });

  it('log of the golden ratio at the period-3 onset r = 1 + sqrt 8 and inside the window (Milnor-Thurston; the kneading (RLL)^inf gives 1 - t - t^2)', () => {
    // 1 + sqrt 8 to 40 digits, rounded up into the window.
    for (const r of ['3.828427124746190097603377448419396157140', '3.83', '3.845']) {
      expect(topologicalEntropy(logistic, r, 1000).entropy, r).toBeCloseTo(LN_PHI, 10);
    }
  });

  it('0 in the period-doubling cascade below r_inf = 3.5699456... (OEIS A098587): periods 1, 2, 4, ... have zero entropy', () => {
    for (const r of ['2.5', '3.2', '3.5', '3.56', '3.569']) {
      const e = topologicalEntropy(logistic, r, 1000);
      expect(e.entropy, r).toBe(0);
      expect(e.basis, r).toBe('periodic');
    }
  });

  it('(1/2) log 2 at the band-merging point, the real root of r^3 - 2 r^2 - 4 r - 8 (exact algebra: f^3(1/2) is the fixed point; the value is from memory)', () => {
    // Newton on the cubic in doubles, written here.
    let r = 3.68;
    for (let k = 0; k < 50; k++) r -= (r ** 3 - 2 * r ** 2 - 4 * r - 8) / (3 * r ** 2 - 4 * r - 4);
    const e = topologicalEntropy(logistic, r.toPrecision(17), 1000);
    expect(e.entropy).toBeCloseTo(LN2 / 2, 6);
  });

  it('log of the tribonacci constant (OEIS A058265, 1.839286755...) on the period-4 window RLL: its kneading (RLL C) gives 1 - t - t^2 - t^3', () => {
    // The window's superstable parameter, to 25 digits (its c = r/2 - r^2/4 is a real zero of F_4: see window-cascade.test.ts).
    const e = topologicalEntropy(logistic, '3.960270127221152601571258', 1000);
    expect(e.entropy).toBeCloseTo(Math.log(1.839286755214161132551852564653286600424), 10);
  });

  it('never decreases with r (monotonicity of entropy in the real quadratic family: Milnor-Thurston, Douady-Hubbard)', () => {
    let last = 0;
    for (let k = 0; k <= 40; k++) {
      const r = (3.55 + (k * 0.45) / 40).toFixed(6);
      const e = topologicalEntropy(logistic, r, 600);
      // A bound is an upper bound: it only has to stay above the last value known exactly.
      if (e.basis !== 'bound') {
        expect(e.entropy, r).toBeGreaterThanOrEqual(last - 1e-9);
        last = e.entropy;
      }
    }
    expect(last).toBeCloseTo(LN2, 9);
  });
});

describe('universality of the ends', () => {
  it('the sine family r sin(pi x) is full at r = 1: log 2', () => {
    expect(topologicalEntropy(sine, '1', 120).entropy).toBeCloseTo(LN2, 10);
  });
});

describe('quadatlas section entropy', () => {
  it('prints a table whose last row is log 2, and refuses a parameter outside the family range in one line', () => {
    const r = runCli(['section', 'entropy', '--r-from', '3.5', '--r-to', '4', '--steps', '3', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const t = JSON.parse(r.stdout) as { rows: Array<{ r: string; entropy: number; basis: string }> };
    expect(t.rows.map((row) => row.r)).toEqual(['3.5', '3.75', '4']);
    expect(t.rows.at(-1)!.entropy).toBeCloseTo(LN2, 7);
    expect(t.rows[0]!.entropy).toBe(0);
    const bad = runCli(['section', 'entropy', '--r-from', '5']);
    expect(bad.status).toBe(2);
    expect(bad.stderr.trim().split('\n')).toHaveLength(1);
    expect(bad.stderr).toMatch(/--r-from/);
    for (const [args, field] of [
      [['--r-from', '3.9', '--r-to', '3.5'], '--r-to'],
      [['--steps', '1'], '--steps'],
      [['--letters', 'many'], '--letters'],
      [['--out', 'plot.pdf'], '--out'],
    ] as const) {
      const b = runCli(['section', 'entropy', ...args]);
      expect(b.status, args.join(' ')).toBe(2);
      expect(b.stderr.trim().split('\n')).toHaveLength(1);
      expect(b.stderr).toContain(field);
    }
  });

  it('--out FILE.svg writes the plot carrying its settings, and a sidecar', () => {
    const dir = tempDir();
    const file = path.join(dir, 'h.svg');
    const r = runCli(['section', 'entropy', '--r-from', '3.6', '--steps', '12', '--out', file]);
    expect(r.status, r.stderr).toBe(0);
    const svg = readFileSync(file, 'utf8');
    expect(svg).toMatch(/<svg/);
    expect(svg).toContain('section-entropy');
    expect(JSON.parse(readFileSync(`${file}.json`, 'utf8'))).toBeTruthy();
    // The sheet comes back out of the plot, and --again renders the same bytes.
    const sheet = runCli(['sheet', file]);
    expect(sheet.status, sheet.stderr).toBe(0);
    expect(JSON.parse(sheet.stdout)).toMatchObject({ kind: 'section-entropy', schema: 1, r: { from: '3.6' }, steps: 12 });
    const again = runCli(['section', 'entropy', '--again', file]);
    expect(again.status, again.stderr).toBe(0);
    expect(readFileSync(path.join(dir, 'h-again.svg')).equals(readFileSync(file))).toBe(true);
  });
});
