/**
 * The options of `quadatlas plate`, declared once: the commander parser and
 * --help are built from this table, and `applyPlateOptions` turns parsed flag
 * values into overrides of a sheet (pure, unit-tested without a process).
 */
import { COLOUR_OPTIONS } from './colour-options.js';
import { UserError } from '../check/user-error.js';
import type { OptionSpec } from './option-spec.js';
import { parseSize } from '../check/fields.js';

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

export const PLATE_OPTIONS: readonly OptionSpec[] = [
  {
    flags: '--center <re,im>',
    description: 'centre of the view in c, RE,IM as decimal numbers kept as written (default -0.75,0; sheet view.re, view.im)',
    apply: (s, v) => {
      const parts = v.split(',');
      if (parts.length !== 2) throw new UserError('--center', 'two decimal numbers RE,IM (e.g. -0.75,0.1)', v);
      const view = sub(s, 'view');
      view['re'] = parts[0]!.trim();
      view['im'] = parts[1]!.trim();
    },
  },
  {
    flags: '--span <width>',
    description: 'width of the view in c units, a decimal such as 3.2 or 1e-9 (default 3.2; sheet view.span)',
    apply: (s, v) => void (sub(s, 'view')['span'] = v),
  },
  {
    flags: '--rotation <degrees>',
    description: 'turn the view counter-clockwise about its centre, in degrees (default 0; sheet view.rotation)',
    apply: (s, v) => void (sub(s, 'view')['rotation'] = number(v)),
  },
  {
    flags: '--size <WxH>',
    description: 'image size in pixels WxH, e.g. 1600x1200 (default 1200x900; sheet pixels)',
    apply: (s, v) => {
      const [w, h] = parseSize(v, '--size');
      delete s['print'];
      s['pixels'] = { width: w, height: h };
    },
  },
  {
    flags: '--print <WxHmm>',
    description: 'print size in millimetres WxHmm, e.g. 420x297mm; pixels follow from --dpi (default: use --size; sheet print)',
    apply: (s, v) => {
      const [w, h] = parseSize(v, '--print', 'mm');
      delete s['pixels'];
      s['print'] = { width_mm: w, height_mm: h };
    },
  },
  { flags: '--dpi <dots>', description: 'print resolution in dots per inch, written into the file (default 300; sheet dpi)', apply: (s, v) => void (s['dpi'] = number(v)) },
  {
    flags: '--iterations <n>',
    description: 'iteration limit per sample, or auto (chosen from the view, reported) (default 2000; sheet iterations)',
    apply: (s, v) => void (s['iterations'] = v.trim() === 'auto' ? 'auto' : integer(v, '--iterations')),
  },
  {
    flags: '--arith <mode>',
    description: 'arithmetic: auto, double or deep; auto picks deep where doubles cannot resolve the pixels (default auto; sheet arithmetic)',
    apply: (s, v) => void (s['arithmetic'] = v),
  },
  { flags: '--no-skip', description: 'deep arithmetic: step every iteration, no bilinear-approximation skipping (default: skip; sheet skip)' },
  {
    flags: '--reference <re,im,period>',
    description: 'deep arithmetic: a nucleus RE,IM and its period (e.g. from `quadatlas locate`) as the reference orbit (default: the centre; sheet reference)',
    apply: (s, v) => {
      const parts = v.split(',');
      if (parts.length !== 3) throw new UserError('--reference', 'RE,IM,PERIOD (a nucleus and its period)', v);
      s['reference'] = { re: parts[0]!.trim(), im: parts[1]!.trim(), period: integer(parts[2]!, '--reference') };
    },
  },
  {
    flags: '--samples <n>',
    description: 'samples per refined pixel: 1 (off) or a square such as 4, 9, 16 (default 9; sheet samples)',
    apply: (s, v) => void (s['samples'] = integer(v, '--samples')),
  },
  { flags: '--depth <bits>', description: 'bits per channel: 8 or 16 (default 8; sheet depth)', apply: (s, v) => void (s['depth'] = integer(v, '--depth')) },
  ...COLOUR_OPTIONS,
  {
    flags: '--label-periods <n>',
    description: 'mark and label the nuclei of periods 1..n that are large enough, n from 0 (none) to 14 (default 0; sheet labels)',
    apply: (s, v) => void (s['labels'] = integer(v, '--label-periods')),
  },
  { flags: '--title <text>', description: 'title recorded in the metadata (default none; sheet title)', apply: (s, v) => void (s['title'] = v) },
  { flags: '--axes', description: 'figures: frame, ticks and labels in Re c and Im c outside the image; not with --rotation (default: none; sheet figure.axes)' },
  { flags: '--scale-bar', description: 'figures: a bar of a round length in c, labelled with it, in the lower left corner of the plate (default: none; sheet figure.scaleBar)' },
  { flags: '--caption <text>', description: 'figures: text drawn below the figure (default none; sheet figure.caption)', apply: (s, v) => void (sub(s, 'figure')['caption'] = v) },
  {
    flags: '--rays <angles>',
    description:
      'figures: parameter rays of these external angles p/q, comma-separated (e.g. 1/3,2/3,1/7), traced to where they land and labelled (default none; sheet figure.rays)',
    apply: (s, v) => void (sub(s, 'figure')['rays'] = v.split(',').map((a) => a.trim())),
  },
  {
    flags: '--rays-of <period>',
    description: 'figures: both rays landing at the root of every component of this period (1 to 12) in view, 0 for none (default 0; sheet figure.raysOf)',
    apply: (s, v) => void (sub(s, 'figure')['raysOf'] = integer(v, '--rays-of')),
  },
  {
    flags: '--equipotentials <n>',
    description: 'figures: n level curves of the potential, G_0 / 2^k for k = 0..n-1 with G_0 the largest in view, n from 0 (none) to 64 (default 0; sheet figure.equipotentials)',
    apply: (s, v) => void (sub(s, 'figure')['equipotentials'] = integer(v, '--equipotentials')),
  },
  {
    flags: '--outlines <period>',
    description: 'figures: draw the boundary of every component of this period (1 to 14) in view, 0 for none (default 0; sheet figure.outlines)',
    apply: (s, v) => void (sub(s, 'figure')['outlines'] = integer(v, '--outlines')),
  },
  {
    flags: '--internal-rays <spec>',
    description:
      'figures: internal rays of every component of this period (1 to 14) whose nucleus is in view, at these internal angles (0 or p/q, comma-separated), from the nucleus to the boundary, e.g. 1:0,1/3,1/2 (default none; sheet figure.internalRays)',
    apply: (s, v) => {
      const m = /^\s*([^:]*):(.*)$/.exec(v);
      if (m === null) throw new UserError('--internal-rays', 'PERIOD:ANGLES, a period and internal angles 0 or p/q (e.g. 1:0,1/3,1/2)', v);
      sub(s, 'figure')['internalRays'] = { period: integer(m[1]!, '--internal-rays'), angles: m[2]!.split(',').map((a) => a.trim()) };
    },
  },
  {
    flags: '--marks <file.csv>',
    description: 'figures: labelled points from a CSV file of rows re,im,label; the rows are recorded in the sheet (default none; sheet figure.marks)',
  },
  {
    flags: '--out <file>',
    description: 'output file: an image ending in .png, .tif or .tiff, or a figure ending in .pdf or .svg (default out/<sheet>.png; sheet output.file)',
    apply: (s, v) => void (sub(s, 'output')['file'] = v),
  },
  {
    flags: '--data <dir>',
    description: 'also write the per-pixel arrays as NPY files into this directory (default none; sheet output.data)',
    apply: (s, v) => void (sub(s, 'output')['data'] = v),
  },
  { flags: '--no-sidecar', description: 'do not write the JSON sidecar FILE.json beside the image (default: write it; sheet output.sidecar)' },
  { flags: '--workers <n>', description: 'worker threads, never changes the output (default: one per core)' },
  { flags: '--tile-size <pixels>', description: 'tile side in pixels, 8 to 1024, never changes the output (default 64)' },
  { flags: '--again <file>', description: 'render again from the sheet stored in a PNG, TIFF, PDF, SVG or JSON sidecar quadatlas wrote (default: none)' },
  { flags: '--json', description: 'print a JSON summary of the render on stdout (default: a one-line report on stderr)' },
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
  if (values['axes'] === true) sub(sheet, 'figure')['axes'] = true;
  if (values['scaleBar'] === true) sub(sheet, 'figure')['scaleBar'] = true;
  return sheet;
}

