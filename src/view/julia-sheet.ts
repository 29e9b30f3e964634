/**
 * A Julia sheet: a sheet (src/view/sheet.ts) of the dynamical plane of one c.
 * Every field of a plate sheet keeps its meaning, read in z instead of c
 * (the view's default is centre 0, 0 and span 4), plus:
 *
 * ```json
 * {
 *   "kind": "julia",
 *   "c": { "re": "-0.12256116687665", "im": "0.74486176661974" },
 *   "cardioidAngle": "1/3",          // optional: c = m/2 - m^2/4, m = e^{2 pi i theta} (parabolic); replaces c
 *   "basin": "point-time",           // interior colouring: point | time | point-time
 *   "marks": { "orbit": 0, "cycle": false, "fixedPoints": false, "rays": ["1/7", "2/7", "4/7"] }
 * }
 * ```
 * c is kept as decimal strings (like the view); the labels and deep-reference
 * fields of plate sheets mean nothing here and are refused. A figure (output
 * .pdf or .svg, or `figure` given) keeps axes (Re z, Im z), caption, scale
 * bar, equipotentials (of G_c) and marks (points z); its parameter rays,
 * rays of a period, outlines and internal rays are refused.
 */
import { migrateSheet, SHEET_SCHEMA } from './sheet-kind.js';
import { Received, UserError } from '../check/user-error.js';
import { BASIN_STYLES, type BasinStyle } from '../colour/shade-julia.js';
import { rayAngle } from '../dynamic/dynamic-ray.js';
import { parseDecimalString, parseInteger, parseSheet, renderRecord, type Sheet } from './sheet.js';

export interface JuliaMarks {
  /** Draw the critical orbit's first `orbit` points (0: none). */
  readonly orbit: number;
  readonly cycle: boolean;
  readonly fixedPoints: boolean;
  /** Dynamic ray angles as written ("p/q" or a decimal). */
  readonly rays: readonly string[];
}

export interface JuliaSheet extends Sheet {
  readonly kind: 'julia';
  readonly c: { readonly re: string; readonly im: string };
  /** The internal angle on the main cardioid, "s/q" in lowest terms, when c was given by it. */
  readonly cardioidAngle: string | null;
  readonly basin: BasinStyle;
  readonly marks: JuliaMarks;
}

export const JULIA_KEYS = ['kind', 'schema', 'c', 'cardioidAngle', 'basin', 'marks'] as const;
/** Most orbit points drawn. */
export const MAX_ORBIT_MARKS = 100_000;
/** Largest denominator of a cardioid angle: the parabolic basin has q petals, each found by a series of degree q + 1. */
export const MAX_CARDIOID_DENOMINATOR = 128;

type Json = Record<string, unknown>;

/** The golden mean (sqrt 5 - 1) / 2, the rotation number of the classical Siegel disk (a Brjuno number: bounded type). */
export const GOLDEN_MEAN = (Math.sqrt(5) - 1) / 2;

