/**
 * Where a `section` sheet comes from: a positional sheet file (JSON; a JSON
 * sidecar quadatlas wrote is taken too), `--again FILE` (the sheet stored in
 * a PNG, SVG or JSON sidecar quadatlas wrote), or nothing (all defaults).
 * The sheet is migrated to the current schema; a sheet of another kind is
 * refused in one line that names the command to use instead.
 */
import { readPlateMetadata } from '../../io/plate-metadata.js';
import type { Json } from '../../section/sheet-fields.js';
import { migrateSheet, SHEET_SCHEMA, type SheetKind } from '../../view/sheet-kind.js';
import { readSheetFile } from '../sheet-file.js';
import { Received, UserError } from '../../check/user-error.js';
import { toolVersion } from '../../io/tool-version.js';

/** The command that renders a sheet of `kind`. */
export function commandFor(kind: SheetKind): string {
  return kind.startsWith('section-') ? `quadatlas section ${kind.slice('section-'.length)}` : `quadatlas ${kind}`;
}

function isObject(v: unknown): v is Json {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

function checkKind(raw: Json, expected: SheetKind, field: string, file: string, how: (file: string) => string): Json {
  const kind = migrateSheet(raw, field);
  if (kind !== expected) {
    // The command to use goes in the expected part, which is never shortened.
    throw new UserError(field, `a ${expected} sheet (for this one use ${commandFor(kind)} ${how(file)})`, new Received(`a ${kind} sheet`));
  }
  return raw;
}

/** The sheet stored in an output file quadatlas wrote (PNG, TIFF, SVG, JSON sidecar), raw. */
export async function sheetFromOutput(file: string, field: string): Promise<Json> {
  let text: string | undefined;
  try {
    text = await readPlateMetadata(file);
  } catch (err) {
    throw new UserError(
      field,
      'a PNG, SVG or JSON file that quadatlas wrote',
      new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message.split('\n')[0]})`),
    );
  }
  if (text === undefined) throw new UserError(field, 'a file carrying quadatlas metadata', new Received(`${file} (none found)`));
  let meta: unknown;
  try {
    meta = JSON.parse(text);
  } catch {
    throw new UserError(field, 'quadatlas metadata holding JSON', new Received(`${file} (unreadable metadata)`));
  }
  if (!isObject(meta) || !isObject(meta['sheet'])) throw new UserError(field, 'metadata holding a sheet', new Received(file));
  if (meta['version'] !== toolVersion()) {
    process.stderr.write(`quadatlas: note: ${file} was written by quadatlas ${String(meta['version'] ?? '?')}; this is ${toolVersion()}, so bytes may differ\n`);
  }
  return meta['sheet'];
}

export interface LoadedSheet {
  readonly raw: Json;
  /** The --again file, when the sheet came from one. */
  readonly again?: string;
}

export async function loadSectionSheet(kind: SheetKind, sheetFile: string | undefined, again: unknown): Promise<LoadedSheet> {
  if (again !== undefined) {
    if (typeof again !== 'string') throw new UserError('--again', 'a file name', again);
    if (sheetFile !== undefined) throw new UserError('--again', 'either a sheet file or --again, not both', sheetFile);
    const raw = checkKind(await sheetFromOutput(again, '--again'), kind, '--again', again, (f) => `--again ${f}`);
    return { raw, again };
  }
  if (sheetFile === undefined) {
    return { raw: { kind, schema: SHEET_SCHEMA } };
  }
  let raw = await readSheetFile(sheetFile);
  // A JSON sidecar ({ metadata, summary }) or bare metadata carries its sheet inside.
  if (isObject(raw['metadata']) && isObject(raw['metadata']['sheet'])) raw = raw['metadata']['sheet'];
  else if (raw['tool'] === 'quadatlas' && isObject(raw['sheet'])) raw = raw['sheet'];
  return { raw: checkKind(raw, kind, 'sheet', sheetFile, (f) => f) };
}

/**
 * The default output of a run from `--again FILE`: FILE with "-again" before
 * its extension (a sidecar FILE.png.json gives FILE-again.png), keeping an
 * extension from `exts` or else taking the first.
 */
export function againOutput(again: string, exts: readonly string[]): string {
  const image = again.replace(/\.json$/i, '');
  const ext = exts.find((e) => image.toLowerCase().endsWith(e));
  return ext === undefined ? `${image}-again${exts[0]!}` : `${image.slice(0, -ext.length)}-again${image.slice(-ext.length)}`;
}
