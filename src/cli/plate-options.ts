/**
 * The options of `quadatlas plate`, declared once: the commander parser and
 * --help are built from this table, and `applyPlateOptions` turns parsed flag
 * values into overrides of a sheet (pure, unit-tested without a process).
 */
import { COLOUR_OPTIONS } from './colour-options.js';
import { UserError } from './user-error.js';

export interface OptionSpec {
  readonly flags: string;
  readonly description: string;
  /** Writes the flag's value into the raw sheet object (before validation). */
  readonly apply?: (sheet: Record<string, unknown>, value: string) => void;
}

function sub(sheet: Record<string, unknown>, key: string): Record<string, unknown> {
  const v = sheet[key];
  if (typeof v === 'object' && v !== null && !Array.isArray(v)) return v as Record<string, unknown>;
  const fresh: Record<string, unknown> = {};
  sheet[key] = fresh;
  return fresh;
}

function integer(value: string, field: string): number | string {
  return /^[+-]?\d+$/.test(value.trim()) ? Number(value) : value;
}

function number(value: string): number | string {
  const n = Number(value);
  return value.trim() !== '' && Number.isFinite(n) ? n : value;
}

/** "WxH" with optional unit suffix, e.g. "1600x1200" or "420x297mm". */
export function parsePair(value: string, field: string, unit = ''): [number, number] {
  const m = new RegExp(`^\\s*(\\d+(?:\\.\\d+)?)\\s*[xX]\\s*(\\d+(?:\\.\\d+)?)\\s*${unit}\\s*$`).exec(value);
  if (!m) throw new UserError(field, `a size written WxH${unit} (e.g. ${unit === 'mm' ? '420x297mm' : '1600x1200'})`, value);
  return [Number(m[1]), Number(m[2])];
}

export const PLATE_OPTIONS: readonly OptionSpec[] = [
  {
    flags: '--center <re,im>',
    description: 'centre of the view as two decimal numbers, e.g. -0.75,0 (kept as written)',
    apply: (s, v) => {
      const parts = v.split(',');
      if (parts.length !== 2) throw new UserError('--center', 'two decimal numbers RE,IM (e.g. -0.75,0.1)', v);
      const view = sub(s, 'view');
      view['re'] = parts[0]!.trim();
      view['im'] = parts[1]!.trim();
    },
  },
  { flags: '--span <width>', description: 'width of the view in c units (decimal, e.g. 3.2 or 1e-9)', apply: (s, v) => void (sub(s, 'view')['span'] = v) },
  { flags: '--rotation <degrees>', description: 'turn the view counter-clockwise about its centre', apply: (s, v) => void (sub(s, 'view')['rotation'] = number(v)) },
  {
    flags: '--size <WxH>',
    description: 'size in pixels, e.g. 1600x1200',
    apply: (s, v) => {
      const [w, h] = parsePair(v, '--size');
      delete s['print'];
      s['pixels'] = { width: w, height: h };
    },
  },
  {
    flags: '--print <WxHmm>',
    description: 'print size in millimetres, e.g. 420x297mm (A3 landscape); pixels follow from --dpi',
    apply: (s, v) => {
      const [w, h] = parsePair(v, '--print', 'mm');
      delete s['pixels'];
      s['print'] = { width_mm: w, height_mm: h };
    },
  },
  { flags: '--dpi <dots>', description: 'print resolution written into the file (default 300)', apply: (s, v) => void (s['dpi'] = number(v)) },
  { flags: '--iterations <n>', description: 'iteration limit per sample, or auto (chosen from the depth, reported)', apply: (s, v) => void (s['iterations'] = v.trim() === 'auto' ? 'auto' : integer(v, '--iterations')) },
  { flags: '--arith <mode>', description: 'arithmetic: auto (default), double or deep; auto picks deep where doubles cannot resolve the pixels', apply: (s, v) => void (s['arithmetic'] = v) },
  { flags: '--no-skip', description: 'deep arithmetic: step every iteration (no bilinear-approximation skipping)' },
  {
    flags: '--reference <re,im,period>',
    description: 'deep arithmetic: a nucleus (e.g. from `quadatlas locate`) and its period as the reference orbit',
    apply: (s, v) => {
      const parts = v.split(',');
      if (parts.length !== 3) throw new UserError('--reference', 'RE,IM,PERIOD (a nucleus and its period)', v);
      s['reference'] = { re: parts[0]!.trim(), im: parts[1]!.trim(), period: integer(parts[2]!, '--reference') };
    },
  },
  { flags: '--samples <k>', description: 'samples per refined pixel: 1 (off) or a square, e.g. 4, 9, 16', apply: (s, v) => void (s['samples'] = integer(v, '--samples')) },
  { flags: '--depth <bits>', description: 'bits per channel: 8 or 16', apply: (s, v) => void (s['depth'] = integer(v, '--depth')) },
  ...COLOUR_OPTIONS,
  { flags: '--label-periods <n>', description: 'mark and label the nuclei of periods 1..n that are large enough (0: none)', apply: (s, v) => void (s['labels'] = integer(v, '--label-periods')) },
  { flags: '--title <text>', description: 'title recorded in the metadata', apply: (s, v) => void (s['title'] = v) },
  { flags: '--out <file>', description: 'output image (.png, .tif or .tiff)', apply: (s, v) => void (sub(s, 'output')['file'] = v) },
  { flags: '--data <dir>', description: 'also write the per-pixel arrays as NPY files into this directory', apply: (s, v) => void (sub(s, 'output')['data'] = v) },
  { flags: '--no-sidecar', description: 'do not write the JSON sidecar beside the image' },
  { flags: '--workers <n>', description: 'worker threads (default: all cores); never changes the output' },
  { flags: '--tile <pixels>', description: 'tile size in pixels (default 64); never changes the output' },
  { flags: '--again <file>', description: 're-render a plate from the metadata stored in its PNG or TIFF' },
  { flags: '--json', description: 'print a JSON summary of the render on stdout' },
];

/** Applies flag values (keyed by commander's camelCase names) to a raw sheet object, in table order. */
export function applyPlateOptions(sheet: Record<string, unknown>, values: Record<string, unknown>): Record<string, unknown> {
  for (const spec of PLATE_OPTIONS) {
    if (!spec.apply) continue;
    const key = attributeName(spec.flags);
    const v = values[key];
    if (typeof v === 'string') spec.apply(sheet, v);
  }
  if (values['sidecar'] === false) sub(sheet, 'output')['sidecar'] = false;
  if (values['skip'] === false) sheet['skip'] = false;
  return sheet;
}

/** commander's attribute name for a flag: "--no-sidecar" -> "sidecar", "--span <w>" -> "span". */
export function attributeName(flags: string): string {
  const long = flags.split(/[ ,|]+/).find((f) => f.startsWith('--'))!;
  const bare = long.replace(/^--(no-)?/, '');
  return bare.replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
}