function isObject(v: unknown): v is Json {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** A cardioid angle "s/q" or a decimal in [0, 1), as [s, q] in lowest terms. */
export function parseCardioidAngle(value: unknown, field: string): [number, number] {
  const angle = typeof value === 'string' ? rayAngle(value) : null;
  if (value === 'golden') return [0, 0];
  if (angle === null) throw new UserError(field, 'a rational angle in [0, 1) written s/q or as a decimal (e.g. 1/3 or 0.25), or golden (the golden mean, a Siegel disk)', value);
  if (angle[1] > MAX_CARDIOID_DENOMINATOR) throw new UserError(field, `an angle s/q with q at most ${MAX_CARDIOID_DENOMINATOR}`, value);
  return angle;
}

/**
 * c = m/2 - m^2/4 for m = e^{2 pi i s/q} (the main cardioid's boundary,
 * docs/checks: "main cardioid"), with the quarter turns exact; the fixed
 * point alpha = m/2 then has multiplier m.
 */
export function cardioidPoint(s: number, q: number): { cRe: number; cIm: number; mRe: number; mIm: number } {
  const exact: Record<string, [number, number]> = { '0/1': [1, 0], '1/2': [-1, 0], '1/4': [0, 1], '3/4': [0, -1] };
  // q = 0 stands for the golden mean theta = (sqrt 5 - 1) / 2.
  const turn = q === 0 ? 2 * Math.PI * GOLDEN_MEAN : (2 * Math.PI * s) / q;
  const [mRe, mIm] = exact[`${s}/${q}`] ?? [Math.cos(turn), Math.sin(turn)];
  const m2Re = mRe * mRe - mIm * mIm,
    m2Im = 2 * mRe * mIm;
  return { cRe: mRe / 2 - m2Re / 4, cIm: mIm / 2 - m2Im / 4, mRe, mIm };
}

function parseMarks(value: unknown): JuliaMarks {
  if (value === undefined) return { orbit: 0, cycle: false, fixedPoints: false, rays: [] };
  if (!isObject(value)) throw new UserError('marks', 'an object { "orbit": N, "cycle": true, "fixedPoints": true, "rays": ["1/7"] }', value);
  for (const key of Object.keys(value)) {
    if (!['orbit', 'cycle', 'fixedPoints', 'rays'].includes(key))
      throw new UserError(`marks.${key}`, 'one of the fields orbit, cycle, fixedPoints, rays in marks', new Received(`an unknown field "${key}"`));
  }
  const bool = (v: unknown, field: string): boolean => {
    if (v === undefined) return false;
    if (typeof v !== 'boolean') throw new UserError(field, 'true or false', v);
    return v;
  };
  const raysIn = value['rays'] ?? [];
  if (!Array.isArray(raysIn)) throw new UserError('marks.rays', 'a list of angles ["1/7", "2/7"]', raysIn);
  const rays = raysIn.map((r, i) => {
    if (typeof r !== 'string' || rayAngle(r) === null) throw new UserError(`marks.rays[${i}]`, 'an angle in [0, 1) written p/q or as a decimal (e.g. "1/7")', r);
    return r.trim();
  });
  return {
    orbit: parseInteger(value['orbit'] ?? 0, 'marks.orbit', 0, MAX_ORBIT_MARKS),
    cycle: bool(value['cycle'], 'marks.cycle'),
    fixedPoints: bool(value['fixedPoints'], 'marks.fixedPoints'),
    rays,
  };
}

/** Checks a parsed JSON Julia sheet and fills in defaults; errors name the field. */
export function parseJuliaSheet(input: unknown, name = 'julia'): JuliaSheet {
  if (!isObject(input)) throw new UserError('sheet', 'a JSON object', input);
  const value: Json = { ...input };
  // A Julia sheet without kind and schema (schema 0) is taken as one: the command says what it renders.
  if (value['kind'] === undefined && value['schema'] === undefined) value['kind'] = 'julia';
  if (value['kind'] === 'julia' && value['schema'] === undefined) value['schema'] = SHEET_SCHEMA;
  migrateSheet(value, 'sheet', ['julia']);
  for (const field of ['labels', 'reference'] as const) {
    if (value[field] !== undefined && value[field] !== null && value[field] !== 0) {
      throw new UserError(
        field,
        `no ${field} on a Julia plate (${field === 'labels' ? 'period labels belong to the c-plane' : 'the deep reference is a parameter-plane nucleus'})`,
        value[field],
      );
    }
  }
  const rest: Json = {};
  for (const [k, v] of Object.entries(value)) if (!(JULIA_KEYS as readonly string[]).includes(k)) rest[k] = v;
  const viewIn = rest['view'] ?? {};
  if (isObject(viewIn)) rest['view'] = { re: '0', im: '0', span: '4', ...viewIn };
  const sheet = parseSheet(rest, name);
  if (sheet.figure !== null) {
    // Figures of the dynamical plane: axes, caption, scale bar, equipotentials of G_c and labelled points in z; the rest belongs to the c-plane.
    const f = sheet.figure;
    const refused: Array<[string, boolean, string]> = [
      ['figure.rays', f.rays.length > 0, 'no parameter rays on a Julia figure (its dynamic rays are marks.rays, --rays)'],
      ['figure.raysOf', f.raysOf > 0, "no rays of a period's components on a Julia figure (they are parameter rays)"],
      ['figure.outlines', f.outlines > 0, 'no component outlines on a Julia figure (components belong to the c-plane)'],
      ['figure.internalRays', f.internalRays !== null, 'no internal rays on a Julia figure (they belong to components of the c-plane)'],
    ];
    for (const [field, given, expected] of refused) {
      if (given) throw new UserError(field, expected, (value['figure'] as Json)[field.slice('figure.'.length)]);
    }
  }

  let c: { re: string; im: string };
  let cardioidAngle: string | null = null;
  if (value['cardioidAngle'] !== undefined && value['cardioidAngle'] !== null) {
    const [s, q] = parseCardioidAngle(value['cardioidAngle'], 'cardioidAngle');
    cardioidAngle = q === 0 ? 'golden' : `${s}/${q}`;
    const p = cardioidPoint(s, q);
    c = { re: String(p.cRe), im: String(p.cIm) };
  } else {
    const cIn = value['c'];
    if (!isObject(cIn)) throw new UserError('c', 'an object { "re": "...", "im": "..." } (decimal strings), or a cardioidAngle', cIn);
    for (const key of Object.keys(cIn))
      if (key !== 're' && key !== 'im') throw new UserError(`c.${key}`, 'one of the fields re, im in c', new Received(`an unknown field "${key}"`));
    c = { re: parseDecimalString(cIn['re'], 'c.re'), im: parseDecimalString(cIn['im'] ?? '0', 'c.im') };
    if (!(Math.hypot(Number(c.re), Number(c.im)) <= 16)) throw new UserError('c', 'a parameter with |c| <= 16', new Received(`${c.re},${c.im}`));
  }
  const basin = value['basin'] ?? 'point-time';
  if (typeof basin !== 'string' || !(BASIN_STYLES as readonly string[]).includes(basin)) throw new UserError('basin', `one of ${BASIN_STYLES.join(', ')}`, basin);
  return { ...sheet, kind: 'julia', c, cardioidAngle, basin: basin as BasinStyle, marks: parseMarks(value['marks']) };
}

/** The part of a Julia sheet that fixes the pixels, as stored in the plate's metadata (see renderRecord). */
export function juliaRenderRecord(sheet: JuliaSheet, version: string): Json {
  const record = renderRecord(sheet, version);
  delete record['labels'];
  delete record['reference'];
  delete record['skip'];
  const { kind: _plate, schema, writtenBy, ...rest } = record;
  return {
    kind: 'julia',
    schema,
    writtenBy,
    c: { ...sheet.c },
    ...(sheet.cardioidAngle === null ? {} : { cardioidAngle: sheet.cardioidAngle }),
    ...rest,
    basin: sheet.basin,
    marks: { ...sheet.marks, rays: [...sheet.marks.rays] },
  };
}

/** The whole Julia sheet, outputs included (what `presets show` prints). */
export function juliaSheetRecord(sheet: JuliaSheet, version: string): Json {
  return {
    ...juliaRenderRecord(sheet, version),
    output: { file: sheet.output.file, data: sheet.output.data, sidecar: sheet.output.sidecar },
    startup: sheet.startup,
  };
}
