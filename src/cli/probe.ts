/**
 * `quadatlas probe RE,IM`: everything about one parameter c. Outside the
 * set: iteration count, smooth count, exterior distance estimate. Inside a
 * hyperbolic component: period of the attracting cycle, multiplier, internal
 * angle, interior distance estimate, and the component (nucleus, root,
 * size, shape, angles, address). For real c also the logistic parameter r
 * and the map between z and x.
 */
import type { Command } from 'commander';
import { attractingCycle, createCycleResult } from '../plane/attracting-cycle.js';
import { exteriorDistance } from '../plane/exterior-distance.js';
import { interiorDistance } from '../plane/interior-distance.js';
import { smoothCount } from '../plane/smooth-count.js';
import { cToR } from '../section/conjugacy.js';
import { windowOf } from '../section/window-of.js';

/** Periods searched for the window that holds a real c (the windows of period <= 10 list in well under a second). */
const WINDOW_PERIODS = 10;
import { componentInfo } from '../components/component-info.js';
import { findNucleus } from '../components/nucleus.js';
import { decimalToNumber, parseDecimalPair } from '../precise/decimal-string.js';
import { componentJson, componentLines, significant } from './component-report.js';
import { juliaCommandLine } from './julia-command.js';
import { criticalOrbit } from '../dynamic/critical-orbit.js';
import { findJuliaCycle } from '../dynamic/julia-cycle.js';
import { parseInteger } from '../check/fields.js';
import { addOptions, type OptionSpec } from './option-spec.js';
import { externalAngleOf } from '../components/ray-out.js';
import { Received, UserError } from '../check/user-error.js';
import { componentSpan, plateCommandLine } from './plate-command.js';

const ESCAPE_RADIUS = 1e6;

/** Longest escape for which the external angle is traced outward (the trace costs about 16 n^2 iterations). */
export const MAX_ANGLE_LEVEL = 4000;

export const PROBE_OPTIONS: readonly OptionSpec[] = [
  { flags: '--digits <digits>', description: 'digits after the decimal point; multipliers, distances and sizes to D significant digits (at most 17)', default: '20' },
  { flags: '--iterations <n>', description: 'iteration limit of the escape test', default: '100000' },
  { flags: '--max-period <period>', description: 'longest attracting cycle looked for, in iterations', default: '1000' },
  { flags: '--angle-bits <n>', description: `binary digits of the external angle of an exterior c, traced outward along its ray (default 64; exterior c escaping within ${MAX_ANGLE_LEVEL} iterations)` },
  { flags: '--orbit <n>', description: 'also list the first n points of the critical orbit and the cycle it settles on (default: none)' },
  { flags: '--json', description: 'JSON output (default: aligned text)' },
];

