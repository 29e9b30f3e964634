/**
 * Every sheet says what it renders (`kind`) and which version of the sheet
 * format it is written in (`schema`). Commands that take a sheet from a file
 * or an image (`plate`, `section ... --again`, `sheet`, `presets check`)
 * dispatch on `kind`; a sheet of an older schema is migrated, one of a newer
 * schema is refused in one line.
 *
 * Schema history:
 * - 0: no `kind` and no `schema` field (sheets written before both existed;
 *      they were all plates). Migrated by adding `kind: "plate"`.
 * - 1: `kind` and `schema` at the top level.
 */
import { Received, UserError } from '../check/user-error.js';

export const SHEET_SCHEMA = 1;

export type SheetKind = 'plate' | 'julia' | 'section-diagram' | 'section-lyapunov' | 'section-compare' | 'section-orbit' | 'section-cobweb' | 'section-entropy';
export const SHEET_KINDS: readonly SheetKind[] = ['plate', 'julia', 'section-diagram', 'section-lyapunov', 'section-compare', 'section-orbit', 'section-cobweb', 'section-entropy'];

/** The command that renders a sheet of each kind. */
export const COMMAND_OF_KIND: Readonly<Record<SheetKind, string>> = {
  plate: 'quadatlas plate',
  julia: 'quadatlas julia',
  'section-diagram': 'quadatlas section diagram',
  'section-lyapunov': 'quadatlas section lyapunov',
  'section-compare': 'quadatlas section compare',
  'section-orbit': 'quadatlas section orbit',
  'section-cobweb': 'quadatlas section cobweb',
  'section-entropy': 'quadatlas section entropy',
};

/**
 * The kind of a raw sheet, after migrating it in place to SHEET_SCHEMA
 * (`kind` and `schema` are then set). `expected` restricts the kinds a
 * command takes; `field` names where the sheet came from in errors.
 */
export function migrateSheet(raw: Record<string, unknown>, field = 'sheet', expected: readonly SheetKind[] = SHEET_KINDS): SheetKind {
  const schema = raw['schema'] ?? (raw['kind'] === undefined ? 0 : undefined);
  if (schema === undefined) throw new UserError(`${field}.schema`, `the sheet schema version (an integer from 0 to ${SHEET_SCHEMA})`, new Received('nothing'));
  if (typeof schema !== 'number' || !Number.isInteger(schema) || schema < 0) {
    throw new UserError(`${field}.schema`, `the sheet schema version (an integer from 0 to ${SHEET_SCHEMA})`, schema);
  }
  if (schema > SHEET_SCHEMA) {
    throw new UserError(`${field}.schema`, `a sheet schema this quadatlas reads (at most ${SHEET_SCHEMA}; a newer quadatlas wrote this one)`, schema);
  }
  if (schema === 0) {
    if (raw['kind'] !== undefined) throw new UserError(`${field}.kind`, 'no kind in a schema-0 sheet (schema 0 sheets are plates)', raw['kind']);
    raw['kind'] = 'plate';
  }
  const kind = raw['kind'];
  if (typeof kind !== 'string' || !(SHEET_KINDS as readonly string[]).includes(kind)) {
    throw new UserError(`${field}.kind`, `one of ${SHEET_KINDS.join(', ')}`, kind);
  }
  if (!(expected as readonly string[]).includes(kind)) {
    throw new UserError(`${field}.kind`, `a sheet of kind ${expected.join(' or ')} (render this one with ${COMMAND_OF_KIND[kind as SheetKind]})`, kind);
  }
  raw['schema'] = SHEET_SCHEMA;
  return kind as SheetKind;
}
