/**
 * Renders a checked sheet to its files: the image (PNG or TIFF), optional NPY
 * data arrays, the JSON sidecar, the legend file. This is the edge where the
 * renderer meets the file system: it checks the output paths, the memory and
 * the disk before any work, writes every file under a temporary name and
 * renames only when all is done.
 */
import { mkdir, stat } from 'node:fs/promises';
import { gridRecord, pixelCentreRow, pixelOffsetRow } from '../view/pixel-coordinates.js';
import os from 'node:os';
import path from 'node:path';
import { checkFreeSpace } from '../io/check-free-space.js';
import { checkWritableDirectory } from '../io/check-writable-directory.js';
import { openNpySink } from '../io/npy-sink.js';
import { openPngSink } from '../io/png-sink.js';
import type { RasterSink, RasterSpec } from '../io/raster-sink.js';
import { openTiffSink } from '../io/tiff-sink.js';
import { writeFileAtomic } from '../io/write-file-atomic.js';
import { legendBounds, legendSvg, presentPeriods } from '../colour/legend.js';
import { figureFont } from '../figure/figure-font.js';
import { DEFAULT_ESCAPE_RADIUS } from '../plane/sample-parameters.js';
import { BLA_ENTRY_BYTES, DENSE_ENTRIES, blaEntriesAtMost } from '../plane/deep/bla-table.js';
import type { PlateJob, TileStats } from './plate-job.js';
import { createProgress } from './progress.js';
import { bytesPerPixel, DEFAULT_STRIP_BUDGET, DEFAULT_TILE_SIZE, renderPlate, type DataSink, type PlateSinks } from './render-plate.js';
import { renderRecord, type Sheet } from '../view/sheet.js';
import { sheetArithmetic, sheetIterations, sheetJob, type IterationChoice } from './sheet-job.js';
import { cToPixel, doubleGrid, fitsDouble, pixelToC, type DoubleGrid, type View } from '../view/view.js';
import { componentsInBox } from '../components/components-in-box.js';
import type { Legend } from '../colour/legend.js';
import { labelHeightPixels, layoutPeriodLabels } from '../colour/period-labels.js';
import { Received, UserError } from '../check/user-error.js';
import { toolVersion } from '../io/tool-version.js';

export interface RenderSheetOptions {
  readonly workers?: number;
  readonly tileSize?: number;
  readonly label?: string;
}

export interface PlateSummary {
  readonly file: string;
  readonly files: string[];
  readonly view: { re: string; im: string; span: string; rotation: number; width: number; height: number; pixelSpacing: number };
  readonly arithmetic: 'double' | 'deep';
  /** Precision used: 53-bit doubles, or the deep path's reference bits, tile unit and timings. */
  readonly precision: Record<string, unknown>;
  readonly iterations: number;
  readonly iterationsRule: 'auto' | 'given';
  /** How the limit was found: given, or `auto` by the probe of the view with its passes (methods B9). */
  readonly iterationsChoice?: { rule: 'given' | 'probe'; probe?: IterationChoice['probe']; probeSeconds: number };
  /** Deep arithmetic: iterations stepped one at a time and covered by bilinear-approximation skips. */
  readonly deepIterations: { stepped: number; skipped: number; skips: number; skippedFraction: number } | null;
  readonly samples: number;
  readonly seconds: number;
  readonly pixels: { total: number; escaped: number; interior: number; undecided: number; refined: number };
  readonly kernelSamples: number;
  /** Peak resident memory of the process (all worker threads included), MiB. */
  readonly peakMemoryMiB: number;
  readonly periods: Record<string, number>;
  /**
   * Interior area estimate and a bound on its error (docs/methods.md A7): the
   * true area of the set within the view lies in [interior - uncertainty,
   * interior + uncertainty], uncertainty = (nearBoundary + undecided pixels) x pixel area.
   */
  readonly area: { interior: number; undecided: number; nearBoundary: number; uncertainty: number; pixelArea: number; note: string };
  /** Julia plates: c, the cycle found (kind, period, points, multiplier) and the marks drawn. */
  readonly julia?: Record<string, unknown>;
}

/**
 * The metadata JSON stored in the image: tool, version and the sheet that
 * fixes the pixels, plus what was derived from it (arithmetic, reference
 * precision, the resolved iteration limit) for the reader's information.
 */
