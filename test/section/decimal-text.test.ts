import { spawnSync } from 'node:child_process';
import { Decimal } from 'decimal.js';
import { describe, expect, it } from 'vitest';
import { doubleToPlaces, toExponent, toPlaces } from '../../src/section/decimal-text.js';
import { requireInCi } from '../helpers/require-in-ci.js';

// Python's decimal module (General Decimal Arithmetic, IEEE 754-2008 rounding) as the reference.
const python = requireInCi(spawnSync('python3', ['-c', 'import decimal'], { stdio: 'ignore' }).status === 0, 'python3');

function pythonLines(program: string, input: string): string[] {
  const r = spawnSync('python3', ['-c', program], { input, encoding: 'utf8' });
  expect(r.stderr).toBe('');
  return r.stdout.trim().split('\n');
}

/** Deterministic pseudo-random decimal strings with up to 30 digits either side of the point. */
function sampleDecimals(n: number): string[] {
  let h = 12345;
  const next = (): number => {
    h = (Math.imul(h, 1103515245) + 12345) >>> 0;
    return h;
  };
  const out: string[] = [];
  for (let k = 0; k < n; k++) {
    const int = String(next() % 1000);
    let frac = '';
    const len = 1 + (next() % 30);
    for (let i = 0; i < len; i++) frac += String(next() % 10);
    // Every fourth value ends in a 5 exactly: the ties that half-even rounding decides.
    if (k % 4 === 0) frac = `${frac.slice(0, 3)}5`;
    out.push(`${next() % 2 === 0 ? '-' : ''}${int}.${frac}`);
  }
  return out;
}

describe('toPlaces', () => {
  it('toPlaces rounds ties to even (IEEE 754 roundTiesToEven), drops trailing zeros and never writes -0', () => {
    // Exact decimal arithmetic: 2.5 -> 2, 3.5 -> 4, -1.752225 -> -1.75222 at 5 places.
    expect(toPlaces('2.5', 0)).toBe('2');
    expect(toPlaces('3.5', 0)).toBe('4');
    expect(toPlaces('-1.752225', 5)).toBe('-1.75222');
    expect(toPlaces('-0.0000004', 6)).toBe('0');
    expect(toPlaces('4.000', 10)).toBe('4');
    expect(toPlaces('1e-12', 14)).toBe('0.000000000001');
  });

  it.skipIf(!python)('toPlaces agrees with Python decimal quantize(ROUND_HALF_EVEN) on 400 values at 0..20 places', () => {
    const values = sampleDecimals(400);
    const places = values.map((_, k) => k % 21);
    const program = [
      'import sys, decimal',
      'decimal.getcontext().prec = 100',
      'for line in sys.stdin:',
      '    v, p = line.split()',
      '    q = decimal.Decimal(v).quantize(decimal.Decimal(1).scaleb(-int(p)), rounding=decimal.ROUND_HALF_EVEN)',
      "    s = format(q, 'f')",
      "    s = s.rstrip('0').rstrip('.') if '.' in s else s",
      "    print('0' if s == '-0' else s)",
    ].join('\n');
    const expected = pythonLines(program, values.map((v, k) => `${v} ${places[k]}`).join('\n'));
    expect(values.map((v, k) => toPlaces(v, places[k]!))).toEqual(expected);
  });
});

describe('toExponent', () => {
  it('toExponent writes D significant digits, keeping trailing zeros', () => {
    // docs/checks.md: |s| of the real period-3 component 0.019035515913132 (Hunt-Ott 1997).
    expect(toExponent(0.019035515913132, 6)).toBe('1.90355e-2');
    expect(toExponent(new Decimal('0.00125'), 2)).toBe('1.2e-3'); // tie to even
    expect(toExponent(2, 3)).toBe('2.00e+0');
  });

  it('toExponent writes a double with 17 or more digits in its shortest round-trip form (no invented digits)', () => {
    expect(toExponent(0.1, 40)).toBe('1e-1');
    expect(Number(toExponent(Math.PI, 20))).toBe(Math.PI);
  });

  it.skipIf(!python)("toExponent of doubles agrees with Python's correctly rounded '%.{D-1}e' formatting", () => {
    const xs = sampleDecimals(200).map((s, k) => Number(s) * 10 ** ((k % 13) - 8));
    const ds = xs.map((_, k) => 1 + (k % 16));
    const program = ['import sys', 'for line in sys.stdin:', '    x, d = line.split()', "    print('%.*e' % (int(d) - 1, float(x)))"].join('\n');
    const expected = pythonLines(program, xs.map((x, k) => `${x} ${ds[k]}`).join('\n')).map((s) => s.replace(/e([+-])0*(\d)/, 'e$1$2'));
    expect(xs.map((x, k) => toExponent(x, ds[k]!))).toEqual(expected);
  });
});

describe('doubleToPlaces', () => {
  it('doubleToPlaces prints no float noise and keeps the stated places', () => {
    // 0.1 + 0.2 is the double 0.30000000000000004 (IEEE 754 binary64); 2.8 + 0.4 is 3.1999999999999997.
    expect(doubleToPlaces(0.1 + 0.2, 6)).toBe('0.300000');
    expect(doubleToPlaces(2.8 + 0.4, 6)).toBe('3.200000');
    expect(doubleToPlaces(-1e-9, 6)).toBe('0.000000');
    expect(doubleToPlaces(Math.log(2), 6)).toBe('0.693147'); // ln 2 = 0.693147180... (OEIS A002162)
  });
});
