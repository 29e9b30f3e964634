/**
 * A sheet: one JSON file holding a view, its colouring and its output. Flags
 * on the command line override fields of the sheet. `parseSheet` checks a
 * plain JSON value against the schema below and returns a complete sheet with
 * every default filled in; each error names the field, what was expected and
 * what was received.
 *
 * ```json
 * {
 *   "title": "The whole set",                 // optional, free text
 *   "note": "...",                            // optional, free text
 *   "view": { "re": "-0.75", "im": "0", "span": "3.2", "rotation": 0 },
 *   "pixels": { "width": 1600, "height": 1200 },   // or "print": { "width_mm": 420, "height_mm": 297 }
 *   "dpi": 300,
 *   "iterations": 4000,                       // or "auto"
 *   "samples": 16,                            // samples per pixel where refinement is needed (1 or a square)
 *   "depth": 8,                               // 8 or 16 bits per channel
 *   "colour": { ... },                        // see src/colour/colour-settings.ts
 *   "labels": 6,                             // label nuclei of periods 1..6 that can carry a label (0: none)
 *   "arithmetic": "auto",                    // auto | double | deep
 *   "skip": true,                            // deep: bilinear-approximation skipping
 *   "reference": { "re": "...", "im": "...", "period": 79 },   // deep: a nucleus as periodic reference (default: the centre)
 *   "output": { "file": "out/name.png", "data": "out/name-data", "sidecar": true },   // or .pdf / .svg: a figure
 *   "figure": { "axes": true, "caption": "...", "rays": ["1/3", "2/3"], "raysOf": 4, "equipotentials": 6, "outlines": 3, "scaleBar": true,
 *               "internalRays": { "period": 1, "angles": ["0", "1/2"] }, "marks": [{ "re": "-0.75", "im": "0", "label": "root" }] },   // with a .pdf or .svg output
 *   "startup": true                           // rendered by `npm start`
 * }
 * ```
 * Decimal fields (view.re, view.im, view.span) must be JSON strings, so no
 * digit is lost to a double before the precision of the view is known.
 */
import { Decimal } from 'decimal.js';
import { Received, UserError } from '../check/user-error.js';
import { parseColourSettings, type ColourSettings } from '../colour/colour-settings.js';
import { migrateSheet, SHEET_SCHEMA } from './sheet-kind.js';
import { parseDecimalText, parseInteger as parseIntegerField } from '../check/fields.js';

export interface Sheet {
  readonly title: string;
  readonly note: string;
  readonly view: { readonly re: string; readonly im: string; readonly span: string; readonly rotation: number };
  readonly width: number;
  readonly height: number;
  readonly dpi: number;
  /**
   * Iteration limit, or 'auto': plates and pyramids find it from a probe of
   * the view (render/sheet-job.ts sheetIterations, docs/methods.md B9) under
   * autoIterations as a ceiling; Julia plates take autoIterations.
   */
  readonly iterations: number | 'auto';
  readonly samples: number;
  readonly depth: 8 | 16;
  readonly colour: ColourSettings;
  /** Label the nuclei of components of period 1..labels that are large enough to carry a label (0: none). */
  readonly labels: number;
  /** 'auto' picks doubles where they resolve every pixel, else the deep arithmetic; the others force one (for testing). */
  readonly arithmetic: 'auto' | 'double' | 'deep';
  /** Deep arithmetic: skip iterations with the bilinear-approximation table (false: step every iteration). */
  readonly skip: boolean;
  /** Deep arithmetic: reference point, e.g. a nucleus from `quadatlas locate` with its period; default the view centre. */
  readonly reference: { readonly re: string; readonly im: string; readonly period: number } | null;
  readonly output: { readonly file: string; readonly data: string | null; readonly sidecar: boolean };
  /** Present exactly when output.file is a figure (.pdf or .svg): what is drawn around and over the plate. */
  readonly figure: FigureSpec | null;
  readonly startup: boolean;
}

