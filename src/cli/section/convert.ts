/**
 * `quadatlas section convert`: between c and the logistic r, and between the
 * states z and x, at any precision (docs/methods.md E1). Values are written to
 * `--digits` places after the decimal point; given values are echoed as given.
 */
import type { Command } from 'commander';
import { Decimal } from 'decimal.js';
import { cToR, rToC, xToZ, zToX } from '../../section/conjugacy.js';
import { toPlaces } from '../../section/decimal-text.js';
import { formatTable, type SectionTable } from '../../section/section-table.js';
import { Received, UserError } from '../../check/user-error.js';
import { addOptions, CSV_OPTION, digitsOption, guarded, JSON_OPTION, parseDecimal, tableFormat, type SectionOption, type Values, writeStdout } from './section-options.js';
import { optionalInteger } from '../../check/fields.js';

const DEFAULT_DIGITS = 30;

export const CONVERT_OPTIONS: readonly SectionOption[] = [
  { flags: '--c <value>', description: 'a real parameter c of z -> z^2 + c, c <= 1/4 (default: none; give --c or --r)' },
  { flags: '--r <value>', description: 'a logistic parameter r (default: none; give --c or --r)' },
  { flags: '--x <value>', description: 'a logistic state x, converted to z at the parameter (default: none)' },
  { flags: '--z <value>', description: 'a quadratic state z, converted to x at the parameter (default: none)' },
  digitsOption(DEFAULT_DIGITS, 'the converted values'),
  JSON_OPTION,
  CSV_OPTION,
];

/** The size of the decimal exponent of a nonzero value (0 for zero): x = 1/2 - z/r grows as r shrinks. */
function decimalOrder(s: string): number {
  const v = new Decimal(s);
  return v.isZero() ? 0 : Math.abs(v.e);
}

export function convertTable(values: Values): SectionTable {
  const digits = optionalInteger(values['digits'], '--digits', 0, 10000) ?? DEFAULT_DIGITS;
  // Significant digits that cover `digits` places: c grows like r^2, z like r x and x like z / r, so add twice the inputs' decimal orders, plus guards.
  const order = Math.max(0, ...(['c', 'r', 'x', 'z'] as const).filter((k) => typeof values[k] === 'string').map((k) => decimalOrder(parseDecimal(values[k], `--${k}`))));
  const work = digits + 16 + 2 * order;
  const at = (s: string): string => toPlaces(s, digits);
  const given = ['c', 'r'].filter((k) => values[k] !== undefined);
  if (given.length !== 1) throw new UserError('--c/--r', 'exactly one of --c and --r', new Received(given.length === 0 ? 'neither' : 'both'));
  let c: string;
  let r: string;
  if (values['c'] !== undefined) {
    c = parseDecimal(values['c'], '--c');
    try {
      r = at(cToR(c, work));
    } catch {
      throw new UserError('--c', 'a real c <= 1/4 (larger c has no real logistic r)', values['c']);
    }
  } else {
    r = parseDecimal(values['r'], '--r');
    c = at(rToC(r, work));
  }
  const row = [c, r];
  const columns = ['c', 'r'];
  if (values['x'] !== undefined && values['z'] !== undefined) throw new UserError('--x/--z', 'at most one of --x and --z', new Received('both'));
  if (values['x'] !== undefined) {
    const x = parseDecimal(values['x'], '--x');
    columns.push('x', 'z');
    row.push(x, at(xToZ(x, r, work)));
  } else if (values['z'] !== undefined) {
    const z = parseDecimal(values['z'], '--z');
    if (Number(r) === 0) throw new UserError('--r', 'a nonzero r for a state conversion', values['r']);
    columns.push('x', 'z');
    row.push(at(zToX(z, r, work)), z);
  }
  return {
    title: 'logistic x -> r x (1 - x)  <->  quadratic z -> z^2 + c   (c = r/2 - r^2/4, r = 1 + sqrt(1 - 4c), z = r (1/2 - x))',
    columns,
    rows: [row],
    summary: [
      { name: 'orientation', value: 'flipped', note: 'x > 1/2 exactly when z < 0; on r >= 1, c decreases as r increases' },
      { name: 'branch', value: 'r >= 1', note: 'r and 2 - r give the same c' },
    ],
    extra: { digits },
  };
}

export function register(section: Command): void {
  const cmd = section.command('convert').description('convert between c and the logistic r (and between z and x) at any precision');
  addOptions(cmd, CONVERT_OPTIONS);
  cmd.action(
    guarded((values: Values) => {
      writeStdout(formatTable(convertTable(values), tableFormat(values)));
    }),
  );
}
