/**
 * `quadatlas section ...`: the real slice. Subcommands convert, cascade,
 * windows, lyapunov, diagram and compare. This file parses and validates
 * flags, calls src/section/, and writes; the mathematics lives there.
 */
import type { Command } from 'commander';
import type { Decimal } from 'decimal.js';
import { cToR, rToC, xToZ, zToX } from '../section/conjugacy.js';
import { FAMILIES } from '../section/families/index.js';
import { formatTable, type SectionTable, type TableFormat } from '../section/section-table.js';
import type { UnimodalFamily } from '../section/unimodal-family.js';
import { Received, UserError } from './user-error.js';

const FAMILY_NAMES = [...FAMILIES.keys()];

/** Every option of every subcommand, declared once: flags and help text. */
const OPTION = {
  family: ['--family <name>', `the unimodal family: ${FAMILY_NAMES.join(', ')} (default logistic)`],
  digits: ['--digits <n>', 'significant digits of the parameters'],
  json: ['--json', 'write the table as JSON to stdout'],
  csv: ['--csv', 'write the table as CSV to stdout'],
  levels: ['--levels <k>', 'cascade levels: periods 1, 2, 4, ..., 2^k (default 12)'],
  maxPeriod: ['--max-period <p>', 'largest period of the windows listed (default 6)'],
  from: ['--from <value>', 'start of the parameter range'],
  to: ['--to <value>', 'end of the parameter range'],
  steps: ['--steps <n>', 'number of parameter values (default 1000)'],
  transient: ['--transient <n>', 'iterations discarded before measuring'],
  iterations: ['--iterations <n>', 'iterations measured per parameter'],
  out: ['--out <file>', 'output file'],
  size: ['--size <WxH>', 'image size in pixels, e.g. 2000x1000'],
  samples: ['--samples <k>', 'jittered parameter samples per pixel column (default 4)'],
  depth: ['--depth <bits>', 'bits per channel: 8 or 16 (default 16)'],
  workers: ['--workers <n>', 'worker threads (default: all cores); never changes the output'],
} as const satisfies Record<string, readonly [string, string]>;

type Values = Record<string, unknown>;

export function parseFamily(value: unknown): UnimodalFamily {
  const name = value === undefined ? 'logistic' : String(value);
  const family = FAMILIES.get(name);
  if (family === undefined) throw new UserError('--family', `one of ${FAMILY_NAMES.join(', ')}`, value);
  return family;
}

export function parseInteger(value: unknown, field: string, min: number, max: number, fallback: number): number {
  if (value === undefined) return fallback;
  const n = typeof value === 'string' && /^\s*\d+\s*$/.test(value) ? Number(value) : NaN;
  if (!Number.isInteger(n) || n < min || n > max) throw new UserError(field, `an integer between ${min} and ${max}`, value);
  return n;
}

