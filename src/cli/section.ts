/**
 * `quadatlas section ...`: the real slice. Subcommands convert, cascade,
 * windows, lyapunov, diagram and compare. This file parses and validates
 * flags, calls src/section/, and writes; the mathematics lives there.
 */
import type { Command } from 'commander';
import type { Decimal } from 'decimal.js';
import { cToR, rToC, xToZ, zToX } from '../section/conjugacy.js';
import { FAMILIES } from '../section/families/index.js';
import { formatTable, type SectionTable, type TableFormat } from '../section/section-table.js';
import type { UnimodalFamily } from '../section/unimodal-family.js';
import { registerOrbitCommands } from './section-orbit.js';
import { Received, UserError } from './user-error.js';

const FAMILY_NAMES = [...FAMILIES.keys()];

/** Every option of every subcommand, declared once: flags and help text. */
const OPTION = {
  family: ['--family <name>', `the unimodal family: ${FAMILY_NAMES.join(', ')} (default logistic)`],
  digits: ['--digits <n>', 'significant digits of the parameters'],
  json: ['--json', 'write the table as JSON to stdout'],
  csv: ['--csv', 'write the table as CSV to stdout'],
  levels: ['--levels <k>', 'cascade levels: periods 1, 2, 4, ..., 2^k (default 16 for logistic: delta to about 16 digits, alpha to 12; 9 otherwise)'],
  maxPeriod: ['--max-period <p>', 'largest period of the windows listed (default 6)'],
  from: ['--from <value>', 'start of the parameter range'],
  to: ['--to <value>', 'end of the parameter range'],
  steps: ['--steps <n>', 'number of parameter values (default 1000)'],
  transient: ['--transient <n>', 'iterations discarded before measuring'],
  iterations: ['--iterations <n>', 'iterations measured per parameter'],
  out: ['--out <file>', 'output file (lyapunov: .svg or .png plot; diagram: .png; compare: .svg or .png)'],
  size: ['--size <WxH>', 'image size in pixels, e.g. 2000x1000'],
  samples: ['--samples <k>', 'jittered parameter samples per pixel column (default 4)'],
  depth: ['--depth <bits>', 'bits per channel: 8 or 16 (default 16)'],
  workers: ['--workers <n>', 'worker threads (default: all cores); never changes the output'],
} as const satisfies Record<string, readonly [string, string]>;

type Values = Record<string, unknown>;

export function parseFamily(value: unknown): UnimodalFamily {
  const name = value === undefined ? 'logistic' : String(value);
  const family = FAMILIES.get(name);
  if (family === undefined) throw new UserError('--family', `one of ${FAMILY_NAMES.join(', ')}`, value);
  return family;
}

export function parseInteger(value: unknown, field: string, min: number, max: number, fallback: number): number {
  if (value === undefined) return fallback;
  const n = typeof value === 'string' && /^\s*\d+\s*$/.test(value) ? Number(value) : NaN;
  if (!Number.isInteger(n) || n < min || n > max) throw new UserError(field, `an integer between ${min} and ${max}`, value);
  return n;
}