export function register(program: Command): void {
  addOptions(program.command('probe').description('everything known about one parameter c').argument('<re,im>', 'the parameter c as RE,IM (write `probe -- -1.76,0.01` when RE is negative, or give RE and IM apart)').argument('[im]', 'IM, when RE and IM are given as two arguments'), PROBE_OPTIONS)
    .action(async (first: string, second: string | undefined, o: Record<string, unknown>) => {
      const c = parseDecimalPair(second === undefined ? first : `${first},${second}`, 'c');
      const digits = parseInteger(o['digits'], '--digits', 1, 2000);
      const iterations = parseInteger(o['iterations'], '--iterations', 1, 100_000_000);
      const maxPeriod = parseInteger(o['maxPeriod'], '--max-period', 1, 100_000);
      const angleBits = o['angleBits'] === undefined ? null : parseInteger(o['angleBits'], '--angle-bits', 1, MAX_ANGLE_LEVEL + 50);
      const cr = decimalToNumber(c.re);
      const ci = decimalToNumber(c.im);
      const out: Record<string, unknown> = { c: { re: c.re.text, im: c.im.text } };
      let plateSpan = 0.01;
      const lines: string[] = [`c                 ${c.re.text}, ${c.im.text}`];
      // escape test in double (A1, A2)
      let zr = 0;
      let zi = 0;
      let n = 0;
      while (n < iterations && zr * zr + zi * zi <= ESCAPE_RADIUS * ESCAPE_RADIUS) {
        const t = zr * zr - zi * zi + cr;
        zi = 2 * zr * zi + ci;
        zr = t;
        n += 1;
      }
      if (zr * zr + zi * zi > ESCAPE_RADIUS * ESCAPE_RADIUS) {
        const mu = smoothCount(n, zr, zi, Math.log(ESCAPE_RADIUS));
        const de = exteriorDistance(cr, ci, n, zr, zi);
        Object.assign(out, { escapes: true, iterations: n, smoothCount: mu, exteriorDistance: de });
        lines.push(`escapes           yes, after ${n} iterations (radius 1e6)`, `smooth count      ${mu.toFixed(Math.min(digits, 12))}`, `distance estimate ${significant(de, digits)} (the distance to the set lies between a quarter of this and this)`);
        // external angle by the ray traced outward (docs/methods.md D5)
        const ray = externalAngleOf(cr, ci, angleBits ?? 64, MAX_ANGLE_LEVEL);
        if (ray === null) {
          if (angleBits !== null) throw new UserError('--angle-bits', `a c whose orbit escapes within ${MAX_ANGLE_LEVEL} iterations, so that its ray can be traced outward in double precision`, new Received(`c = ${c.re.text}, ${c.im.text}`));
          out['externalAngle'] = null;
          lines.push(`external angle    not traced (the orbit escapes after more than ${MAX_ANGLE_LEVEL} iterations)`);
        } else {
          out['externalAngle'] = { binary: `0.${ray.digits}`, digits: ray.digits.length, certainDigits: ray.certain, turns: ray.turns };
          out['potential'] = ray.potential;
          lines.push(`external angle    0.${ray.digits} (binary; ${ray.certain} of ${ray.digits.length} digits certain)`, `  in turns        ${ray.turns.toPrecision(16)}`, `potential G(c)    ${significant(ray.potential, digits)}`);
        }
        plateSpan = 20 * de;
      } else {
        // attracting cycle: try periods in order from the settled orbit (A5)
        const cyc = createCycleResult();
        let period = 0;
        for (let p = 1; p <= maxPeriod; p += 1) {
          attractingCycle(cr, ci, p, zr, zi, cyc);
          if (cyc.ok) {
            period = p;
            break;
          }
        }
        if (angleBits !== null) throw new UserError('--angle-bits', 'a c outside the Mandelbrot set (an external angle belongs to an exterior c)', new Received(`c = ${c.re.text}, ${c.im.text}, whose orbit stays bounded for ${iterations} iterations`));
        out['escapes'] = false;
        lines.push(`escapes           no (${iterations} iterations)`);
        if (period === 0) {
          out['period'] = null;
          lines.push(`attracting cycle  none of period up to ${maxPeriod} found (parabolic, Misiurewicz, or a longer period)`);
        } else {
          const mulAbs = Math.hypot(cyc.mulRe, cyc.mulIm);
          const angle = Math.atan2(cyc.mulIm, cyc.mulRe) / (2 * Math.PI);
          const ide = interiorDistance(cr, ci, cyc.wRe, cyc.wIm, period);
          const nucleus = findNucleus(period, { re: c.re.text, im: c.im.text }, digits).nucleus;
          const info = await componentInfo(period, nucleus, digits);
          Object.assign(out, {
            period,
            multiplier: { re: cyc.mulRe, im: cyc.mulIm },
            multiplierModulus: mulAbs,
            internalAngle: angle < 0 ? angle + 1 : angle,
            interiorDistance: ide,
            component: componentJson(info),
          });
          plateSpan = componentSpan(info.size, info.log10Size);
          lines.push(
            `period            ${period}`,
            `multiplier        ${significant(cyc.mulRe, digits)} ${cyc.mulIm < 0 ? '-' : '+'} ${significant(Math.abs(cyc.mulIm), digits)} i  (modulus ${significant(mulAbs, digits)})`,
            `internal angle    ${(angle < 0 ? angle + 1 : angle).toFixed(Math.min(digits, 16))} turns`,
            `interior distance ${significant(ide, digits)}`,
            `-- component --`,
            ...componentLines(info, digits),
          );
        }
      }
      if (ci === 0 && cr <= 0.25) {
        const r = cToR(c.re.text, Math.max(digits, 17));
        out['logistic'] = { r, z: `z = ${r} (1/2 - x)`, x: `x = 1/2 - z / ${r}` };
        lines.push(`-- real slice --`, `logistic r        ${r}  (r = 1 + sqrt(1 - 4c))`, `z and x           z = r (1/2 - x), x = 1/2 - z/r`);
        // The innermost periodic window of period <= 12 holding c (its onset .. crisis end).
        const w = cr >= -2 && cr < -0.75 ? windowOf(c.re.text, WINDOW_PERIODS) : undefined;
        if (w === undefined) {
          lines.push(`window            none of period <= ${WINDOW_PERIODS}`);
        } else {
          const at = (d: { toSignificantDigits(n: number): { toString(): string } }): string => d.toSignificantDigits(15).toString();
          out['window'] = { period: w.period, word: w.word, onsetR: at(w.onset), superstableR: at(w.superstable), doublingR: at(w.doubling), endR: at(w.end) };
          lines.push(
            `window            period ${w.period}, MSS word ${w.word}`,
            `  onset r         ${at(w.onset)}`,
            `  superstable r   ${at(w.superstable)}`,
            `  doubling r      ${at(w.doubling)}`,
            `  end r           ${at(w.end)}`,
          );
        }
      }
      if (o['orbit'] !== undefined) {
        const count = parseInteger(o['orbit'], 'orbit', 1, 100_000);
        const zs = criticalOrbit(cr, ci, count);
        const points = [];
        for (let k = 0; k + 1 < zs.length; k += 2) points.push({ re: zs[k]!, im: zs[k + 1]! });
        const cycle = findJuliaCycle(cr, ci);
        out['criticalOrbit'] = { points, cycle: { kind: cycle.kind, period: cycle.period, points: cycle.pointsRe.map((re, j) => ({ re, im: cycle.pointsIm[j]! })), note: cycle.note } };
        lines.push(`-- critical orbit --`, ...points.map((p, k) => `z_${String(k).padEnd(14)} ${p.re.toPrecision(15)} ${p.im < 0 ? '-' : '+'} ${Math.abs(p.im).toPrecision(15)} i`), `settles on        ${cycle.note}`);
      }
      const julia = juliaCommandLine(c.re.text, c.im.text);
      out['juliaCommand'] = julia;
      const plate = plateCommandLine(c.re.text, c.im.text, plateSpan);
      out['plateCommand'] = plate;
      lines.push(`plate command     ${plate}`, `-- dynamical plane --`, `julia command     ${julia}`);
      process.stdout.write(o['json'] === true ? `${JSON.stringify(out, null, 2)}\n` : `${lines.join('\n')}\n`);
    });
}
