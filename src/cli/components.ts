/**
 * `quadatlas components --period P`: every hyperbolic component of exact
 * period P (all, real ones, or those in a box), or just their number.
 * Components are found by landing the rays of every period-P external angle
 * (src/components/census.ts); rows are sorted by the lower external angle of
 * the root, i.e. counter-clockwise around the set starting from the cusp 1/4.
 */
import type { Command } from 'commander';
import { availableParallelism } from 'node:os';
import { census, MAX_CENSUS_PERIOD } from '../components/census.js';
import type { CensusComponent } from '../components/census.js';
import type { ComponentInfo } from '../components/component-info.js';
import { listComponents, listingPool, listRowCells } from '../components/list-components.js';
import { LISTING_HEADER, listingRow } from '../components/component-json.js';
import { censusSlices } from '../components/census-slices.js';
import { parseBox, componentJson } from './component-report.js';
import { certifyListing, MAX_CERTIFY_PERIOD, reportCensusCertificate } from './certify-report.js';
import { UserError } from '../check/user-error.js';
import { parseInteger } from '../check/fields.js';
import { addOptions, PROGRESS_JSON_OPTION, type OptionSpec } from './option-spec.js';
import { createProgress, type Progress } from '../render/progress.js';
import { TABLE_EXTENSIONS, writeTableFile, type ColumnType } from '../io/table-file.js';
import { prepareOutputFile } from '../io/check-writable-directory.js';
import { mkdir, rm, stat } from 'node:fs/promises';
import os from 'node:os';
import { releaseTemp, removeStaleTemps, tempPathFor } from '../io/temp-path.js';
import { totalmem } from 'node:os';
import { checkFreeSpace, formatBytes } from '../io/check-free-space.js';
import { openTableStream, textTableStream } from '../io/table-stream.js';
import path from 'node:path';
import { resolveShard } from '../render/pyramid-shard.js';
import { shardAngleRange, shardCommentLine, shardHeader } from '../components/census-shard.js';
import { registerMerge } from './components-merge.js';
import { misiurewiczCount, parseMisiurewiczType } from '../components/misiurewicz-points.js';
import { angleTexts, listMisiurewicz } from '../components/misiurewicz-list.js';

/** Longest listing period: the census' (memory and disk are checked against an estimate before starting, listingEstimate). */
export const MAX_LIST_PERIOD = MAX_CENSUS_PERIOD;

/** Bytes per component the census holds while it runs (docs/census.md: about 865 MB at period 22). */
const CENSUS_BYTES = 420;
/** Bytes per row held when the output is not streamed (text table, --json to stdout, --certify). */
const ROW_BYTES = 1500;

/**
 * What a listing of `period` needs, estimated from 2^(p-1) components (an
 * upper bound of OEIS A000740): memory (the census, plus the rows unless they
 * stream) and the bytes of a CSV file at `digits` digits.
 */
export function listingEstimate(period: number, digits: number, streamed: boolean, sliced = false): { components: number; memory: number; file: number } {
  const components = 2 ** (period - 1);
  const memory = sliced ? components * SLICED_BYTES + SLICED_BASE : components * (CENSUS_BYTES + (streamed ? 0 : ROW_BYTES));
  return { components, memory, file: components * (4 * (digits + 4) + 110) };
}

/**
 * The census in slices holds the traced pairs (8 bytes each, about half as many as components) and
 * one slice at a time: measured 4.5 bytes per component (peak RSS once the slices are planned, periods
 * 26 to 27) and about 460 MB for a slice and two workers (periods 22, 23; docs/census.md).
 */
const SLICED_BYTES = 5;
const SLICED_BASE = 500 * 2 ** 20;

