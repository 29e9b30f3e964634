/**
 * Misiurewicz points (preperiodic parameters) by Newton's method in BigInt
 * fixed point: solve G(c) = F^{k+p}(0,c) - F^k(0,c) = 0 with
 * G' = D_c F^{k+p} - D_c F^k, with k = (preperiod of the angle) + 1 and p the
 * period (c = -2: angle 1/2, orbit 0, -2, 2, 2, so z_2 = z_3). The start
 * comes from tracing the ray of a preperiodic angle (docs/methods.md D4).
 * Source: mathr.co.uk/web/m-misiurewicz.html (C. Heiland-Allen); the same
 * Newton as docs/methods.md C2 applied to the preperiodic equation.
 */
import { bitLength, bitsForDigits, cdiv, fixedScale, fromNumber, rescale } from '../precise/fixed.js';
import type { FixedComplex } from '../precise/fixed.js';
import { NewtonError } from './newton-error.js';
import { formatComplex } from './nucleus.js';
import type { ComplexDecimal } from './nucleus.js';

/** Newton to the Misiurewicz point of preperiod k and period p from a double-double start. */
export function findMisiurewicz(anglePreperiod: number, period: number, start: { reHi: number; reLo: number; imHi: number; imLo: number }, digits: number): ComplexDecimal {
  // c's orbit index lags the angle by one: the angle's preperiod k' gives z_{k'+1+p} = z_{k'+1}
  const preperiod = anglePreperiod + 1;
  const bits = bitsForDigits(digits + 10, 32);
  const s = fixedScale(bits);
  let c: FixedComplex = { re: fromNumber(start.reHi, s) + fromNumber(start.reLo, s), im: fromNumber(start.imHi, s) + fromNumber(start.imLo, s) };
  const run = (cc: FixedComplex, sc: typeof s): FixedComplex | null => {
    let x = cc;
    let close = 0;
    for (let step = 0; step < 300; step += 1) {
      let zr = 0n,
        zi = 0n,
        dr = 0n,
        di = 0n;
      let kr = 0n,
        ki = 0n,
        kdr = 0n,
        kdi = 0n;
      for (let n = 1; n <= preperiod + period; n += 1) {
        const ndr = ((zr * dr - zi * di) >> (sc.shift - 1n)) + sc.one;
        di = (zr * di + zi * dr) >> (sc.shift - 1n);
        dr = ndr;
        const nzr = ((zr * zr - zi * zi) >> sc.shift) + x.re;
        zi = ((zr * zi) >> (sc.shift - 1n)) + x.im;
        zr = nzr;
        if (bitLength(zr) > sc.bits + 40 || bitLength(zi) > sc.bits + 40) return null;
        if (n === preperiod) [kr, ki, kdr, kdi] = [zr, zi, dr, di];
      }
      const g = { re: zr - kr, im: zi - ki };
      const dg = { re: dr - kdr, im: di - kdi };
      if (dg.re === 0n && dg.im === 0n) return null;
      const h = cdiv(g, dg, sc);
      x = { re: x.re - h.re, im: x.im - h.im };
      if (Math.max(bitLength(h.re), bitLength(h.im)) <= 17) {
        close += 1;
        if (close >= 2) return x;
      }
    }
    return null;
  };
  const r1 = run(c, s);
  if (r1 === null)
    throw new NewtonError('angle', `an angle whose ray lands in the Newton basin of its Misiurewicz point`, `preperiod ${preperiod}, period ${period}`, 'Newton did not converge');
  c = r1;
  const s2 = fixedScale(bits + 64);
  const r2 = run({ re: rescale(c.re, bits, bits + 64), im: rescale(c.im, bits, bits + 64) }, s2);
  if (r2 === null) throw new NewtonError('angle', 'a Misiurewicz point that confirms at higher precision', `preperiod ${preperiod}, period ${period}`, 'did not confirm');
  return formatComplex(r2, s2, digits);
}
