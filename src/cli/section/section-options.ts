/**
 * The flags of the `section` subcommands, declared once per subcommand as a
 * table: commander's parser and --help are built from it, and
 * `applySectionFlags` writes the flag values into a raw sheet, recording
 * which flag set which field so that the sheet's checker names the flag in
 * its errors. Shared parsers for the table-only subcommands live here too.
 * Every help line states its default and unit.
 */
import type { Command } from 'commander';
import { FAMILIES } from '../../section/families/index.js';
import type { FieldOrigin, Json } from '../../section/sheet-fields.js';
import type { TableFormat } from '../../section/section-table.js';
import type { UnimodalFamily } from '../../section/unimodal-family.js';
import { Received, UserError } from '../../check/user-error.js';
import { ConvergenceError, isIntegerText, optionalInteger, parseDecimalText, parseSize } from '../../check/fields.js';
import { addOptions, type OptionSpec } from '../option-spec.js';
export { addOptions };

export type Values = Record<string, unknown>;

/** Section commands use the one option shape of every command. */
export type SectionOption = OptionSpec;

export const FAMILY_NAMES = [...FAMILIES.keys()];

/** An integer as a number; anything else stays text, for the checker to refuse by name. */
export function integerText(text: string): unknown {
  return isIntegerText(text) ? Number(text) : text;
}

/** "WxH" -> { width, height }. */
export function sizeText(flag: string): (text: string) => unknown {
  return (text) => {
    const [width, height] = parseSize(text, flag);
    return { width, height };
  };
}

/** The long flag of a spec: "--r-from <r>" -> "--r-from". */
export function longFlag(flags: string): string {
  return flags.split(/[ ,|]+/).find((f) => f.startsWith('--'))!;
}

/** commander's attribute name for a flag: "--no-sidecar" -> "sidecar", "--r-from <r>" -> "rFrom". */
export function attributeName(flags: string): string {
  return longFlag(flags)
    .replace(/^--(no-)?/, '')
    .replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
}

function setPath(raw: Json, path: string, value: unknown): void {
  const keys = path.split('.');
  let obj = raw;
  for (const key of keys.slice(0, -1)) {
    const next = obj[key];
    if (typeof next === 'object' && next !== null && !Array.isArray(next)) obj = next as Json;
    else {
      const fresh: Json = {};
      obj[key] = fresh;
      obj = fresh;
    }
  }
  obj[keys[keys.length - 1]!] = value;
}

/**
 * Writes the given flags into `raw` (flags override the sheet) and returns
 * which flag set which field. A `--no-X` flag sets its field to false only
 * when given (commander reports true otherwise).
 */
export function applySectionFlags(raw: Json, values: Values, options: readonly SectionOption[]): FieldOrigin {
  const origin: Record<string, string> = {};
  for (const o of options) {
    if (o.field === undefined) continue;
    const v = values[attributeName(o.flags)];
    const negated = longFlag(o.flags).startsWith('--no-');
    if (negated ? v !== false : typeof v !== 'string') continue;
    setPath(raw, o.field, negated ? false : (o.value ?? ((t: string) => t))(v as string));
    origin[o.field] = longFlag(o.flags);
  }
  return origin;
}

// Options shared by several subcommands, with their defaults stated.
export const FAMILY_OPTION: SectionOption = { flags: '--family <name>', description: `the unimodal family: ${FAMILY_NAMES.join(', ')} (default logistic)`, field: 'family' };
export const JSON_OPTION: SectionOption = { flags: '--json', description: 'write the table as JSON to stdout (default: aligned text)' };
export const CSV_OPTION: SectionOption = { flags: '--csv', description: 'write the table as CSV to stdout (default: aligned text)' };
export const WORKERS_OPTION: SectionOption = { flags: '--workers <n>', description: 'worker threads (default: all cores); never changes the output' };
export const NO_SIDECAR_OPTION: SectionOption = {
  flags: '--no-sidecar',
  description: 'do not write the JSON sidecar FILE.json beside the output (default: write it)',
  field: 'output.sidecar',
};
export function againOption(kind: string): SectionOption {
  return { flags: '--again <file>', description: `render again from the sheet stored in a PNG, SVG or JSON sidecar that a ${kind} run wrote (default: none)` };
}
export function digitsOption(fallback: number, what: string): SectionOption {
  return { flags: '--digits <digits>', description: `digits after the decimal point of ${what}; values written with an exponent carry D significant digits (default ${fallback})` };
}

export function parseFamily(value: unknown): UnimodalFamily {
  const name = value === undefined ? 'logistic' : String(value);
  const family = FAMILIES.get(name);
  if (family === undefined) throw new UserError('--family', `one of ${FAMILY_NAMES.join(', ')}`, value);
  return family;
}

export function parseDecimal(value: unknown, field: string): string {
  return parseDecimalText(value, field, 'a decimal number (e.g. -1.75 or 3.5e0)');
}

export function tableFormat(values: Values): TableFormat {
  if (values['json'] === true && values['csv'] === true) throw new UserError('--json/--csv', 'at most one of --json and --csv', new Received('both'));
  return values['json'] === true ? 'json' : values['csv'] === true ? 'csv' : 'text';
}

export function parseWorkers(value: unknown): number {
  const { availableParallelism } = process as unknown as { availableParallelism?: () => number };
  return optionalInteger(value, '--workers', 1, 256) ?? availableParallelism?.() ?? 2;
}

/**
 * Runs an action; a Newton that did not settle is not the user's fault nor a
 * crash: it is reported as one line with exit code 1.
 */
export function guarded<A extends unknown[]>(action: (...args: A) => Promise<void> | void): (...args: A) => Promise<void> {
  return async (...args) => {
    try {
      await action(...args);
    } catch (err) {
      if (err instanceof ConvergenceError) {
        process.stderr.write(`quadatlas: no convergence: ${err.message.split('\n')[0]}\n`);
        process.exitCode = 1;
        return;
      }
      throw err;
    }
  };
}

export function progressLine(s: string): void {
  if (process.stderr.isTTY) process.stderr.write(`\r\x1b[K${s}`);
}

export function clearProgress(): void {
  if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
}

export function writeStdout(s: string): void {
  process.stdout.write(s);
}
