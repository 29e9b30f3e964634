/**
 * `quadatlas locate`: one component, from a guess (--near), an external
 * angle (--angle a/b: trace the parameter ray in, land on its component or,
 * for a preperiodic angle, on its Misiurewicz point) or an internal address
 * (--address 1-2-4). Reports nucleus, root, size, shape, parent, angles and
 * address, each confirmed at higher precision before it is printed.
 */
import type { Command } from 'commander';
import { componentInfo } from '../components/component-info.js';
import type { ComponentInfo } from '../components/component-info.js';
import { angleOrbit, angleText, parseAngle } from '../components/external-angle.js';
import type { Angle } from '../components/external-angle.js';
import { addressOfAngle, addressText } from '../components/internal-address.js';
import { nucleusDD } from '../components/fast-nucleus.js';
import { findMisiurewicz } from '../components/misiurewicz.js';
import { findNucleus } from '../components/nucleus.js';
import { periodicNumerators } from '../components/periodic-angles.js';
import { traceRayDD } from '../components/trace-ray.js';
import { parseDecimalPair } from '../precise/decimal-string.js';
import { componentJson, componentLines } from './component-report.js';
import { juliaCommandLine } from './julia-command.js';
import { UserError } from '../check/user-error.js';
import { certifyLocated } from './certify-report.js';
import { parseInteger } from '../check/fields.js';
import { addOptions, type OptionSpec } from './option-spec.js';
import { componentName, parseComponent, tune } from '../components/tuning.js';
import { componentSpan, plateCommandLine } from './plate-command.js';
import { misiurewiczSpan, parseMisiurewiczType, refineMisiurewicz } from '../components/misiurewicz-points.js';
import type { MisiurewiczPoint } from '../components/misiurewicz-points.js';
import { attachAngles } from '../components/misiurewicz-list.js';
import { toNumber } from '../precise/fixed.js';

/** Spans below this are rendered in deep arithmetic: the printed plate command names the nucleus as reference. */
const DEEP_SPAN = 1e-10;

/** Longest period for --angle (the ray is traced in double-double) and for --address (angles are enumerated). */
export const MAX_ANGLE_PERIOD = 60;
export const MAX_ADDRESS_PERIOD = 22;

/** --misiurewicz K,P: each Newton step iterates z K + P + 1 times at about 3.3 D + 2 (K + P) bits; beyond these a step takes seconds. */
export const MAX_MISIUREWICZ_PREPERIOD = 1000;
export const MAX_MISIUREWICZ_PERIOD = 1000;

export const LOCATE_OPTIONS: readonly OptionSpec[] = [
  { flags: '--period <period>', description: 'exact period, an integer from 1 (required with --near; default: from the angle or address)' },
  { flags: '--near <re,im>', description: 'start point for Newton in c, RE,IM as decimals (default: none)' },
  { flags: '--angle <a/b>', description: 'a rational external angle in turns, 0 <= a < b: land its ray (default: none)' },
  { flags: '--address <1-2-4>', description: 'an internal address, increasing periods from 1 (default: none)' },
  {
    flags: '--tune <outer-inner...>',
    description: 'two components OUTER INNER, each an angle pair (1/3,2/3) or an internal address (1-2): the copy of INNER inside OUTER, by Douady-Hubbard tuning (default: none)',
  },
  {
    flags: '--misiurewicz <k,p>',
    description: `a Misiurewicz point of exact preperiod K and period P (z_{K+1+P} = z_{K+1} for the orbit z_1 = c), by Newton from --near; K, P from 1 to ${MAX_MISIUREWICZ_PERIOD} (default: none)`,
  },
  { flags: '--digits <digits>', description: 'digits after the decimal point; sizes to D significant digits (at most 17)', default: '30' },
  { flags: '--certify', description: 'prove the nucleus and the root, disks holding exactly one solution each (default: computed, not proved)' },
  { flags: '--json', description: 'JSON output (default: aligned text)' },
];

