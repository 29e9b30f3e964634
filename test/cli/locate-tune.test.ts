import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';

interface LocateOut {
  period: number;
  nucleus: { re: string; im: string };
  externalAngles: string[];
  internalAddress: string;
  tuning: { words: [string, string] };
  plateCommand: string;
}

function locate(args: string[]): LocateOut {
  const r = runCli(['locate', '--json', ...args]);
  expect(r.status, r.stderr).toBe(0);
  return JSON.parse(r.stdout) as LocateOut;
}

/** The real zero of F_p(c) = F^p(0, c) near c0, by Newton in decimal.js at 60 digits (exact algebra, independent of quadatlas). */
function realZero(p: number, c0: string): Decimal {
  const D = Decimal.clone({ precision: 60 });
  let c = new D(c0);
  for (let it = 0; it < 100; it += 1) {
    let z = new D(0);
    let dz = new D(0);
    for (let k = 0; k < p; k += 1) {
      dz = z.times(dz).times(2).plus(1);
      z = z.times(z).plus(c);
    }
    const step = z.div(dz);
    c = c.minus(step);
    if (step.abs().lt('1e-50')) break;
  }
  return c;
}

describe('locate --tune (Douady-Hubbard tuning by angle words, docs/methods.md D6)', () => {
  it('period 2 tuned by itself: the period-4 component of angles 2/5, 3/5 (words 0110, 1001)', () => {
    for (const args of [
      ['1/3,2/3', '1/3,2/3'],
      ['1-2', '1-2'],
    ]) {
      const out = locate(['--tune', ...args]);
      expect(out.period).toBe(4);
      expect(out.tuning.words).toEqual(['0110', '1001']);
      expect(out.externalAngles).toEqual(['2/5', '3/5']);
      // the period-4 nucleus of the period-doubling cascade, the real zero of F_4 near -1.31
      expect(Number(out.nucleus.re)).toBeCloseTo(realZero(4, '-1.31').toNumber(), 14);
    }
  });

  it('the real period-3 component tuned by period 2: the real period-6 component of the period-3 cascade', () => {
    const out = locate(['--tune', '3/7,4/7', '1-2', '--digits', '40']);
    expect(out.period).toBe(6);
    expect(out.externalAngles).toEqual(['4/9', '5/9']);
    expect(out.internalAddress).toBe('1-2-3-6');
    // c = -1.772892903381624 [memory]; checked against the decimal.js zero of F_6 to 35 digits
    const z = realZero(6, '-1.7728929');
    expect(new Decimal(out.nucleus.re).minus(z).abs().lt('1e-35')).toBe(true);
    expect(out.nucleus.im).toMatch(/^-?0(\.0*)?$/);
    expect(out.plateCommand).toContain(`--center ${out.nucleus.re},${out.nucleus.im}`);
  });

  it('the period-3 bulb tuned by the main cardioid is the period-3 bulb itself', () => {
    const out = locate(['--tune', '1/7,2/7', '1']);
    expect(out.period).toBe(3);
    expect(out.externalAngles).toEqual(['1/7', '2/7']);
  });

  for (const [args, field] of [
    [['--tune', '1/3,1/5', '1-2'], '--tune OUTER'],
    [['--tune', '1/7,3/7', '1-2'], '--tune OUTER'],
    [['--tune', '1-2', '1-0'], '--tune INNER'],
    [['--tune', '1-2'], '--tune'],
  ] as const) {
    it(`bad component ${args.join(' ')}: one line naming ${field}, exit 2`, () => {
      const r = runCli(['locate', ...args]);
      expect(r.status).toBe(2);
      expect(r.stderr.trim().split('\n')).toHaveLength(1);
      expect(r.stderr).toContain(`for ${field} `);
    });
  }
});
