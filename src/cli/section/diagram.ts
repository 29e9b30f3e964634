/**
 * `quadatlas section diagram [SHEET]`: the bifurcation diagram as a density
 * image (docs/methods.md E7), a grey PNG of 8 or 16 bits carrying its sheet.
 * Flags override the sheet; `--again FILE` takes the sheet from a diagram
 * (or its sidecar) written before, and gives the same bytes.
 */
import { quickPixels } from '../quick.js';
import type { Command } from 'commander';
import { diagramRecord, parseDiagramSheet, type DiagramSheet } from '../../section/diagram-sheet.js';
import { FAMILIES } from '../../section/families/index.js';
import { reportWrote } from '../wrote.js';
import { Received, UserError } from '../../check/user-error.js';
import { toolVersion } from '../../io/tool-version.js';
import { againOutput, loadSectionSheet } from './load-section-sheet.js';
import { prepareOutput, sectionMetadata, writeOutput, writeSidecar } from './section-output.js';
import {
  addOptions,
  againOption,
  applySectionFlags,
  clearProgress,
  FAMILY_OPTION,
  guarded,
  integerText,
  NO_SIDECAR_OPTION,
  parseWorkers,
  progressLine,
  sizeText,
  WORKERS_OPTION,
  type SectionOption,
  type Values,
} from './section-options.js';

export const DIAGRAM_OPTIONS: readonly SectionOption[] = [
  FAMILY_OPTION,
  { flags: '--r-from <r>', description: 'left edge of the parameter axis r (default 2.8 logistic, 0.7 sine, 0.6 quartic)', field: 'r.from' },
  { flags: '--r-to <r>', description: 'right edge of the parameter axis r (default 4 logistic, 1 sine, 2^(1/3) quartic)', field: 'r.to' },
  { flags: '--x-from <x>', description: 'bottom edge of the state axis x (default 0; quartic -1.26)', field: 'x.from' },
  { flags: '--x-to <x>', description: 'top edge of the state axis x (default 1; quartic 1.26)', field: 'x.to' },
  { flags: '--size <WxH>', description: 'image size in pixels, 1x1 to 65535x65535 (default 2000x1000)', field: 'pixels', value: sizeText('--size') },
  { flags: '--samples <n>', description: 'jittered parameter samples per pixel column, 1 to 1024 (default 4)', field: 'samples', value: integerText },
  { flags: '--transient <n>', description: 'iterations discarded per sample before plotting (default 1000)', field: 'transient', value: integerText },
  { flags: '--iterations <n>', description: 'iterations plotted per sample (default 2 x height, at least 1000)', field: 'iterations', value: integerText },
  { flags: '--depth <bits>', description: 'bits per channel of the PNG: 8 or 16 (default 16)', field: 'depth', value: integerText },
  {
    flags: '--out <file>',
    description:
      'output file: a PNG (ticks of r marked in the pixels), or a figure .pdf or .svg with labelled axes: r below, c on top (logistic), x at the left (default out/FAMILY-diagram.png)',
    field: 'output.file',
  },
  { flags: '--caption <text>', description: 'figures (.pdf, .svg): text drawn below the figure (default none)', field: 'caption' },
  {
    flags: '--windows <n>',
    description: 'figures: shade the periodic windows of period 3 to n (up to 8), onset to end, labelled by period; 0 for none (default 0)',
    field: 'windows',
    value: integerText,
  },
  { flags: '--cascade', description: 'figures: mark the period doublings of the cascade with a line each (default: none)' },
  NO_SIDECAR_OPTION,
  againOption('section diagram'),
  WORKERS_OPTION,
];

/** The sheet of a run: from the positional file or --again, with flags over it. */
export async function diagramSheet(sheetFile: string | undefined, values: Values): Promise<DiagramSheet> {
  const { raw, again } = await loadSectionSheet('section-diagram', sheetFile, values['again']);
  if (values['cascade'] === true) raw['cascade'] = true;
  if (again !== undefined && typeof values['out'] !== 'string') raw['output'] = { file: againOutput(again, ['.png', '.pdf', '.svg']) };
  return quickPixels(parseDiagramSheet(raw, applySectionFlags(raw, values, DIAGRAM_OPTIONS)));
}