export const COMPONENTS_OPTIONS: readonly OptionSpec[] = [
  { flags: '--period <period>', description: 'exact period, an integer from 1 (required unless --misiurewicz, no default)' },
  {
    flags: '--misiurewicz <k,p>',
    description: 'instead of components: the Misiurewicz points of exact preperiod K and period P (z_{K+1+P} = z_{K+1} for z_1 = c), with their external angles (default: none)',
  },
  { flags: '--real', description: 'only components on the real axis (default: all)' },
  { flags: '--within <box>', description: 'only nuclei inside the box RE0,IM0,RE1,IM1 in c (default: the whole plane)' },
  {
    flags: '--digits <digits>',
    description:
      'digits after the decimal point for nuclei and roots (more for a component smaller than 10^(6-D): to a millionth of its size); sizes to D significant digits (at most 17)',
    default: '20',
  },
  { flags: '--count', description: 'print only the number of components, with the time taken on stderr (default: list them)' },
  { flags: '--workers <n>', description: 'worker threads for the census (default: all cores)' },
  { flags: '--certify', description: 'prove each nucleus (a disk holding exactly one, of exact period P) and the census complete (default: computed, not proved)' },
  { flags: '--json', description: 'JSON output (default: aligned text)' },
  { flags: '--csv', description: 'CSV output with snake_case columns (default: aligned text)' },
  {
    flags: '--out <file>',
    description: 'write the rows to FILE instead of stdout: .csv, .json or .parquet (typed columns), by its extension; with --shard a .csv or a folder (default: stdout)',
  },
  {
    flags: '--shard <i/n>',
    description:
      'only the components whose lower angle lies in the I-th of N ranges; `components merge` joins them (default from SLURM_ARRAY_TASK_ID/_COUNT or JOB_COMPLETION_INDEX, else all)',
  },
  { flags: '--shards <n>', description: 'number of shards, with JOB_COMPLETION_INDEX (Kubernetes Indexed Job) (default: no sharding)' },
  PROGRESS_JSON_OPTION,
];

