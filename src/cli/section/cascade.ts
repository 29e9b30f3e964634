/**
 * `quadatlas section cascade`: the period-doubling cascade of a family, its
 * Feigenbaum ratios, their accelerated limits with trusted digits, and the
 * accumulation point (docs/methods.md E2, E3); with --window, the cascade inside
 * that periodic window (src/section/window-cascade.ts). Parameters are written to
 * `--digits` places after the decimal point.
 */
import type { Command } from 'commander';
import type { Decimal } from 'decimal.js';
import { toPlaces } from '../../section/decimal-text.js';
import { formatTable, integerCell, type Cell, type SectionTable } from '../../section/section-table.js';
import {
  addOptions,
  clearProgress,
  CSV_OPTION,
  digitsOption,
  FAMILY_OPTION,
  guarded,
  JSON_OPTION,
  parseFamily,
  progressLine,
  tableFormat,
  type SectionOption,
  type Values,
  writeStdout,
} from './section-options.js';
import { optionalInteger } from '../../check/fields.js';
import { parseWindowWord, windowSolver } from '../../section/window-cascade.js';

const DEFAULT_DIGITS = 24;

export const CASCADE_OPTIONS: readonly SectionOption[] = [
  FAMILY_OPTION,
  {
    flags: '--window <word>',
    description: 'the cascade inside the periodic window of this MSS word (e.g. RL: periods 3, 6, 12, ...; see `section windows`); default: the main cascade',
  },
  {
    flags: '--levels <n>',
    description: 'cascade levels: periods 1, 2, 4, ..., 2^k, k from 2 to 22 (default 16 for logistic: delta to about 16 significant digits, alpha to 12; 9 otherwise)',
  },
  digitsOption(DEFAULT_DIGITS, 'the parameters and ratios, from 8 to 500'),
  JSON_OPTION,
  CSV_OPTION,
];

/**
 * A constant shown with only its trusted digits, and no more than `places`
 * after the point; trailing zeros kept, since every digit shown is trusted.
 */
function trusted(value: Decimal, significant: number, places: number): string {
  if (significant <= 0) return 'not trusted';
  const placesTrusted = significant - (value.e + 1);
  if (placesTrusted < 0) return value.toSignificantDigits(significant).toString();
  return value.toFixed(Math.min(placesTrusted, places));
}

/** alpha and delta of order Z from the fixed point, only the digits two truncations agree on (in this thread: a fraction of a second). */
async function fixedPointConstants(order: number, digits: number): Promise<{ alpha: string; delta: string }> {
  const { constantsPlan, agreeingDigits } = await import('../../section/constants/feigenbaum-constants.js');
  const { constantsOnWorkers } = await import('../../render/feigenbaum-pool.js');
  const [a, b] = await constantsOnWorkers(constantsPlan(order, digits), 1, digits + 4);
  return { alpha: agreeingDigits(a!.alpha, b!.alpha).text, delta: agreeingDigits(a!.delta, b!.delta).text };
}

