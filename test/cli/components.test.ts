import { beforeAll, describe, expect, it } from 'vitest';
import { spawnSync } from 'node:child_process';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
const cli = path.join(root, 'dist/src/cli/main.js');

function run(...args: string[]): { code: number | null; out: string; err: string } {
  const r = spawnSync(process.execPath, [cli, ...args], { cwd: root, encoding: 'utf8' });
  return { code: r.status, out: r.stdout, err: r.stderr };
}

beforeAll(() => {
  if (!existsSync(cli)) spawnSync(process.execPath, [path.join(root, 'scripts/build.mjs')], { cwd: root, stdio: 'inherit' });
});

describe('quadatlas components / locate / describe', () => {
  it('components --period 10 --count prints 495 (OEIS A000740) and --real prints 51 (OEIS A000048)', () => {
    expect(run('components', '--period', '10', '--count').out.trim()).toBe('495');
    expect(run('components', '--period', '10', '--count', '--real').out.trim()).toBe('51');
  });
  it('components --period 3 --json lists 3 components with the period-3 angle pairs of docs/checks.md', () => {
    const j = JSON.parse(run('components', '--period', '3', '--json').out) as { components: Array<{ externalAngles: string[] }>; statistics: { satellite: number } };
    expect(j.components.map((r) => r.externalAngles.join(' '))).toEqual(['1/7 2/7', '3/7 4/7', '5/7 6/7']);
    // the 1/3 and 2/3 bulbs of the cardioid: N(1) phi(3) = 2 satellites (Douady-Hubbard, docs/methods.md C6)
    expect(j.statistics.satellite).toBe(2);
  });
  it('components --period 8 --count --json carries the statistics: 120 (OEIS A000740), 16 real (OEIS A000048(8)), 12 satellites', () => {
    const j = JSON.parse(run('components', '--period', '8', '--count', '--json').out) as {
      count: number;
      statistics: { count: number; real: number; satellite: number; primitive: number; sizeHistogram: Array<{ count: number }> };
    };
    // satellites of period 8: N(1) phi(8) + N(2) phi(4) + N(4) phi(2) = 4 + 2 + 6 = 12 (divisor formula, OEIS A000740)
    expect([j.count, j.statistics.count, j.statistics.real, j.statistics.satellite, j.statistics.primitive]).toEqual([120, 120, 16, 12, 108]);
    expect(j.statistics.sizeHistogram.reduce((a, b) => a + b.count, 0)).toBe(120);
  });
  it('locate --address 1-2-4 finds the period-4 disk on the period-2 disk at -1.3107...', () => {
    const r = run('locate', '--address', '1-2-4', '--digits', '15', '--json');
    const j = JSON.parse(r.out) as { nucleus: { re: string }; parent: { internalAngle: string } };
    expect(j.nucleus.re).toBe('-1.310702641336833');
    expect(j.parent.internalAngle).toBe('1/2');
  });
  it('bad period, box, angle, address and point: one line on stderr, exit code 2', () => {
    const cases: string[][] = [
      ['components', '--period', '0'],
      ['components', '--period', '4', '--within', '1,2'],
      ['locate', '--angle', '3/2'],
      ['locate', '--address', '1-3-2'],
      ['locate', '--period', '3', '--near', 'abc,0'],
      ['probe', '1,2,3'],
    ];
    for (const args of cases) {
      const r = run(...args);
      expect(r.code, args.join(' ')).toBe(2);
      expect(r.err.trim().split('\n'), args.join(' ')).toHaveLength(1);
      expect(r.err).toMatch(/^quadatlas: Expected /);
    }
  });
  it('describe -1.76 0.01 reports period 3 and the nucleus of the real period-3 component', () => {
    const r = run('probe', '-1.76', '0.01', '--json');
    const j = JSON.parse(r.out) as { period: number; component: { nucleus: { re: string } } };
    expect(j.period).toBe(3);
    expect(j.component.nucleus.re.startsWith('-1.754877666246692760')).toBe(true); // OEIS A060006
  });
});