export function register(program: Command): void {
  addOptions(program.command('locate').description('Newton to one nucleus of period P from a guess, an external angle or an internal address'), LOCATE_OPTIONS).action(
    async (o: Record<string, unknown>) => {
      const digits = parseInteger(o['digits'], '--digits', 1, 5000);
      const given = ['near', 'angle', 'address', 'tune'].filter((k) => o[k] !== undefined);
      if (o['misiurewicz'] !== undefined && given.join() !== 'near')
        throw new UserError(
          '--misiurewicz',
          'a start point --near RE,IM (and no --angle, --address or --tune)',
          given.length === 0 ? 'no --near' : given.map((g) => `--${g}`).join(' '),
        );
      if (given.length !== 1)
        throw new UserError('locate', 'exactly one of --near, --angle, --address or --tune', given.length === 0 ? 'none' : given.map((g) => `--${g}`).join(' '));
      const period = o['period'] === undefined ? null : parseInteger(o['period'], '--period', 1, 100_000);
      let out: Record<string, unknown>;
      let lines: string[];
      let located: ComponentInfo | null = null;
      if (o['misiurewicz'] !== undefined) {
        const { preperiod: k, period: p } = parseMisiurewiczType(o['misiurewicz'], '--misiurewicz', MAX_MISIUREWICZ_PREPERIOD, MAX_MISIUREWICZ_PERIOD);
        if (period !== null && period !== p) throw new UserError('--period', `the period of --misiurewicz (${p})`, period);
        const near = parseDecimalPair(String(o['near']), '--near');
        const point = refineMisiurewicz(k, p, { re: near.re.text, im: near.im.text }, digits);
        const listed = [{ re: toNumber(point.fixed.re, point.scale), im: toNumber(point.fixed.im, point.scale), angles: [] as Angle[] }];
        const search = attachAngles(k, p, listed);
        const angles = listed[0]!.angles.map(angleText);
        const span = misiurewiczSpan(point, k);
        out = {
          misiurewicz: point.c,
          preperiod: k,
          period: p,
          separationLog2: point.type.log2Separation,
          externalAngles: angles,
          angleSearch: { periods: search.anglePeriods, raysTraced: search.raysTraced },
          plateSpan: span.span,
        };
        const where = search.anglePeriods.length === 0 ? null : `searched periods ${search.anglePeriods.join(', ')}`;
        lines = [
          `Misiurewicz point ${point.c.re}, ${point.c.im}`,
          `preperiod         ${k}`,
          `period            ${p}`,
          `orbit check       z_${k + 1 + p} = z_${k + 1}; z_${k + p} != z_${k}${p > 1 ? ` and z_${k + 1}..z_${k + p} distinct` : ''} (nearest pair 2^${point.type.log2Separation} apart)`,
          `external angles   ${where === null ? 'not searched (preperiod above 40 or too many rays for the ray search)' : `${angles.length > 0 ? angles.join(' ') : 'none found'} (${where})`}`,
        ];
      } else if (o['near'] !== undefined) {
        if (period === null) throw new UserError('--period', 'an integer period with --near', 'nothing');
        const near = parseDecimalPair(String(o['near']), '--near');
        const found = findNucleus(period, { re: near.re.text, im: near.im.text }, digits);
        const info = await componentInfo(period, found.nucleus, digits);
        out = { ...componentJson(info), newtonSteps: found.steps };
        lines = componentLines(info, digits);
        located = info;
      } else if (o['angle'] !== undefined) {
        const angle = parseAngle(String(o['angle']), '--angle');
        const orbit = angleOrbit(angle);
        if (orbit.preperiod + orbit.period > MAX_ANGLE_PERIOD) {
          throw new UserError('--angle', `an angle with preperiod + period at most ${MAX_ANGLE_PERIOD}`, angleText(angle));
        }
        if (orbit.preperiod === 0) {
          if (period !== null && period !== orbit.period) throw new UserError('--period', `the period of angle ${angleText(angle)} (${orbit.period})`, period);
          const info = await landAngle(angle, orbit.period, digits);
          out = componentJson(info);
          lines = componentLines(info, digits);
          located = info;
        } else {
          const p = orbit.period;
          const end = traceRayDD(angle.num, angle.den, 2 * (orbit.preperiod + p) + 8, 8);
          if (!end.ok) throw new UserError('--angle', 'an angle whose ray can be traced in double-double precision', angleText(angle));
          const found = findMisiurewicz(orbit.preperiod, p, end, digits);
          // the orbit's own period may divide the angle's (q rays meeting at each point of the cycle: 5/12 lands on the fixed point alpha)
          const point = refineForAngle(orbit.preperiod, p, found, digits);
          const span = misiurewiczSpan(point, orbit.preperiod);
          out = { misiurewicz: point.c, preperiod: orbit.preperiod, period: point.type.period, anglePeriod: p, externalAngle: angleText(angle), plateSpan: span.span };
          lines = [
            `Misiurewicz point ${point.c.re}, ${point.c.im}`,
            `preperiod         ${orbit.preperiod}`,
            `period            ${point.type.period}${point.type.period === p ? '' : ` (of the orbit; the angle's period is ${p})`}`,
            `external angle    ${angleText(angle)}`,
          ];
        }
      } else if (o['tune'] !== undefined) {
        const names = o['tune'] as string[];
        if (names.length !== 2) throw new UserError('--tune', 'two components OUTER INNER (angle pairs such as 1/3,2/3 or internal addresses such as 1-2)', names.join(' '));
        const outer = parseComponent(names[0]!, '--tune OUTER');
        const inner = parseComponent(names[1]!, '--tune INNER');
        const tuned = tune(outer, inner);
        if (tuned.period > MAX_ANGLE_PERIOD)
          throw new UserError(
            '--tune',
            `two components whose periods multiply to at most ${MAX_ANGLE_PERIOD} (the ray is traced in double-double precision)`,
            `periods ${outer.period} and ${inner.period}`,
          );
        if (period !== null && period !== tuned.period) throw new UserError('--period', `the product of the two periods (${tuned.period})`, period);
        const info = await landAngle(tuned.lo, tuned.period, digits, [tuned.lo, tuned.hi]);
        const tuning = { outer: componentName(outer), inner: componentName(inner), words: tuned.words, angles: [angleText(tuned.lo), angleText(tuned.hi)] };
        out = { ...componentJson(info), tuning };
        lines = [
          `tuning            ${tuning.outer} tuned by ${tuning.inner}${outer.sharing > 1 || inner.sharing > 1 ? ' (of the components sharing an address, the one with the lowest angle)' : ''}`,
          `angle words       ${tuned.words[0]}, ${tuned.words[1]}`,
          ...componentLines(info, digits),
        ];
        located = info;
      } else {
        const address = parseAddress(String(o['address']));
        const p = address[address.length - 1]!;
        if (period !== null && period !== p) throw new UserError('--period', `the last entry of the address (${p})`, period);
        const den = 2 ** p - 1;
        const want = addressText(address);
        const matches = Array.from(periodicNumerators(p, false)).filter((n) => {
          const a = toAngle(n, den);
          return p === 1 ? want === '1' : addressText(addressOfAngle(a, p)) === want;
        });
        if (matches.length === 0) throw new UserError('--address', 'an internal address that some component has', want);
        const info = await landAngle(toAngle(matches[0]!, den), p, digits);
        out = { ...componentJson(info), componentsWithThisAddress: Math.max(1, Math.round(matches.length / (p === 1 ? 1 : 2))) };
        lines = [...componentLines(info, digits), `components with this address  ${String(out['componentsWithThisAddress'])} (the one with the lowest angle is shown)`];
        located = info;
      }
      if (o['certify'] === true) {
        if (located === null) {
          out = { ...out, certified: false };
          lines = [...lines, 'certified         no (Misiurewicz points are not certified)'];
          process.exitCode = 1;
        } else {
          const proof = certifyLocated(located, digits);
          out = { ...out, ...proof.json };
          lines = [...lines, ...proof.lines];
        }
      }
      const found = (out['nucleus'] ?? out['misiurewicz']) as { re: string; im: string } | undefined;
      if (found !== undefined) {
        if (located !== null) {
          const span = componentSpan(located.size, located.log10Size);
          // deep views: the nucleus itself as the reference orbit (one cycle, exactly periodic)
          const extra = span < DEEP_SPAN ? ['--reference', `${found.re},${found.im},${located.period}`] : [];
          out['plateCommand'] = plateCommandLine(found.re, found.im, span, extra);
        } else if (typeof out['plateSpan'] === 'number') {
          out['plateCommand'] = plateCommandLine(found.re, found.im, out['plateSpan']);
          delete out['plateSpan'];
        }
        if (out['plateCommand'] !== undefined) lines.push(`plate command     ${String(out['plateCommand'])}`);
        out['juliaCommand'] = juliaCommandLine(found.re, found.im);
        lines.push(`julia command     ${String(out['juliaCommand'])}`);
      }
      process.stdout.write(o['json'] === true ? `${JSON.stringify(out, null, 2)}\n` : `${lines.join('\n')}\n`);
    },
  );
}

/**
 * The point of preperiod k whose orbit period divides the angle's period p, refined and checked
 * (q rays meeting at each point of the cycle make the orbit's period p / q: 1/7 after a
 * preperiod lands on the fixed point alpha when c is in the 1/3 limb). Divisors are tried from
 * the smallest; the first whose Newton converges to a point of exactly that type is it.
 */
function refineForAngle(k: number, p: number, found: { re: string; im: string }, digits: number): MisiurewiczPoint {
  let last: unknown = null;
  for (let d = 1; d <= p; d += 1) {
    if (p % d !== 0) continue;
    try {
      return refineMisiurewicz(k, d, found, digits, '--angle');
    } catch (e) {
      last = e;
    }
  }
  throw last;
}

function toAngle(n: number, den: number): Angle {
  let a = BigInt(n);
  let b = BigInt(den);
  let x = a;
  let y = b;
  while (y !== 0n) [x, y] = [y, x % y];
  if (a === 0n) return { num: 0n, den: 1n };
  a /= x;
  b /= x;
  return { num: a, den: b };
}

/** Lands the ray of a periodic angle, refines the nucleus and describes the component. */
async function landAngle(angle: Angle, period: number, digits: number, angles?: Angle[]) {
  if (period === 1) return componentInfo(1, { re: '0', im: '0' }, digits, [{ num: 0n, den: 1n }]);
  const end = traceRayDD(angle.num, angle.den, 2 * period, 4);
  const nu = end.ok ? nucleusDD(period, end) : null;
  if (nu === null || !nu.ok) throw new UserError('--angle', 'an angle whose ray lands in double-double precision', angleText(angle));
  const guess = { re: (nu.reHi + nu.reLo).toPrecision(17), im: (nu.imHi + nu.imLo).toPrecision(17) };
  const real = Math.abs(nu.imHi) <= 1e-3 * nu.size;
  const found = findNucleus(period, real ? { re: guess.re, im: '0' } : guess, digits);
  // the other angle of the pair: its numerator over 2^p - 1 is found by the census path in componentInfo for small p
  return componentInfo(period, found.nucleus, digits, angles ?? (period <= 12 ? undefined : [angle]));
}

function parseAddress(text: string): number[] {
  const parts = text.split(/->|-|→/).map((s) => s.trim());
  const nums = parts.map((s) => (/^\d+$/.test(s) ? Number(s) : Number.NaN));
  const ok = nums.length >= 1 && nums[0] === 1 && nums.every((n, i) => Number.isInteger(n) && (i === 0 || n > nums[i - 1]!));
  if (!ok) throw new UserError('--address', 'an internal address such as 1-2-4 (starting at 1, strictly increasing)', text);
  if (nums[nums.length - 1]! > MAX_ADDRESS_PERIOD) throw new UserError('--address', `an internal address ending at a period of at most ${MAX_ADDRESS_PERIOD}`, text);
  return nums;
}