export async function cascadeTable(values: Values, progress: (s: string) => void): Promise<SectionTable> {
  const family = parseFamily(values['family']);
  // 16 logistic levels take about 10 s on 2 cores; decimal.js sin makes the sine family about 40 times slower per step than the BigInt logistic path.
  const word = values['window'] === undefined ? undefined : parseWindowWord(values['window']);
  const p0 = word === undefined ? 1 : word.length + 1;
  // Inside a window every level costs p times more; the default keeps periods below about 2^16 (logistic) or 2^9.
  const levels = optionalInteger(values['levels'], '--levels', 2, 22) ?? Math.max(4, (family.name === 'logistic' ? 16 : 9) - Math.ceil(Math.log2(p0)));
  const digits = optionalInteger(values['digits'], '--digits', 8, 500) ?? DEFAULT_DIGITS;
  const { computeCascade } = await import('../../section/cascade.js');
  const { cascadeSolverFor } = await import('../../section/cascade-solver-for.js');
  // Significant working digits: delta^-n shrinks the gaps by about 0.67 digits per level and two gaps meet in
  // delta_n, so `digits` places of delta_n need that much more; the accelerated limits need 1.4 per level.
  const work = Math.max(digits + 6 + Math.ceil(0.7 * levels), Math.ceil(1.4 * levels) + 24);
  const solver = cascadeSolverFor(family, work);
  const cascadeSolver = word === undefined ? solver.solver : windowSolver(family, word, solver.solver);
  const started = Date.now();
  const cascade = computeCascade(cascadeSolver, levels, work, (l) => progress(`level ${l.level} (period ${l.period}) in ${((Date.now() - started) / 1000).toFixed(1)} s`));
  const toC = solver.toC;
  const p = family.parameter;
  const columns = ['n', 'period', `doubling_${p}`, ...(toC ? ['doubling_c'] : []), `superstable_${p}`, ...(toC ? ['superstable_c'] : []), 'delta_n', 'alpha_n'];
  const at = (v: Decimal | undefined): string => (v === undefined ? '' : toPlaces(v, digits));
  const cOf = (v: Decimal | undefined): string => (v === undefined || toC === undefined ? '' : toPlaces(toC(v, work), digits));
  const rows = cascade.levels.map((l) => {
    const row: Cell[] = [integerCell(l.level), integerCell(p0 * l.period), at(l.doubling)];
    if (toC) row.push(cOf(l.doubling));
    row.push(at(l.superstable));
    if (toC) row.push(cOf(l.superstable));
    row.push(at(l.delta), at(l.alpha));
    return row;
  });
  const acc = cascade.accumulation;
  const summary = [
    {
      name: 'delta',
      value: trusted(cascade.delta.value, cascade.delta.digits, digits),
      note: `${cascade.delta.digits} significant digits trusted, repeated Aitken x${cascade.delta.passes}`,
    },
    {
      name: 'alpha',
      value: trusted(cascade.alpha.value, cascade.alpha.digits, digits),
      note: `${cascade.alpha.digits} significant digits trusted, repeated Aitken x${cascade.alpha.passes}`,
    },
    { name: `${p}_inf`, value: trusted(acc.value, acc.digits, digits), note: `${acc.digits} significant digits trusted, accumulation point` },
  ];
  // Beside the cascade's own estimates: the renormalisation fixed point of the family's order (docs/methods.md E9).
  const fixed = await fixedPointConstants(family.maximumOrder, Math.max(cascade.delta.digits, cascade.alpha.digits) + 10);
  const { roundedAgreement } = await import('../../section/constants/feigenbaum-constants.js');
  const right = (estimate: string, exact: string): number => (estimate === 'not trusted' ? 0 : roundedAgreement(estimate, exact));
  const deltaShown = cascade.delta.digits > 0 ? cascade.delta.value.toPrecision(cascade.delta.digits) : 'not trusted';
  const alphaShown = cascade.alpha.digits > 0 ? cascade.alpha.value.toPrecision(cascade.alpha.digits) : 'not trusted';
  const deltaRight = right(deltaShown, fixed.delta);
  const alphaRight = right(alphaShown, fixed.alpha);
  if (toC && acc.digits > 0) {
    const { Decimal } = await import('decimal.js');
    summary.push({ name: 'c_inf', value: trusted(new Decimal(toC(acc.value, work)), acc.digits, digits), note: `${acc.digits} significant digits, from ${p}_inf` });
  }
  summary.push(
    { name: 'delta (fixed point)', value: fixed.delta, note: `order ${family.maximumOrder}; ${deltaRight} of the cascade's ${cascade.delta.digits} trusted digits agree` },
    { name: 'alpha (fixed point)', value: fixed.alpha, note: `order ${family.maximumOrder}; ${alphaRight} of the cascade's ${cascade.alpha.digits} trusted digits agree` },
  );

  return {
    title:
      word === undefined
        ? `period-doubling cascade of the ${family.name} family ${family.formula}`
        : `period-doubling cascade inside the window ${word} (period ${p0}) of the ${family.name} family ${family.formula}`,
    columns,
    rows,
    summary,
    extra: {
      family: family.name,
      ...(word === undefined ? {} : { window: word, windowPeriod: p0 }),
      digits,
      estimates: {
        delta: { value: toPlaces(cascade.delta.value, digits), significantDigits: cascade.delta.digits },
        alpha: { value: toPlaces(cascade.alpha.value, digits), significantDigits: cascade.alpha.digits },
        accumulation: { value: toPlaces(acc.value, digits), significantDigits: acc.digits },
      },
      fixedPoint: { order: family.maximumOrder, delta: fixed.delta, alpha: fixed.alpha, deltaDigitsAgreeing: deltaRight, alphaDigitsAgreeing: alphaRight },
    },
  };
}

export function register(section: Command): void {
  const cmd = section.command('cascade').description('period-doubling cascade, Feigenbaum delta and alpha, accumulation point');
  addOptions(cmd, CASCADE_OPTIONS);
  cmd.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      const table = await cascadeTable(values, progressLine);
      clearProgress();
      writeStdout(formatTable(table, format));
    }),
  );
}
