import { Received, UserError } from '../check/user-error.js';
import { hexToLinear, linearToOklab, oklabToLinear, type Vec3 } from './oklab.js';

/**
 * A custom exterior gradient: colour stops at positions along one cycle.
 *
 * A sheet carries the stops themselves (`colour.gradient: [{at, colour}]`),
 * never a path to the file they came from, so a plate renders again from its
 * metadata alone. Positions `at` are fractions of a cycle in [0, 1], in
 * non-decreasing order (two stops at one position make a hard step: the later
 * one takes over there); colours are sRGB '#rrggbb'. Between stops the colour
 * is interpolated linearly in OKLab (Ottosson 2020), as the named gradients
 * are (exterior-gradients.ts); the cycle wraps from the last stop back to the
 * first, so a gradient whose first and last stops differ has no seam unless
 * they sit at 0 and 1.
 */
export interface GradientStop {
  readonly at: number;
  readonly colour: string;
}

export const MIN_GRADIENT_STOPS = 2;
export const MAX_GRADIENT_STOPS = 256;

const HEX = /^#?[0-9a-fA-F]{6}$/;

function isPlainObject(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v) && Object.getPrototypeOf(v) === Object.prototype;
}

/** '#rrggbb' or 'rrggbb' -> '#rrggbb' in lower case, or null. */
function normaliseHex(v: unknown): string | null {
  if (typeof v !== 'string' || !HEX.test(v.trim())) return null;
  const s = v.trim().toLowerCase();
  return s.startsWith('#') ? s : `#${s}`;
}

/**
 * Checks one stop. `where(key)` names the field for an error, e.g.
 * 'colour.gradient[2].at' or '--gradient (stops.csv, row 3, at)'.
 */
function checkStop(at: unknown, colour: unknown, previous: number, where: (key: 'at' | 'colour') => string): GradientStop {
  if (typeof at !== 'number' || !Number.isFinite(at) || at < 0 || at > 1) throw new UserError(where('at'), 'a position in [0, 1]', at);
  if (at < previous) throw new UserError(where('at'), `a position at or after the previous stop's ${previous}`, at);
  const hex = normaliseHex(colour);
  if (hex === null) throw new UserError(where('colour'), 'an sRGB colour "#rrggbb"', colour);
  return { at, colour: hex };
}

function checkCount(n: number, field: string, received: unknown): void {
  if (n < MIN_GRADIENT_STOPS || n > MAX_GRADIENT_STOPS) {
    throw new UserError(field, `between ${MIN_GRADIENT_STOPS} and ${MAX_GRADIENT_STOPS} colour stops`, received);
  }
}

/** Validates `colour.gradient` of a sheet: an array of {at, colour}. */
export function parseGradientStops(value: unknown, field: string): GradientStop[] {
  if (!Array.isArray(value)) throw new UserError(field, 'an array of colour stops [{"at": 0, "colour": "#rrggbb"}, ...]', value);
  checkCount(value.length, field, value);
  const stops: GradientStop[] = [];
  let previous = 0;
  value.forEach((entry, i) => {
    if (!isPlainObject(entry)) throw new UserError(`${field}[${i}]`, 'a colour stop {"at": number, "colour": "#rrggbb"}', entry);
    for (const key of Object.keys(entry)) {
      if (key !== 'at' && key !== 'colour') throw new UserError(`${field}[${i}].${key}`, 'no such key (known: at, colour)', entry[key]);
    }
    const stop = checkStop(entry['at'], entry['colour'], previous, (key) => `${field}[${i}].${key}`);
    previous = stop.at;
    stops.push(stop);
  });
  return stops;
}

/**
 * Reads colour stops from the text of a file: a JSON array of {at, colour}
 * (when the name ends in .json or the text starts with '['), otherwise CSV
 * with one stop per line, `at,colour` (an optional header line `at,colour`;
 * blank lines and lines starting with '#' followed by a space are skipped).
 * Errors name the file, the row (the line number in CSV, the index in JSON)
 * and the field, under `flag`.
 */