export function register(program: Command): void {
  const cmd = program
    .command('components')
    .description('list or count the hyperbolic components of exact period P, or the Misiurewicz points of preperiod K and period P; `components merge DIR` joins shards');
  // `components merge DIR` takes no --period: commander checks a parent's required options in its subcommands too
  cmd.hook('preSubcommand', (c) => {
    for (const opt of c.options) if (opt.long === '--period') opt.mandatory = false;
  });
  registerMerge(cmd, COLUMN_TYPES);
  addOptions(cmd, COMPONENTS_OPTIONS).action(async (o: Record<string, unknown>) => {
    const count = o['count'] === true;
    const certify = o['certify'] === true;
    if (o['misiurewicz'] !== undefined) {
      if (o['period'] !== undefined) throw new UserError('--misiurewicz', 'no --period beside it (K,P gives the period)', `--period ${String(o['period'])}`);
      for (const f of ['real', 'within', 'certify', 'out', 'workers', 'shard', 'shards'])
        if (o[f] !== undefined) throw new UserError('--misiurewicz', `no --${f} beside it (not offered for Misiurewicz points)`, `--${f}`);
      if (o['json'] === true && o['csv'] === true) throw new UserError('--json, --csv', 'one of --json or --csv', '--json --csv');
      await listMisiurewiczCommand(o);
      return;
    }
    if (o['period'] === undefined) throw new UserError('--period', 'an exact period (or --misiurewicz K,P)', 'nothing');
    const period = parseInteger(o['period'], '--period', 1, count ? MAX_CENSUS_PERIOD : MAX_LIST_PERIOD);
    // CSV and files stream their rows as blocks complete; the text table, JSON on stdout and --certify hold them all
    const streamed = !certify && (typeof o['out'] === 'string' || (o['csv'] === true && o['json'] !== true));
    const sliced = !certify && (count || streamed) && period >= SLICED_FROM && o['shard'] === undefined && o['shards'] === undefined;
    const need = listingEstimate(period, o['digits'] === undefined ? 20 : Number(o['digits']), streamed || count, sliced);
    const memory = totalmem();
    if (need.memory > 0.8 * memory) {
      throw new UserError(
        '--period',
        `a period whose ${count ? 'census' : 'listing'} fits in memory (period ${period}: about ${formatBytes(need.memory)} for up to ${need.components} components${streamed || count ? '' : '; --csv or --out streams the rows'}; this machine has ${formatBytes(memory)})`,
        period,
      );
    }
    const shard = resolveShard(typeof o['shard'] === 'string' ? o['shard'] : undefined, typeof o['shards'] === 'string' ? o['shards'] : undefined, process.env);
    if (shard !== null && certify)
      throw new UserError(
        '--certify',
        'a whole census (the proof of completeness needs every shard; certify after merging is not offered)',
        `--shard ${shard.index}/${shard.count}`,
      );
    if (certify && period > MAX_CERTIFY_PERIOD) {
      throw new UserError(
        '--period',
        `a period of at most ${MAX_CERTIFY_PERIOD} with --certify (every certified disk is kept in memory; period ${period} would need about ${Math.ceil((2 ** (period - 1) * 400) / 2 ** 30)} GB)`,
        period,
      );
    }
    const digits = parseInteger(o['digits'], '--digits', 1, 2000);
    const workers = o['workers'] === undefined ? availableParallelism() : parseInteger(o['workers'], '--workers', 0, 256);
    const box = o['within'] === undefined ? null : parseBox(o['within'], '--within');
    if (o['json'] === true && o['csv'] === true) throw new UserError('--json, --csv', 'one of --json or --csv', '--json --csv');
    let out = typeof o['out'] === 'string' ? o['out'] : null;
    if (out !== null) {
      if (count) throw new UserError('--out', 'a listing (without --count) to write', '--count');
      if (shard !== null) {
        // a shard goes to a CSV with its header line (period, I/N, angle range), by default named after itself in a folder
        const isDir = out.endsWith('/') || (await stat(out).catch(() => null))?.isDirectory() === true;
        if (isDir) {
          await mkdir(out, { recursive: true });
          out = path.join(out, `components-p${period}-shard-${shard.index}-of-${shard.count}.csv`);
        } else if (!out.toLowerCase().endsWith('.csv')) throw new UserError('--out', 'a .csv file or a folder for a shard (`components merge` writes Parquet)', out);
      } else if (!TABLE_EXTENSIONS.some((e) => out!.toLowerCase().endsWith(e))) throw new UserError('--out', 'a file name ending in .csv, .json or .parquet', out);
      await prepareOutputFile(out, '--out');
      await checkFreeSpace(path.dirname(path.resolve(out)), need.file, '--out');
    }
    if (shard === null && !certify && (count || streamed) && period >= SLICED_FROM) {
      await slicedCensus(period, { count, json: o['json'] === true, real: o['real'] === true, box, digits, workers, out, progressJson: o['progressJson'] === true });
      return;
    }
    const angleRange = shard === null ? undefined : shardAngleRange(period, shard);
    const t0 = performance.now();
    const progressJson = o['progressJson'] === true;
    // a terminal line once the census has run a second (shorter ones print nothing), or JSON lines from the start
    // (the pairing reports only its start and end; the landing's clock starts with its first chunk, so its ETA leaves the pairing out)
    const pairing = createProgress(`quadatlas: period ${period}:`, { json: progressJson, unit: 'steps', phase: 'pairing', delayMs: 1000 });
    pairing.update(0, 1);
    let landing: Progress | null = null;
    const result = await census(period, {
      workers,
      ...(angleRange === undefined ? {} : { angleRange }),
      onProgress: (d, t) => {
        if (landing === null) {
          pairing.update(1, 1);
          landing = createProgress(`quadatlas: period ${period}:`, { json: progressJson, unit: 'rays', phase: 'landing', delayMs: 1000 });
        }
        landing.update(d, t);
      },
    });
    (landing as Progress | null)?.end();
    const seconds = (performance.now() - t0) / 1000;
    let comps: readonly CensusComponent[] = result.components;
    if (o['real'] === true) comps = comps.filter((c) => c.real);
    if (box !== null) comps = comps.filter((c) => inBox(c, box));
    if (result.unpaired > 0 || result.raysLost > 0) {
      process.stderr.write(`quadatlas: warning: ${result.unpaired} angle pairs could not be given a nucleus of their own, ${result.raysLost} rays were lost\n`);
    }
    const proof = certify ? await reportCensusCertificate(result, workers, progressJson) : null;
    if (count) {
      const n = comps.length;
      if (o['json'] === true) {
        const extra = proof === null ? {} : { certified: proof.ok, certifySeconds: proof.seconds };
        process.stdout.write(
          `${JSON.stringify({
            period,
            real: o['real'] === true,
            count: n,
            seconds: Number(seconds.toFixed(2)),
            raysTraced: result.raysTraced,
            unpaired: result.unpaired,
            ...extra,
            ...(shard === null ? {} : { shard: shardHeader(period, shard, n) }),
            statistics: result.statistics,
          })}\n`,
        );
      } else process.stdout.write(`${n}\n`);
      const slice = shard === null ? '' : ` (shard ${shard.index}/${shard.count})`;
      process.stderr.write(`quadatlas: period ${period}${slice}: ${n} components located in ${seconds.toFixed(2)} s (${result.raysTraced} rays, ${workers} workers)\n`);
      return;
    }
    const listing = createProgress(`quadatlas: period ${period}:`, { json: progressJson, unit: 'rows', phase: 'listing', delayMs: 1000 });
    let noRoot = 0;
    if (streamed) {
      // rows go out block by block, in order, as the workers finish them
      const columns = HEADER.map((name) => ({ name, type: COLUMN_TYPES[name] ?? 'string' }));
      const comment = shard === null ? undefined : shardCommentLine(shardHeader(period, shard, comps.length));
      const sink = out === null ? textTableStream(process.stdout, columns, 'csv') : await openTableStream(out, columns, comment);
      try {
        await listComponents(
          period,
          comps,
          digits,
          workers,
          (d, t) => listing.update(d, t),
          (block) => sink.write(block.map(flat)),
        );
        await sink.close();
      } catch (err) {
        await sink.abort();
        throw err;
      }
      listing.end();
      warnNoRoot(noRoot);
      if (out !== null) process.stderr.write(`quadatlas: wrote ${out} (${comps.length} rows)\n`);
      return;
    }
    const rows = await listComponents(period, comps, digits, workers, (d, t) => listing.update(d, t));
    warnNoRoot(rows.filter((r) => r.root.re === '').length);
    listing.end();
    const radii = certify ? certifyListing(period, rows, digits) : null;
    if (out !== null) {
      const head = radii === null ? HEADER : [...HEADER, 'certified_radius'];
      await writeTableFile(
        out,
        head.map((name) => ({ name, type: COLUMN_TYPES[name] ?? 'string' })),
        rows.map((r, i) => (radii === null ? flat(r) : [...flat(r), radii[i]!])),
        shard === null ? undefined : shardCommentLine(shardHeader(period, shard, rows.length)),
      );
      process.stderr.write(`quadatlas: wrote ${out} (${rows.length} rows)\n`);
      return;
    }
    if (o['json'] === true)
      process.stdout.write(
        `${JSON.stringify(
          {
            period,
            statistics: result.statistics,
            components: rows.map((r, i) => (radii === null ? componentJson(r) : { ...componentJson(r), certifiedRadius: radii[i] })),
          },
          null,
          2,
        )}\n`,
      );
    else if (o['csv'] === true) process.stdout.write(toCsv(rows, radii));
    else process.stdout.write(toTable(rows, radii));
  });
}