/** The annotations of a figure (src/figure/), recorded in the sheet so `--again` draws them again. */
export interface FigureSpec {
  /** Frame, ticks and labels in Re c and Im c outside the image (needs rotation 0). */
  readonly axes: boolean;
  /** Text drawn below the figure; '' for none (separate from the metadata title). */
  readonly caption: string;
  /** External angles p/q (0 <= p < q) of the parameter rays to draw, as written. */
  readonly rays: readonly string[];
  /** Draw the boundary of every component of this period in view (0: none). */
  readonly outlines: number;
  /** Draw both rays landing at the root of every component of this period in view (0: none). */
  readonly raysOf: number;
  /** Draw this many equipotentials, G_k = G_0 / 2^k for k = 0..n-1 with G_0 the largest potential in view (0: none). */
  readonly equipotentials: number;
  /** A bar of a round length in c in the plate's lower left corner. */
  readonly scaleBar: boolean;
  /** Internal rays of every component of this period whose nucleus is in view, at these internal angles (p/q, or "0"); null for none. */
  readonly internalRays: { readonly period: number; readonly angles: readonly string[] } | null;
  /** Labelled points (from `--marks FILE.csv`), c as decimal strings; the file's rows themselves are recorded, so `--again` needs no file. */
  readonly marks: readonly FigurePin[];
}

/** A labelled point of a figure. */
export interface FigurePin {
  readonly re: string;
  readonly im: string;
  readonly label: string;
}

/** Most labelled points one figure carries. */
export const MAX_MARKS = 256;
/** Longest label of a point, in characters. */
export const MAX_MARK_LABEL = 60;
/** Most internal angles one figure draws (per component). */
export const MAX_INTERNAL_ANGLES = 64;

/** An internal angle: "0" or p/q with integers 0 <= p < q < 2^52, as parseAngleText; returned trimmed. */
export function parseInternalAngle(value: unknown, field: string): string {
  if (typeof value === 'string' && /^\s*0\s*$/.test(value)) return '0';
  if (typeof value === 'string' && /^\s*\d+\s*\/\s*\d+\s*$/.test(value)) {
    try {
      return parseAngleText(value, field);
    } catch {
      // worded below
    }
  }
  throw new UserError(field, 'an internal angle written 0 or p/q with integers 0 <= p < q < 2^52 (e.g. 1/3)', value);
}

/** A labelled point: { "re": "...", "im": "...", "label": "..." }. */
export function parsePin(value: unknown, field: string): FigurePin {
  if (!isObject(value)) throw new UserError(field, 'an object { "re": "-0.75", "im": "0", "label": "root" }', value);
  noUnknownKeys(value, ['re', 'im', 'label'], field);
  const re = parseDecimalString(value['re'], `${field}.re`);
  const im = parseDecimalString(value['im'], `${field}.im`);
  const label = value['label'];
  if (typeof label !== 'string' || label.trim() === '' || label.length > MAX_MARK_LABEL || /[\u0000-\u001f]/.test(label)) {
    throw new UserError(`${field}.label`, `a label of 1 to ${MAX_MARK_LABEL} characters on one line`, label);
  }
  return { re, im, label: label.trim() };
}

/** A figure's output file: vector PDF or SVG with the plate inside. */
export function isFigureFile(file: string): boolean {
  return /\.(pdf|svg)$/i.test(file);
}

/** Rays of a period come from its census, which pairs every angle up to period 12 in seconds. */
export const MAX_RAYS_OF_PERIOD = 12;
/** Most equipotentials one figure draws. */
export const MAX_EQUIPOTENTIALS = 64;
/** Most rays one figure draws. */
export const MAX_RAYS = 64;
/** Denominators of ray angles stay below 2^52, so doubling the numerator is exact in a double. */
const MAX_DENOMINATOR = 2n ** 52n;