export function gradientStopsFromText(text: string, file: string, flag = '--gradient'): GradientStop[] {
  const trimmed = text.trim();
  if (/\.json$/i.test(file) || trimmed.startsWith('[')) {
    let json: unknown;
    try {
      json = JSON.parse(text) as unknown;
    } catch (err) {
      throw new UserError(`${flag} (${file})`, 'a JSON array of colour stops', new Received(`invalid JSON (${(err as Error).message})`));
    }
    if (!Array.isArray(json)) throw new UserError(`${flag} (${file})`, 'a JSON array of colour stops [{"at": 0, "colour": "#rrggbb"}, ...]', json);
    checkCount(json.length, `${flag} (${file})`, new Received(`${json.length} stops`));
    const stops: GradientStop[] = [];
    let previous = 0;
    json.forEach((entry, i) => {
      const where = (key: string): string => `${flag} (${file}, entry ${i}, ${key})`;
      if (!isPlainObject(entry)) throw new UserError(`${flag} (${file}, entry ${i})`, 'a colour stop {"at": number, "colour": "#rrggbb"}', entry);
      for (const key of Object.keys(entry)) if (key !== 'at' && key !== 'colour') throw new UserError(where(key), 'no such key (known: at, colour)', entry[key]);
      const stop = checkStop(entry['at'], entry['colour'], previous, where);
      previous = stop.at;
      stops.push(stop);
    });
    return stops;
  }
  const stops: GradientStop[] = [];
  let previous = 0;
  const lines = text.split(/\r?\n/);
  for (let k = 0; k < lines.length; k++) {
    const line = lines[k]!.trim();
    const row = k + 1;
    if (line === '' || line.startsWith('# ')) continue;
    const cells = line.split(',').map((c) => c.trim());
    if (stops.length === 0 && cells[0]?.toLowerCase() === 'at' && cells[1]?.toLowerCase() === 'colour' && cells.length === 2) continue;
    if (cells.length !== 2) throw new UserError(`${flag} (${file}, row ${row})`, 'two fields: at,colour (e.g. 0.5,#3a6ea5)', line);
    const where = (key: string): string => `${flag} (${file}, row ${row}, ${key})`;
    const at = cells[0] !== '' && Number.isFinite(Number(cells[0])) ? Number(cells[0]) : cells[0];
    const stop = checkStop(at, cells[1], previous, where);
    previous = stop.at;
    stops.push(stop);
  }
  checkCount(stops.length, `${flag} (${file})`, new Received(`${stops.length} stops`));
  return stops;
}

/** A custom gradient prepared for shading: positions and OKLab colours, flat. */
export interface PreparedGradient {
  readonly at: Float64Array;
  /** [L, a, b] per stop. */
  readonly lab: Float64Array;
}

export function prepareGradient(stops: readonly GradientStop[]): PreparedGradient {
  const at = new Float64Array(stops.length);
  const lab = new Float64Array(3 * stops.length);
  const t = [0, 0, 0];
  stops.forEach((s, i) => {
    at[i] = s.at;
    hexToLinear(s.colour, t);
    linearToOklab(t[0]!, t[1]!, t[2]!, t);
    lab.set(t, 3 * i);
  });
  return { at, lab };
}

/** The OKLab colour at position t in [0, 1) of a prepared custom gradient, written into out. */
export function customGradientOklab<T extends Vec3>(g: PreparedGradient, t: number, out: T): T {
  const { at, lab } = g;
  const n = at.length;
  // The last stop at or before t; -1 when t lies before the first stop.
  let i = -1;
  while (i + 1 < n && at[i + 1]! <= t) i++;
  let a: number, b: number, lo: number, hi: number;
  if (i === -1 || i === n - 1) {
    // The wrap segment from the last stop to the first stop of the next cycle.
    a = n - 1;
    b = 0;
    lo = at[n - 1]! - (i === -1 ? 1 : 0);
    hi = at[0]! + (i === -1 ? 0 : 1);
  } else {
    a = i;
    b = i + 1;
    lo = at[i]!;
    hi = at[i + 1]!;
  }
  const f = hi > lo ? (t - lo) / (hi - lo) : 0;
  for (let c = 0; c < 3; c++) {
    const x = lab[3 * a + c]!;
    out[c] = x + (lab[3 * b + c]! - x) * f;
  }
  return out;
}

/** The linear-light sRGB colour at position t of a prepared custom gradient (clipped to [0, 1]). */
export function customGradientLinear<T extends Vec3>(g: PreparedGradient, t: number, out: T): T {
  customGradientOklab(g, t, out);
  oklabToLinear(out[0]!, out[1]!, out[2]!, out);
  for (let c = 0; c < 3; c++) {
    const v = out[c]!;
    out[c] = v < 0 ? 0 : v > 1 ? 1 : v;
  }
  return out;
}
