/**
 * `quadatlas probe RE,IM`: everything about one parameter c. Outside the
 * set: iteration count, smooth count, exterior distance estimate. Inside a
 * hyperbolic component: period of the attracting cycle, multiplier, internal
 * angle, interior distance estimate, and the component (nucleus, root,
 * size, shape, angles, address). For real c also the logistic parameter r
 * and the map between z and x.
 */
import type { Command } from 'commander';
import { parseDecimalPair } from '../precise/decimal-string.js';
import { MAX_ANGLE_LEVEL, probePoint } from '../section/probe-point.js';
import { juliaCommandLine } from './julia-command.js';
import { parseInteger } from '../check/fields.js';
import { addOptions, type OptionSpec } from './option-spec.js';
import { componentSpan, plateCommandLine } from './plate-command.js';

export const PROBE_OPTIONS: readonly OptionSpec[] = [
  { flags: '--digits <digits>', description: 'digits after the decimal point; multipliers, distances and sizes to D significant digits (at most 17)', default: '20' },
  { flags: '--iterations <n>', description: 'iteration limit of the escape test', default: '100000' },
  { flags: '--max-period <period>', description: 'longest attracting cycle looked for, in iterations', default: '1000' },
  {
    flags: '--angle-bits <n>',
    description: `binary digits of the external angle of an exterior c, traced outward along its ray (default 64; exterior c escaping within ${MAX_ANGLE_LEVEL} iterations)`,
  },
  { flags: '--orbit <n>', description: 'also list the first n points of the critical orbit and the cycle it settles on (default: none)' },
  { flags: '--json', description: 'JSON output (default: aligned text)' },
];

export function register(program: Command): void {
  addOptions(
    program
      .command('probe')
      .description('everything known about one parameter c')
      .argument('<re,im>', 'the parameter c as RE,IM (write `probe -- -1.76,0.01` when RE is negative, or give RE and IM apart)')
      .argument('[im]', 'IM, when RE and IM are given as two arguments'),
    PROBE_OPTIONS,
  ).action(async (first: string, second: string | undefined, o: Record<string, unknown>) => {
    const c = parseDecimalPair(second === undefined ? first : `${first},${second}`, 'c');
    const digits = parseInteger(o['digits'], '--digits', 1, 2000);
    const iterations = parseInteger(o['iterations'], '--iterations', 1, 100_000_000);
    const maxPeriod = parseInteger(o['maxPeriod'], '--max-period', 1, 100_000);
    const angleBits = o['angleBits'] === undefined ? undefined : parseInteger(o['angleBits'], '--angle-bits', 1, MAX_ANGLE_LEVEL + 50);
    const { json: out, lines } = await probePoint(c, {
      digits,
      iterations,
      maxPeriod,
      ...(o['orbit'] === undefined ? {} : { orbit: parseInteger(o['orbit'], 'orbit', 1, 100_000) }),
      ...(angleBits === undefined ? {} : { angleBits }),
    });
    // A plate framing c: 20 distance estimates wide outside, the component's size inside.
    const comp = out['component'] as { size?: number | string } | undefined;
    const de = out['exteriorDistance'];
    const size = comp === undefined ? Number.NaN : Number(comp.size);
    const plateSpan = typeof de === 'number' && de > 0 ? 20 * de : size > 0 ? componentSpan(size, Math.log10(size)) : 0.01;
    const julia = juliaCommandLine(c.re.text, c.im.text);
    out['juliaCommand'] = julia;
    const plate = plateCommandLine(c.re.text, c.im.text, plateSpan);
    out['plateCommand'] = plate;
    lines.push(`plate command     ${plate}`, `-- dynamical plane --`, `julia command     ${julia}`);
    process.stdout.write(o['json'] === true ? `${JSON.stringify(out, null, 2)}\n` : `${lines.join('\n')}\n`);
  });
}
