/**
 * Everything about one parameter c, as `quadatlas probe` prints it and the
 * survey page shows it. Outside the set: iteration count, smooth count,
 * exterior distance estimate. Inside a hyperbolic component: period of the
 * attracting cycle, multiplier, internal angle, interior distance estimate,
 * and the component (nucleus, root, size, shape, angles, address). For real
 * c also the logistic parameter r and the window holding it.
 */
import { attractingCycle, createCycleResult } from '../plane/attracting-cycle.js';
import { exteriorDistance } from '../plane/exterior-distance.js';
import { interiorDistance } from '../plane/interior-distance.js';
import { smoothCount } from '../plane/smooth-count.js';
import { cToR } from './conjugacy.js';
import { windowOf } from './window-of.js';
import { componentInfo } from '../components/component-info.js';
import { componentJson, componentLines, significant } from '../components/component-json.js';
import { findNucleus } from '../components/nucleus.js';
import { decimalToNumber, type DecimalPair } from '../precise/decimal-string.js';
import { criticalOrbit } from '../dynamic/critical-orbit.js';
import { findJuliaCycle } from '../dynamic/julia-cycle.js';
import { externalAngleOf } from '../components/ray-out.js';
import { Received, UserError } from '../check/user-error.js';

/** Periods searched for the window that holds a real c (the windows of period <= 10 list in well under a second). */
const WINDOW_PERIODS = 10;
const ESCAPE_RADIUS = 1e6;

export interface ProbeOptions {
  /** Digits after the decimal point; multipliers, distances and sizes to this many significant digits. */
  readonly digits: number;
  readonly iterations: number;
  readonly maxPeriod: number;
  /** List the first n points of the critical orbit and the cycle it settles on. */
  readonly orbit?: number;
  /** Binary digits of the external angle of an exterior c (default 64); given explicitly, a c that cannot be traced is refused. */
  readonly angleBits?: number;
}

/** Longest escape for which the external angle is traced outward (the trace costs about 16 n^2 iterations). */
export const MAX_ANGLE_LEVEL = 4000;

/** The probe of c as JSON-able data and as aligned text lines. */
export interface ProbeReport {
  readonly json: Record<string, unknown>;
  readonly lines: string[];
}

export async function probePoint(c: DecimalPair, options: ProbeOptions): Promise<ProbeReport> {
  const { digits, iterations, maxPeriod } = options;
  const cr = decimalToNumber(c.re);
  const ci = decimalToNumber(c.im);
  const out: Record<string, unknown> = { c: { re: c.re.text, im: c.im.text } };
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
    lines.push(
      `escapes           yes, after ${n} iterations (radius 1e6)`,
      `smooth count      ${mu.toFixed(Math.min(digits, 12))}`,
      `distance estimate ${significant(de, digits)} (the distance to the set lies between a quarter of this and this)`,
    );
    // external angle by the ray traced outward (docs/methods.md D5)
    const ray = externalAngleOf(cr, ci, options.angleBits ?? 64, MAX_ANGLE_LEVEL);
    if (ray === null) {
      if (options.angleBits !== undefined)
        throw new UserError(
          '--angle-bits',
          `a c whose orbit escapes within ${MAX_ANGLE_LEVEL} iterations, so that its ray can be traced outward in double precision`,
          new Received(`c = ${c.re.text}, ${c.im.text}`),
        );
      out['externalAngle'] = null;
      lines.push(`external angle    not traced (the orbit escapes after more than ${MAX_ANGLE_LEVEL} iterations)`);
    } else {
      out['externalAngle'] = { binary: `0.${ray.digits}`, digits: ray.digits.length, certainDigits: ray.certain, turns: ray.turns };
      out['potential'] = ray.potential;
      lines.push(
        `external angle    0.${ray.digits} (binary; ${ray.certain} of ${ray.digits.length} digits certain)`,
        `  in turns        ${ray.turns.toPrecision(16)}`,
        `potential G(c)    ${significant(ray.potential, digits)}`,
      );
    }
  } else {
    if (options.angleBits !== undefined)
      throw new UserError(
        '--angle-bits',
        'a c outside the Mandelbrot set (an external angle belongs to an exterior c)',
        new Received(`c = ${c.re.text}, ${c.im.text}, whose orbit stays bounded for ${iterations} iterations`),
      );
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
  if (options.orbit !== undefined) {
    const count = options.orbit;
    const zs = criticalOrbit(cr, ci, count);
    const points = [];
    for (let k = 0; k + 1 < zs.length; k += 2) points.push({ re: zs[k]!, im: zs[k + 1]! });
    const cycle = findJuliaCycle(cr, ci);
    out['criticalOrbit'] = { points, cycle: { kind: cycle.kind, period: cycle.period, points: cycle.pointsRe.map((re, j) => ({ re, im: cycle.pointsIm[j]! })), note: cycle.note } };
    lines.push(
      `-- critical orbit --`,
      ...points.map((p, k) => `z_${String(k).padEnd(14)} ${p.re.toPrecision(15)} ${p.im < 0 ? '-' : '+'} ${Math.abs(p.im).toPrecision(15)} i`),
      `settles on        ${cycle.note}`,
    );
  }
  return { json: out, lines };
}