/** commander's attribute name for a flag: "--no-sidecar" -> "sidecar", "--span <w>" -> "span". */
export function attributeName(flags: string): string {
  const long = flags.split(/[ ,|]+/).find((f) => f.startsWith('--'))!;
  const bare = long.replace(/^--(no-)?/, '');
  return bare.replace(/-([a-z])/g, (_, c: string) => c.toUpperCase());
}

/** Sheet fields (or their prefixes) and the plate flag that sets each. */
const FIELD_FLAGS: ReadonlyArray<readonly [string, string]> = [
  ['view.re', '--center'],
  ['view.im', '--center'],
  ['view.span', '--span'],
  ['view.rotation', '--rotation'],
  ['pixels', '--size'],
  ['print', '--print'],
  ['dpi', '--dpi'],
  ['iterations', '--iterations'],
  ['arithmetic', '--arith'],
  ['reference', '--reference'],
  ['samples', '--samples'],
  ['depth', '--depth'],
  ['labels', '--label-periods'],
  ['title', '--title'],
  ['output.file', '--out'],
  ['figure.caption', '--caption'],
  ['figure.rays', '--rays'],
  ['figure.outlines', '--outlines'],
  ['figure.raysOf', '--rays-of'],
  ['figure.equipotentials', '--equipotentials'],
  ['figure.internalRays', '--internal-rays'],
  ['output.data', '--data'],
];

/**
 * The flag that set sheet field `field` in this run, or undefined when the
 * field came from the sheet file (or no flag sets it).
 */
export function flagForField(field: string, values: Record<string, unknown>, options: readonly OptionSpec[] = PLATE_OPTIONS): string | undefined {
  for (const [prefix, flag] of FIELD_FLAGS) {
    if (field !== prefix && !field.startsWith(`${prefix}.`) && !field.startsWith(`${prefix}[`)) continue;
    const spec = options.find((o) => o.flags.startsWith(`${flag} `) || o.flags === flag);
    if (spec !== undefined && typeof values[attributeName(spec.flags)] === 'string') return flag;
  }
  return undefined;
}

/** A UserError about a sheet field set by a flag names both: "--size (sheet field pixels.width)". */
export function nameTheFlag(err: unknown, values: Record<string, unknown>): unknown {
  if (!(err instanceof UserError)) return err;
  const flag = flagForField(err.field, values);
  if (err.field === 'figure' && typeof values['out'] === 'string') return err.withField('--out (sheet field output.file)');
  if (flag === undefined && err.field === 'figure.axes' && values['axes'] === true) return err.withField('--axes (sheet field figure.axes)');
  if (flag === undefined && err.field === 'figure.scaleBar' && values['scaleBar'] === true) return err.withField('--scale-bar (sheet field figure.scaleBar)');
  return flag === undefined ? err : err.withField(`${flag} (sheet field ${err.field})`);
}