/** An external angle written p/q with integers 0 <= p < q; returned as written (trimmed). */
export function parseAngleText(value: unknown, field: string): string {
  const m = typeof value === 'string' ? /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(value) : null;
  if (m === null || BigInt(m[1]!) >= BigInt(m[2]!) || BigInt(m[2]!) >= MAX_DENOMINATOR) {
    throw new UserError(field, 'an external angle written p/q with integers 0 <= p < q < 2^52 (e.g. 1/3)', value);
  }
  return `${BigInt(m[1]!)}/${BigInt(m[2]!)}`;
}

function parseFigure(value: unknown, file: string, rotation: number): FigureSpec | null {
  // A .pdf or .svg output is always a figure; a .png or .tif plate is one when it has annotations.
  if (!isFigureFile(file) && (value === undefined || value === null)) return null;
  const v = value ?? {};
  if (!isObject(v)) throw new UserError('figure', 'an object { "axes": ..., "caption": ..., "rays": [...] }', v);
  noUnknownKeys(v, ['axes', 'caption', 'rays', 'raysOf', 'equipotentials', 'outlines', 'scaleBar', 'internalRays', 'marks'], 'figure');
  const axes = parseBoolean(v['axes'] ?? false, 'figure.axes');
  if (axes && rotation !== 0)
    throw new UserError('figure.axes', 'a view without rotation (the axes run along the real and imaginary directions)', new Received(`rotation ${rotation}`));
  const caption = v['caption'] ?? '';
  if (typeof caption !== 'string') throw new UserError('figure.caption', 'a string', caption);
  const raysIn = v['rays'] ?? [];
  if (!Array.isArray(raysIn)) throw new UserError('figure.rays', 'a list of angles p/q, e.g. ["1/3", "2/3"]', raysIn);
  if (raysIn.length > MAX_RAYS) throw new UserError('figure.rays', `at most ${MAX_RAYS} rays`, new Received(`${raysIn.length} rays`));
  const rays = raysIn.map((a: unknown, i: number) => parseAngleText(a, `figure.rays[${i}]`));
  const outlines = parseInteger(v['outlines'] ?? 0, 'figure.outlines', 0, MAX_LABEL_PERIOD);
  const raysOf = parseInteger(v['raysOf'] ?? 0, 'figure.raysOf', 0, MAX_RAYS_OF_PERIOD);
  const equipotentials = parseInteger(v['equipotentials'] ?? 0, 'figure.equipotentials', 0, MAX_EQUIPOTENTIALS);
  const scaleBar = parseBoolean(v['scaleBar'] ?? false, 'figure.scaleBar');
  const internalIn = v['internalRays'] ?? null;
  let internalRays: FigureSpec['internalRays'] = null;
  if (internalIn !== null) {
    if (!isObject(internalIn)) throw new UserError('figure.internalRays', 'an object { "period": 1, "angles": ["0", "1/3"] }', internalIn);
    noUnknownKeys(internalIn, ['period', 'angles'], 'figure.internalRays');
    const period = parseInteger(internalIn['period'], 'figure.internalRays.period', 1, MAX_LABEL_PERIOD);
    const anglesIn = internalIn['angles'];
    if (!Array.isArray(anglesIn) || anglesIn.length === 0 || anglesIn.length > MAX_INTERNAL_ANGLES)
      throw new UserError('figure.internalRays.angles', `a list of 1 to ${MAX_INTERNAL_ANGLES} internal angles, e.g. ["0", "1/3"]`, anglesIn);
    internalRays = { period, angles: anglesIn.map((a: unknown, i: number) => parseInternalAngle(a, `figure.internalRays.angles[${i}]`)) };
  }
  const marksIn = v['marks'] ?? [];
  if (!Array.isArray(marksIn) || marksIn.length > MAX_MARKS)
    throw new UserError(
      'figure.marks',
      `a list of at most ${MAX_MARKS} points { "re", "im", "label" }`,
      Array.isArray(marksIn) ? new Received(`${marksIn.length} points`) : marksIn,
    );
  const marks = marksIn.map((m: unknown, i: number) => parsePin(m, `figure.marks[${i}]`));
  return { axes, caption, rays, raysOf, equipotentials, outlines, scaleBar, internalRays, marks };
}