const DECIMAL = /^\s*[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?\s*$/;

export function parseDecimal(value: unknown, field: string): string {
  if (typeof value !== 'string' || !DECIMAL.test(value)) throw new UserError(field, 'a decimal number (e.g. -1.75 or 3.5e0)', value);
  return value.trim();
}

export function tableFormat(values: Values): TableFormat {
  if (values['json'] === true && values['csv'] === true) throw new UserError('--json/--csv', 'at most one of --json and --csv', new Received('both'));
  return values['json'] === true ? 'json' : values['csv'] === true ? 'csv' : 'text';
}

function show(v: Decimal, digits: number): string {
  const s = v.toSignificantDigits(digits).toString();
  return s === '-0' ? '0' : s;
}

// ---------------------------------------------------------------- convert

export function convertTable(values: Values): SectionTable {
  const digits = parseInteger(values['digits'], '--digits', 1, 10000, 30);
  const given = ['c', 'r'].filter((k) => values[k] !== undefined);
  if (given.length !== 1) throw new UserError('--c/--r', 'exactly one of --c and --r', new Received(given.length === 0 ? 'neither' : 'both'));
  let c: string;
  let r: string;
  if (values['c'] !== undefined) {
    c = parseDecimal(values['c'], '--c');
    try {
      r = cToR(c, digits);
    } catch {
      throw new UserError('--c', 'a real c <= 1/4 (larger c has no real logistic r)', values['c']);
    }
  } else {
    r = parseDecimal(values['r'], '--r');
    c = rToC(r, digits);
  }
  const row = [c, r];
  const columns = ['c', 'r'];
  if (values['x'] !== undefined && values['z'] !== undefined) throw new UserError('--x/--z', 'at most one of --x and --z', new Received('both'));
  if (values['x'] !== undefined) {
    const x = parseDecimal(values['x'], '--x');
    columns.push('x', 'z');
    row.push(x, xToZ(x, r, digits));
  } else if (values['z'] !== undefined) {
    const z = parseDecimal(values['z'], '--z');
    if (Number(r) === 0) throw new UserError('--r', 'a nonzero r for a state conversion', values['r']);
    columns.push('x', 'z');
    row.push(zToX(z, r, digits), z);
  }
  return {
    title: 'logistic x -> r x (1 - x)  <->  quadratic z -> z^2 + c   (c = r/2 - r^2/4, r = 1 + sqrt(1 - 4c), z = r (1/2 - x))',
    columns,
    rows: [row],
    summary: [
      { name: 'orientation', value: 'flipped', note: 'x > 1/2 exactly when z < 0; on r >= 1, c decreases as r increases' },
      { name: 'branch', value: 'r >= 1', note: 'r and 2 - r give the same c' },
    ],
    extra: { digits },
  };
}

// ---------------------------------------------------------------- cascade

export async function cascadeTable(values: Values, progress: (s: string) => void): Promise<SectionTable> {
  const family = parseFamily(values['family']);
  // 16 logistic levels take about 10 s on 2 cores; decimal.js sin makes the sine family about 40 times slower per step than the BigInt logistic path.
  const levels = parseInteger(values['levels'], '--levels', 2, 22, family.name === 'logistic' ? 16 : 9);
  const digits = parseInteger(values['digits'], '--digits', 10, 500, 25);
  const { computeCascade } = await import('../section/cascade.js');
  const { cascadeSolverFor } = await import('../section/cascade-solver-for.js');
  // delta^-n shrinks the gaps by about 0.67 digits per level; two gaps meet in delta_n.
  const work = Math.max(digits, Math.ceil(1.4 * levels) + 24);
  const solver = cascadeSolverFor(family, work);
  const started = Date.now();
  const cascade = computeCascade(solver.solver, levels, work, (l) => progress(`level ${l.level} (period ${l.period}) in ${((Date.now() - started) / 1000).toFixed(1)} s`));
  const withC = solver.toC !== undefined;
  const p = family.parameter;
  const columns = ['n', 'period', `doubling_${p}`, ...(withC ? ['doubling_c'] : []), `superstable_${p}`, ...(withC ? ['superstable_c'] : []), 'delta_n', 'alpha_n'];
  const fmt = (v: Decimal | undefined): string => (v === undefined ? '' : show(v, digits));
  const rows = cascade.levels.map((l) => {
    const row = [String(l.level), String(l.period), fmt(l.doubling)];
    if (withC) row.push(l.doubling === undefined ? '' : solver.toC!(l.doubling, digits));
    row.push(fmt(l.superstable));
    if (withC) row.push(solver.toC!(l.superstable, digits));
    row.push(l.delta === undefined ? '' : show(l.delta, 16), l.alpha === undefined ? '' : show(l.alpha, 16));
    return row;
  });
  // toPrecision keeps trailing zeros: every digit shown is a digit trusted.
  const trusted = (a: { value: Decimal; digits: number }): string => (a.digits > 0 ? a.value.toPrecision(a.digits) : 'not trusted');
  const acc = cascade.accumulation;
  const summary = [
    { name: 'delta', value: trusted(cascade.delta), note: `${cascade.delta.digits} digits trusted, repeated Aitken x${cascade.delta.passes}` },
    { name: 'alpha', value: trusted(cascade.alpha), note: `${cascade.alpha.digits} digits trusted, repeated Aitken x${cascade.alpha.passes}` },
    { name: `${p}_inf`, value: trusted(acc), note: `${acc.digits} digits trusted, accumulation point` },
  ];
  if (withC && acc.digits > 0) summary.push({ name: 'c_inf', value: solver.toC!(acc.value, acc.digits), note: `${acc.digits} digits, from ${p}_inf` });
  return {
    title: `period-doubling cascade of the ${family.name} family ${family.formula}`,
    columns,
    rows,
    summary,
    extra: {
      family: family.name,
      digits,
      estimates: {
        delta: { value: show(cascade.delta.value, digits), digits: cascade.delta.digits },
        alpha: { value: show(cascade.alpha.value, digits), digits: cascade.alpha.digits },
        accumulation: { value: show(acc.value, digits), digits: acc.digits },
      },
    },
  };
}

// ---------------------------------------------------------------- windows

export async function windowsTable(values: Values): Promise<SectionTable> {
  const family = parseFamily(values['family']);
  if (family.maximumOrder !== 2) throw new UserError('--family', 'a family with a quadratic maximum for windows (logistic or sine)', values['family']);
  const maxPeriod = parseInteger(values['maxPeriod'], '--max-period', 1, 16, 6);
  const digits = parseInteger(values['digits'], '--digits', 6, 200, 15);
  const { findWindows } = await import('../section/windows.js');
  const { componentOf } = await import('../section/component-of.js');
  const { windows } = findWindows(family, maxPeriod, digits + 4);
  const p = family.parameter;
  const withC = family.toC !== undefined;
  const cols = ['onset', 'superstable', 'doubling', 'end'];
  const columns = ['period', 'word', 'kind', ...cols.map((k) => `${k}_${p}`), ...(withC ? cols.map((k) => `${k}_c`) : []), `stable_width_${p}`, `window_width_${p}`];
  if (withC) columns.push('stable_width_c', 'window_width_c', 'nucleus_c', 'size', 'shape');
  const rows = windows.map((w) => {
    const ps = [w.onset, w.superstable, w.doubling, w.end];
    const row = [String(w.period), w.word === '' ? '(C)' : w.word, w.satellite ? 'doubled' : w.period === 1 ? 'main' : 'primitive', ...ps.map((v) => show(v, digits))];
    if (withC) row.push(...ps.map((v) => family.toC!(v.toString(), digits)));
    row.push(show(w.doubling.minus(w.onset).abs(), 6), show(w.end.minus(w.onset).abs(), 6));
    if (withC) {
      const [on, , dbl, end] = ps.map((v) => Number(family.toC!(v.toString(), 20)));
      row.push(Math.abs(dbl! - on!).toPrecision(6), Math.abs(end! - on!).toPrecision(6));
      const comp = componentOf(w.period, family.toC!(w.superstable.toString(), digits));
      row.push(comp.nucleus, comp.size.toPrecision(6), comp.shape);
    }
    return row;
  });
  const counts = Array.from({ length: maxPeriod }, (_, i) => windows.filter((w) => w.period === i + 1).length);
  return {
    title: `periodic windows of the ${family.name} family ${family.formula}, periods 1..${maxPeriod}, in increasing ${p}`,
    columns,
    rows,
    summary: [{ name: 'windows per period', value: counts.join(' '), note: 'equal to the real components per period (OEIS A000048)' }],
    extra: { family: family.name, digits, countsByPeriod: counts },
  };
}

// ---------------------------------------------------------------- marks

interface Landmarks {
  /** Period-doubling points of the cascade (family parameter). */
  doublings: { at: number; label: string }[];
  /** Periodic windows (onset to end, family parameter). */
  windows: { from: number; to: number; superstable: number; period: number; label: string }[];
}

/** Cascade doublings (levels 1..6) and windows of period 3..maxPeriod, at modest precision, for plot marks. */
export async function landmarks(family: UnimodalFamily, maxPeriod: number): Promise<Landmarks> {
  const { computeCascade } = await import('../section/cascade.js');
  const { familySolver } = await import('../section/cascade-solver.js');
  const cascade = computeCascade(familySolver(family, 16), 6, 16);
  const doublings = cascade.levels.filter((l) => l.doubling !== undefined).map((l) => ({ at: l.doubling!.toNumber(), label: `${l.period / 2}->${l.period}` }));
  const windows: Landmarks['windows'] = [];
  if (family.maximumOrder === 2 && maxPeriod >= 3) {
    const { findWindows } = await import('../section/windows.js');
    for (const w of findWindows(family, maxPeriod, 16).windows) {
      if (w.satellite || w.period < 3) continue;
      windows.push({ from: w.onset.toNumber(), to: w.end.toNumber(), superstable: w.superstable.toNumber(), period: w.period, label: `p${w.period} ${w.word}` });
    }
  }
  return { doublings, windows };
}

function parseRange(values: Values, family: UnimodalFamily, defaults: readonly [string, string]): [number, number] {
  const from = Number(values['from'] === undefined ? defaults[0] : parseDecimal(values['from'], '--from'));
  const to = Number(values['to'] === undefined ? defaults[1] : parseDecimal(values['to'], '--to'));
  const [lo, hi] = [Number(family.fixedPointOnset), Number(family.range[1])];
  const ok = (v: number): boolean => v >= Math.min(lo, 0) && v <= hi;
  if (!ok(from)) throw new UserError('--from', `a ${family.parameter} between ${Math.min(lo, 0)} and ${hi} for the ${family.name} family`, values['from']);
  if (!ok(to)) throw new UserError('--to', `a ${family.parameter} between ${Math.min(lo, 0)} and ${hi} for the ${family.name} family`, values['to']);
  if (!(to > from)) throw new UserError('--to', `a value above --from (${from})`, values['to']);
  return [from, to];
}

async function writeText(file: string, text: string | Uint8Array): Promise<void> {
  const { writeFileAtomic } = await import('../io/write-file-atomic.js');
  try {
    await writeFileAtomic(file, text);
  } catch (err) {
    throw new UserError('--out', 'a writable file path', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`));
  }
}

// ---------------------------------------------------------------- lyapunov

export async function lyapunovRun(values: Values): Promise<{ table: SectionTable; svg?: string }> {
  const family = parseFamily(values['family']);
  const defaults: Record<string, readonly [string, string]> = { logistic: ['2.8', '4'], sine: ['0.7', '1'], quartic: ['0.6', family.range[1]] };
  const [from, to] = parseRange(values, family, defaults[family.name] ?? family.range);
  const steps = parseInteger(values['steps'], '--steps', 2, 1_000_000, 1000);
  const transient = parseInteger(values['transient'], '--transient', 0, 100_000_000, 1000);
  const iterations = parseInteger(values['iterations'], '--iterations', 1, 100_000_000, 10_000);
  const { lyapunovExponents } = await import('../section/lyapunov.js');
  const params = new Float64Array(steps);
  for (let k = 0; k < steps; k++) params[k] = from + ((to - from) * k) / (steps - 1);
  const lam = new Float64Array(steps);
  const spread = new Float64Array(steps);
  lyapunovExponents(family, params, { transient, iterations, starts: 3 }, lam, spread);
  const p = family.parameter;
  const withC = family.toC !== undefined;
  const columns = [p, ...(withC ? ['c'] : []), 'lyapunov', 'spread'];
  const rows = Array.from(params, (r, k) => {
    const row = [String(r)];
    if (withC) row.push(String(r / 2 - (r * r) / 4));
    row.push(lam[k]!.toPrecision(8), spread[k]!.toPrecision(3));
    return row;
  });
  const table: SectionTable = {
    title: `Lyapunov exponent of the ${family.name} family ${family.formula}, ${transient} transient + ${iterations} measured steps, 3 starts`,
    columns,
    rows,
    summary: [],
    extra: { family: family.name, from, to, steps, transient, iterations },
  };
  if (typeof values['out'] !== 'string') return { table };
  const { plotSvg } = await import('../section/plot-svg.js');
  const marks = await landmarks(family, 5);
  const svg = plotSvg({
    title: `Lyapunov exponent, ${family.formula} (shaded: periodic windows onset to end; red: period doublings)`,
    xLabel: family.parameter,
    yLabel: 'Lyapunov exponent',
    xs: params,
    ys: lam,
    marks: marks.doublings.map((d) => ({ at: d.at, label: d.label })),
    bands: marks.windows.map((w) => ({ from: w.from, to: w.to, label: w.label })),
    yMin: -3,
  });
  return { table, svg };
}

// ---------------------------------------------------------------- diagram

function parseSize(value: unknown, fallback: [number, number]): [number, number] {
  if (value === undefined) return fallback;
  const m = typeof value === 'string' ? /^\s*(\d+)\s*[xX]\s*(\d+)\s*$/.exec(value) : null;
  const w = m ? Number(m[1]) : NaN;
  const h = m ? Number(m[2]) : NaN;
  if (!(w >= 1 && w <= 65535 && h >= 1 && h <= 65535)) throw new UserError('--size', 'a size WxH in pixels between 1x1 and 65535x65535 (e.g. 2000x1000)', value);
  return [w, h];
}

function parseWorkers(value: unknown): number {
  const { availableParallelism } = process as unknown as { availableParallelism?: () => number };
  return parseInteger(value, '--workers', 1, 256, availableParallelism?.() ?? 2);
}

function parseOut(value: unknown, exts: readonly string[], fallback: string): string {
  const file = value === undefined ? fallback : String(value);
  if (!exts.some((e) => file.toLowerCase().endsWith(e))) throw new UserError('--out', `a file name ending in ${exts.join(' or ')}`, value);
  return file;
}

async function writeInkPng(file: string, ink: Uint16Array, width: number, height: number, depth: 8 | 16, metadata: string): Promise<void> {
  const { openPngSink } = await import('../io/png-sink.js');
  const { toolVersion } = await import('./version.js');
  let sink;
  try {
    sink = await openPngSink(file, { width, height, depth, channels: 3, metadata, software: `quadatlas ${toolVersion()}` });
  } catch (err) {
    throw new UserError('--out', 'a writable file path', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`));
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

export async function diagramRun(values: Values, progress: (s: string) => void): Promise<{ file: string; seconds: number; width: number; height: number }> {
  const family = parseFamily(values['family']);
  const defaults: Record<string, readonly [string, string]> = { logistic: ['2.8', '4'], sine: ['0.7', '1'], quartic: ['0.6', family.range[1]] };
  const [from, to] = parseRange(values, family, defaults[family.name] ?? family.range);
  const [width, height] = parseSize(values['size'], [2000, 1000]);
  const samples = parseInteger(values['samples'], '--samples', 1, 1024, 4);
  const transient = parseInteger(values['transient'], '--transient', 0, 10_000_000, 1000);
  const iterations = parseInteger(values['iterations'], '--iterations', 1, 10_000_000, Math.max(1000, 2 * height));
  const depth = parseInteger(values['depth'], '--depth', 8, 16, 16);
  if (depth !== 8 && depth !== 16) throw new UserError('--depth', '8 or 16', values['depth']);
  const workers = parseWorkers(values['workers']);
  const file = parseOut(values['out'], ['.png'], `out/${family.name}-diagram.png`);
  const { renderDiagram } = await import('../section/render-diagram.js');
  const { drawTicks } = await import('../section/diagram-ticks.js');
  const { niceTicks } = await import('../section/plot-svg.js');
  const [top, bottom] = [family.stateRange[1], family.stateRange[0]];
  const settings = { width, height, samples, transient, iterations, stateTop: top, stateBottom: bottom };
  const axis = { kind: 'parameter', from, to } as const;
  const started = Date.now();
  const ink = await renderDiagram(family, axis, settings, workers, (d, n) => progress(`diagram ${Math.round((100 * d) / n)} %`));
  const ticks = niceTicks(from, to, 10);
  drawTicks(ink, width, height, ticks.map((t) => (t - from) / (to - from)), Math.max(4, Math.round(height / 100)));
  const metadata = JSON.stringify({ kind: 'section diagram', family: family.name, formula: family.formula, axis: { parameter: family.parameter, from, to, ticks }, state: { top, bottom }, samples, transient, iterations, depth });
  await writeInkPng(file, ink, width, height, depth, metadata);
  return { file, seconds: (Date.now() - started) / 1000, width, height };
}

// ---------------------------------------------------------------- compare

export async function compareRun(values: Values, progress: (s: string) => void): Promise<{ file: string; seconds: number }> {
  const from = Number(values['from'] === undefined ? '-2' : parseDecimal(values['from'], '--from'));
  const to = Number(values['to'] === undefined ? '-0.7' : parseDecimal(values['to'], '--to'));
  if (!(from >= -2 && from <= 0.25)) throw new UserError('--from', 'a c between -2 and 0.25 (the real slice of the set)', values['from']);
  if (!(to >= -2 && to <= 0.25 && to > from)) throw new UserError('--to', `a c between -2 and 0.25 above --from (${from})`, values['to']);
  const [width, height] = parseSize(values['size'], [2400, 1500]);
  if (width < 100 || height < 100) throw new UserError('--size', 'a plate of at least 100x100 pixels', values['size']);
  const samples = parseInteger(values['samples'], '--samples', 1, 1024, 4);
  const workers = parseWorkers(values['workers']);
  const maxPeriod = parseInteger(values['maxPeriod'], '--max-period', 3, 8, 5);
  const file = parseOut(values['out'], ['.svg', '.png'], 'out/section-compare.svg');
  const started = Date.now();
  const { logistic } = await import('../section/families/index.js');
  const { planeStrip } = await import('../section/plane-strip.js');
  const { renderDiagram } = await import('../section/render-diagram.js');
  const { comparePlateSvg } = await import('../section/compare-plate.js');
  const sharp = (await import('sharp')).default;
  const stripHeight = Math.round(height / 3);
  const diagramHeight = height - stripHeight;
  progress('plane strip');
  const strip = planeStrip(from, to, width, stripHeight, 4000);
  const stripPng = await sharp(strip, { raw: { width, height: stripHeight, channels: 3 } }).png().toBuffer();
  progress('diagram');
  const settings = { width, height: diagramHeight, samples, transient: 2000, iterations: Math.max(2000, 2 * diagramHeight), stateTop: 1, stateBottom: 0 };
  const ink = await renderDiagram(logistic, { kind: 'c', from, to }, settings, workers);
  const grey = new Uint8Array(ink.length);
  for (let k = 0; k < ink.length; k++) grey[k] = Math.round(ink[k]! / 257);
  const diagramPng = await sharp(grey, { raw: { width, height: diagramHeight, channels: 1 } }).png().toBuffer();
  progress('landmarks');
  const marks = await landmarks(logistic, maxPeriod);
  const cOf = (r: number): number => r / 2 - (r * r) / 4;
  const svg = comparePlateSvg({
    from,
    to,
    width,
    stripHeight,
    diagramHeight,
    stripPng: stripPng.toString('base64'),
    diagramPng: diagramPng.toString('base64'),
    title: 'The real slice: z -> z^2 + c along the real axis above the logistic map, one parameter axis',
    marks: [
      ...marks.doublings.map((d) => ({ c: cOf(d.at), label: d.label, kind: 'doubling' as const })),
      ...marks.windows.map((w) => ({ c: cOf(w.superstable), label: String(w.period), kind: 'window' as const, from: cOf(w.from), to: cOf(w.to) })),
    ],
  });
  if (file.toLowerCase().endsWith('.svg')) await writeText(file, svg);
  else {
    const png = await sharp(Buffer.from(svg)).png().toBuffer();
    await writeText(file, png);
  }
  return { file, seconds: (Date.now() - started) / 1000 };
}

// ---------------------------------------------------------------- register

function opt(cmd: Command, key: keyof typeof OPTION): Command {
  const [flags, text] = OPTION[key];
  return cmd.option(flags, text);
}

function write(s: string): void {
  process.stdout.write(s);
}

/**
 * Runs an action; a Newton that did not settle is not the user's fault nor a
 * crash: it is reported as one line with exit code 1.
 */
function guarded(action: (values: Values) => Promise<void> | void): (values: Values) => Promise<void> {
  return async (values) => {
    try {
      await action(values);
    } catch (err) {
      if (err instanceof Error && err.name === 'NoConvergenceError') {
        process.stderr.write(`quadatlas: no convergence: ${err.message.split('\n')[0]}\n`);
        process.exitCode = 1;
        return;
      }
      throw err;
    }
  };
}

function progressLine(s: string): void {
  if (process.stderr.isTTY) process.stderr.write(`\r\x1b[K${s}`);
}

export function register(program: Command): void {
  const section = program.command('section').description('the real slice: convert, cascade, windows, lyapunov, diagram, compare, orbit, cobweb');
  registerOrbitCommands(section);

  const convert = section
    .command('convert')
    .description('convert between c and the logistic r (and between z and x) at any precision')
    .option('--c <value>', 'a real parameter c of z -> z^2 + c (c <= 1/4)')
    .option('--r <value>', 'a logistic parameter r')
    .option('--x <value>', 'a logistic state x (needs the parameter)')
    .option('--z <value>', 'a quadratic state z (needs the parameter)');
  for (const k of ['digits', 'json', 'csv'] as const) opt(convert, k);
  convert.action(
    guarded((values: Values) => {
      write(formatTable(convertTable(values), tableFormat(values)));
    }),
  );

  const cascade = section.command('cascade').description('period-doubling cascade, Feigenbaum delta and alpha, accumulation point');
  for (const k of ['family', 'levels', 'digits', 'json', 'csv'] as const) opt(cascade, k);
  cascade.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      const table = await cascadeTable(values, progressLine);
      if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
      write(formatTable(table, format));
    }),
  );

  const windows = section.command('windows').description('periodic windows up to a period: MSS word, onset, superstable, doubling, end, component');
  for (const k of ['family', 'maxPeriod', 'digits', 'json', 'csv'] as const) opt(windows, k);
  windows.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      write(formatTable(await windowsTable(values), format));
    }),
  );

  const lyapunov = section.command('lyapunov').description('Lyapunov exponent across a parameter range (table; an SVG or PNG plot with --out)');
  for (const k of ['family', 'from', 'to', 'steps', 'transient', 'iterations', 'out', 'json', 'csv'] as const) opt(lyapunov, k);
  lyapunov.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      if (values['out'] !== undefined) parseOut(values['out'], ['.svg', '.png'], '');
      const { table, svg } = await lyapunovRun(values);
      if (svg !== undefined) {
        const file = String(values['out']);
        if (file.toLowerCase().endsWith('.png')) {
          const sharp = (await import('sharp')).default;
          await writeText(file, await sharp(Buffer.from(svg), { density: 144 }).png().toBuffer());
        } else await writeText(file, svg);
        process.stderr.write(`quadatlas: wrote ${String(values['out'])}\n`);
        if (format !== 'text') write(formatTable(table, format));
      } else write(formatTable(table, format));
    }),
  );

  const diagram = section.command('diagram').description('the bifurcation diagram as a 16-bit density image (PNG)');
  for (const k of ['family', 'from', 'to', 'size', 'samples', 'transient', 'iterations', 'depth', 'workers', 'out'] as const) opt(diagram, k);
  diagram.action(
    guarded(async (values: Values) => {
      const r = await diagramRun(values, progressLine);
      if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
      process.stderr.write(`quadatlas: wrote ${r.file} (${r.width}x${r.height}) in ${r.seconds.toFixed(1)} s\n`);
    }),
  );

  const compare = section
    .command('compare')
    .description('one plate: a strip of the c-plane above the logistic bifurcation diagram on one axis (SVG or PNG)')
    .option('--from <c>', 'left end of the axis in c (default -2)')
    .option('--to <c>', 'right end of the axis in c (default -0.7)')
    .option('--size <WxH>', 'plate size in pixels without margins (default 2400x1500)')
    .option('--max-period <p>', 'mark windows up to this period (default 5)');
  for (const k of ['samples', 'workers', 'out'] as const) opt(compare, k);
  compare.action(
    guarded(async (values: Values) => {
      const r = await compareRun(values, progressLine);
      if (process.stderr.isTTY) process.stderr.write('\r\x1b[K');
      process.stderr.write(`quadatlas: wrote ${r.file} in ${r.seconds.toFixed(1)} s\n`);
    }),
  );
}
