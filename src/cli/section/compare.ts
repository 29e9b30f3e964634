/**
 * `quadatlas section compare [SHEET]`: one plate with a strip of the
 * c-plane along the real axis above the logistic bifurcation diagram, both
 * on one axis linear in c (SVG, or PNG through sharp), carrying its sheet.
 * Flags override the sheet; `--again FILE` takes the sheet from a plate (or
 * its sidecar) written before, and gives the same bytes.
 */
import { quickPixels } from '../quick.js';
import type { Command } from 'commander';
import { compareHeights, compareRecord, parseCompareSheet, type CompareSheet } from '../../section/compare-sheet.js';
import { reportWrote } from '../wrote.js';
import { againOutput, loadSectionSheet } from './load-section-sheet.js';
import { prepareOutput, rasterisePlot, sectionMetadata, writeOutput, writeSidecar } from './section-output.js';
import {
  addOptions,
  againOption,
  applySectionFlags,
  clearProgress,
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

export const COMPARE_OPTIONS: readonly SectionOption[] = [
  { flags: '--c-from <c>', description: 'left end of the axis in c, -2 to 0.25 (default -2)', field: 'c.from' },
  { flags: '--c-to <c>', description: 'right end of the axis in c, -2 to 0.25 (default -0.7)', field: 'c.to' },
  { flags: '--x-from <x>', description: 'bottom edge of the diagram state axis x (default 0)', field: 'x.from' },
  { flags: '--x-to <x>', description: 'top edge of the diagram state axis x (default 1)', field: 'x.to' },
  {
    flags: '--size <WxH>',
    description: 'plate size in pixels without margins, 100x100 to 20000x20000; the strip takes the top third (default 2400x1500)',
    field: 'pixels',
    value: sizeText('--size'),
  },
  { flags: '--samples <n>', description: 'jittered parameter samples per diagram column, 1 to 1024 (default 4)', field: 'samples', value: integerText },
  { flags: '--transient <n>', description: 'diagram iterations discarded per sample (default 2000)', field: 'transient', value: integerText },
  { flags: '--iterations <n>', description: 'diagram iterations plotted per sample (default 2 x diagram height, at least 2000)', field: 'iterations', value: integerText },
  { flags: '--plane-iterations <n>', description: 'iteration limit of the plane strip (default 4000)', field: 'planeIterations', value: integerText },
  { flags: '--max-period <period>', description: 'mark windows of period 3 up to this, 3 to 8 (default 5)', field: 'maxPeriod', value: integerText },
  { flags: '--out <file>', description: 'output file, .svg or .png (default out/section-compare.svg)', field: 'output.file' },
  NO_SIDECAR_OPTION,
  againOption('section compare'),
  WORKERS_OPTION,
];

export async function compareSheet(sheetFile: string | undefined, values: Values): Promise<CompareSheet> {
  const { raw, again } = await loadSectionSheet('section-compare', sheetFile, values['again']);
  if (again !== undefined && typeof values['out'] !== 'string') raw['output'] = { file: againOutput(again, ['.svg', '.png']) };
  return quickPixels(parseCompareSheet(raw, applySectionFlags(raw, values, COMPARE_OPTIONS)));
}

/** The plate as SVG (without metadata), its text as DejaVu outlines (the same SVG is rasterised for PNG). */
export async function compareSvg(sheet: CompareSheet, workers: number, progress: (s: string) => void): Promise<string> {
  const { logistic } = await import('../../section/families/index.js');
  const { planeStrip } = await import('../../section/plane-strip.js');
  const { renderDiagram } = await import('../../section/render-diagram.js');
  const { comparePlateSvg } = await import('../../section/compare-plate.js');
  const { outlineLettering } = await import('../../figure/outline-lettering.js');
  const { landmarks } = await import('../../section/landmarks.js');
  const sharp = (await import('sharp')).default;
  const [from, to] = [Number(sheet.c.from), Number(sheet.c.to)];
  const { width } = sheet.pixels;
  const { strip: stripHeight, diagram: diagramHeight } = compareHeights(sheet.pixels.height);
  progress('plane strip');
  const strip = planeStrip(from, to, width, stripHeight, sheet.planeIterations);
  const stripPng = await sharp(strip, { raw: { width, height: stripHeight, channels: 3 } })
    .png()
    .toBuffer();
  progress('diagram');
  const settings = {
    width,
    height: diagramHeight,
    samples: sheet.samples,
    transient: sheet.transient,
    iterations: sheet.iterations,
    stateTop: Number(sheet.x.to),
    stateBottom: Number(sheet.x.from),
  };
  const ink = await renderDiagram(logistic, { kind: 'c', from, to }, settings, workers);
  const grey = new Uint8Array(ink.length);
  for (let k = 0; k < ink.length; k++) grey[k] = Math.round(ink[k]! / 257);
  const diagramPng = await sharp(grey, { raw: { width, height: diagramHeight, channels: 1 } })
    .png()
    .toBuffer();
  progress('landmarks');
  const marks = await landmarks(logistic, sheet.maxPeriod);
  const cOf = (r: number): number => r / 2 - (r * r) / 4;
  return comparePlateSvg(
    {
      from,
      to,
      width,
      stripHeight,
      diagramHeight,
      stripPng: stripPng.toString('base64'),
      diagramPng: diagramPng.toString('base64'),
      title: 'The real slice: z -> z^2 + c along the real axis above the logistic map, one parameter axis',
      stateFrom: Number(sheet.x.from),
      stateTo: Number(sheet.x.to),
      marks: [
        ...marks.doublings.map((d) => ({ c: cOf(d.at), label: d.label, kind: 'doubling' as const })),
        ...marks.windows.map((w) => ({ c: cOf(w.superstable), label: String(w.period), kind: 'window' as const, from: cOf(w.from), to: cOf(w.to) })),
      ],
    },
    outlineLettering(),
  );
}

export async function compareRun(sheet: CompareSheet, workers: number, field: string, progress: (s: string) => void): Promise<{ files: string[]; seconds: number }> {
  const file = sheet.output.file;
  await prepareOutput(file, field);
  const started = Date.now();
  const svg = await compareSvg(sheet, workers, progress);
  const metadata = sectionMetadata(compareRecord(sheet));
  const { pngWithMetadata, svgWithMetadata } = await import('../../io/embed-metadata.js');
  if (file.toLowerCase().endsWith('.svg')) await writeOutput(file, svgWithMetadata(svg, metadata), field);
  else {
    await writeOutput(file, pngWithMetadata(await rasterisePlot(svg), metadata), field);
  }
  const seconds = (Date.now() - started) / 1000;
  const files = [file];
  if (sheet.output.sidecar) files.push(await writeSidecar(file, metadata, { file, files: [file, `${file}.json`], seconds, pixels: { ...sheet.pixels } }, field));
  return { files, seconds };
}

export function register(section: Command): void {
  const cmd = section
    .command('compare')
    .description('one plate: a strip of the c-plane above the logistic bifurcation diagram on one axis, SVG or PNG (flags override the sheet)')
    .argument('[sheet]', 'a section-compare sheet (JSON) holding the parameters');
  addOptions(cmd, COMPARE_OPTIONS);
  cmd.action(
    guarded(async (sheetFile: string | undefined, values: Values) => {
      const workers = parseWorkers(values['workers']);
      const sheet = await compareSheet(sheetFile, values);
      const r = await compareRun(sheet, workers, typeof values['out'] === 'string' ? '--out' : 'output.file', progressLine);
      clearProgress();
      reportWrote(r.files, r.seconds);
    }),
  );
}
