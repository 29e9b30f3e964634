/**
 * `quadatlas section lyapunov [SHEET]`: the Lyapunov exponent along the
 * family parameter r (docs/methods.md E6) as a table, and with an output file an
 * SVG or PNG plot that carries its sheet. Flags override the sheet;
 * `--again FILE` takes the sheet from a plot (or its sidecar) written before.
 */
import type { Command } from 'commander';
import { FAMILIES } from '../../section/families/index.js';
import { rToC } from '../../section/conjugacy.js';
import { doubleToPlaces, toExponent, toPlaces } from '../../section/decimal-text.js';
import { lyapunovRecord, parseLyapunovSheet, type LyapunovSheet } from '../../section/lyapunov-sheet.js';
import { gridPlaces, parameterGrid } from '../../section/parameter-grid.js';
import { formatTable, numberCell, type Cell, type SectionTable } from '../../section/section-table.js';
import { reportWrote } from '../wrote.js';
import { againOutput, loadSectionSheet } from './load-section-sheet.js';
import { plotFileBytes, prepareOutput, sectionMetadata, writeOutput, writeSidecar } from './section-output.js';
import {
  addOptions,
  againOption,
  applySectionFlags,
  CSV_OPTION,
  digitsOption,
  FAMILY_OPTION,
  guarded,
  integerText,
  JSON_OPTION,
  NO_SIDECAR_OPTION,
  tableFormat,
  type SectionOption,
  type Values,
  writeStdout,
} from './section-options.js';
import { optionalInteger } from '../../check/fields.js';

const DEFAULT_DIGITS = 6;

export const LYAPUNOV_OPTIONS: readonly SectionOption[] = [
  FAMILY_OPTION,
  { flags: '--r-from <r>', description: 'left end of the parameter axis r (default 2.8 logistic, 0.7 sine, 0.6 quartic)', field: 'r.from' },
  { flags: '--r-to <r>', description: 'right end of the parameter axis r (default 4 logistic, 1 sine, 2^(1/3) quartic)', field: 'r.to' },
  { flags: '--steps <n>', description: 'parameter values, evenly spaced, both ends included, 2 to 1000000 (default 1000)', field: 'steps', value: integerText },
  { flags: '--transient <n>', description: 'iterations discarded per start before measuring (default 1000)', field: 'transient', value: integerText },
  { flags: '--iterations <n>', description: 'iterations measured per start (default 10000)', field: 'iterations', value: integerText },
  { flags: '--starts <n>', description: 'initial states averaged per parameter, 1 to 64; their spread is reported (default 3)', field: 'starts', value: integerText },
  digitsOption(DEFAULT_DIGITS, 'the exponent in text and CSV (JSON carries full doubles)'),
  { flags: '--out <file>', description: 'also write the plot to this file, .svg or .png (default: table only)', field: 'output.file' },
  NO_SIDECAR_OPTION,
  againOption('section lyapunov'),
  JSON_OPTION,
  CSV_OPTION,
];

export interface LyapunovResult {
  readonly table: SectionTable;
  /** The plot as SVG (without metadata). */
  readonly svg: string;
  /** Extremes of the exponent over the scan. */
  readonly range: { readonly min: number; readonly max: number };
}

