/**
 * `quadatlas section windows`: the periodic windows of a family up to a
 * period, each with its MSS word, onset, superstable parameter, first
 * doubling and end (docs/methods.md E4, E5), and for the logistic family the
 * same points in c and the window's component in the plane. Points are
 * written to `--digits` places; widths and sizes with an exponent and
 * `--digits` significant digits.
 */
import type { Command } from 'commander';
import { Decimal } from 'decimal.js';
import { toExponent, toPlaces } from '../../section/decimal-text.js';
import { formatTable, integerCell, numberCell, type Cell, type SectionTable } from '../../section/section-table.js';
import { UserError } from '../../check/user-error.js';
import {
  addOptions,
  CSV_OPTION,
  digitsOption,
  FAMILY_OPTION,
  guarded,
  JSON_OPTION,
  parseFamily,
  tableFormat,
  type SectionOption,
  type Values,
  writeStdout,
  progressLine,
  clearProgress,
} from './section-options.js';
import { optionalInteger } from '../../check/fields.js';

const DEFAULT_DIGITS = 15;

export const WINDOWS_OPTIONS: readonly SectionOption[] = [
  { ...FAMILY_OPTION, description: `${FAMILY_OPTION.description}; windows need a quadratic maximum (logistic or sine)` },
  { flags: '--max-period <period>', description: 'largest period of the windows listed, 1 to 24 (default 6; period 16 alone has 2048 windows, period 20 has 26214)' },
  digitsOption(DEFAULT_DIGITS, 'the window points, from 4 to 200'),
  JSON_OPTION,
  CSV_OPTION,
];

export async function windowsTable(values: Values): Promise<SectionTable> {
  const family = parseFamily(values['family']);
  if (family.maximumOrder !== 2) throw new UserError('--family', 'a family with a quadratic maximum for windows (logistic or sine)', values['family']);
  const maxPeriod = optionalInteger(values['maxPeriod'], '--max-period', 1, 24) ?? 6;
  const digits = optionalInteger(values['digits'], '--digits', 4, 200) ?? DEFAULT_DIGITS;
  const { findWindows } = await import('../../section/windows.js');
  const { componentOf } = await import('../../section/component-of.js');
  // Significant working digits: `digits` places of parameters near 1..4, and `digits` significant digits of
  // widths that shrink by about 0.6 decimal orders per period (narrowest windows of period p near 4^-p).
  const work = digits + 6 + Math.ceil(0.7 * maxPeriod);
  const started = Date.now();
  // Window counts grow like 2^p / p (OEIS A000048), so each period costs about twice the one before.
  const { windows } = findWindows(family, maxPeriod, work, (period, count) => {
    const s = (Date.now() - started) / 1000;
    const left = period < maxPeriod ? `, about ${(s * (2 ** (maxPeriod - period + 1) - 1)).toFixed(0)} s left` : '';
    progressLine(`windows: periods 1..${period} done, ${count} windows, ${s.toFixed(1)} s${left}`);
  });
  clearProgress();
  const W = Decimal.clone({ precision: work + 10 });
  const p = family.parameter;
  const toC = family.toC;
  const cols = ['onset', 'superstable', 'doubling', 'end'];
  const columns = ['period', 'word', 'kind', ...cols.map((k) => `${k}_${p}`), ...(toC ? cols.map((k) => `${k}_c`) : []), `stable_width_${p}`, `window_width_${p}`];
  if (toC) columns.push('stable_width_c', 'window_width_c', 'nucleus_c', 'size', 'shape');
  const rows = windows.map((w) => {
    const ps = [w.onset, w.superstable, w.doubling, w.end];
    const row: Cell[] = [
      integerCell(w.period),
      w.word === '' ? '(C)' : w.word,
      w.satellite ? 'doubled' : w.period === 1 ? 'main' : 'primitive',
      ...ps.map((v) => toPlaces(v, digits)),
    ];
    const inC = toC ? ps.map((v) => new W(toC(v.toString(), work))) : [];
    row.push(...inC.map((v) => toPlaces(v, digits)));
    row.push(toExponent(w.doubling.minus(w.onset).abs(), digits), toExponent(w.end.minus(w.onset).abs(), digits));
    if (toC) {
      const [on, sup, dbl, end] = inC as [Decimal, Decimal, Decimal, Decimal];
      row.push(toExponent(dbl.minus(on).abs(), digits), toExponent(end.minus(on).abs(), digits));
      const comp = componentOf(w.period, sup.toString());
      row.push(toPlaces(comp.nucleus, digits), numberCell(comp.size, toExponent(comp.size, digits)), comp.shape);
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

export function register(section: Command): void {
  const cmd = section.command('windows').description('periodic windows up to a period: MSS word, onset, superstable, doubling, end, component');
  addOptions(cmd, WINDOWS_OPTIONS);
  cmd.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      writeStdout(formatTable(await windowsTable(values), format));
    }),
  );
}
