// locate --misiurewicz and components --misiurewicz from the command line
// (docs/checks.md "Misiurewicz points"): c = i is the point of preperiod 1 and
// period 2 at angle 1/6 (orbit i, -1+i, -i, -1+i: exact arithmetic), c = -2 the
// point (1, 1) at angle 1/2 (orbit -2, 2, 2); bad input is one line naming the field, exit 2.
import { describe, expect, it } from 'vitest';
import { existsSync } from 'node:fs';
import path from 'node:path';
import { runCli, tempDir } from '../helpers/run-cli.js';

interface Located {
  misiurewicz: { re: string; im: string };
  preperiod: number;
  period: number;
  externalAngles: string[];
  plateCommand: string;
}

function locate(...args: string[]): Located {
  const r = runCli(['locate', '--json', ...args]);
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout) as Located;
}

describe('locate --misiurewicz K,P --near RE,IM', () => {
  it('from 0.1,0.9 finds c = i, (1, 2), external angle 1/6, and prints a plate command centred there', () => {
    const j = locate('--misiurewicz', '1,2', '--near', '0.1,0.9', '--digits', '40');
    expect(Number(j.misiurewicz.re)).toBe(0);
    expect(j.misiurewicz.im).toBe(`1.${'0'.repeat(40)}`);
    expect([j.preperiod, j.period]).toEqual([1, 2]);
    expect(j.externalAngles).toEqual(['1/6']);
    expect(j.plateCommand).toContain(`--center 0,1.${'0'.repeat(40)}`);
  });

  it('from -1.9,0.1 finds c = -2, (1, 1), external angle 1/2', () => {
    const j = locate('--misiurewicz', '1,1', '--near', '-1.9,0.1');
    expect(Number(j.misiurewicz.re)).toBe(-2);
    expect(Number(j.misiurewicz.im)).toBe(0);
    expect(j.externalAngles).toEqual(['1/2']);
  });

  it('the printed plate command renders (it runs as printed, at a smaller size)', () => {
    const j = locate('--misiurewicz', '3,1', '--near', '-0.1,0.95', '--digits', '20');
    // the branch point of angles 9/56, 11/56, 15/56 (three rays on the fixed point alpha of the 1/3 limb)
    expect(j.externalAngles).toEqual(['9/56', '11/56', '15/56']);
    const args = j.plateCommand.split(' ').slice(1);
    const out = path.join(tempDir(), 'm.png');
    const r = runCli([...args, '--size', '32x24', '--out', out]);
    expect(r.status, r.stderr).toBe(0);
    expect(existsSync(out)).toBe(true);
  });

  it('a start far outside the set: Newton does not converge, one line naming --near, exit 2', () => {
    const r = runCli(['locate', '--misiurewicz', '1,3', '--near', '5,5']);
    expect(r.status).toBe(2);
    expect(r.stderr.trim().split('\n')).toHaveLength(1);
    expect(r.stderr).toContain('near');
  });
});

describe('components --misiurewicz K,P', () => {
  it('--count 2,1 prints 3 (Hutz-Towsley Corollary 3.3 with m = 3, n = 1: 2^3 - 2^2 - 1 = 3)', () => {
    const r = runCli(['components', '--misiurewicz', '2,1', '--count']);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout.trim()).toBe('3');
  });

  it('--csv 1,2 lists i and -i with angles 1/6 and 5/6', () => {
    const r = runCli(['components', '--misiurewicz', '1,2', '--csv', '--digits', '10']);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout.trim().split('\n')).toEqual(['preperiod,period,re,im,external_angles', '1,2,0,1.0000000000,1/6', '1,2,0,-1.0000000000,5/6']);
  });
});

describe('bad input: one line naming the field, exit 2', () => {
  for (const [args, field] of [
    [['locate', '--misiurewicz', '0,2', '--near', '0,1'], '--misiurewicz preperiod'],
    [['locate', '--misiurewicz', '1,0', '--near', '0,1'], '--misiurewicz period'],
    [['locate', '--misiurewicz', '1.5,2', '--near', '0,1'], '--misiurewicz'],
    [['locate', '--misiurewicz', 'one,two', '--near', '0,1'], '--misiurewicz'],
    [['locate', '--misiurewicz', '1,2'], '--misiurewicz'],
    [['locate', '--misiurewicz', '1,5000', '--near', '0,1'], '--misiurewicz period'],
    [['components', '--misiurewicz', '12,12'], '--misiurewicz'],
    [['components', '--misiurewicz', '-1,2'], '--misiurewicz preperiod'],
    [['components', '--misiurewicz', '2,2', '--period', '3'], '--misiurewicz'],
    [['components'], '--period'],
  ] as const) {
    it(`${args.join(' ')} names ${field}`, () => {
      const r = runCli([...args]);
      expect(r.status).toBe(2);
      const lines = r.stderr.trim().split('\n');
      expect(lines).toHaveLength(1);
      expect(lines[0]).toContain(`for ${field} but received`);
    });
  }
});

describe('README: the deep plate found by navigation alone', () => {
  it('the plate command under "angles in, picture out" is centred where locate --angle lands the ray', async () => {
    const { readFileSync } = await import('node:fs');
    const { ROOT } = await import('../helpers/run-cli.js');
    const readme = readFileSync(path.join(ROOT, 'README.md'), 'utf8');
    const m = /npx quadatlas locate --angle (\d+\/\d+) --digits (\d+)[^\n]*\nnpx quadatlas plate --center (\S+)/.exec(readme);
    expect(m).not.toBeNull();
    const r = runCli(['locate', '--json', '--angle', m![1]!, '--digits', m![2]!]);
    expect(r.status, r.stderr).toBe(0);
    const j = JSON.parse(r.stdout) as Located;
    expect(m![3]).toBe(`${j.misiurewicz.re},${j.misiurewicz.im}`);
    expect(j.plateCommand).toContain(`--center ${m![3]!} `);
  });
});