async function writeInkPng(file: string, ink: Uint16Array, width: number, height: number, depth: 8 | 16, metadata: string, field: string): Promise<void> {
  const { openPngSink } = await import('../../io/png-sink.js');
  let sink;
  try {
    sink = await openPngSink(file, { width, height, depth, channels: 3, metadata, software: `quadatlas ${toolVersion()}` });
  } catch (err) {
    throw new UserError(field, 'a writable file path', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`));
  }
  try {
    const band = 64;
    for (let j0 = 0; j0 < height; j0 += band) {
      const rows = Math.min(band, height - j0);
      const px = depth === 16 ? new Uint16Array(rows * width * 3) : new Uint8Array(rows * width * 3);
      for (let k = 0; k < rows * width; k++) {
        const v = ink[j0 * width + k]!;
        const q = depth === 16 ? v : Math.round(v / 257);
        px[3 * k] = q;
        px[3 * k + 1] = q;
        px[3 * k + 2] = q;
      }
      await sink.writeRows(px, rows);
    }
    await sink.finish();
  } catch (err) {
    await sink.abort();
    throw err;
  }
}

export interface DiagramWritten {
  readonly files: string[];
  readonly seconds: number;
}

/** Renders a diagram sheet and writes the PNG (and its sidecar). */
/** Print resolution of a diagram figure: the density image at this many pixels an inch. */
export const DIAGRAM_FIGURE_DPI = 300;

/**
 * A diagram as a figure: the ink as a PNG under a temporary name, then the
 * figure model (figure/diagram-figure.ts) laid out around it and written as
 * PDF or SVG with the sheet in its metadata.
 */
async function writeDiagramFigure(sheet: DiagramSheet, ink: Uint16Array, metadata: string, field: string): Promise<void> {
  const { readFile, rm } = await import('node:fs/promises');
  const { tempPathFor, releaseTemp } = await import('../../io/temp-path.js');
  const { diagramFigureModel } = await import('../../figure/diagram-figure.js');
  const { figureFont } = await import('../../figure/figure-font.js');
  const { layoutFigure } = await import('../../figure/layout-figure.js');
  const file = sheet.output.file;
  const { width, height } = sheet.pixels;
  const family = FAMILIES.get(sheet.family)!;
  const png = tempPathFor(file.replace(/\.(pdf|svg)$/i, '-plot.png'));
  try {
    await writeInkPng(png, ink, width, height, sheet.depth, metadata, field);
    const bytes = await readFile(png);
    const { landmarks } = await import('../../section/landmarks.js');
    const marks = sheet.windows > 0 || sheet.cascade ? await landmarks(family, sheet.windows) : { doublings: [], windows: [] };
    const model = diagramFigureModel({
      width,
      height,
      dpi: DIAGRAM_FIGURE_DPI,
      parameter: family.parameter,
      r: sheet.r,
      x: sheet.x,
      cAxis: family.name === 'logistic' && Number(sheet.r.from) >= 1,
      caption: sheet.caption,
      windows: sheet.windows > 0 ? marks.windows : [],
      doublings: sheet.cascade ? marks.doublings : [],
    });
    const font = figureFont();
    const scene = layoutFigure(model, DIAGRAM_FIGURE_DPI, font);
    if (/\.pdf$/i.test(file)) {
      const { figurePdf } = await import('../../figure/write-figure-pdf.js');
      await writeOutput(file, await figurePdf(scene, bytes, font, { title: `${family.name} bifurcation diagram`, creator: `quadatlas ${toolVersion()}`, metadata }), field);
    } else {
      const { figureSvg } = await import('../../figure/write-figure-svg.js');
      const { svgWithMetadata } = await import('../../io/embed-metadata.js');
      await writeOutput(file, svgWithMetadata(figureSvg(scene, `data:image/png;base64,${bytes.toString('base64')}`, font, ''), metadata), field);
    }
  } finally {
    await rm(png, { force: true });
    releaseTemp(png);
  }
}

export async function diagramRun(sheet: DiagramSheet, workers: number, field: string, progress: (s: string) => void): Promise<DiagramWritten> {
  const family = FAMILIES.get(sheet.family)!;
  const file = sheet.output.file;
  await prepareOutput(file, field);
  const { renderDiagram } = await import('../../section/render-diagram.js');
  const { drawTicks } = await import('../../section/diagram-ticks.js');
  const { niceTicks } = await import('../../section/plot-svg.js');
  const { width, height } = sheet.pixels;
  const [from, to] = [Number(sheet.r.from), Number(sheet.r.to)];
  const settings = {
    width,
    height,
    samples: sheet.samples,
    transient: sheet.transient,
    iterations: sheet.iterations,
    stateTop: Number(sheet.x.to),
    stateBottom: Number(sheet.x.from),
  };
  const started = Date.now();
  const ink = await renderDiagram(family, { kind: 'parameter', from, to }, settings, workers, (d, n) => progress(`diagram ${Math.round((100 * d) / n)} %`));
  let metadata: string;
  if (/\.(pdf|svg)$/i.test(file)) {
    metadata = sectionMetadata(diagramRecord(sheet), { formula: family.formula });
    await writeDiagramFigure(sheet, ink, metadata, field);
  } else {
    const ticks = niceTicks(from, to, 10);
    drawTicks(
      ink,
      width,
      height,
      ticks.map((t) => (t - from) / (to - from)),
      Math.max(4, Math.round(height / 100)),
    );
    // The tick marks are drawn as pixels; their values travel in the metadata.
    metadata = sectionMetadata(diagramRecord(sheet), { formula: family.formula, ticks: { r: ticks } });
    await writeInkPng(file, ink, width, height, sheet.depth, metadata, field);
  }
  const seconds = (Date.now() - started) / 1000;
  const files = [file];
  if (sheet.output.sidecar) files.push(await writeSidecar(file, metadata, { file, files: [file, `${file}.json`], seconds, pixels: { ...sheet.pixels } }, field));
  return { files, seconds };
}

export function register(section: Command): void {
  const cmd = section
    .command('diagram')
    .description('the bifurcation diagram as a density image, 8- or 16-bit grey PNG (flags override the sheet)')
    .argument('[sheet]', 'a section-diagram sheet (JSON) holding the parameters');
  addOptions(cmd, DIAGRAM_OPTIONS);
  cmd.action(
    guarded(async (sheetFile: string | undefined, values: Values) => {
      const workers = parseWorkers(values['workers']);
      const sheet = await diagramSheet(sheetFile, values);
      const r = await diagramRun(sheet, workers, typeof values['out'] === 'string' ? '--out' : 'output.file', progressLine);
      clearProgress();
      reportWrote(r.files, r.seconds);
    }),
  );
}
