/**
 * `quadatlas section entropy`: the topological entropy of the real map along
 * the family parameter, from the kneading sequence of the critical value by
 * the Milnor-Thurston kneading determinant (docs/methods.md E10), as a
 * table and, with --out, an SVG plot carrying its parameters.
 */
import type { Command } from 'commander';
import { doubleToPlaces } from '../../section/decimal-text.js';
import { parameterGrid } from '../../section/parameter-grid.js';
import { formatTable, integerCell, numberCell, type Cell, type SectionTable } from '../../section/section-table.js';
import { UserError } from '../user-error.js';
import { reportWrote } from '../wrote.js';
import { prepareOutput, sectionMetadata, writeOutput } from './section-output.js';
import { addOptions, CSV_OPTION, digitsOption, FAMILY_OPTION, guarded, JSON_OPTION, parseDecimal, parseFamily, parseInteger, tableFormat, type SectionOption, type Values, writeStdout } from './section-options.js';

const DEFAULT_DIGITS = 10;
const MAX_SYMBOLS = 2000;

export const ENTROPY_OPTIONS: readonly SectionOption[] = [
  FAMILY_OPTION,
  { flags: '--r-from <r>', help: 'left end of the parameter axis r (default 3.4 for logistic, else the start of the family range)' },
  { flags: '--r-to <r>', help: 'right end of the parameter axis r (default: full chaos, 4 for logistic)' },
  { flags: '--steps <n>', help: 'parameter values, evenly spaced, both ends included, 1 to 100000 (default 200)' },
  digitsOption(DEFAULT_DIGITS, 'the entropy, 1 to 15'),
  { flags: '--out <file>', help: 'also write the plot to this .svg file (default: table only)' },
  JSON_OPTION,
  CSV_OPTION,
];

export interface EntropyRun {
  readonly table: SectionTable;
  readonly xs: Float64Array;
  readonly ys: Float64Array;
}

export async function entropyRun(values: Values): Promise<EntropyRun> {
  const family = parseFamily(values['family']);
  const from = values['rFrom'] === undefined ? (family.name === 'logistic' ? '3.4' : family.range[0]) : parseDecimal(values['rFrom'], '--r-from');
  const to = values['rTo'] === undefined ? family.range[1] : parseDecimal(values['rTo'], '--r-to');
  const steps = parseInteger(values['steps'], '--steps', 1, 100000, 200);
  const digits = parseInteger(values['digits'], '--digits', 1, 15, DEFAULT_DIGITS);
  const { Decimal } = await import('decimal.js');
  const [lo, hi] = family.range;
  for (const [v, field] of [[from, '--r-from'], [to, '--r-to']] as const) {
    if (new Decimal(v).lt(lo) || new Decimal(v).gt(hi)) throw new UserError(field, `a parameter of the ${family.name} family between ${lo} and ${hi} (beyond full chaos the orbit of the critical point escapes)`, v);
  }
  const { kneadingEntropy, kneadingOrbit } = await import('../../section/entropy.js');
  const grid = parameterGrid(from, to, steps);
  const xs = Float64Array.from(grid, Number);
  const ys = new Float64Array(steps);
  const rows: Cell[][] = grid.map((r, k) => {
    // Working digits: enough for r as written, and 60 so that ~200 symbols stay certain at entropy log 2.
    const work = Math.max(60, r.replace(/^[-+]?0*/, '').length + 10);
    const e = kneadingEntropy(kneadingOrbit(family, r, work, MAX_SYMBOLS));
    ys[k] = e.entropy;
    return [
      r,
      numberCell(e.entropy, doubleToPlaces(e.entropy, digits)),
      e.method === 'periodic' ? `periodic (preperiod ${e.period!.preperiod}, period ${e.period!.period})` : e.method === 'finite' ? 'finite (superstable)' : 'truncated',
      e.below > 0 ? numberCell(e.below, `< ${doubleToPlaces(e.below, 4)}`) : '',
      integerCell(e.symbols),
    ];
  });
  const p = family.parameter;
  return {
    table: {
      title: `topological entropy of the ${family.name} family ${family.formula} from the kneading determinant (Milnor-Thurston), ${steps} values of ${p}`,
      columns: [p, 'entropy', 'kneading', 'entropy_below', 'symbols'],
      rows,
      summary: [
        { name: 'entropy', value: 'log(1/s), s the smallest zero in (0, 1) of D(t) = sum theta_n t^n', note: 'docs/methods.md E10' },
        { name: 'truncated', value: 'entropies below the resolution of the symbols are shown as 0 with a bound', note: 'zeros resolved up to s = exp(-18.4/n)' },
      ],
      extra: { family: family.name, r: { from, to }, steps, digits },
    },
    xs,
    ys,
  };
}

export function register(section: Command): void {
  const cmd = section.command('entropy').description('topological entropy along the parameter from the kneading determinant (table; an SVG plot with --out)');
  addOptions(cmd, ENTROPY_OPTIONS);
  cmd.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      const file = values['out'] === undefined ? undefined : String(values['out']);
      if (file !== undefined) {
        if (!file.toLowerCase().endsWith('.svg')) throw new UserError('--out', 'a file name ending in .svg', file);
        await prepareOutput(file, '--out');
      }
      const started = Date.now();
      const run = await entropyRun(values);
      if (file !== undefined) {
        const { plotSvg } = await import('../../section/plot-svg.js');
        const { svgWithMetadata } = await import('../../io/embed-metadata.js');
        const family = parseFamily(values['family']);
        const svg = plotSvg({ title: `topological entropy, ${family.formula} (kneading determinant)`, xLabel: family.parameter, yLabel: 'entropy', xs: run.xs, ys: run.ys, marks: [], bands: [] });
        await writeOutput(file, svgWithMetadata(svg, sectionMetadata({ kind: 'section-entropy', ...run.table.extra })), '--out');
        reportWrote([file], (Date.now() - started) / 1000);
        if (format === 'text') return;
      }
      writeStdout(formatTable(run.table, format));
    }),
  );
}