/** Most points listed: Aberth-Ehrlich costs points^2 per sweep and about 0.4 points sweeps (2048 points: about 30 s). */
export const MAX_MISIUREWICZ_POINTS = 2048;

async function listMisiurewiczCommand(o: Record<string, unknown>): Promise<void> {
  const { preperiod, period } = parseMisiurewiczType(o['misiurewicz'], '--misiurewicz', 30, 30);
  const expected = misiurewiczCount(preperiod, period);
  if (expected > MAX_MISIUREWICZ_POINTS)
    throw new UserError(
      '--misiurewicz',
      `a preperiod and period with at most ${MAX_MISIUREWICZ_POINTS} points (the root finder holds and compares every pair)`,
      `${preperiod},${period} (${expected} points)`,
    );
  const digits = parseInteger(o['digits'], '--digits', 1, 2000);
  const t0 = performance.now();
  const progress = process.stderr.isTTY
    ? (stage: string, done: number, total: number): void => {
        process.stderr.write(`\rquadatlas: misiurewicz ${preperiod},${period}: ${stage} ${done}/${total}   `);
      }
    : undefined;
  const listing = listMisiurewicz(preperiod, period, digits, progress, o['count'] !== true);
  if (progress !== undefined) process.stderr.write('\n');
  const seconds = (performance.now() - t0) / 1000;
  const n = listing.points.length;
  const found = listing.points.filter((p) => p.angles.length > 0).length;
  process.stderr.write(
    `quadatlas: misiurewicz ${preperiod},${period}: ${n} points in ${seconds.toFixed(2)} s (Hutz-Towsley count ${expected}; ${listing.sweeps} Aberth sweeps; ${o['count'] === true ? 'angles not searched' : `angles found for ${found}, rays of periods ${listing.anglePeriods.join(', ') || 'none'}`})\n`,
  );
  if (n !== expected || !listing.converged) process.stderr.write(`quadatlas: warning: ${n} of ${expected} points confirmed (${listing.rejected} roots rejected)\n`);
  const rows = listing.points.map((p) => ({ preperiod, period, re: p.c.re, im: p.c.im, angles: angleTexts(p.angles) }));
  if (o['count'] === true) {
    if (o['json'] === true) process.stdout.write(`${JSON.stringify({ preperiod, period, count: n, expected, seconds: Number(seconds.toFixed(2)) })}\n`);
    else process.stdout.write(`${n}\n`);
    return;
  }
  if (o['json'] === true) {
    process.stdout.write(
      `${JSON.stringify(
        rows.map((r) => ({ misiurewicz: { re: r.re, im: r.im }, preperiod, period, externalAngles: r.angles })),
        null,
        2,
      )}\n`,
    );
    return;
  }
  const head = ['preperiod', 'period', 're', 'im', 'external_angles'];
  const cells = rows.map((r) => [String(preperiod), String(period), r.re, r.im, r.angles.join(' ')]);
  if (o['csv'] === true) {
    process.stdout.write([head.join(','), ...cells.map((c) => c.join(','))].join('\n') + '\n');
    return;
  }
  const all = [head, ...cells];
  const widths = head.map((_, i) => Math.max(...all.map((r) => r[i]!.length)));
  process.stdout.write(
    all
      .map((r) =>
        r
          .map((v, i) => v.padEnd(widths[i]!))
          .join('  ')
          .trimEnd(),
      )
      .join('\n') + '\n',
  );
}

