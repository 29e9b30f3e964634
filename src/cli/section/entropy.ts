/**
 * `quadatlas section entropy`: the topological entropy of the real map along
 * its parameter, from the kneading sequence by the Milnor-Thurston kneading
 * determinant (src/section/entropy.ts), as a table and, with --out, an SVG or
 * PNG plot that carries the run's settings.
 */
import type { Command } from 'commander';
import { isDecimalText, optionalInteger } from '../../check/fields.js';
import { Received, UserError } from '../../check/user-error.js';
import { Decimal } from 'decimal.js';
import { doubleToPlaces } from '../../section/decimal-text.js';
import { parameterGrid } from '../../section/parameter-grid.js';
import { formatTable, numberCell, type Cell, type SectionTable } from '../../section/section-table.js';
import type { UnimodalFamily } from '../../section/unimodal-family.js';
import { reportWrote } from '../wrote.js';
import { againOutput, loadSectionSheet } from './load-section-sheet.js';
import { SHEET_SCHEMA } from '../../view/sheet-kind.js';
import { toolVersion } from '../../io/tool-version.js';
import { plotFileBytes, prepareOutput, sectionMetadata, writeOutput, writeSidecar } from './section-output.js';
import {
  addOptions,
  againOption,
  clearProgress,
  CSV_OPTION,
  digitsOption,
  FAMILY_OPTION,
  guarded,
  JSON_OPTION,
  NO_SIDECAR_OPTION,
  parseFamily,
  progressLine,
  tableFormat,
  type SectionOption,
  type Values,
  writeStdout,
} from './section-options.js';

const DEFAULT_DIGITS = 8;
/** Letters per parameter: BigInt arithmetic makes the logistic family cheap; decimal.js sin and powers are not. */
const DEFAULT_LETTERS = { logistic: 1000, other: 300 };

export const ENTROPY_OPTIONS: readonly SectionOption[] = [
  FAMILY_OPTION,
  { flags: '--r-from <r>', description: 'left end of the parameter axis (default: the start of the family range, e.g. 2 for logistic)' },
  { flags: '--r-to <r>', description: 'right end of the parameter axis (default: full chaos, e.g. 4 for logistic)' },
  { flags: '--steps <n>', description: 'parameter values, evenly spaced, both ends included, 2 to 100000 (default 401)' },
  { flags: '--letters <n>', description: 'kneading letters per parameter, 16 to 100000 (default 1000 logistic, 300 otherwise)' },
  digitsOption(DEFAULT_DIGITS, 'the entropy, 1 to 15'),
  { flags: '--out <file>', description: 'also write the plot to this file, .svg or .png (default: table only)' },
  NO_SIDECAR_OPTION,
  againOption('section entropy'),
  JSON_OPTION,
  CSV_OPTION,
];

function parameterOf(value: unknown, field: string, fallback: string, family: UnimodalFamily): string {
  if (value === undefined) return fallback;
  if (typeof value !== 'string' || !isDecimalText(value))
    throw new UserError(field, `a decimal number in the ${family.name} range ${family.range[0]} to ${family.range[1]}`, value);
  const v = new Decimal(value.trim());
  if (v.lt(family.range[0]) || v.gt(family.range[1])) throw new UserError(field, `a decimal number in the ${family.name} range ${family.range[0]} to ${family.range[1]}`, value);
  return value.trim();
}

export interface EntropyRun {
  readonly table: SectionTable;
  readonly svg: string;
  readonly record: Record<string, unknown>;
}