export function plateMetadata(
  sheet: Sheet,
  derived: { arithmetic: 'double' | 'deep'; bits: number; iterations: number; iterationsRule?: IterationChoice['rule']; probe?: IterationChoice['probe'] },
): string {
  return JSON.stringify({
    tool: 'quadatlas',
    version: toolVersion(),
    arithmetic: derived.arithmetic,
    referenceBits: derived.arithmetic === 'deep' ? derived.bits : 53,
    iterations: derived.iterations,
    // recorded for `auto` only, so that a plate with a given limit keeps its bytes
    ...(derived.iterationsRule === undefined || derived.iterationsRule === 'given' ? {} : { iterationsRule: derived.iterationsRule }),
    ...(derived.probe === undefined ? {} : { iterationsProbe: derived.probe }),
    sheet: renderRecord(sheet, toolVersion()),
  });
}

/** Bytes a deep plate's orbit and table hold, at most, for this limit (see deepBound). */
const ORBIT_BYTES = 40;
export const DEEP_BOUND_RULE = `reference ${ORBIT_BYTES} bytes an iterate (two doubles, and room for a full-range copy of a tiny one), table ${BLA_ENTRY_BYTES} bytes an entry (about two an iterate, or an entry at every start within ${DENSE_ENTRIES} entries), over min(limit, period) iterates`;

/**
 * The memory bound of a deep plate's reference orbit and table: they hold
 * min(limit, period) iterates (one cycle for a nucleus reference, the orbit
 * to its escape otherwise, never beyond the limit) and the table's entries
 * for that many (blaEntriesAtMost); 40 bytes an iterate for the orbit leave
 * room for a full-range copy (24 bytes) of every iterate below 2^-500,
 * though such iterates are rare.
 */
export function deepBound(iterations: number, sheet: Pick<Sheet, 'reference' | 'skip'>): number {
  const iterates = (sheet.reference === null || sheet.reference === undefined ? iterations : Math.min(iterations, sheet.reference.period)) + 1;
  return iterates * ORBIT_BYTES + (sheet.skip ? BLA_ENTRY_BYTES * blaEntriesAtMost(iterates - 1) : 0);
}

/** The longest orbit whose bound fits in half the memory (the aligned table's two entries an iterate; a denser one adds at most 22 MB). */
function mostDeepIterations(sheet: Pick<Sheet, 'skip'>): number {
  return Math.floor(os.totalmem() / 2 / (ORBIT_BYTES + (sheet.skip ? 2 * BLA_ENTRY_BYTES : 0)));
}

function round3(x: number): number {
  return Math.round(x * 1000) / 1000;
}

/** An output name that is an existing directory is refused before any work (it would fail at the final rename). */
export async function refuseDirectory(file: string, field: string): Promise<void> {
  let isDir = false;
  try {
    isDir = (await stat(file)).isDirectory();
  } catch {
    return;
  }
  if (isDir) throw new UserError(field, 'a file name (not an existing directory)', new Received(`${file} (a directory)`));
}

async function prepareDirectory(dir: string, field: string): Promise<void> {
  try {
    await mkdir(dir, { recursive: true });
  } catch (err) {
    const code = (err as NodeJS.ErrnoException).code ?? 'error';
    throw new UserError(field, 'a directory that exists or can be created', new Received(`${dir} (${code})`));
  }
  await checkWritableDirectory(dir, field);
}

/**
 * Label sprites for the nuclei of periods 1..maxPeriod in view whose
 * component is large enough to hold its label: the size estimate |s| is about
 * twice a disk's radius (docs/methods.md C4: p = 2 gives 0.5 for radius 1/4), so we
 * ask for |s| / 2 >= the label's height in pixels.
 */
async function periodLabels(grid: DoubleGrid, maxPeriod: number, dpi: number, workers: number): Promise<Legend[]> {
  const corners = [
    [0, 0],
    [grid.width, 0],
    [0, grid.height],
    [grid.width, grid.height],
  ].map(([x, y]) => pixelToC(grid, x!, y!, new Float64Array(2)));
  const box = {
    re0: Math.min(...corners.map((c) => c[0]!)),
    re1: Math.max(...corners.map((c) => c[0]!)),
    im0: Math.min(...corners.map((c) => c[1]!)),
    im1: Math.max(...corners.map((c) => c[1]!)),
  };
  const minSize = 2 * labelHeightPixels(dpi) * grid.spacing;
  const nuclei = await componentsInBox({ min: 1, max: maxPeriod }, box, minSize, { workers });
  const points = nuclei.map((n) => {
    const [x, y] = cToPixel(grid, n.re, n.im);
    return { period: n.period, x, y };
  });
  return layoutPeriodLabels(points, dpi, grid.width, grid.height, figureFont());
}