/** Largest side in pixels: beyond it a plate is refused before any work. */
export const MAX_SIDE = 1_000_000;
/** Iteration counts are stored as int32 by the kernels. */
export const MAX_ITERATIONS = 2 ** 31 - 2;
export const MAX_SAMPLES = 256;
export const DEFAULT_DPI = 300;
/** Labels need every component of each period located (the census); beyond 14 that takes too long for a plate. */
export const MAX_LABEL_PERIOD = 14;

const TOP_KEYS = [
  'kind',
  'schema',
  'writtenBy',
  'title',
  'note',
  'view',
  'pixels',
  'print',
  'dpi',
  'iterations',
  'samples',
  'depth',
  'colour',
  'labels',
  'arithmetic',
  'skip',
  'reference',
  'output',
  'figure',
  'startup',
];

type Json = Record<string, unknown>;

function isObject(v: unknown): v is Json {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function noUnknownKeys(obj: Json, allowed: readonly string[], field: string): void {
  for (const key of Object.keys(obj)) {
    if (!allowed.includes(key)) {
      const where = field === '' ? key : `${field}.${key}`;
      throw new UserError(where, `one of the fields ${allowed.join(', ')}${field === '' ? '' : ` in ${field}`}`, new Received(`an unknown field "${key}"`));
    }
  }
}

/** A decimal string, validated; kept as written (trailing zeros and all). */
export function parseDecimalString(value: unknown, field: string): string {
  return parseDecimalText(value, field);
}

/** A sheet's integer field: a JSON number only ("3000" is refused, not read). */
export function parseInteger(value: unknown, field: string, min: number, max: number): number {
  return parseIntegerField(value, field, min, max, 'number');
}

export function parseNumber(value: unknown, field: string, min: number, max: number): number {
  if (typeof value !== 'number' || !Number.isFinite(value) || value < min || value > max) {
    throw new UserError(field, `a number between ${min} and ${max}`, value);
  }
  return value;
}

function parseSpan(value: unknown, field: string): string {
  const text = parseDecimalString(value, field);
  if (!new Decimal(text).isPositive() || new Decimal(text).isZero()) {
    throw new UserError(field, 'a positive decimal span (width of the view in c units)', value);
  }
  if (new Decimal(text).greaterThan(64)) throw new UserError(field, 'a span of at most 64 (the set lies within |c| <= 2)', value);
  return text;
}

function parseSamples(value: unknown, field: string): number {
  const k = parseInteger(value, field, 1, MAX_SAMPLES);
  const root = Math.round(Math.sqrt(k));
  if (root * root !== k) throw new UserError(field, 'a square number of samples per pixel (1, 4, 9, 16, ... 256)', value);
  return k;
}

function parseBoolean(value: unknown, field: string): boolean {
  if (typeof value !== 'boolean') throw new UserError(field, 'true or false', value);
  return value;
}

function parseArithmetic(value: unknown): 'auto' | 'double' | 'deep' {
  if (value !== 'auto' && value !== 'double' && value !== 'deep') throw new UserError('arithmetic', 'one of auto, double, deep', value);
  return value;
}

function parseReference(value: unknown): Sheet['reference'] {
  if (value === null) return null;
  if (!isObject(value)) throw new UserError('reference', 'an object { "re": "...", "im": "...", "period": P } or null', value);
  noUnknownKeys(value, ['re', 'im', 'period'], 'reference');
  return {
    re: parseDecimalString(value['re'], 'reference.re'),
    im: parseDecimalString(value['im'], 'reference.im'),
    period: parseInteger(value['period'], 'reference.period', 1, 1_000_000),
  };
}

/**
 * The depth rule: the ceiling of the probe that resolves 'auto' for plates
 * and pyramids (methods B9), and the limit itself for Julia plates. 1000 at
 * the whole set, growing as the
 * 1.5th power of the magnification in bits, zoom = log2(3 / span):
 * 19 000 at a span of 1e-13, 370 000 at 1e-100, capped at 10^7. Common
 * practice (deeper views need more iterations), not a published rule.
 */
export function autoIterations(span: string): number {
  const zoom = Math.max(0, Math.log2(3) - new Decimal(span).log(2).toNumber());
  return Math.min(10_000_000, Math.round(1000 + 40 * zoom ** 1.5));
}

/** The iteration limit a sheet asks for, with 'auto' resolved by the depth rule alone (Julia plates). */
export function resolveIterations(sheet: Pick<Sheet, 'iterations' | 'view'>): number {
  return sheet.iterations === 'auto' ? autoIterations(sheet.view.span) : sheet.iterations;
}

/** Pixels from a print size in millimetres at a given dpi. */
export function printPixels(mm: number, dpi: number): number {
  return Math.max(1, Math.round((mm / 25.4) * dpi));
}

/** Checks a parsed JSON sheet and fills in defaults. `name` becomes the default output file name. */
export function parseSheet(input: unknown, name = 'plate'): Sheet {
  if (!isObject(input)) throw new UserError('sheet', 'a JSON object', input);
  const value: Json = { ...input };
  migrateSheet(value, 'sheet', ['plate']);
  noUnknownKeys(value, TOP_KEYS, '');
  if (value['writtenBy'] !== undefined && typeof value['writtenBy'] !== 'string')
    throw new UserError('writtenBy', 'a string naming the quadatlas version that wrote the sheet', value['writtenBy']);
  const text = (v: unknown, field: string): string => {
    if (v === undefined) return '';
    if (typeof v !== 'string') throw new UserError(field, 'a string', v);
    return v;
  };
  const viewIn = value['view'] ?? {};
  if (!isObject(viewIn)) throw new UserError('view', 'an object with re, im, span (and rotation)', viewIn);
  noUnknownKeys(viewIn, ['re', 'im', 'span', 'rotation'], 'view');
  const view = {
    re: parseDecimalString(viewIn['re'] ?? '-0.75', 'view.re'),
    im: parseDecimalString(viewIn['im'] ?? '0', 'view.im'),
    span: parseSpan(viewIn['span'] ?? '3.2', 'view.span'),
    rotation: parseNumber(viewIn['rotation'] ?? 0, 'view.rotation', -360, 360),
  };
  const dpi = parseNumber(value['dpi'] ?? DEFAULT_DPI, 'dpi', 1, 10_000);
  let width = 1200;
  let height = 900;
  if (value['pixels'] !== undefined && value['print'] !== undefined) {
    throw new UserError('print', 'either pixels or print, not both', new Received('both'));
  }
  if (value['pixels'] !== undefined) {
    const px = value['pixels'];
    if (!isObject(px)) throw new UserError('pixels', 'an object { "width": W, "height": H }', px);
    noUnknownKeys(px, ['width', 'height'], 'pixels');
    width = parseInteger(px['width'], 'pixels.width', 1, MAX_SIDE);
    height = parseInteger(px['height'], 'pixels.height', 1, MAX_SIDE);
  } else if (value['print'] !== undefined) {
    const pr = value['print'];
    if (!isObject(pr)) throw new UserError('print', 'an object { "width_mm": W, "height_mm": H }', pr);
    noUnknownKeys(pr, ['width_mm', 'height_mm'], 'print');
    width = printPixels(parseNumber(pr['width_mm'], 'print.width_mm', 1, 100_000), dpi);
    height = printPixels(parseNumber(pr['height_mm'], 'print.height_mm', 1, 100_000), dpi);
    if (width > MAX_SIDE || height > MAX_SIDE)
      throw new UserError('print', `a print size of at most ${MAX_SIDE} pixels a side at ${dpi} dpi`, new Received(`${width}x${height} pixels`));
  }
  const outIn = value['output'] ?? {};
  if (!isObject(outIn)) throw new UserError('output', 'an object { "file": ..., "data": ..., "sidecar": ... }', outIn);
  noUnknownKeys(outIn, ['file', 'data', 'sidecar'], 'output');
  const file = outIn['file'] === undefined ? `out/${name}.png` : text(outIn['file'], 'output.file');
  if (!/\.(png|tif|tiff|pdf|svg)$/i.test(file)) throw new UserError('output.file', 'a file name ending in .png, .tif, .tiff, .pdf or .svg', file);
  const data = outIn['data'] === undefined || outIn['data'] === null ? null : text(outIn['data'], 'output.data');
  const sidecar = outIn['sidecar'] ?? true;
  if (typeof sidecar !== 'boolean') throw new UserError('output.sidecar', 'true or false', sidecar);
  const depth = value['depth'] ?? 8;
  if (depth !== 8 && depth !== 16) throw new UserError('depth', '8 or 16', depth);
  const startup = value['startup'] ?? false;
  if (typeof startup !== 'boolean') throw new UserError('startup', 'true or false', startup);
  return {
    title: text(value['title'], 'title'),
    note: text(value['note'], 'note'),
    view,
    width,
    height,
    dpi,
    iterations: value['iterations'] === 'auto' ? 'auto' : parseInteger(value['iterations'] ?? 2000, 'iterations', 1, MAX_ITERATIONS),
    samples: parseSamples(value['samples'] ?? 9, 'samples'),
    depth,
    colour: parseColourSettings(value['colour'] ?? {}, 'colour'),
    labels: parseInteger(value['labels'] ?? 0, 'labels', 0, MAX_LABEL_PERIOD),
    arithmetic: parseArithmetic(value['arithmetic'] ?? 'auto'),
    skip: parseBoolean(value['skip'] ?? true, 'skip'),
    reference: parseReference(value['reference'] ?? null),
    output: { file, data, sidecar },
    figure: parseFigure(value['figure'], file, view.rotation),
    startup,
  };
}

/**
 * The part of a sheet that determines the pixels, as recorded in a plate's
 * metadata: everything but where the files go. Re-rendering from it gives the
 * same bytes.
 */
export function renderRecord(sheet: Sheet, version: string): Json {
  return {
    kind: 'plate',
    schema: SHEET_SCHEMA,
    writtenBy: `quadatlas ${version}`,
    title: sheet.title,
    note: sheet.note,
    view: { ...sheet.view },
    pixels: { width: sheet.width, height: sheet.height },
    dpi: sheet.dpi,
    iterations: sheet.iterations,
    samples: sheet.samples,
    depth: sheet.depth,
    colour: sheet.colour as unknown as Json,
    labels: sheet.labels,
    arithmetic: sheet.arithmetic,
    skip: sheet.skip,
    reference: sheet.reference === null ? null : { ...sheet.reference },
    ...(sheet.figure === null
      ? {}
      : {
          figure: {
            axes: sheet.figure.axes,
            caption: sheet.figure.caption,
            rays: [...sheet.figure.rays],
            raysOf: sheet.figure.raysOf,
            equipotentials: sheet.figure.equipotentials,
            outlines: sheet.figure.outlines,
            scaleBar: sheet.figure.scaleBar,
            internalRays: sheet.figure.internalRays === null ? null : { period: sheet.figure.internalRays.period, angles: [...sheet.figure.internalRays.angles] },
            marks: sheet.figure.marks.map((m) => ({ ...m })),
          },
        }),
  };
}

/**
 * The whole sheet as JSON, outputs included: what `presets show` prints.
 * `parseSheet(sheetRecord(s))` gives back `s`.
 */
export function sheetRecord(sheet: Sheet, version: string): Json {
  return {
    ...renderRecord(sheet, version),
    output: { file: sheet.output.file, data: sheet.output.data, sidecar: sheet.output.sidecar },
    startup: sheet.startup,
  };
}
