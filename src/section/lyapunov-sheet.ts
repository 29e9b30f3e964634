/**
 * The sheet of a Lyapunov-exponent run (`quadatlas section lyapunov`): the
 * family, the parameter range `r` (decimal strings), the number of
 * parameter values and the iteration counts. The table and the plot follow
 * from these alone; `output.file` (optional: without it only the table is
 * printed) is not part of the record embedded in the plot.
 */
import { UserError } from '../check/user-error.js';
import { SHEET_SCHEMA } from '../view/sheet-kind.js';
import { defaultParameterRange, parameterBounds, readFamily } from './diagram-sheet.js';
import { type FieldOrigin, type Json, readInterval, SheetFields } from './sheet-fields.js';

export interface LyapunovSheet {
  readonly kind: 'section-lyapunov';
  readonly schema: number;
  readonly family: string;
  readonly r: { readonly from: string; readonly to: string };
  /** Parameter values, evenly spaced from r.from to r.to inclusive. */
  readonly steps: number;
  readonly transient: number;
  readonly iterations: number;
  /** Initial states averaged per parameter; their spread is reported. */
  readonly starts: number;
  readonly output: { readonly file: string | null; readonly sidecar: boolean };
}

const TOP_KEYS = ['kind', 'schema', 'version', 'family', 'r', 'steps', 'transient', 'iterations', 'starts', 'output'];

export function parseLyapunovSheet(raw: Json, origin: FieldOrigin = {}): LyapunovSheet {
  const fields = new SheetFields(raw, origin);
  fields.only('', TOP_KEYS, 'a JSON object');
  if (raw['kind'] !== 'section-lyapunov') throw new UserError('kind', 'section-lyapunov', raw['kind']);
  const family = readFamily(fields);
  const [lo, hi] = parameterBounds(family);
  const r = readInterval(fields, 'r', lo, hi, defaultParameterRange(family), `an ${family.parameter} of the ${family.name} family`);
  const steps = fields.integer('steps', 2, 1_000_000, 1000);
  const transient = fields.integer('transient', 0, 100_000_000, 1000);
  const iterations = fields.integer('iterations', 1, 100_000_000, 10_000);
  const starts = fields.integer('starts', 1, 64, 3);
  fields.only('output', ['file', 'sidecar'], 'an object { "file": "...", "sidecar": true }');
  const file = fields.file('output.file', ['.svg', '.png'], null);
  const sidecar = fields.boolean('output.sidecar', true);
  return { kind: 'section-lyapunov', schema: SHEET_SCHEMA, family: family.name, r, steps, transient, iterations, starts, output: { file, sidecar } };
}

export function lyapunovRecord(sheet: LyapunovSheet): Json {
  const { kind, schema, family, r, steps, transient, iterations, starts } = sheet;
  return { kind, schema, family, r: { ...r }, steps, transient, iterations, starts };
}
