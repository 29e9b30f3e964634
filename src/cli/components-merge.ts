/**
 * `quadatlas components merge DIR --out FILE.csv|.parquet`: the shard files
 * that `components --period P --shard I/N --out DIR` wrote, checked as a set
 * (src/components/census-shard.ts) and written as one table, in the order of
 * the single run. Any problem is one line and exit 2, and nothing is written.
 */
import type { Command } from 'commander';
import { readdir, readFile, stat } from 'node:fs/promises';
import path from 'node:path';
import { UserError } from '../check/user-error.js';
import { checkShardSet, parseShardComment, type ShardRows } from '../components/census-shard.js';
import { exactPeriodCount } from '../components/certify/exact-period-count.js';
import { prepareOutputFile } from '../io/check-writable-directory.js';
import { csvCells, writeTableFile, type ColumnType } from '../io/table-file.js';
import { addOptions, type OptionSpec } from './option-spec.js';

export const MERGE_OPTIONS: readonly OptionSpec[] = [{ flags: '--out <file>', description: 'the merged table: .csv or .parquet, by its extension (required, no default)' }];

interface ReadShard extends ShardRows {
  readonly head: readonly string[];
  readonly cells: readonly (readonly string[])[];
}

async function readShard(file: string, field: string): Promise<ReadShard> {
  const lines = (await readFile(file, 'utf8')).split('\n');
  if (lines[lines.length - 1] === '') lines.pop();
  const header = parseShardComment(lines[0] ?? '');
  if (header === null)
    throw new UserError(field, 'a folder of shard files only (each .csv starting "# quadatlas components shard")', `${file}: ${JSON.stringify((lines[0] ?? '').slice(0, 40))}`);
  const head = csvCells(lines[1] ?? '');
  const cells = lines.slice(2).map((l) => csvCells(l));
  const col = (name: string): number => {
    const i = head.indexOf(name);
    if (i < 0) throw new UserError(field, `a ${name} column in every shard`, `${file}: ${head.join(',')}`);
    return i;
  };
  const [a, re, im, sz] = [col('angle_lo'), col('nucleus_re'), col('nucleus_im'), col('size')];
  return {
    file: path.basename(file),
    header,
    rows: cells.length,
    head,
    cells,
    angleLo: cells.map((c) => c[a] ?? ''),
    nucleusRe: cells.map((c) => c[re] ?? ''),
    nucleusIm: cells.map((c) => c[im] ?? ''),
    size: cells.map((c) => c[sz] ?? ''),
  };
}

/** Registers `merge` under the components command; `types` are the listing's typed columns. */
export function registerMerge(components: Command, types: Readonly<Record<string, ColumnType>>): void {
  addOptions(components.command('merge <dir>').description('check the shard files in DIR and write them as one table'), MERGE_OPTIONS).action(
    async (dir: string, o: Record<string, unknown>) => {
      // commander gives `--out` to the parent command when both declare it
      const given = o['out'] ?? components.opts()['out'];
      const out = typeof given === 'string' ? given : null;
      if (out === null) throw new UserError('--out', 'the merged file, FILE.csv or FILE.parquet', undefined);
      if (!['.csv', '.parquet'].some((e) => out.toLowerCase().endsWith(e))) throw new UserError('--out', 'a file name ending in .csv or .parquet', out);
      const st = await stat(dir).catch(() => null);
      if (st === null || !st.isDirectory()) throw new UserError('DIR', 'a folder holding shard files', dir);
      await prepareOutputFile(out, '--out');
      const names = (await readdir(dir)).filter((n) => n.toLowerCase().endsWith('.csv')).sort();
      const shards: ReadShard[] = [];
      for (const n of names) {
        const file = path.join(dir, n);
        if (path.resolve(file) === path.resolve(out)) continue;
        shards.push(await readShard(file, 'DIR'));
      }
      const ordered = checkShardSet(shards, 'DIR') as ReadShard[];
      const head = ordered[0]!.head;
      for (const s of ordered)
        if (s.head.join(',') !== head.join(','))
          throw new UserError('DIR', `the same columns in every shard (${ordered[0]!.file}: ${head.join(',')})`, `${s.file}: ${s.head.join(',')}`);
      const rows = ordered.flatMap((s) => s.cells);
      await writeTableFile(
        out,
        head.map((name) => ({ name, type: types[name] ?? 'string' })),
        rows,
      );
      const period = ordered[0]!.header.period;
      process.stderr.write(`quadatlas: merged ${ordered.length} shards of period ${period}: ${rows.length} rows to ${out}\n`);
      // every component of the period, or fewer (shards listed with --real or --within, or pairs the census could not place)
      const all = Number(exactPeriodCount(period));
      if (rows.length !== all)
        process.stderr.write(`quadatlas: note: period ${period} has ${all} components (sum over d | ${period} of mu(${period}/d) 2^(d-1)); these shards hold ${rows.length}\n`);
    },
  );
}
