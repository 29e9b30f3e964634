/**
 * `quadatlas presets list|show|check|render`: the sheets in presets/.
 */
import { readdir } from 'node:fs/promises';
import path from 'node:path';
import type { Command } from 'commander';
import { parseSheet, type Sheet } from '../view/sheet.js';
import { parseCount } from './plate.js';
import { presetsDir } from './presets-dir.js';
import { renderSheet } from './render-sheet.js';
import { parseJuliaSheet, type JuliaSheet } from '../view/julia-sheet.js';
import { renderJuliaSheet } from './render-julia.js';
import { isFigureKind, parseFigureSheet, renderFigureSheet, type FigureSheet } from './figure-sheet.js';
import { readSheetFile, sheetName } from './sheet-file.js';
import { UserError } from './user-error.js';

interface Entry {
  name: string;
  file: string;
}

async function entries(): Promise<Entry[]> {
  const dir = presetsDir();
  const names = (await readdir(dir)).filter((f) => f.endsWith('.json')).sort();
  return names.map((f) => ({ name: sheetName(f), file: path.join(dir, f) }));
}

async function find(name: string): Promise<Entry> {
  const all = await entries();
  const hit = all.find((e) => e.name === name || path.basename(e.file) === name);
  if (!hit) throw new UserError('preset', `one of ${all.map((e) => e.name).join(', ')}`, name);
  return hit;
}

async function load(e: Entry): Promise<Sheet | JuliaSheet | FigureSheet> {
  const raw = await readSheetFile(e.file);
  if (raw['kind'] === 'julia') return parseJuliaSheet(raw, e.name);
  if (isFigureKind(raw['kind'])) return parseFigureSheet(raw, e.name);
  return parseSheet(raw, e.name);
}

export function register(program: Command): void {
  const presets = program.command('presets').description('list, show, check and render the sheets in presets/');
  presets
    .command('list')
    .description('one line per preset: name, size, title')
    .option('--json', 'print the list as JSON')
    .action(async (opts: { json?: boolean }) => {
      const rows = [];
      for (const e of await entries()) {
        const s = await load(e);
        rows.push({ name: e.name, width: s.width, height: s.height, startup: s.startup, title: s.title });
      }
      if (opts.json) {
        process.stdout.write(`${JSON.stringify(rows, null, 2)}\n`);
        return;
      }
      const w = Math.max(...rows.map((r) => r.name.length));
      for (const r of rows) process.stdout.write(`${r.name.padEnd(w)}  ${`${r.width}x${r.height}`.padEnd(11)} ${r.startup ? '*' : ' '} ${r.title}\n`);
      process.stdout.write('(* rendered by `npm start`)\n');
    });
  presets
    .command('show <name>')
    .description('print a preset with every default filled in')
    .action(async (name: string) => {
      const s = await load(await find(name));
      process.stdout.write(`${JSON.stringify(s, null, 2)}\n`);
    });
  presets
    .command('check [files...]')
    .description('check sheets against the schema (default: every preset); one line per sheet')
    .action(async (files: string[]) => {
      const targets: Entry[] = files.length > 0 ? files.map((f) => ({ name: sheetName(f), file: f })) : await entries();
      let bad = 0;
      for (const e of targets) {
        try {
          await load(e);
          process.stdout.write(`ok    ${e.file}\n`);
        } catch (err) {
          if (!(err instanceof UserError)) throw err;
          bad++;
          process.stdout.write(`error ${e.file}: ${err.message}\n`);
        }
      }
      if (bad > 0) process.exitCode = 2;
    });
  presets
    .command('render [names...]')
    .description('render presets (default: those marked startup) into their output files')
    .option('--out <dir>', 'write into this directory instead of the sheets\' own paths')
    .option('--all', 'render every preset')
    .option('--workers <n>', 'worker threads (default: all cores)')
    .action(async (names: string[], opts: { out?: string; all?: boolean; workers?: string }) => {
      const all = await entries();
      let chosen: Entry[];
      if (names.length > 0) chosen = await Promise.all(names.map(find));
      else if (opts.all) chosen = all;
      else {
        chosen = [];
        for (const e of all) if ((await load(e)).startup) chosen.push(e);
      }
      const workers = parseCount(opts.workers, '--workers', 1, 256);
      for (const e of chosen) {
        let sheet = await load(e);
        if (opts.out !== undefined) {
          const rebase = (p: string): string => path.join(opts.out!, path.basename(p));
          const moved = <T extends { readonly output: { readonly file: string; readonly data: string | null } }>(s: T): T => ({ ...s, output: { ...s.output, file: rebase(s.output.file), data: s.output.data === null ? null : rebase(s.output.data) } }) as T;
          sheet = moved(sheet);
        }
        if ('values' in sheet) {
          const files = await renderFigureSheet(sheet);
          process.stderr.write(`${e.name}: wrote ${files.join(', ')}\n`);
          continue;
        }
        const options = { label: e.name, ...(workers === undefined ? {} : { workers }) };
        const summary = 'kind' in sheet ? await renderJuliaSheet(sheet, options) : await renderSheet(sheet, options);
        process.stderr.write(`${e.name}: wrote ${summary.files.map((f) => path.relative(process.cwd(), f)).join(', ')} (${summary.seconds} s)\n`);
      }
    });
}
