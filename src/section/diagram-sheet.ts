/**
 * The sheet of a bifurcation diagram (`quadatlas section diagram`): plain
 * JSON holding every parameter that fixes the image, checked here with
 * one-line errors naming the field. Defaults are filled in, so the record
 * embedded in the image (diagramRecord) renders the same bytes again.
 *
 * Axes: `r` is the family parameter along the width (left to right), `x` the
 * state along the height (x.from at the bottom edge, x.to at the top), both
 * decimal strings as given. `output` says where to write and is not part of
 * the record: the same record written to another file gives the same image.
 */
import { Received, UserError } from '../check/user-error.js';

/** Windows are located up to this period for a diagram figure (findWindows, seconds). */
export const MAX_WINDOW_PERIOD = 8;
import { SHEET_SCHEMA } from '../view/sheet-kind.js';
import { FAMILIES } from './families/index.js';
import { type FieldOrigin, type Json, readInterval, SheetFields } from './sheet-fields.js';
import type { UnimodalFamily } from './unimodal-family.js';

export interface DiagramSheet {
  readonly kind: 'section-diagram';
  readonly schema: number;
  readonly family: string;
  readonly r: { readonly from: string; readonly to: string };
  readonly x: { readonly from: string; readonly to: string };
  readonly pixels: { readonly width: number; readonly height: number };
  /** Jittered parameter samples per pixel column. */
  readonly samples: number;
  /** Steps discarded before plotting, per sample. */
  readonly transient: number;
  /** Steps plotted per sample. */
  readonly iterations: number;
  /** Bits per channel of the PNG. */
  readonly depth: 8 | 16;
  /** Text drawn below a figure (.pdf, .svg output); '' for none. */
  readonly caption: string;
  /** Figures: shade the periodic windows of period 3..windows (0: none). */
  readonly windows: number;
  /** Figures: mark the period doublings of the cascade. */
  readonly cascade: boolean;
  readonly output: { readonly file: string; readonly sidecar: boolean };
}

const TOP_KEYS = ['kind', 'schema', 'version', 'family', 'r', 'x', 'pixels', 'samples', 'transient', 'iterations', 'depth', 'caption', 'windows', 'cascade', 'output'];

/** The default parameter window of each family's diagram and Lyapunov plot (the cascade and the chaotic band). */
export function defaultParameterRange(family: UnimodalFamily): readonly [string, string] {
  const defaults: Record<string, readonly [string, string]> = { logistic: ['2.8', '4'], sine: ['0.7', '1'], quartic: ['0.6', family.range[1]] };
  return defaults[family.name] ?? family.range;
}

/** The parameters a family accepts on its axis: from min(onset, 0) to full chaos. */
export function parameterBounds(family: UnimodalFamily): [number, number] {
  return [Math.min(Number(family.fixedPointOnset), 0), Number(family.range[1])];
}

export function readFamily(fields: SheetFields): UnimodalFamily {
  const names = [...FAMILIES.keys()];
  const name = fields.choice('family', names, 'logistic');
  return FAMILIES.get(name)!;
}

/** Checks a raw diagram sheet (kind and schema already migrated) and fills its defaults. */
export function parseDiagramSheet(raw: Json, origin: FieldOrigin = {}): DiagramSheet {
  const fields = new SheetFields(raw, origin);
  fields.only('', TOP_KEYS, 'a JSON object');
  if (raw['kind'] !== 'section-diagram') throw new UserError('kind', 'section-diagram', raw['kind']);
  const family = readFamily(fields);
  const [lo, hi] = parameterBounds(family);
  const r = readInterval(fields, 'r', lo, hi, defaultParameterRange(family), `an ${family.parameter} of the ${family.name} family`);
  const [s0, s1] = family.stateRange;
  const x = readInterval(fields, 'x', Math.min(s0, s1) - 1, Math.max(s0, s1) + 1, [String(s0), String(s1)], 'a state x');
  const pixels = fields.pixels('pixels', 1, 65535, { width: 2000, height: 1000 });
  const samples = fields.integer('samples', 1, 1024, 4);
  const transient = fields.integer('transient', 0, 10_000_000, 1000);
  const iterations = fields.integer('iterations', 1, 10_000_000, Math.max(1000, 2 * pixels.height));
  const depth = fields.choice('depth', [8, 16] as const, 16);
  fields.only('output', ['file', 'sidecar'], 'an object { "file": "...", "sidecar": true }');
  // .pdf or .svg: a figure with labelled axes (r below, c on top for the logistic family, x at the left)
  const file = fields.file('output.file', ['.png', '.pdf', '.svg'], `out/${family.name}-diagram.png`)!;
  const sidecar = fields.boolean('output.sidecar', true);
  const caption = fields.get('caption') ?? '';
  if (typeof caption !== 'string') throw new UserError(fields.name('caption'), 'a string', caption);
  const windows = fields.integer('windows', 0, MAX_WINDOW_PERIOD, 0);
  if (windows === 1 || windows === 2) throw new UserError(fields.name('windows'), `0 (none) or a largest period from 3 to ${MAX_WINDOW_PERIOD}`, windows);
  const cascade = fields.boolean('cascade', false);
  const isFigure = /\.(pdf|svg)$/i.test(file);
  if (!isFigure && (windows > 0 || cascade))
    throw new UserError(
      fields.name(windows > 0 ? 'windows' : 'cascade'),
      'an output file ending in .pdf or .svg (windows and the cascade are drawn on figures)',
      new Received(file),
    );
  return {
    kind: 'section-diagram',
    schema: SHEET_SCHEMA,
    family: family.name,
    r,
    x,
    pixels,
    samples,
    transient,
    iterations,
    depth,
    caption,
    windows,
    cascade,
    output: { file, sidecar },
  };
}

/** Everything that fixes the image, in a fixed key order (the sheet embedded in the file). */
export function diagramRecord(sheet: DiagramSheet): Json {
  const { kind, schema, family, r, x, pixels, samples, transient, iterations, depth, caption, windows, cascade } = sheet;
  return {
    kind,
    schema,
    family,
    r: { ...r },
    x: { ...x },
    pixels: { ...pixels },
    samples,
    transient,
    iterations,
    depth,
    ...(caption === '' ? {} : { caption }),
    ...(windows === 0 ? {} : { windows }),
    ...(cascade ? { cascade } : {}),
  };
}
