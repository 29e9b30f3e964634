/**
 * `quadatlas sheet FILE`: print the sheet stored in a file quadatlas wrote (a
 * plate's PNG or TIFF, a JSON sidecar, a section plot's SVG or PNG). The
 * printed JSON is a sheet: `quadatlas sheet a.png > a.json && quadatlas plate
 * a.json` renders the same image bytes (the output name aside).
 */
import type { Command } from 'commander';
import { migrateSheet } from '../view/sheet-kind.js';
import { sheetFromPlate } from './plate.js';

export function register(program: Command): void {
  program
    .command('sheet')
    .description('print the sheet stored in a PNG, TIFF, SVG or JSON sidecar quadatlas wrote')
    .argument('<file>', 'an image, plot or sidecar written by quadatlas')
    .action(async (file: string) => {
      const raw = await sheetFromPlate(file, 'file');
      migrateSheet(raw, 'file');
      process.stdout.write(`${JSON.stringify(raw, null, 2)}\n`);
    });
}
