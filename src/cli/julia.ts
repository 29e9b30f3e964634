/**
 * `quadatlas julia [SHEET.json] [flags]`: render one image of the dynamical
 * plane of one c. Flags override the sheet; `--again FILE` takes the sheet
 * from the metadata stored in an earlier Julia plate or figure. An output
 * .pdf or .svg (or figure flags) makes a figure (render-julia-figure.ts).
 */
import type { Command } from 'commander';
import { parseJuliaSheet } from '../view/julia-sheet.js';
import { applyJuliaOptions, JULIA_OPTIONS } from './julia-options.js';
import { applyMarksFile, sheetFromPlate } from './plate.js';
import { nameTheFlag } from './plate-options.js';
import { renderJuliaSheet } from '../render/render-julia.js';
import { readSheetFile, sheetName } from './sheet-file.js';
import { UserError } from '../check/user-error.js';
import { optionalInteger } from '../check/fields.js';
import { addOptions } from './option-spec.js';

export function register(program: Command): void {
  const cmd = program
    .command('julia')
    .description('render one image of the dynamical plane of one c (flags override the sheet)')
    .argument('[sheet]', 'a Julia sheet (JSON) holding c, the view, colouring and output');
  addOptions(cmd, JULIA_OPTIONS);
  cmd.action(async (sheetFile: string | undefined, values: Record<string, unknown>) => {
    let raw: Record<string, unknown>;
    let name = 'julia';
    if (typeof values['again'] === 'string') {
      if (sheetFile !== undefined) throw new UserError('--again', 'either a sheet or --again, not both', sheetFile);
      raw = await sheetFromPlate(values['again']);
      if (raw['kind'] !== 'julia') throw new UserError('--again', 'a Julia plate (use `quadatlas plate --again` for a c-plane plate)', values['again']);
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
    if (raw['c'] === undefined && raw['cardioidAngle'] === undefined && values['c'] === undefined && values['cardioidAngle'] === undefined) {
      throw new UserError('--c', 'a parameter --c RE,IM (or --cardioid-angle THETA, or a sheet holding c)', values['c']);
    }
    const workers = optionalInteger(values['workers'], '--workers', 1, 256);
    const tileSize = optionalInteger(values['tileSize'], '--tile-size', 8, 1024);
    const options = { ...(workers === undefined ? {} : { workers }), ...(tileSize === undefined ? {} : { tileSize }) };
    let summary;
    try {
      const sheet = parseJuliaSheet(await applyMarksFile(applyJuliaOptions(raw, values), values), name);
      summary = sheet.figure === null ? await renderJuliaSheet(sheet, options) : await (await import('../render/render-julia-figure.js')).renderJuliaFigure(sheet, options);
    } catch (err) {
      // a sheet field set by a flag is named with the flag: "--equipotentials (sheet field figure.equipotentials)"
      throw nameTheFlag(err, values);
    }
    if (values['json'] === true) process.stdout.write(`${JSON.stringify(summary, null, 2)}\n`);
    else process.stderr.write(`wrote ${summary.files.join(', ')} (${summary.seconds} s)\n`);
  });
}