const DECIMAL = /^\s*[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?\s*$/;

export function parseDecimal(value: unknown, field: string): string {
  if (typeof value !== 'string' || !DECIMAL.test(value)) throw new UserError(field, 'a decimal number (e.g. -1.75 or 3.5e0)', value);
  return value.trim();
}

export function tableFormat(values: Values): TableFormat {
  if (values['json'] === true && values['csv'] === true) throw new UserError('--json/--csv', 'at most one of --json and --csv', new Received('both'));
  return values['json'] === true ? 'json' : values['csv'] === true ? 'csv' : 'text';
}

function show(v: Decimal, digits: number): string {
  const s = v.toSignificantDigits(digits).toString();
  return s === '-0' ? '0' : s;
}

// ---------------------------------------------------------------- convert

export function convertTable(values: Values): SectionTable {
  const digits = parseInteger(values['digits'], '--digits', 1, 10000, 30);
  const given = ['c', 'r'].filter((k) => values[k] !== undefined);
  if (given.length !== 1) throw new UserError('--c/--r', 'exactly one of --c and --r', new Received(given.length === 0 ? 'neither' : 'both'));
  let c: string;
  let r: string;
  if (values['c'] !== undefined) {
    c = parseDecimal(values['c'], '--c');
    try {
      r = cToR(c, digits);
    } catch {
      throw new UserError('--c', 'a real c <= 1/4 (larger c has no real logistic r)', values['c']);
    }
  } else {
    r = parseDecimal(values['r'], '--r');
    c = rToC(r, digits);
  }
  const row = [c, r];
  const columns = ['c', 'r'];
  if (values['x'] !== undefined && values['z'] !== undefined) throw new UserError('--x/--z', 'at most one of --x and --z', new Received('both'));
  if (values['x'] !== undefined) {
    const x = parseDecimal(values['x'], '--x');
    columns.push('x', 'z');
    row.push(x, xToZ(x, r, digits));
  } else if (values['z'] !== undefined) {
    const z = parseDecimal(values['z'], '--z');
    if (Number(r) === 0) throw new UserError('--r', 'a nonzero r for a state conversion', values['r']);
    columns.push('x', 'z');
    row.push(zToX(z, r, digits), z);
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

// ---------------------------------------------------------------- cascade

export async function cascadeTable(values: Values, progress: (s: string) => void): Promise<SectionTable> {
  const family = parseFamily(values['family']);
  const levels = parseInteger(values['levels'], '--levels', 2, 22, 12);
  const digits = parseInteger(values['digits'], '--digits', 10, 500, 25);
  const { computeCascade } = await import('../section/cascade.js');
  const { cascadeSolverFor } = await import('../section/cascade-solver-for.js');
  // delta^-n shrinks the gaps by about 0.67 digits per level; two gaps meet in delta_n.
  const work = Math.max(digits, Math.ceil(1.4 * levels) + 24);
  const solver = cascadeSolverFor(family, work);
  const started = Date.now();
  const cascade = computeCascade(solver.solver, levels, work, (l) => progress(`level ${l.level} (period ${l.period}) in ${((Date.now() - started) / 1000).toFixed(1)} s`));
  const withC = solver.toC !== undefined;
  const p = family.parameter;
  const columns = ['n', 'period', `doubling_${p}`, ...(withC ? ['doubling_c'] : []), `superstable_${p}`, ...(withC ? ['superstable_c'] : []), 'delta_n', 'alpha_n'];
  const fmt = (v: Decimal | undefined): string => (v === undefined ? '' : show(v, digits));
  const rows = cascade.levels.map((l) => {
    const row = [String(l.level), String(l.period), fmt(l.doubling)];
    if (withC) row.push(l.doubling === undefined ? '' : solver.toC!(l.doubling, digits));
    row.push(fmt(l.superstable));
    if (withC) row.push(solver.toC!(l.superstable, digits));
    row.push(l.delta === undefined ? '' : show(l.delta, 16), l.alpha === undefined ? '' : show(l.alpha, 16));
    return row;
  });
  // toPrecision keeps trailing zeros: every digit shown is a digit trusted.
  const trusted = (a: { value: Decimal; digits: number }): string => (a.digits > 0 ? a.value.toPrecision(a.digits) : 'not trusted');
  const acc = cascade.accumulation;
  const summary = [
    { name: 'delta', value: trusted(cascade.delta), note: `${cascade.delta.digits} digits trusted, repeated Aitken x${cascade.delta.passes}` },
    { name: 'alpha', value: trusted(cascade.alpha), note: `${cascade.alpha.digits} digits trusted, repeated Aitken x${cascade.alpha.passes}` },
    { name: `${p}_inf`, value: trusted(acc), note: `${acc.digits} digits trusted, accumulation point` },
  ];
  if (withC && acc.digits > 0) summary.push({ name: 'c_inf', value: solver.toC!(acc.value, acc.digits), note: `${acc.digits} digits, from ${p}_inf` });
  return {
    title: `period-doubling cascade of the ${family.name} family ${family.formula}`,
    columns,
    rows,
    summary,
    extra: {
      family: family.name,
      digits,
      seconds: (Date.now() - started) / 1000,
      estimates: {
        delta: { value: show(cascade.delta.value, digits), digits: cascade.delta.digits },
        alpha: { value: show(cascade.alpha.value, digits), digits: cascade.alpha.digits },
        accumulation: { value: show(acc.value, digits), digits: acc.digits },
      },
    },
  };
}

// ---------------------------------------------------------------- windows

export async function windowsTable(values: Values): Promise<SectionTable> {
  const family = parseFamily(values['family']);
  if (family.maximumOrder !== 2) throw new UserError('--family', 'a family with a quadratic maximum for windows (logistic or sine)', values['family']);
  const maxPeriod = parseInteger(values['maxPeriod'], '--max-period', 1, 16, 6);
  const digits = parseInteger(values['digits'], '--digits', 6, 200, 15);
  const { findWindows } = await import('../section/windows.js');
  const { componentOf } = await import('../section/component-of.js');
  const { windows } = findWindows(family, maxPeriod, digits + 4);
  const p = family.parameter;
  const withC = family.toC !== undefined;
  const cols = ['onset', 'superstable', 'doubling', 'end'];
  const columns = ['period', 'word', 'kind', ...cols.map((k) => `${k}_${p}`), ...(withC ? cols.map((k) => `${k}_c`) : []), `stable_width_${p}`, `window_width_${p}`];
  if (withC) columns.push('stable_width_c', 'window_width_c', 'nucleus_c', 'size', 'shape');
  const rows = windows.map((w) => {
    const ps = [w.onset, w.superstable, w.doubling, w.end];
    const row = [String(w.period), w.word === '' ? '(C)' : w.word, w.satellite ? 'doubled' : w.period === 1 ? 'main' : 'primitive', ...ps.map((v) => show(v, digits))];
    if (withC) row.push(...ps.map((v) => family.toC!(v.toString(), digits)));
    row.push(show(w.doubling.minus(w.onset).abs(), 6), show(w.end.minus(w.onset).abs(), 6));
    if (withC) {
      const [on, , dbl, end] = ps.map((v) => Number(family.toC!(v.toString(), 20)));
      row.push(Math.abs(dbl! - on!).toPrecision(6), Math.abs(end! - on!).toPrecision(6));
      const comp = componentOf(w.period, family.toC!(w.superstable.toString(), digits));
      row.push(comp.nucleus, comp.size.toPrecision(6), comp.shape);
    }
    return row;
  });
  const counts = Array.from({ length: maxPeriod }, (_, i) => windows.filter((w) => w.period === i + 1).length);
  return {
    title: `periodic windows of the ${family.name} family ${family.formula}, periods 1..${maxPeriod}, in increasing ${p}`,
    columns,
    rows,
    summary: [{ name: 'windows per period', value: counts.join(' '), note: 'equal to the real components per period (OEIS A000048)' }],
    extra: { family: family.name, digits, countsByPeriod: counts },
  };
}

// ---------------------------------------------------------------- register

function opt(cmd: Command, key: keyof typeof OPTION): Command {
  const [flags, text] = OPTION[key];
  return cmd.option(flags, text);
}

function write(s: string): void {
  process.stdout.write(s);
}

function progressLine(s: string): void {
  if (process.stderr.isTTY) process.stderr.write(`\r\x1b[K${s}`);
}

export function register(program: Command): void {
  const section = program.command('section').description('the real slice: convert, cascade, windows, lyapunov, diagram, compare');

  const convert = section
    .command('convert')
    .description('convert between c and the logistic r (and between z and x) at any precision')
    .option('--c <value>', 'a real parameter c of z -> z^2 + c (c <= 1/4)')
    .option('--r <value>', 'a logistic parameter r')
    .option('--x <value>', 'a logistic state x (needs the parameter)')
    .option('--z <value>', 'a quadratic state z (needs the parameter)');
  for (const k of ['digits', 'json', 'csv'] as const) opt(convert, k);
  convert.action((values: Values) => {
    write(formatTable(convertTable(values), tableFormat(values)));
  });

  const cascade = section.command('cascade').description('period-doubling cascade, Feigenbaum delta and alpha, accumulation point');
  for (const k of ['family', 'levels', 'digits', 'json', 'csv'] as const) opt(cascade, k);
  cascade.action(async (values: Values) => {
    const format = tableFormat(values);
    const table = await cascadeTable(values, progressLine);
    if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
    write(formatTable(table, format));
  });

  const windows = section.command('windows').description('periodic windows up to a period: MSS word, onset, superstable, doubling, end, component');
  for (const k of ['family', 'maxPeriod', 'digits', 'json', 'csv'] as const) opt(windows, k);
  windows.action(async (values: Values) => {
    const format = tableFormat(values);
    write(formatTable(await windowsTable(values), format));
  });
}
