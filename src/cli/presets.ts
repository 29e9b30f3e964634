/**
 * `quadatlas presets list|show|check|render`: the sheets in presets/.
 */
import { readdir } from 'node:fs/promises';
import path from 'node:path';
import type { Command } from 'commander';
import { parseSheet, sheetRecord, type Sheet } from '../view/sheet.js';
import { juliaSheetRecord } from '../view/julia-sheet.js';
import { presetsDir } from './presets-dir.js';
import { renderSheet } from '../render/render-sheet.js';
import { parseJuliaSheet, type JuliaSheet } from '../view/julia-sheet.js';
import { renderJuliaSheet } from '../render/render-julia.js';
import { figureSheetRecord, isFigureKind, parseFigureSheet, renderFigureSheet, type FigureSheet } from './figure-sheet.js';
import { readSheetFile, sheetName } from './sheet-file.js';
import { UserError } from '../check/user-error.js';
import { quickSheet } from './quick.js';
import { toolVersion } from '../io/tool-version.js';
import { reportWrote } from './wrote.js';
import { optionalInteger } from '../check/fields.js';
import { addOptions, type OptionSpec } from './option-spec.js';

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

export const PRESETS_LIST_OPTIONS: readonly OptionSpec[] = [{ flags: '--json', description: 'print the list as JSON (default: aligned text)' }];

export const PRESETS_RENDER_OPTIONS: readonly OptionSpec[] = [
  { flags: '--out-dir <dir>', description: "write into this directory instead of the sheets' own paths (default: each sheet's output.file)" },
  { flags: '--all', description: 'render every preset (default: only those marked startup)' },
  { flags: '--workers <n>', description: 'worker threads, never changes the output (default: one per core)' },
];

export function register(program: Command): void {
  const presets = program.command('presets').description('list, show, check and render the sheets in presets/');
  addOptions(presets.command('list').description('one line per preset: name, size, title'), PRESETS_LIST_OPTIONS).action(async (opts: { json?: boolean }) => {
    const rows = [];
    for (const e of await entries()) {
      const s = await load(e);
      rows.push({ name: e.name, kind: 'kind' in s ? s.kind : 'plate', width: s.width, height: s.height, startup: s.startup, title: s.title });
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
    .description('print a preset as a complete sheet, every default filled in (it renders to the same bytes)')
    .action(async (name: string) => {
      const s = await load(await find(name));
      const record = 'values' in s ? figureSheetRecord(s, toolVersion()) : 'c' in s ? juliaSheetRecord(s, toolVersion()) : sheetRecord(s, toolVersion());
      process.stdout.write(`${JSON.stringify(record, null, 2)}\n`);
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
  addOptions(presets.command('render [names...]').description('render presets (default: those marked startup) into their output files'), PRESETS_RENDER_OPTIONS).action(
    async (names: string[], opts: { outDir?: string; all?: boolean; workers?: string }) => {
      const all = await entries();
      let chosen: Entry[];
      if (names.length > 0) chosen = await Promise.all(names.map(find));
      else if (opts.all) chosen = all;
      else {
        chosen = [];
        for (const e of all) if ((await load(e)).startup) chosen.push(e);
      }
      const workers = optionalInteger(opts.workers, '--workers', 1, 256);
      for (const e of chosen) {
        let sheet = await load(e);
        if (!('values' in sheet)) sheet = quickSheet(sheet);
        if (opts.outDir !== undefined) {
          const outDir = opts.outDir;
          const rebase = (p: string): string => path.join(outDir, path.basename(p));
          const moved = <T extends { readonly output: { readonly file: string; readonly data: string | null } }>(s: T): T =>
            ({ ...s, output: { ...s.output, file: rebase(s.output.file), data: s.output.data === null ? null : rebase(s.output.data) } }) as T;
          sheet = moved(sheet);
        }
        if ('values' in sheet) {
          const files = await renderFigureSheet(sheet);
          reportWrote(files);
          continue;
        }
        const options = { label: e.name, ...(workers === undefined ? {} : { workers }) };
        const summary = 'kind' in sheet ? await renderJuliaSheet(sheet, options) : await renderSheet(sheet, options);
        reportWrote(summary.files, summary.seconds);
      }
    },
  );
}
