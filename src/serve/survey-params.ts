/**
 * The survey server's request parameters, each checked at the boundary with
 * the one error shape (UserError: field, expected, received), so the handlers
 * below trust what they get. Decimal strings stay strings; their length is
 * bounded (a longer centre is deeper than the page can reach and costs the
 * server a precision it will not spend for a request).
 */
import { Decimal } from 'decimal.js';
import { Received, UserError } from '../check/user-error.js';
import { isDecimalText } from '../check/fields.js';

/** Most characters in a decimal parameter (about 1e-390 at depth). */
export const MAX_DECIMAL_LENGTH = 420;
/** The frame (the plate the tiles are crops of): even sides up to this many pixels. */
export const MAX_FRAME_SIDE = 8192;
export const MIN_TILE_SIZE = 16;
export const MAX_TILE_SIZE = 512;
/** Zoom levels relative to the frame's span: span x 2^-level. */
export const MIN_LEVEL = -30;
export const MAX_LEVEL = 200;
/** The largest side of a print. */
export const MAX_PRINT_SIDE = 8192;

const D = Decimal.clone({ precision: 2000, toExpNeg: -7, toExpPos: 21, minE: -9e15, maxE: 9e15 });

export function decimalParam(value: string | null, field: string, most: number): string {
  if (value === null) throw new UserError(field, 'a decimal number', new Received('nothing'));
  if (value.length > MAX_DECIMAL_LENGTH) throw new UserError(field, `a decimal number of at most ${MAX_DECIMAL_LENGTH} characters`, new Received(`${value.length} characters`));
  if (!isDecimalText(value)) throw new UserError(field, 'a decimal number (e.g. -0.75)', value);
  const text = value.trim();
  if (new D(text).abs().greaterThan(most)) throw new UserError(field, `a decimal number between -${most} and ${most}`, value);
  return text;
}

export function spanParam(value: string | null, field: string): string {
  const text = decimalParam(value, field, 64);
  if (!new D(text).greaterThan(0)) throw new UserError(field, 'a positive span (the width of the view in c units, at most 64)', value);
  return text;
}

export function integerParam(value: string | null, field: string, min: number, max: number): number {
  const n = value !== null && /^[+-]?\d{1,10}$/.test(value) ? Number(value) : Number.NaN;
  if (!Number.isInteger(n) || n < min || n > max) throw new UserError(field, `an integer between ${min} and ${max}`, value ?? new Received('nothing'));
  return n;
}

export function evenSideParam(value: string | null, field: string): number {
  const n = integerParam(value, field, 2, MAX_FRAME_SIDE);
  if (n % 2 !== 0) throw new UserError(field, `an even number of pixels between 2 and ${MAX_FRAME_SIDE}`, value);
  return n;
}

/** span x 2^-level, exactly (2^-level is a finite decimal), as a decimal string. */
export function spanAtLevel(span: string, level: number): string {
  const factor = level >= 0 ? new D(0.5).pow(level) : new D(2).pow(-level);
  return new D(span).times(factor).toString();
}

/**
 * A frame: the plate (centre, span, width x height, no rotation) whose
 * crops the tiles are. The frame's centre sits on the corner between its
 * four middle pixels (both sides even), so tile (tx, ty) of `size` pixels
 * starts at frame pixel (width/2 + tx size, height/2 + ty size).
 */
export interface Frame {
  readonly re: string;
  readonly im: string;
  readonly span: string;
  readonly width: number;
  readonly height: number;
}

export interface TileRequest {
  readonly frame: Frame;
  readonly level: number;
  readonly size: number;
  readonly tx: number;
  readonly ty: number;
}

export function frameParams(q: URLSearchParams): Frame {
  return {
    re: decimalParam(q.get('re'), 're', 4),
    im: decimalParam(q.get('im'), 'im', 4),
    span: spanParam(q.get('span'), 'span'),
    width: evenSideParam(q.get('w'), 'w'),
    height: evenSideParam(q.get('h'), 'h'),
  };
}

export function tileParams(q: URLSearchParams): TileRequest {
  const frame = frameParams(q);
  const level = integerParam(q.get('level'), 'level', MIN_LEVEL, MAX_LEVEL);
  const size = integerParam(q.get('size'), 'size', MIN_TILE_SIZE, MAX_TILE_SIZE);
  const reach = (side: number): number => Math.ceil(side / 2 / size);
  const tx = integerParam(q.get('tx'), 'tx', -reach(frame.width), reach(frame.width) - 1);
  const ty = integerParam(q.get('ty'), 'ty', -reach(frame.height), reach(frame.height) - 1);
  return { frame, level, size, tx, ty };
}

/** The tile's rectangle in frame pixels, cut to the frame. */
export function tileRect(t: TileRequest): { x0: number; y0: number; w: number; h: number } {
  const x0 = t.frame.width / 2 + t.tx * t.size;
  const y0 = t.frame.height / 2 + t.ty * t.size;
  const cx0 = Math.max(0, x0);
  const cy0 = Math.max(0, y0);
  const w = Math.min(t.frame.width, x0 + t.size) - cx0;
  const h = Math.min(t.frame.height, y0 + t.size) - cy0;
  if (w <= 0 || h <= 0) throw new UserError('tx', 'a tile that meets the frame', `${t.tx},${t.ty}`);
  return { x0: cx0, y0: cy0, w, h };
}

/** "RE,IM" for the probe. */
export function pointParam(value: string | null, field: string): { re: string; im: string } {
  if (value === null) throw new UserError(field, 'a point RE,IM', new Received('nothing'));
  if (value.length > 2 * MAX_DECIMAL_LENGTH + 1)
    throw new UserError(field, `a point RE,IM of at most ${2 * MAX_DECIMAL_LENGTH + 1} characters`, new Received(`${value.length} characters`));
  const parts = value.split(',');
  if (parts.length !== 2) throw new UserError(field, 'a point RE,IM (two decimal numbers and a comma)', value);
  return { re: decimalParam(parts[0]!, `${field} (real part)`, 4), im: decimalParam(parts[1]!, `${field} (imaginary part)`, 4) };
}
