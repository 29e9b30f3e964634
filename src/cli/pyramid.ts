/**
 * `quadatlas pyramid [SHEET] [flags] --out DIR`: a deep-zoom tile pyramid of
 * a view (IIIF Image API 3.0, level 0, as a static file tree) with an offline
 * viewer page. Runs on this machine (all tiles, or one shard of them for a
 * batch scheduler), or spreads the tiles over a Redis queue for
 * `quadatlas worker`. `--finish` checks that every tile is there and writes
 * info.json and the viewer. Flags override the sheet, as for `plate`.
 */
import type { Command } from 'commander';
import { existsSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { checkFreeSpace } from '../io/check-free-space.js';
import { iiifInfo, iiifTilePath } from '../io/iiif-info.js';
import { preparePyramidDir, pyramidKey, readPyramidSpec, MANIFEST_NAME } from '../io/iiif-manifest.js';
import { tileFileSize } from '../io/iiif-tile-file.js';
import { checkTileTree, TILES_FOLDER, writeIiifInfo } from '../io/iiif-tree.js';
import { writeViewer } from '../io/viewer-page.js';
import { createProgress } from '../render/progress.js';
import { pyramidSetup, type PyramidSetup } from '../render/pyramid-job.js';
import { pyramidSpec, sameSpec, type PyramidSpec, type TileFormat } from '../view/pyramid-spec.js';
import { pyramidTileAt } from '../view/pyramid-plan.js';
import { PyramidPool } from '../render/pyramid-pool.js';
import { renderPyramidShare, shareSize } from '../render/pyramid-run.js';
import { resolveShard, type Shard } from '../render/pyramid-shard.js';
import { parseSheet, type Sheet } from '../view/sheet.js';
import { DOUBLE_MIN_RELATIVE_SPACING, fitsDouble } from '../view/view.js';
import { sheetFromPlate } from './plate.js';
import { COLOUR_OPTIONS } from './colour-options.js';
import { applyPlateOptions, attributeName, PLATE_OPTIONS } from './plate-options.js';
import { addOptions, PROGRESS_JSON_OPTION, type OptionSpec } from './option-spec.js';
import { readSheetFile, sheetName } from './sheet-file.js';
import { Received, UserError } from '../check/user-error.js';
import { toolVersion } from '../io/tool-version.js';
import { quickSheet } from './quick.js';
import { reportWrote } from './wrote.js';
import { optionalInteger } from '../check/fields.js';

/** Plate flags that mean the same for a pyramid. */
const SHARED = [
  ...['--center', '--span', '--rotation', '--size', '--print', '--dpi', '--iterations', '--samples', '--title', '--workers', '--again'],
  // Colour applies to the tiles; the legend does not (the viewer page shows its own).
  ...COLOUR_OPTIONS.map((o) => o.flags.split(' ')[0]!).filter((f) => !f.startsWith('--legend')),
];

export const PYRAMID_OPTIONS: readonly OptionSpec[] = [
  ...PLATE_OPTIONS.filter((o) => SHARED.some((f) => o.flags.startsWith(`${f} `))),
  { flags: '--out-dir <dir>', description: 'output folder, empty or holding this same pyramid (default out/<sheet>-pyramid)' },
  { flags: '--tile-size <pixels>', description: 'tile side in pixels, 16 to 4096 (default 256)' },
  { flags: '--format <png|jpg>', description: 'tile format (default png)' },
  { flags: '--quality <percent>', description: 'JPEG quality 1-100 (default 90)' },
  { flags: '--base-url <url>', description: 'URL the folder will be served from; info.json id = <url>/tiles (default: its file:// URL)' },
  { flags: '--shard <i/n>', description: 'render only tiles t with t mod n = i (default from SLURM_ARRAY_TASK_ID/_COUNT or JOB_COMPLETION_INDEX)' },
  { flags: '--shards <n>', description: 'number of shards, with JOB_COMPLETION_INDEX (Kubernetes Indexed Job) (default: no sharding)' },
  { flags: '--finish', description: 'check that every tile exists, then write info.json and the viewer page (default: render, then finish when every tile is there)' },
  { flags: '--queue <url>', description: 'put the tiles on a Redis queue redis://host:port for `quadatlas worker`, wait, then finish (default: render here)' },
  { flags: '--json', description: 'print a JSON summary on stdout (default: a one-line report on stderr)' },
  PROGRESS_JSON_OPTION,
];

export const DEFAULT_PYRAMID_TILE = 256;

export interface PyramidSummary {
  readonly dir: string;
  readonly mode: 'local' | 'shard' | 'queue' | 'finish';
  readonly shard: string | null;
  readonly base: { readonly width: number; readonly height: number };
  readonly tileSize: number;
  readonly format: TileFormat;
  readonly levels: number;
  readonly tiles: { readonly total: number; readonly share: number; readonly rendered: number; readonly skipped: number; readonly missing: number | null };
  readonly bytesWritten: number;
  readonly finished: boolean;
  readonly seconds: number;
  readonly tilesPerSecond: number;
  readonly peakMemoryMiB: number;
  readonly workers?: readonly string[];
  readonly info?: string;
  readonly viewer?: string;
}

function parseFormat(v: unknown): TileFormat {
  if (v === undefined) return 'png';
  if (v === 'png' || v === 'jpg') return v;
  if (v === 'jpeg') return 'jpg';
  throw new UserError('--format', 'png or jpg', v);
}

function checkDouble(s: PyramidSetup): void {
  if (s.arithmetic.arithmetic === 'double' && !fitsDouble(s.baseGrid)) {
    const g = s.baseGrid;
    const reach = Math.max(1, Math.abs(g.centerRe), Math.abs(g.centerIm));
    const minSpan = s.sheet.width * DOUBLE_MIN_RELATIVE_SPACING * reach;
    throw new UserError(
      'view.span',
      `a span of at least ${minSpan.toPrecision(3)} at this base width for double arithmetic (leave arithmetic at auto for deeper views)`,
      s.sheet.view.span,
    );
  }
}

async function sheetFrom(sheetFile: string | undefined, values: Record<string, unknown>): Promise<{ sheet: Sheet; name: string } | undefined> {
  const plateValues = { ...values };
  delete plateValues['out'];
  const touchesSheet = sheetFile !== undefined || PLATE_OPTIONS.some((o) => o.apply !== undefined && typeof plateValues[attributeName(o.flags)] === 'string');
  if (!touchesSheet && typeof values['again'] !== 'string') return undefined;
  let raw: Record<string, unknown> = {};
  let name = 'pyramid';
  if (typeof values['again'] === 'string') {
    if (sheetFile !== undefined) throw new UserError('--again', 'either a sheet or --again, not both', sheetFile);
    raw = await sheetFromPlate(values['again']);
    name = sheetName(values['again']).replace(/\.(png|tiff?)$/i, '');
  } else if (sheetFile !== undefined) {
    raw = await readSheetFile(sheetFile);
    name = sheetName(sheetFile);
  }
  delete raw['startup'];
  delete raw['output'];
  if (raw['depth'] !== undefined && raw['depth'] !== 8) throw new UserError('depth', '8 (pyramid tiles are 8-bit, as viewers show them)', raw['depth']);
  return { sheet: quickSheet(parseSheet(applyPlateOptions(raw, plateValues), name)), name };
}

/** Checks every tile, writes tiles/info.json, tiles/info.js and the viewer. */
async function finish(dir: string, setup: PyramidSetup, baseUrl: string | undefined): Promise<{ missing: number; info: string; viewer: string }> {
  const { plan, spec, sheet } = setup;
  const check = await checkTileTree(dir, plan, spec.format);
  if (check.missing > 0) {
    throw new UserError(
      '--finish',
      'a pyramid folder holding every tile (run the missing shards, or rerun to resume)',
      new Received(`${dir} (${check.missing} of ${plan.tileCount} tiles missing, e.g. ${check.firstMissing})`),
    );
  }
  const id = baseUrl !== undefined ? `${baseUrl.replace(/\/+$/, '')}/${TILES_FOLDER}` : pathToFileURL(path.resolve(dir, TILES_FOLDER)).href;
  await writeIiifInfo(dir, iiifInfo(plan, id, spec.format));
  await writeViewer(dir, { sheet, tileSize: spec.tileSize, format: spec.format, version: spec.version });
  return { missing: 0, info: path.resolve(dir, TILES_FOLDER, 'info.json'), viewer: path.resolve(dir, 'index.html') };
}

function parseBaseUrl(v: unknown): string | undefined {
  if (v === undefined) return undefined;
  try {
    const u = new URL(String(v));
    if (!/^(https?|file):$/.test(u.protocol)) throw new Error('scheme');
    return String(v);
  } catch {
    throw new UserError('--base-url', 'an http://, https:// or file:// URL', v);
  }
}

/** Tile numbers of the pyramid not yet on disk (stat, a few dozen at a time). */
async function missingIndices(dir: string, setup: PyramidSetup): Promise<number[]> {
  const { plan, spec } = setup;
  const missing: number[] = [];
  let next = 0;
  const lane = async (): Promise<void> => {
    while (next < plan.tileCount) {
      const t = next++;
      const file = path.join(dir, TILES_FOLDER, iiifTilePath(plan, pyramidTileAt(plan, t), spec.format));
      if ((await tileFileSize(file)) === 0) missing.push(t);
    }
  };
  await Promise.all(Array.from({ length: 32 }, lane));
  return missing.sort((a, b) => a - b);
}

export async function runPyramid(sheetFile: string | undefined, values: Record<string, unknown>): Promise<PyramidSummary> {
  const started = process.hrtime.bigint();
  const given = await sheetFrom(sheetFile, values);
  const dir = path.resolve(typeof values['outDir'] === 'string' ? values['outDir'] : `out/${given?.name ?? 'pyramid'}-pyramid`);
  const baseUrl = parseBaseUrl(values['baseUrl']);
  const workers = optionalInteger(values['workers'], '--workers', 1, 256) ?? os.availableParallelism();
  const tileSize = optionalInteger(values['tileSize'], '--tile-size', 16, 4096) ?? DEFAULT_PYRAMID_TILE;
  const format = parseFormat(values['format']);
  const quality = optionalInteger(values['quality'], '--quality', 1, 100) ?? 90;
  const queueUrl = typeof values['queue'] === 'string' ? values['queue'] : undefined;
  const isFinish = values['finish'] === true;

  let spec: PyramidSpec;
  if (given === undefined) {
    const recorded = await readPyramidSpec(dir);
    if (recorded === undefined) {
      if (isFinish) throw new UserError('--out-dir', `a pyramid folder (holding ${MANIFEST_NAME})`, new Received(`${dir} (no ${MANIFEST_NAME})`));
      spec = pyramidSpec(parseSheet({}, 'pyramid'), tileSize, format, quality, toolVersion());
    } else {
      spec = recorded;
    }
  } else {
    spec = pyramidSpec(given.sheet, tileSize, format, quality, toolVersion());
  }
  const setup = pyramidSetup(spec);
  checkDouble(setup);
  const { plan } = setup;
  const seconds = (): number => Math.round(Number(process.hrtime.bigint() - started) / 1e6) / 1000;
  const base = {
    dir,
    base: { width: plan.width, height: plan.height },
    tileSize: spec.tileSize,
    format: spec.format,
    levels: plan.levels.length,
  };
  const peak = (): number => Math.round(process.resourceUsage().maxRSS / 1024);

  if (isFinish) {
    const recorded = await readPyramidSpec(dir);
    if (recorded === undefined) throw new UserError('--out-dir', `a pyramid folder (holding ${MANIFEST_NAME})`, new Received(`${dir} (no ${MANIFEST_NAME})`));
    if (!sameSpec(recorded, spec)) throw new UserError('--out-dir', 'a folder holding the pyramid of this sheet', new Received(`${dir} (holds a different pyramid)`));
    const f = await finish(dir, setup, baseUrl);
    const s = seconds();
    return {
      ...base,
      mode: 'finish',
      shard: null,
      tiles: { total: plan.tileCount, share: 0, rendered: 0, skipped: 0, missing: 0 },
      bytesWritten: 0,
      finished: true,
      seconds: s,
      tilesPerSecond: 0,
      peakMemoryMiB: peak(),
      info: f.info,
      viewer: f.viewer,
    };
  }

  // Disk: all levels' pixels (4/3 of the base) at a guessed compression (PNG 1/4, JPEG 1/10 of raw).
  const levelPixels = plan.levels.reduce((n, l) => n + l.width * l.height, 0);
  const parent = path.dirname(dir);
  await checkFreeSpace(existingAncestor(parent), levelPixels * 3 * (spec.format === 'png' ? 0.25 : 0.1), '--out-dir');

  if (queueUrl !== undefined) {
    if (values['shard'] !== undefined) throw new UserError('--shard', 'no --shard beside --queue', values['shard']);
    const { checkRedis, enqueueAndWait, parseRedisUrl } = await import('../render/pyramid-queue.js');
    const target = parseRedisUrl(queueUrl);
    await checkRedis(target);
    await preparePyramidDir(dir, spec);
    const key = pyramidKey(dir, spec);
    const todo = await missingIndices(dir, setup);
    if (todo.length > 0 && !process.stderr.isTTY) {
      // Nothing else would tell a log reader what the run is waiting for.
      process.stderr.write(`quadatlas: ${todo.length} tiles on ${queueUrl}; waiting for \`quadatlas worker --queue ${queueUrl}\`\n`);
    }
    const progress = createProgress('pyramid (queue)', { json: values['progressJson'] === true, phase: 'tiles' });
    let r;
    try {
      r = await enqueueAndWait({
        target,
        dir,
        key,
        indices: todo,
        tileCount: plan.tileCount,
        onDisk: async (t) => (await tileFileSize(path.join(dir, TILES_FOLDER, iiifTilePath(plan, pyramidTileAt(plan, t), spec.format)))) > 0,
        onProgress: (d, t) => progress.update(d, t),
      });
    } finally {
      progress.end();
    }
    if (r.failed.length > 0) {
      const first = r.failed[0]!;
      throw new Error(`${r.failed.length} tiles failed in the workers; tile ${first.index}: ${first.reason.split('\n')[0]}`);
    }
    const f = await finish(dir, setup, baseUrl);
    const s = seconds();
    const rendered = r.completed - r.skipped;
    return {
      ...base,
      mode: 'queue',
      shard: null,
      tiles: { total: plan.tileCount, share: todo.length, rendered, skipped: plan.tileCount - todo.length + r.skipped, missing: 0 },
      bytesWritten: r.bytes,
      finished: true,
      seconds: s,
      tilesPerSecond: Math.round((rendered / s) * 10) / 10,
      peakMemoryMiB: peak(),
      workers: r.workers,
      info: f.info,
      viewer: f.viewer,
    };
  }

  const shardFlag = typeof values['shard'] === 'string' ? values['shard'] : undefined;
  const shardsFlag = typeof values['shards'] === 'string' ? values['shards'] : undefined;
  const shard: Shard | null = resolveShard(shardFlag, shardsFlag, process.env);
  await preparePyramidDir(dir, spec);
  const pool = new PyramidPool(workers);
  const progress = createProgress(shard === null ? 'pyramid' : `pyramid shard ${shard.index}/${shard.count}`, { json: values['progressJson'] === true, phase: 'tiles' });
  let result;
  try {
    result = await renderPyramidShare({
      pool,
      key: pyramidKey(dir, spec),
      spec,
      dir,
      tileCount: plan.tileCount,
      shard: shard ?? { index: 0, count: 1 },
      onProgress: (d, t) => progress.update(d, t),
    });
  } finally {
    progress.end();
    await pool.close();
  }
  const f = shard === null ? await finish(dir, setup, baseUrl) : undefined;
  const s = seconds();
  return {
    ...base,
    mode: shard === null ? 'local' : 'shard',
    shard: shard === null ? null : `${shard.index}/${shard.count}`,
    tiles: {
      total: plan.tileCount,
      share: shareSize(plan.tileCount, shard ?? { index: 0, count: 1 }),
      rendered: result.rendered,
      skipped: result.skipped,
      missing: f === undefined ? null : 0,
    },
    bytesWritten: result.bytes,
    finished: f !== undefined,
    seconds: s,
    tilesPerSecond: Math.round((result.rendered / Math.max(s, 1e-3)) * 10) / 10,
    peakMemoryMiB: peak(),
    ...(f === undefined ? {} : { info: f.info, viewer: f.viewer }),
  };
}

/** The nearest existing folder at or above `dir` (statfs needs one; checkFreeSpace passes silently otherwise). */
function existingAncestor(dir: string): string {
  let d = dir;
  while (!existsSync(d) && path.dirname(d) !== d) d = path.dirname(d);
  return d;
}

export function register(program: Command): void {
  const cmd = program
    .command('pyramid')
    .description('write a deep-zoom tile pyramid (IIIF level 0) of a view with an offline viewer page')
    .argument('[sheet]', 'a sheet (JSON) holding the view and colouring');
  addOptions(cmd, PYRAMID_OPTIONS);
  cmd.action(async (sheetFile: string | undefined, values: Record<string, unknown>) => {
    const summary = await runPyramid(sheetFile, values);
    if (values['json'] === true) process.stdout.write(`${JSON.stringify(summary, null, 2)}\n`);
    else {
      if (summary.finished)
        reportWrote([summary.dir, ...(summary.viewer === undefined ? [] : [summary.viewer])], summary.seconds, `${summary.tiles.total} tiles in ${summary.levels} levels`);
      else
        process.stderr.write(
          `quadatlas: rendered shard ${summary.shard} (${summary.tiles.rendered} tiles, ${summary.tiles.skipped} already there; ${summary.tiles.total} tiles in ${summary.levels} levels, ${summary.seconds.toFixed(1)} s)\n`,
        );
    }
  });
}