/** From this period on, counts and streamed listings run the census in slices (census-slices.ts): bounded memory. */
export const SLICED_FROM = 19;

/**
 * The census of `period` in slices: counted, or listed as the slices hand
 * their components over (to `out`, or CSV on stdout), with progress on stderr
 * and the time per component at the end.
 */
async function slicedCensus(
  period: number,
  o: {
    count: boolean;
    json: boolean;
    real: boolean;
    box: { re0: number; im0: number; re1: number; im1: number } | null;
    digits: number;
    workers: number;
    out: string | null;
    progressJson: boolean;
  },
): Promise<void> {
  const t0 = performance.now();
  const progress = createProgress(`quadatlas: period ${period}:`, { json: o.progressJson, unit: 'components', phase: o.count ? 'census' : 'listing', delayMs: 1000 });
  const columns = HEADER.map((name) => ({ name, type: COLUMN_TYPES[name] ?? 'string' }));
  const sink = o.count ? null : o.out === null ? textTableStream(process.stdout, columns, 'csv') : await openTableStream(o.out, columns);
  let total = 0;
  let handed = 0;
  let kept = 0;
  let noRoot = 0;
  let listSeconds = 0;
  // the slices' temporary files live in a registered temporary folder: a signal removes it, a later run removes one a kill left
  const workName = `quadatlas-census-p${period}`;
  await removeStaleTemps(os.tmpdir(), workName);
  const work = tempPathFor(path.join(os.tmpdir(), workName));
  await mkdir(work);
  // one set of listing threads for every slice (started once, not once a slice)
  const pool = sink === null || o.workers <= 1 ? null : listingPool(o.workers);
  try {
    const result = await censusSlices(period, {
      workers: o.workers,
      tempDir: work,
      onPlan: (components) => {
        total = components;
        progress.update(0, total);
      },
      onComponents: async (comps) => {
        handed += comps.length;
        let chosen = comps;
        if (o.real) chosen = chosen.filter((c) => c.real);
        if (o.box !== null) chosen = chosen.filter((c) => inBox(c, o.box!));
        kept += chosen.length;
        if (sink !== null && chosen.length > 0) {
          const t = performance.now();
          await listRowCells(
            period,
            chosen,
            o.digits,
            o.workers,
            async (rows) => {
              noRoot += rows.filter((r) => r[3] === '').length;
              await sink.write(rows);
            },
            pool ?? undefined,
          );
          listSeconds += (performance.now() - t) / 1000;
        }
        progress.update(handed, total);
      },
    });
    await sink?.close();
    progress.end();
    const seconds = (performance.now() - t0) / 1000;
    if (result.unpaired > 0 || result.raysLost > 0 || result.crossDuplicates > 0) {
      process.stderr.write(
        `quadatlas: warning: ${result.unpaired} angle pairs could not be given a nucleus of their own, ${result.raysLost} rays were lost, ${result.crossDuplicates} nuclei of different slices coincide\n`,
      );
    }
    warnNoRoot(noRoot);
    const split = {
      pairing: Number(result.seconds.pairing.toFixed(2)),
      landingAndListing: Number(result.seconds.landing.toFixed(2)),
      listing: Number(listSeconds.toFixed(2)),
      distinctness: Number(result.seconds.distinctness.toFixed(2)),
    };
    if (o.count) {
      if (o.json)
        process.stdout.write(
          `${JSON.stringify({
            period,
            real: o.real,
            count: kept,
            seconds: Number(seconds.toFixed(2)),
            raysTraced: result.raysTraced,
            unpaired: result.unpaired,
            slices: result.slices,
            crossDuplicates: result.crossDuplicates,
            secondsSplit: split,
            statistics: result.statistics,
          })}\n`,
        );
      else process.stdout.write(`${kept}\n`);
    }
    const perComponent = (1e6 * seconds) / Math.max(1, result.count);
    process.stderr.write(
      `quadatlas: period ${period}: ${result.count} components ${o.count ? 'located' : 'listed'} in ${seconds.toFixed(2)} s, ${perComponent.toFixed(1)} us per component (${result.slices} slices, ${result.raysTraced} rays, ${o.workers} workers; pairing ${split.pairing} s, rows ${split.listing} s, distinctness ${split.distinctness} s)\n`,
    );
    if (o.out !== null) process.stderr.write(`quadatlas: wrote ${o.out} (${kept} rows)\n`);
  } catch (err) {
    await sink?.abort();
    throw err;
  } finally {
    await pool?.close();
    await rm(work, { recursive: true, force: true });
    releaseTemp(work);
  }
}