/** The pixel-centre coordinates beside the data arrays (docs/data.md): re/im for double views, offsets for deep ones. */
async function writeCoordinates(dataDir: string, view: View, grid: DoubleGrid, deep: boolean, opened: Array<RasterSink | DataSink>): Promise<string[]> {
  const names = deep ? ['offset_re', 'offset_im'] : ['re', 'im'];
  const shape: [number, number] = [view.height, view.width];
  const a = await openNpySink(path.join(dataDir, `${names[0]}.npy`), '<f8', shape);
  opened.push(a);
  const b = await openNpySink(path.join(dataDir, `${names[1]}.npy`), '<f8', shape);
  opened.push(b);
  const rowRe = new Float64Array(view.width);
  const rowIm = new Float64Array(view.width);
  for (let j = 0; j < view.height; j++) {
    if (deep) pixelOffsetRow(grid, j, rowRe, rowIm);
    else pixelCentreRow(grid, j, rowRe, rowIm);
    await a.writeRows(rowRe, 1);
    await b.writeRows(rowIm, 1);
  }
  return names;
}

export async function renderSheet(sheet: Sheet, options: RenderSheetOptions = {}): Promise<PlateSummary> {
  // A figure (.pdf, .svg) renders its plate through this function again, with figure null.
  if (sheet.figure !== null) return (await import('./render-figure.js')).renderFigure(sheet, options);
  const started = process.hrtime.bigint();
  const view = { centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, width: sheet.width, height: sheet.height, rotation: sheet.view.rotation };
  const grid = doubleGrid(view);
  const arith = sheetArithmetic(sheet);
  const { arithmetic, plan, bits } = arith;
  if (arithmetic === 'double' && !fitsDouble(grid)) {
    process.stderr.write('quadatlas: note: doubles cannot resolve this view; the plate is forced to double arithmetic and will be wrong\n');
  }
  if (arithmetic === 'deep' && sheet.labels > 0) {
    throw new UserError('labels', '0 for a deep view (labels are placed from nuclei located in double precision)', sheet.labels);
  }
  if (arithmetic === 'deep' && sheet.iterations !== 'auto' && deepBound(sheet.iterations, sheet) > os.totalmem() / 2) {
    throw new UserError('iterations', `at most ${mostDeepIterations(sheet)} iterations for the deep arithmetic on this machine`, sheet.iterations);
  }
  const choice = sheetIterations(sheet, arith);
  const iterations = choice.iterations;
  if (arithmetic === 'deep' && deepBound(iterations, sheet) > os.totalmem() / 2) {
    throw new UserError('iterations', `at most ${mostDeepIterations(sheet)} iterations for the deep arithmetic on this machine (auto chose ${iterations})`, sheet.iterations);
  }
  const workers = options.workers ?? os.availableParallelism();
  const tileSize = options.tileSize ?? DEFAULT_TILE_SIZE;
  // Periods never exceed the iteration limit, which bounds the legend's number width.
  const bounds = legendBounds(sheet.colour, sheet.width, sheet.height, sheet.dpi, String(iterations).length, figureFont());
  const { job, referenceSeconds, tableSeconds, memory } = sheetJob(
    sheet,
    grid,
    iterations,
    arith,
    {
      ...(bounds === null ? {} : { legendBounds: bounds }),
      depth: sheet.depth,
      withData: sheet.output.data !== null,
      labels: sheet.labels > 0 ? await periodLabels(grid, sheet.labels, sheet.dpi, workers) : [],
    },
    choice.builder,
  );
  const deepTimes = { reference: referenceSeconds, table: tableSeconds };

  const metadata = plateMetadata(sheet, { arithmetic, bits, iterations, iterationsRule: choice.rule, ...(choice.probe === undefined ? {} : { probe: choice.probe }) });
  const precision =
    arithmetic === 'deep'
      ? {
          referenceBits: bits,
          unitExponent: plan.unitExponent,
          reference: sheet.reference ?? { re: sheet.view.re, im: sheet.view.im, period: 0 },
          referenceSeconds: round3(deepTimes.reference),
          tableSeconds: round3(deepTimes.table),
          ...(memory === undefined ? {} : { memory: { ...memory, bound: deepBound(iterations, sheet), boundRule: DEEP_BOUND_RULE } }),
        }
      : { referenceBits: 53 };
  const iterationsChoice = { rule: choice.rule, ...(choice.probe === undefined ? {} : { probe: choice.probe }), probeSeconds: round3(choice.probeSeconds) };
  return writePlate(sheet, job, {
    started,
    workers,
    tileSize,
    metadata,
    arithmetic,
    precision,
    iterations,
    iterationsChoice,
    ...(options.label === undefined ? {} : { label: options.label }),
  });
}