export async function entropyRun(values: Values, progress: (s: string) => void): Promise<EntropyRun> {
  const family = parseFamily(values['family']);
  const from = parameterOf(values['rFrom'], '--r-from', family.range[0], family);
  const to = parameterOf(values['rTo'], '--r-to', family.range[1], family);
  if (!new Decimal(from).lt(to)) throw new UserError('--r-to', `a parameter above --r-from (${from})`, new Received(to));
  const steps = optionalInteger(values['steps'], '--steps', 2, 100_000) ?? 401;
  const letters = optionalInteger(values['letters'], '--letters', 16, 100_000) ?? (family.name === 'logistic' ? DEFAULT_LETTERS.logistic : DEFAULT_LETTERS.other);
  const digits = optionalInteger(values['digits'], '--digits', 1, 15) ?? DEFAULT_DIGITS;
  const { topologicalEntropy } = await import('../../section/entropy.js');
  const grid = parameterGrid(from, to, steps);
  const xs = new Float64Array(steps);
  const ys = new Float64Array(steps);
  const rows: Cell[][] = [];
  const started = Date.now();
  for (let k = 0; k < steps; k++) {
    const e = topologicalEntropy(family, grid[k]!, letters);
    xs[k] = Number(grid[k]);
    ys[k] = e.entropy;
    const shown = e.basis === 'bound' ? `<= ${doubleToPlaces(e.entropy, digits)}` : doubleToPlaces(e.entropy, digits);
    rows.push([grid[k]!, numberCell(e.entropy, shown), e.basis, e.period === null ? '' : String(e.period), String(e.letters)]);
    if (k % 16 === 15) {
      const s = (Date.now() - started) / 1000;
      progress(`entropy ${k + 1}/${steps}, ${s.toFixed(1)} s, about ${((s / (k + 1)) * (steps - k - 1)).toFixed(0)} s left`);
    }
  }
  const p = family.parameter;
  const record = { kind: 'section-entropy', schema: SHEET_SCHEMA, writtenBy: `quadatlas ${toolVersion()}`, family: family.name, r: { from, to }, steps, letters };
  const table: SectionTable = {
    title: `topological entropy of the ${family.name} family ${family.formula} from ${letters} kneading letters (Milnor-Thurston kneading determinant)`,
    columns: [p, 'entropy', 'basis', 'period', 'letters'],
    rows,
    summary: [],
    extra: { ...record, digits, bases: 'returned / periodic: exact series; bracketed: zero certified by the remainder bound; bound: entropy at most the value' },
  };
  const { plotSvg } = await import('../../section/plot-svg.js');
  const { outlineLettering } = await import('../../figure/outline-lettering.js');
  const { landmarks } = await import('../../section/landmarks.js');
  const marks = family.maximumOrder === 2 ? await landmarks(family, 5) : { doublings: [], windows: [] };
  const svg = plotSvg(
    {
      title: `Topological entropy, ${family.formula} (shaded: periodic windows; red: period doublings; log 2 at full chaos)`,
      xLabel: p,
      yLabel: 'entropy h',
      xs,
      ys,
      marks: marks.doublings.map((d) => ({ at: d.at, label: d.label })),
      bands: marks.windows.map((w) => ({ from: w.from, to: w.to, label: w.label })),
      yMin: 0,
    },
    outlineLettering(),
  );
  return { table, svg, record };
}

/**
 * The settings of an earlier run, from the sheet in its plot or sidecar
 * (`--again FILE`), under the flags given now; the plot goes to FILE-again
 * unless --out is given.
 */
async function againValues(values: Values): Promise<Values> {
  const { raw, again } = await loadSectionSheet('section-entropy', undefined, values['again']);
  const r = (raw['r'] ?? {}) as { from?: unknown; to?: unknown };
  const from: Values = {
    family: raw['family'],
    rFrom: r.from,
    rTo: r.to,
    steps: raw['steps'] === undefined ? undefined : String(raw['steps']),
    letters: raw['letters'] === undefined ? undefined : String(raw['letters']),
  };
  const out = typeof values['out'] === 'string' ? {} : { out: againOutput(again!, ['.svg', '.png']) };
  const given = Object.fromEntries(Object.entries(values).filter(([k, v]) => v !== undefined && k !== 'again'));
  return { ...from, ...out, ...given };
}

export function register(section: Command): void {
  const cmd = section.command('entropy').description('topological entropy along the parameter, from the kneading sequence (table; an SVG or PNG plot with --out)');
  addOptions(cmd, ENTROPY_OPTIONS);
  cmd.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      if (values['again'] !== undefined) Object.assign(values, await againValues(values));
      const file = typeof values['out'] === 'string' ? values['out'] : null;
      if (file !== null) {
        if (!/\.(svg|png)$/i.test(file)) throw new UserError('--out', 'a file name ending in .svg or .png', file);
        await prepareOutput(file, '--out');
      }
      const started = Date.now();
      const run = await entropyRun(values, progressLine);
      clearProgress();
      if (file === null) {
        writeStdout(formatTable(run.table, format));
        return;
      }
      const metadata = sectionMetadata(run.record);
      await writeOutput(file, await plotFileBytes(run.svg, metadata, file), '--out');
      const files = [file];
      const seconds = (Date.now() - started) / 1000;
      if (values['sidecar'] !== false) files.push(await writeSidecar(file, metadata, { file, seconds }, '--out'));
      reportWrote(files, seconds);
      if (format !== 'text') writeStdout(formatTable(run.table, format));
    }),
  );
}