/** Computes the scan of a sheet: the table (`digits` places for the exponent) and the plot. */
export async function lyapunovRun(sheet: LyapunovSheet, digits: number): Promise<LyapunovResult> {
  const family = FAMILIES.get(sheet.family)!;
  const { lyapunovExponents } = await import('../../section/lyapunov.js');
  const grid = parameterGrid(sheet.r.from, sheet.r.to, sheet.steps);
  const params = Float64Array.from(grid, Number);
  const lam = new Float64Array(sheet.steps);
  const spread = new Float64Array(sheet.steps);
  lyapunovExponents(family, params, { transient: sheet.transient, iterations: sheet.iterations, starts: sheet.starts }, lam, spread);
  const p = family.parameter;
  const withC = family.toC !== undefined;
  // c = r (2 - r) / 4 is exact with twice the places of r, plus two.
  const cPlaces = 2 * gridPlaces(sheet.r.from, sheet.r.to, sheet.steps) + 2;
  const columns = [p, ...(withC ? ['c'] : []), 'lyapunov', 'spread'];
  const rows = grid.map((r, k) => {
    const row: Cell[] = [r];
    if (withC) row.push(toPlaces(rToC(r, cPlaces + 4), cPlaces));
    row.push(numberCell(lam[k]!, doubleToPlaces(lam[k]!, digits)), numberCell(spread[k]!, toExponent(spread[k]!, digits)));
    return row;
  });
  let min = Infinity;
  let max = -Infinity;
  for (const v of lam) {
    min = Math.min(min, v);
    max = Math.max(max, v);
  }
  const table: SectionTable = {
    title: `Lyapunov exponent of the ${family.name} family ${family.formula}, ${sheet.transient} transient + ${sheet.iterations} measured steps, ${sheet.starts} starts`,
    columns,
    rows,
    summary: [],
    extra: { family: family.name, r: { ...sheet.r }, steps: sheet.steps, transient: sheet.transient, iterations: sheet.iterations, starts: sheet.starts, digits },
  };
  const { plotSvg } = await import('../../section/plot-svg.js');
  const { outlineLettering } = await import('../../figure/outline-lettering.js');
  const { landmarks } = await import('../../section/landmarks.js');
  const marks = await landmarks(family, 5);
  const svg = plotSvg(
    {
      title: `Lyapunov exponent, ${family.formula} (shaded: periodic windows onset to end; red: period doublings)`,
      xLabel: family.parameter,
      yLabel: 'Lyapunov exponent',
      xs: params,
      ys: lam,
      marks: marks.doublings.map((d) => ({ at: d.at, label: d.label })),
      bands: marks.windows.map((w) => ({ from: w.from, to: w.to, label: w.label })),
      yMin: -3,
    },
    outlineLettering(),
  );
  return { table, svg, range: { min, max } };
}

/** The sheet of a run: from the positional file or --again, with flags over it. */
export async function lyapunovSheet(sheetFile: string | undefined, values: Values): Promise<LyapunovSheet> {
  const { raw, again } = await loadSectionSheet('section-lyapunov', sheetFile, values['again']);
  if (again !== undefined && typeof values['out'] !== 'string') raw['output'] = { file: againOutput(again, ['.svg', '.png']) };
  return parseLyapunovSheet(raw, applySectionFlags(raw, values, LYAPUNOV_OPTIONS));
}

export function register(section: Command): void {
  const cmd = section
    .command('lyapunov')
    .description('Lyapunov exponent across a parameter range (table; an SVG or PNG plot with --out; flags override the sheet)')
    .argument('[sheet]', 'a section-lyapunov sheet (JSON) holding the parameters');
  addOptions(cmd, LYAPUNOV_OPTIONS);
  cmd.action(
    guarded(async (sheetFile: string | undefined, values: Values) => {
      const format = tableFormat(values);
      const digits = optionalInteger(values['digits'], '--digits', 0, 17) ?? DEFAULT_DIGITS;
      const sheet = await lyapunovSheet(sheetFile, values);
      const file = sheet.output.file;
      const field = typeof values['out'] === 'string' ? '--out' : 'output.file';
      if (file !== null) await prepareOutput(file, field);
      const started = Date.now();
      const run = await lyapunovRun(sheet, digits);
      if (file === null) {
        writeStdout(formatTable(run.table, format));
        return;
      }
      const metadata = sectionMetadata(lyapunovRecord(sheet));
      await writeOutput(file, await plotFileBytes(run.svg, metadata, file), field);
      const files = [file];
      const seconds = (Date.now() - started) / 1000;
      if (sheet.output.sidecar) {
        const summary = { file, files: [file, `${file}.json`], seconds, exponent: { min: run.range.min, max: run.range.max } };
        files.push(await writeSidecar(file, metadata, summary, field));
      }
      reportWrote(files, seconds);
      if (format !== 'text') writeStdout(formatTable(run.table, format));
    }),
  );
}