/** How a plate job is run and recorded: everything writePlate needs beyond the sheet and the job. */
export interface PlateRun {
  readonly started: bigint;
  readonly workers: number;
  readonly tileSize: number;
  /** The metadata JSON stored in the image and the sidecar. */
  readonly metadata: string;
  readonly arithmetic: 'double' | 'deep';
  readonly precision: Record<string, unknown>;
  readonly iterations: number;
  readonly label?: string;
  /** Julia plates: recorded in the summary as `julia`. */
  readonly julia?: Record<string, unknown>;
  /** How the iteration limit was found (plates of the c-plane). */
  readonly iterationsChoice?: PlateSummary['iterationsChoice'];
}

/**
 * Runs a prepared plate job (of the c-plane or, with job.julia, of the
 * dynamical plane) into the sheet's files: checks memory and disk, opens the
 * sinks under temporary names, renders, writes the sidecar, and returns the
 * summary. Any failure aborts every sink.
 */
export async function writePlate(sheet: Sheet, job: PlateJob, run: PlateRun): Promise<PlateSummary> {
  const { started, workers, tileSize, metadata, arithmetic, iterations } = run;
  const grid = job.grid;
  const view: View = { centerRe: sheet.view.re, centerIm: sheet.view.im, span: sheet.view.span, width: sheet.width, height: sheet.height, rotation: sheet.view.rotation };
  const bounds = job.legendBounds ?? null;
  const file = sheet.output.file;
  const tiff = /\.tiff?$/i.test(file);
  // Memory: three strips of at least one tile row each must fit comfortably.
  const minStrip = sheet.width * tileSize * bytesPerPixel(job);
  if (3 * minStrip > os.totalmem() / 4) {
    throw new UserError('pixels.width', `a width whose strips fit in memory (at most ${Math.floor(os.totalmem() / 12 / (tileSize * bytesPerPixel(job)))} pixels)`, sheet.width);
  }
  // An inset legend holds back the strips it may cover until every tile is done (render-plate.ts):
  // with a top corner that is the whole plate, encoded, plus linear colours under the legend.
  if (bounds !== null) {
    const heldRows = bounds.y === 0 ? sheet.height : sheet.height - bounds.y + tileSize;
    const held = sheet.width * heldRows * bytesPerPixel(job) + bounds.width * (bounds.height + 2 * tileSize) * 24;
    if (held > os.totalmem() / 4) {
      throw new UserError(
        'colour.legendCorner',
        'a bottom corner, or colour.legend "beside", for a plate this large (a top inset legend holds the whole plate in memory)',
        sheet.colour.legendCorner,
      );
    }
  }
  // Disk: the image (estimated at a quarter of its raw size, twice for TIFF's bands) plus the exact NPY sizes.
  const rawImage = sheet.width * sheet.height * 3 * (sheet.depth / 8);
  const imageDir = path.dirname(path.resolve(file));
  await prepareDirectory(imageDir, 'output.file');
  for (const f of [file, ...(sheet.output.sidecar ? [`${file}.json`] : [])]) await refuseDirectory(f, 'output.file');
  const dataDir = sheet.output.data === null ? null : path.resolve(sheet.output.data);
  if (dataDir !== null) await prepareDirectory(dataDir, 'output.data');
  const dataBytes = dataDir === null ? 0 : sheet.width * sheet.height * (37 + (job.julia !== undefined ? 4 : 0)) + 7 * 128 + 4096;
  await checkFreeSpace(imageDir, (rawImage / 4) * (tiff ? 2 : 1) + (dataDir !== null && path.resolve(dataDir) === imageDir ? dataBytes : 0), 'pixels');
  if (dataDir !== null && dataDir !== imageDir) await checkFreeSpace(dataDir, dataBytes, 'output.data');

  const spec: RasterSpec = { width: sheet.width, height: sheet.height, depth: sheet.depth, channels: 3, dpi: sheet.dpi, metadata, software: `quadatlas ${toolVersion()}` };
  const opened: Array<RasterSink | DataSink> = [];
  const files: string[] = [];
  try {
    const image = tiff ? await openTiffSink(file, spec) : await openPngSink(file, spec);
    opened.push(image);
    const sinks: { -readonly [K in keyof PlateSinks]: PlateSinks[K] } = { image };
    if (dataDir !== null) {
      const shape: [number, number] = [sheet.height, sheet.width];
      sinks.period = await openNpySink(path.join(dataDir, 'period.npy'), '<i4', shape);
      sinks.smooth = await openNpySink(path.join(dataDir, 'smooth.npy'), '<f8', shape);
      sinks.distance = await openNpySink(path.join(dataDir, 'distance.npy'), '<f8', shape);
      sinks.interior = await openNpySink(path.join(dataDir, 'interior.npy'), '|u1', shape);
      opened.push(sinks.period, sinks.smooth, sinks.distance, sinks.interior);
      if (job.julia !== undefined) {
        sinks.basin = await openNpySink(path.join(dataDir, 'basin.npy'), '<i4', shape);
        opened.push(sinks.basin);
      }
    }
    const progress = createProgress(run.label ?? path.basename(file));
    let stats: TileStats;
    try {
      stats = await renderPlate(job, sinks, { workers, tileSize, stripBudget: DEFAULT_STRIP_BUDGET, onProgress: (d, t) => progress.update(d, t) });
    } finally {
      progress.end();
    }
    if (dataDir !== null) {
      const written = await writeCoordinates(dataDir, view, grid, arithmetic === 'deep', opened);
      for (const s of opened) await s.finish();
      await writeFileAtomic(path.join(dataDir, 'grid.json'), `${JSON.stringify(gridRecord(view, grid, arithmetic === 'deep', job.deep?.unitExponent ?? 0), null, 2)}\n`);
      files.push(path.resolve(file));
      for (const n of ['period', 'smooth', 'distance', 'interior', ...(job.julia !== undefined ? ['basin'] : []), ...written]) files.push(path.join(dataDir, `${n}.npy`));
      files.push(path.join(dataDir, 'grid.json'));
    } else {
      for (const s of opened) await s.finish();
      files.push(path.resolve(file));
    }
    const seconds = Number(process.hrtime.bigint() - started) / 1e9;
    const pixelArea = grid.spacing * grid.spacing;
    const summary: PlateSummary = {
      file: path.resolve(file),
      files,
      view: { ...sheet.view, width: sheet.width, height: sheet.height, pixelSpacing: grid.spacing },
      arithmetic,
      precision: run.precision,
      iterations,
      iterationsRule: sheet.iterations === 'auto' ? 'auto' : 'given',
      ...(run.iterationsChoice === undefined ? {} : { iterationsChoice: run.iterationsChoice }),
      deepIterations:
        arithmetic === 'deep'
          ? {
              stepped: stats.stepped,
              skipped: stats.skipped,
              skips: stats.skips,
              skippedFraction: stats.stepped + stats.skipped > 0 ? stats.skipped / (stats.stepped + stats.skipped) : 0,
            }
          : null,
      samples: sheet.samples,
      seconds: Math.round(seconds * 1000) / 1000,
      pixels: { total: sheet.width * sheet.height, escaped: stats.escaped, interior: stats.interior, undecided: stats.undecided, refined: stats.refined },
      kernelSamples: stats.samples,
      peakMemoryMiB: Math.round(process.resourceUsage().maxRSS / 1024),
      periods: Object.fromEntries(Object.entries(stats.periods).sort((a, b) => Number(a[0]) - Number(b[0]))),
      area: {
        interior: stats.interior * pixelArea,
        undecided: stats.undecided * pixelArea,
        nearBoundary: stats.nearBoundary * pixelArea,
        uncertainty: (stats.nearBoundary + stats.undecided) * pixelArea,
        pixelArea,
        note: 'interior area = interior pixel centres x pixel area; uncertainty = (undecided pixels + decided pixels whose distance estimate is below 2 sqrt 2 spacings) x pixel area; it bounds the error for the part of the set inside the view',
      },
      ...(run.julia === undefined ? {} : { julia: run.julia }),
    };
    if (sheet.colour.legend === 'beside') {
      const legendFile = file.replace(/\.(png|tiff?)$/i, '-legend.svg');
      await writeFileAtomic(legendFile, legendSvg(presentPeriods(stats.periods, sheet.colour), figureFont()));
      files.push(path.resolve(legendFile));
    }
    if (sheet.output.sidecar) {
      const sidecar = `${file}.json`;
      await writeFileAtomic(sidecar, `${JSON.stringify({ metadata: JSON.parse(metadata) as unknown, summary }, null, 2)}\n`);
      files.push(path.resolve(sidecar));
    }
    return summary;
  } catch (err) {
    await Promise.allSettled(opened.map((s) => s.abort()));
    throw err;
  }
}