/** A warning on stderr for rows whose root Newton could not reach (their root cells are empty). */
function warnNoRoot(n: number): void {
  if (n > 0) process.stderr.write(`quadatlas: warning: ${n} rows have no root (the walk of docs/methods.md C3 could not reach it); their root cells are empty\n`);
}

function inBox(c: CensusComponent, b: { re0: number; im0: number; re1: number; im1: number }): boolean {
  const re = c.reHi + c.reLo;
  const im = c.imHi + c.imLo;
  return re >= b.re0 && re <= b.re1 && im >= b.im0 && im <= b.im1;
}

/** Parquet and JSON column types of the listing (the others are strings: decimals kept as printed, exact fractions). */
export const COLUMN_TYPES: Record<string, ColumnType> = { period: 'int', size: 'double', orientation_deg: 'double', parent_period: 'int' };

/** The listing's columns, in order. */
export const HEADER: readonly string[] = LISTING_HEADER;

/** One row's cells as the CSV prints them. */
export const flat = listingRow;

function toCsv(rows: ComponentInfo[], radii: readonly string[] | null): string {
  const head = radii === null ? HEADER : [...HEADER, 'certified_radius'];
  return [head.join(','), ...rows.map((r, i) => (radii === null ? flat(r) : [...flat(r), radii[i]!]).join(','))].join('\n') + '\n';
}

function toTable(rows: ComponentInfo[], radii: readonly string[] | null): string {
  const head = radii === null ? HEADER : [...HEADER, 'certified_radius'];
  const cells = [head, ...rows.map((r, i) => (radii === null ? flat(r) : [...flat(r), radii[i]!]))];
  const widths = head.map((_, i) => Math.max(...cells.map((r) => (r[i] ?? '').length)));
  return (
    cells
      .map((r) =>
        r
          .map((v, i) => v.padEnd(widths[i] ?? 0))
          .join('  ')
          .trimEnd(),
      )
      .join('\n') + '\n'
  );
}
