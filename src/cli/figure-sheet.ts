/**
 * Sheets of the real slice's orbit figures (`"kind": "section-orbit"` and
 * `"section-cobweb"`), so presets can hold them beside plates:
 *
 * ```json
 * { "kind": "section-orbit", "title": "...", "note": "...", "family": "logistic",
 *   "r": ["2.8", "3.2"], "x0": "0.2", "iterations": 60, "transient": 0,
 *   "output": { "file": "out/orbits.svg" }, "startup": true }
 * { "kind": "section-cobweb", ..., "r": "3.83", "iterate": 1, "output": { "file": "out/cobweb.svg" } }
 * ```
 * Decimal values are strings. `parseFigureSheet` checks the fields and turns
 * them into the flag values of `section orbit` / `section cobweb`, which
 * check them again exactly as on the command line.
 */
import { migrateSheet, SHEET_SCHEMA } from '../view/sheet-kind.js';
import { Received, UserError } from '../check/user-error.js';

export interface FigureSheet {
  readonly kind: 'section-orbit' | 'section-cobweb';
  readonly title: string;
  readonly note: string;
  readonly startup: boolean;
  /** The figure's size in SVG pixels (for listings). */
  readonly width: number;
  readonly height: number;
  readonly output: { readonly file: string; readonly data: string | null };
  /** The flag values of the matching command (commander's attribute names). */
  readonly values: Readonly<Record<string, string>>;
}

const KEYS = ['kind', 'schema', 'writtenBy', 'title', 'note', 'family', 'r', 'x0', 'iterations', 'transient', 'iterate', 'output', 'startup'];

export function isFigureKind(kind: unknown): kind is FigureSheet['kind'] {
  return kind === 'section-orbit' || kind === 'section-cobweb';
}

export function parseFigureSheet(input: Record<string, unknown>, name: string): FigureSheet {
  const raw: Record<string, unknown> = { ...input };
  if (raw['schema'] === undefined && isFigureKind(raw['kind'])) raw['schema'] = SHEET_SCHEMA;
  migrateSheet(raw, 'sheet', ['section-orbit', 'section-cobweb']);
  const kind = raw['kind'];
  if (!isFigureKind(kind)) throw new UserError('kind', 'section-orbit or section-cobweb', kind);
  for (const key of Object.keys(raw)) if (!KEYS.includes(key)) throw new UserError(key, `one of the fields ${KEYS.join(', ')}`, new Received(`an unknown field "${key}"`));
  const text = (key: string): string | undefined => {
    const v = raw[key];
    if (v === undefined) return undefined;
    if (typeof v !== 'string') throw new UserError(key, 'a string', v);
    return v;
  };
  const int = (key: string): string | undefined => {
    const v = raw[key];
    if (v === undefined) return undefined;
    if (typeof v !== 'number' || !Number.isInteger(v)) throw new UserError(key, 'an integer', v);
    return String(v);
  };
  const values: Record<string, string> = {};
  const rIn = raw['r'];
  if (kind === 'section-orbit') {
    if (!Array.isArray(rIn) || rIn.length === 0 || !rIn.every((r) => typeof r === 'string')) throw new UserError('r', 'a list of parameters as strings, e.g. ["2.8", "3.2"]', rIn);
    values['r'] = rIn.join(',');
  } else {
    if (typeof rIn !== 'string') throw new UserError('r', 'one parameter as a string, e.g. "3.83"', rIn);
    values['r'] = rIn;
  }
  for (const [key, v] of [
    ['family', text('family')],
    ['x0', text('x0')],
    ['iterations', int('iterations')],
    ['transient', int('transient')],
    ['iterate', int('iterate')],
  ] as const)
    if (v !== undefined) values[key] = v;
  if (kind === 'section-cobweb' && values['transient'] !== undefined) throw new UserError('transient', 'no transient on a cobweb (the staircase starts at x0)', raw['transient']);
  if (kind === 'section-orbit' && values['iterate'] !== undefined) throw new UserError('iterate', 'no iterate on an orbit figure', raw['iterate']);
  const out = raw['output'] ?? {};
  if (typeof out !== 'object' || out === null || Array.isArray(out)) throw new UserError('output', 'an object { "file": "out/name.svg" }', out);
  const file = (out as Record<string, unknown>)['file'] ?? `out/${name}.svg`;
  if (typeof file !== 'string' || !/\.(svg|png)$/i.test(file)) throw new UserError('output.file', 'a file name ending in .svg or .png', file);
  values['out'] = file;
  const startup = raw['startup'] ?? false;
  if (typeof startup !== 'boolean') throw new UserError('startup', 'true or false', startup);
  const [width, height] = kind === 'section-orbit' ? [1000, 560] : [760, 790];
  return { kind, title: text('title') ?? '', note: text('note') ?? '', startup, width, height, output: { file, data: null }, values };
}

/** Renders a figure sheet by running its command with the sheet's values; returns the files written. */
export async function renderFigureSheet(sheet: FigureSheet): Promise<string[]> {
  const { orbitFigure, cobwebFigure } = await import('./section/orbit.js');
  const values = { ...sheet.values, out: sheet.output.file };
  if (sheet.kind === 'section-orbit') await orbitFigure(values);
  else await cobwebFigure(values);
  return [sheet.output.file];
}

/** A figure sheet as JSON (what `presets show` prints; parseFigureSheet reads it back). */
export function figureSheetRecord(sheet: FigureSheet, version: string): Record<string, unknown> {
  const v = sheet.values;
  const out: Record<string, unknown> = { kind: sheet.kind, schema: SHEET_SCHEMA, writtenBy: `quadatlas ${version}`, title: sheet.title, note: sheet.note };
  if (v['family'] !== undefined) out['family'] = v['family'];
  out['r'] = sheet.kind === 'section-orbit' ? (v['r'] ?? '').split(',') : v['r'];
  if (v['x0'] !== undefined) out['x0'] = v['x0'];
  for (const key of ['iterations', 'transient', 'iterate']) if (v[key] !== undefined) out[key] = Number(v[key]);
  out['output'] = { file: sheet.output.file };
  out['startup'] = sheet.startup;
  return out;
}
