/**
 * `quadatlas plate [SHEET.json] [flags]`: render one image of a view of the
 * c-plane. Flags override the sheet; `--again FILE` takes the sheet from the
 * metadata stored in an earlier plate.
 */
import type { Command } from 'commander';
import { readPlateMetadata } from '../io/plate-metadata.js';
import { parseSheet, type Sheet } from '../view/sheet.js';
import { applyPlateOptions, nameTheFlag, PLATE_OPTIONS } from './plate-options.js';
import { quickSheet } from './quick.js';
import { reportWrote } from './wrote.js';
import { renderSheet } from '../render/render-sheet.js';
import { readSheetFile, sheetName } from './sheet-file.js';
import { Received, UserError } from '../check/user-error.js';
import { toolVersion } from '../io/tool-version.js';
import { optionalInteger } from '../check/fields.js';
import { addOptions } from './option-spec.js';
import { readFile } from 'node:fs/promises';
import { parseMarksCsv } from '../view/marks-csv.js';

/**
 * The sheet recorded in a file quadatlas wrote (PNG, TIFF, SVG or JSON
 * sidecar), as raw JSON; `field` names the flag or argument in errors.
 */
export async function sheetFromPlate(file: string, field = '--again'): Promise<Record<string, unknown>> {
  let text: string | undefined;
  try {
    text = await readPlateMetadata(file);
  } catch (err) {
    throw new UserError(field, 'a PNG, TIFF, PDF, SVG or JSON sidecar written by quadatlas', new Received(`${file} (${(err as Error).message.split('\n')[0]})`));
  }
  if (text === undefined) throw new UserError(field, 'a file carrying a quadatlas sheet (PNG, TIFF, PDF, SVG or JSON sidecar)', new Received(`${file} (none found)`));
  const meta = JSON.parse(text) as { version?: string; sheet?: Record<string, unknown> };
  if (meta.sheet === undefined) throw new UserError(field, 'metadata holding a sheet', file);
  if (meta.version !== toolVersion()) {
    process.stderr.write(`quadatlas: note: ${file} was written by quadatlas ${meta.version ?? '?'}; this is ${toolVersion()}, so bytes may differ\n`);
  }
  return meta.sheet;
}

/** `--marks FILE.csv`: the file's rows become the sheet's figure.marks (so the sheet alone redraws them). */
export async function applyMarksFile(raw: Record<string, unknown>, values: Record<string, unknown>): Promise<Record<string, unknown>> {
  const file = values['marks'];
  if (typeof file !== 'string') return raw;
  let text: string;
  try {
    text = await readFile(file, 'utf8');
  } catch (err) {
    throw new UserError('--marks', 'a readable CSV file of rows re,im,label', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? 'unreadable'})`));
  }
  const figure = typeof raw['figure'] === 'object' && raw['figure'] !== null ? (raw['figure'] as Record<string, unknown>) : {};
  raw['figure'] = { ...figure, marks: parseMarksCsv(text, file) };
  return raw;
}

export function register(program: Command): void {
  const cmd = program
    .command('plate')
    .description('render one image of a view of the c-plane (flags override the sheet)')
    .argument('[sheet]', 'a sheet (JSON) holding the view, colouring and output');
  addOptions(cmd, PLATE_OPTIONS);
  cmd.action(async (sheetFile: string | undefined, values: Record<string, unknown>) => {
    let raw: Record<string, unknown>;
    let name = 'plate';
    if (typeof values['again'] === 'string') {
      if (sheetFile !== undefined) throw new UserError('--again', 'either a sheet or --again, not both', sheetFile);
      raw = await sheetFromPlate(values['again']);
      const stem = values['again'].replace(/\.json$/i, '').replace(/\.(png|tiff?|svg|pdf)$/i, '');
      name = `${sheetName(stem)}-again`;
      if (typeof values['out'] !== 'string') {
        const ext = /\.(tiff?|pdf|svg)(\.json)?$/i.exec(values['again'])?.[1]?.toLowerCase().replace('tiff', 'tif') ?? 'png';
        raw['output'] = { file: `${stem}-again.${ext}` };
      }
    } else if (sheetFile !== undefined) {
      raw = await readSheetFile(sheetFile);
      name = sheetName(sheetFile);
    } else {
      raw = {};
    }
    delete raw['startup'];
    const workers = optionalInteger(values['workers'], '--workers', 1, 256);
    const tileSize = optionalInteger(values['tileSize'], '--tile-size', 8, 1024);
    let summary;
    try {
      const sheet: Sheet = quickSheet(parseSheet(await applyMarksFile(applyPlateOptions(raw, values), values), name));
      summary = await renderSheet(sheet, { ...(workers === undefined ? {} : { workers }), ...(tileSize === undefined ? {} : { tileSize }) });
    } catch (err) {
      throw nameTheFlag(err, values);
    }
    if (values['json'] === true) process.stdout.write(`${JSON.stringify(summary, null, 2)}\n`);
    else reportWrote(summary.files, summary.seconds);
  });
}
