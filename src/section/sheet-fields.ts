/**
 * Reading the fields of a real-slice sheet (`section-diagram`,
 * `section-lyapunov`, `section-compare`): one checker per kind of field,
 * each error one line naming the field. A field set by a command-line flag
 * is named by that flag instead (`--r-from` rather than `r.from`), so an
 * error always names what the user typed; `origin` maps field paths to the
 * flags that set them.
 */
import { Received, UserError } from '../check/user-error.js';
import { isDecimalText } from '../check/fields.js';

export type Json = Record<string, unknown>;

/** Field path ("r.from", "pixels") -> the flag that set it ("--r-from", "--size"). */
export type FieldOrigin = Readonly<Record<string, string>>;

export function isObject(v: unknown): v is Json {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

export class SheetFields {
  constructor(
    private readonly raw: Json,
    private readonly origin: FieldOrigin = {},
  ) {}

  /** The name an error uses for a field: the flag that set it, else its path. */
  name(path: string): string {
    return this.origin[path] ?? this.origin[path.split('.')[0]!] ?? path;
  }

  /** The raw value at a dotted path, or undefined. */
  get(path: string): unknown {
    let v: unknown = this.raw;
    for (const key of path.split('.')) {
      if (!isObject(v)) return undefined;
      v = v[key];
    }
    return v;
  }

  /** Refuses fields other than `allowed` in the object at `path` ('' for the top level). */
  only(path: string, allowed: readonly string[], shape: string): void {
    const obj = path === '' ? this.raw : this.get(path);
    if (obj === undefined) return;
    if (!isObject(obj)) throw new UserError(this.name(path), shape, obj);
    for (const key of Object.keys(obj)) {
      if (!allowed.includes(key)) {
        const where = path === '' ? key : `${path}.${key}`;
        throw new UserError(where, `one of the fields ${allowed.join(', ')}${path === '' ? '' : ` in ${path}`}`, new Received(`an unknown field "${key}"`));
      }
    }
  }

  /** A decimal number written as a string, kept as written (trimmed). */
  decimal(path: string, fallback: string): string {
    const v = this.get(path);
    if (v === undefined) return fallback;
    if (typeof v !== 'string' || !isDecimalText(v)) throw new UserError(this.name(path), 'a decimal number written as a string (e.g. "2.8")', v);
    return v.trim();
  }

  integer(path: string, min: number, max: number, fallback: number): number {
    const v = this.get(path);
    if (v === undefined) return fallback;
    if (typeof v !== 'number' || !Number.isInteger(v) || v < min || v > max) throw new UserError(this.name(path), `an integer between ${min} and ${max}`, v);
    return v;
  }

  choice<T extends string | number>(path: string, options: readonly T[], fallback: T): T {
    const v = this.get(path);
    if (v === undefined) return fallback;
    if (!(options as readonly unknown[]).includes(v)) throw new UserError(this.name(path), `one of ${options.join(', ')}`, v);
    return v as T;
  }

  boolean(path: string, fallback: boolean): boolean {
    const v = this.get(path);
    if (v === undefined) return fallback;
    if (typeof v !== 'boolean') throw new UserError(this.name(path), 'true or false', v);
    return v;
  }

  /** `{ width, height }` in pixels, each between min and max. */
  pixels(path: string, min: number, max: number, fallback: { width: number; height: number }): { width: number; height: number } {
    const v = this.get(path);
    if (v === undefined) return { ...fallback };
    const shape = `an object { "width": W, "height": H } in pixels, each between ${min} and ${max}`;
    if (!isObject(v)) throw new UserError(this.name(path), shape, v);
    this.only(path, ['width', 'height'], shape);
    const ok = (n: unknown): n is number => typeof n === 'number' && Number.isInteger(n) && n >= min && n <= max;
    if (!ok(v['width']) || !ok(v['height'])) {
      const from = this.origin[path];
      throw new UserError(
        from ?? path,
        from === undefined ? shape : `a size WxH in pixels, each between ${min} and ${max}`,
        from === undefined ? v : new Received(`${String(v['width'])}x${String(v['height'])}`),
      );
    }
    return { width: v['width'], height: v['height'] };
  }

  /** An output file name ending in one of `exts` (lower case, with the dot). */
  file(path: string, exts: readonly string[], fallback: string | null): string | null {
    const v = this.get(path);
    if (v === undefined || v === null) return fallback;
    if (typeof v !== 'string' || v.trim() === '' || !exts.some((e) => v.toLowerCase().endsWith(e))) {
      throw new UserError(this.name(path), `a file name ending in ${exts.join(' or ')}`, v);
    }
    return v;
  }
}

/**
 * The interval [from, to] of a sheet's axis (`r`, `x` or `c`) as decimal
 * strings, each within [lo, hi] and with from < to.
 */
export function readInterval(fields: SheetFields, axis: string, lo: number, hi: number, fallback: readonly [string, string], what: string): { from: string; to: string } {
  fields.only(axis, ['from', 'to'], `an object { "from": "...", "to": "..." } of decimal strings`);
  const from = fields.decimal(`${axis}.from`, fallback[0]);
  const to = fields.decimal(`${axis}.to`, fallback[1]);
  for (const [end, v] of [
    ['from', from],
    ['to', to],
  ] as const) {
    const n = Number(v);
    if (!(n >= lo && n <= hi)) throw new UserError(fields.name(`${axis}.${end}`), `${what} between ${lo} and ${hi}`, v);
  }
  if (!(Number(to) > Number(from))) throw new UserError(fields.name(`${axis}.to`), `a value above ${fields.name(`${axis}.from`)} (${from})`, to);
  return { from, to };
}
