/**
 * The sheet of the comparison plate (`quadatlas section compare`): the
 * c-axis shared by the plane strip and the logistic diagram (`c`, decimal
 * strings), the state crop of the diagram (`x`, bottom to top), the plate
 * size without margins, the diagram's samples and iteration counts, the
 * plane strip's iteration limit and the largest period of the windows
 * marked. `output` is not part of the record embedded in the plate.
 */
import { UserError } from '../check/user-error.js';
import { SHEET_SCHEMA } from '../view/sheet-kind.js';
import { type FieldOrigin, type Json, readInterval, SheetFields } from './sheet-fields.js';

export interface CompareSheet {
  readonly kind: 'section-compare';
  readonly schema: number;
  readonly c: { readonly from: string; readonly to: string };
  readonly x: { readonly from: string; readonly to: string };
  readonly pixels: { readonly width: number; readonly height: number };
  readonly samples: number;
  readonly transient: number;
  readonly iterations: number;
  /** Iteration limit of the plane strip. */
  readonly planeIterations: number;
  /** Windows of period 3 up to this are marked. */
  readonly maxPeriod: number;
  readonly output: { readonly file: string; readonly sidecar: boolean };
}

const TOP_KEYS = ['kind', 'schema', 'version', 'c', 'x', 'pixels', 'samples', 'transient', 'iterations', 'planeIterations', 'maxPeriod', 'output'];

/** The strip takes the top third of the plate, the diagram the rest. */
export function compareHeights(height: number): { strip: number; diagram: number } {
  const strip = Math.round(height / 3);
  return { strip, diagram: height - strip };
}

export function parseCompareSheet(raw: Json, origin: FieldOrigin = {}): CompareSheet {
  const fields = new SheetFields(raw, origin);
  fields.only('', TOP_KEYS, 'a JSON object');
  if (raw['kind'] !== 'section-compare') throw new UserError('kind', 'section-compare', raw['kind']);
  const c = readInterval(fields, 'c', -2, 0.25, ['-2', '-0.7'], 'a c on the real slice of the set');
  const x = readInterval(fields, 'x', -1, 2, ['0', '1'], 'a logistic state x');
  const pixels = fields.pixels('pixels', 100, 20000, { width: 2400, height: 1500 });
  const samples = fields.integer('samples', 1, 1024, 4);
  const transient = fields.integer('transient', 0, 10_000_000, 2000);
  const iterations = fields.integer('iterations', 1, 10_000_000, Math.max(2000, 2 * compareHeights(pixels.height).diagram));
  const planeIterations = fields.integer('planeIterations', 1, 10_000_000, 4000);
  const maxPeriod = fields.integer('maxPeriod', 3, 8, 5);
  fields.only('output', ['file', 'sidecar'], 'an object { "file": "...", "sidecar": true }');
  const file = fields.file('output.file', ['.svg', '.png'], 'out/section-compare.svg')!;
  const sidecar = fields.boolean('output.sidecar', true);
  return { kind: 'section-compare', schema: SHEET_SCHEMA, c, x, pixels, samples, transient, iterations, planeIterations, maxPeriod, output: { file, sidecar } };
}

export function compareRecord(sheet: CompareSheet): Json {
  const { kind, schema, c, x, pixels, samples, transient, iterations, planeIterations, maxPeriod } = sheet;
  return { kind, schema, c: { ...c }, x: { ...x }, pixels: { ...pixels }, samples, transient, iterations, planeIterations, maxPeriod };
}
