/**
 * `quadatlas section orbit` and `section cobweb`: orbits of the real slice.
 * Parses and checks flags, calls src/section/orbit.ts, precise-orbit.ts and
 * orbit-figures.ts, writes the table and the figure.
 */
import type { Command } from 'commander';
import { classifyOrbit, DEFAULT_CLASSIFY, orbit, type OrbitClass } from '../../section/orbit.js';
import type { SectionTable } from '../../section/section-table.js';
import type { UnimodalFamily } from '../../section/unimodal-family.js';
import { Received, UserError } from '../../check/user-error.js';
import { parseDecimal, parseFamily, tableFormat } from './section-options.js';
import { optionalInteger } from '../../check/fields.js';
import { addOptions, type OptionSpec } from '../option-spec.js';

type Values = Record<string, unknown>;

/** Most orbit steps in double precision (8 bytes each per parameter). */
export const MAX_ORBIT_STEPS = 1_000_000;
/** Most steps with --digits (every step holds two decimal.js numbers of the working precision). */
export const MAX_PRECISE_STEPS = 100_000;
export const MAX_ORBIT_DIGITS = 10_000;
const MAX_PARAMETERS = 8;

/** The parameter range a family accepts: [0, the end of its range] (logistic: [0, 4]). */
export function parameterLimits(family: UnimodalFamily): [number, number] {
  return [0, Number(family.range[1])];
}

function parseParameter(text: string, family: UnimodalFamily): string {
  const r = parseDecimal(text, '--r');
  const [lo, hi] = parameterLimits(family);
  const v = Number(r);
  if (!(v >= lo && v <= hi)) throw new UserError('--r', `a parameter in [${lo}, ${family.range[1]}] for the ${family.name} family`, text);
  return r;
}

function parseStart(value: unknown, family: UnimodalFamily): string {
  const [lo, hi] = family.stateRange;
  if (value === undefined) return String(Number((lo + 0.2 * (hi - lo)).toPrecision(12)));
  const x = parseDecimal(value, '--x0');
  if (!(Number(x) >= lo && Number(x) <= hi)) throw new UserError('--x0', `a start in the invariant interval [${lo}, ${hi}] of the ${family.name} family`, value);
  return x;
}

function fmt(x: number): string {
  return Number.isFinite(x) ? String(Number(x.toPrecision(12))) : String(x);
}

/** One sentence for a classification. */
export function describeClass(c: OrbitClass): string {
  const lyap = `Lyapunov estimate ${c.lyapunov.toFixed(6)} over ${c.lyapunovSteps} steps`;
  const pts = c.cycle.slice(0, 8).map(fmt).join(', ') + (c.cycle.length > 8 ? ', ...' : '');
  if (c.kind === 'cycle') {
    const what = c.period === 1 ? `fixed point ${pts}` : `cycle of period ${c.period}: ${pts}`;
    return `settles on an ${c.stability} ${what} (multiplier ${fmt(c.multiplier)}); ${lyap}`;
  }
  if (c.kind === 'on-cycle') return `x_0 lies on a ${c.stability} cycle of period ${c.period}: ${pts} (multiplier ${fmt(c.multiplier)}); ${lyap}`;
  return `no period up to ${DEFAULT_CLASSIFY.maxPeriod} found after ${DEFAULT_CLASSIFY.transient} steps; ${lyap}`;
}

/** A short phrase for a figure caption. */
export function shortClass(c: OrbitClass): string {
  const pts =
    c.cycle
      .slice(0, 3)
      .map((x) => String(Number(x.toPrecision(4))))
      .join(', ') + (c.cycle.length > 3 ? ', ...' : '');
  const mult = String(Number(c.multiplier.toPrecision(3)));
  if (c.kind === 'none') return `no period found, Lyapunov exponent ${c.lyapunov.toFixed(4)}`;
  const what = c.period === 1 ? 'fixed point' : `${c.period}-cycle`;
  return `${c.kind === 'on-cycle' ? 'starts on a' : 'settles on an'} ${c.stability} ${what} ${pts}; multiplier ${mult}`;
}

function classRecord(c: OrbitClass): Record<string, unknown> {
  return {
    kind: c.kind,
    period: c.period,
    cycle: c.cycle,
    multiplier: c.multiplier,
    stability: c.stability,
    lyapunov: c.lyapunov,
    lyapunovSteps: c.lyapunovSteps,
    description: describeClass(c),
  };
}

export interface OrbitRun {
  readonly table: SectionTable;
  readonly series: Array<{ r: string; values: Float64Array }>;
  readonly family: UnimodalFamily;
  readonly x0: string;
  readonly first: number;
}

export async function orbitRun(values: Values): Promise<OrbitRun> {
  const family = parseFamily(values['family']);
  if (typeof values['r'] !== 'string') throw new UserError('--r', 'one or more parameters R[,R2,...]', values['r']);
  const rs = values['r'].split(',').map((t) => parseParameter(t, family));
  if (rs.length > MAX_PARAMETERS) throw new UserError('--r', `at most ${MAX_PARAMETERS} parameters`, values['r']);
  const x0 = parseStart(values['x0'], family);
  const precise = values['digits'] !== undefined;
  const digits = optionalInteger(values['digits'], '--digits', 1, MAX_ORBIT_DIGITS) ?? 0;
  const iterations = optionalInteger(values['iterations'], '--iterations', 1, precise ? MAX_PRECISE_STEPS : MAX_ORBIT_STEPS) ?? 60;
  const transient = optionalInteger(values['transient'], '--transient', 0, MAX_ORBIT_STEPS) ?? 0;
  if (transient + iterations > (precise ? MAX_PRECISE_STEPS : MAX_ORBIT_STEPS))
    throw new UserError('--iterations', `transient + iterations at most ${precise ? MAX_PRECISE_STEPS : MAX_ORBIT_STEPS}`, transient + iterations);
  const p = family.parameter;
  const rows: string[][] = [];
  const summary: Array<{ name: string; value: string; note?: string }> = [];
  const orbits: Record<string, unknown>[] = [];
  const series: Array<{ r: string; values: Float64Array }> = [];
  const { preciseOrbit } = precise ? await import('../../section/precise-orbit.js') : { preciseOrbit: undefined };
  for (const r of rs) {
    const cls = classifyOrbit(family, Number(r), Number(x0));
    const all = orbit(family, Number(r), Number(x0), transient + iterations);
    const shown = all.subarray(transient);
    series.push({ r, values: shown });
    const record: Record<string, unknown> = { [p]: r, x0, classification: classRecord(cls) };
    if (preciseOrbit !== undefined) {
      const po = preciseOrbit(family, r, x0, transient + iterations, digits, cls.lyapunov);
      for (let n = transient; n <= transient + iterations; n++) rows.push([r, String(n), po.values[n]!, String(po.agree[n]!), n < po.trustedSteps ? 'yes' : 'no']);
      const trusted = `${Math.min(po.trustedSteps, transient + iterations + 1)} of ${transient + iterations + 1} steps`;
      const estimate =
        po.stepsPerDigit === null
          ? 'the orbit does not expand errors (Lyapunov <= 0)'
          : `one digit lost every ${po.stepsPerDigit.toFixed(2)} steps; ${digits} digits last about ${po.estimate!.toFixed(0)} steps at ${digits}-digit precision`;
      summary.push({
        name: `trusted (${p} = ${r})`,
        value: trusted,
        note: `computed at ${po.workingDigits} digits, confirmed against ${po.checkDigits}; first disagreement ${po.firstDisagreement === null ? 'none' : `at step ${po.firstDisagreement}`}; ${estimate}`,
      });
      Object.assign(record, {
        trustedSteps: po.trustedSteps,
        firstDisagreement: po.firstDisagreement,
        workingDigits: po.workingDigits,
        checkDigits: po.checkDigits,
        stepsPerDigit: po.stepsPerDigit,
        estimate: po.estimate,
      });
    } else {
      for (let n = 0; n < shown.length; n++) rows.push([r, String(transient + n), fmt(shown[n]!)]);
    }
    summary.push({
      name: `${p} = ${r}`,
      value: cls.kind === 'none' ? 'no period found' : cls.period === 1 && cls.kind === 'cycle' ? 'fixed point' : `period ${cls.period}`,
      note: describeClass(cls),
    });
    orbits.push(record);
  }
  return {
    table: {
      title: `orbits of the ${family.name} family ${family.formula} from x_0 = ${x0}${precise ? ` (${digits} digits after the point)` : ''}`,
      columns: precise ? [p, 'n', 'x', 'agree_digits', 'trusted'] : [p, 'n', 'x'],
      rows,
      summary,
      extra: { family: family.name, x0, transient, iterations, ...(precise ? { digits } : {}), orbits },
    },
    series,
    family,
    x0,
    first: transient,
  };
}

function parseOut(value: unknown, fallback: string): string {
  const file = value === undefined ? fallback : String(value);
  if (!/\.(svg|png)$/i.test(file)) throw new UserError('--out', 'a file name ending in .svg (the figure) or .png (the same figure)', value);
  return file;
}

async function writeFigure(file: string, svg: (lettering?: import('../../section/orbit-figures.js').Lettering) => string): Promise<void> {
  const { writeFileAtomic } = await import('../../io/write-file-atomic.js');
  let body: string | Uint8Array;
  // Text as DejaVu outlines in both formats (aria-label carries each string): the SVG reads the same in
  // every viewer, and the PNG rasterises no <text>, so no font of the machine enters it.
  const { outlineLettering } = await import('../../figure/outline-lettering.js');
  const lettering = outlineLettering({ typeset: true });
  if (/\.png$/i.test(file)) {
    const { rasterisePlot } = await import('./section-output.js');
    body = await rasterisePlot(svg(lettering), 144);
  } else body = svg(lettering);
  try {
    await writeFileAtomic(file, body);
  } catch (err) {
    throw new UserError('--out', 'a writable file path', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`));
  }
}

export async function cobwebRun(values: Values): Promise<{ table: SectionTable; svg: (l?: import('../../section/orbit-figures.js').Lettering) => string }> {
  const family = parseFamily(values['family']);
  if (typeof values['r'] !== 'string' || values['r'].includes(',')) throw new UserError('--r', 'one parameter R', values['r']);
  const r = parseParameter(values['r'], family);
  const x0 = parseStart(values['x0'], family);
  const K = optionalInteger(values['iterate'], '--iterate', 1, 64) ?? 1;
  const steps = optionalInteger(values['iterations'], '--iterations', 1, 10_000) ?? 80;
  const rv = Number(r);
  const fK = (x: number): number => {
    for (let k = 0; k < K; k++) x = family.f(x, rv);
    return x;
  };
  const xs = new Float64Array(steps + 1);
  xs[0] = Number(x0);
  for (let k = 1; k <= steps; k++) xs[k] = fK(xs[k - 1]!);
  const cls = classifyOrbit(family, rv, Number(x0));
  // Points of the attracting cycle are fixed points of f^K exactly when the period divides K.
  const marks = cls.kind === 'cycle' && cls.stability === 'attracting' ? [...cls.cycle] : [];
  const { cobwebSvg } = await import('../../section/orbit-figures.js');
  const p = family.parameter;
  const label = K === 1 ? 'f(x)' : `f^${K}(x)`;
  const svg = (lettering?: import('../../section/orbit-figures.js').Lettering): string =>
    cobwebSvg(
      {
        title: `Cobweb of ${family.formula.replace('x -> ', 'f(x) = ')}${K > 1 ? `, iterate ${K}` : ''}, ${p} = ${r}, x_0 = ${x0}`,
        subtitle: `${steps} steps: ${shortClass(cls)}`,
        map: fK,
        mapLabel: label,
        steps: xs,
        marks,
        range: family.stateRange,
      },
      lettering,
    );
  const rows = Array.from(xs, (x, n) => [String(n * K), fmt(x)]);
  return {
    table: {
      title: `cobweb of the ${family.name} family at ${p} = ${r} from x_0 = ${x0}${K > 1 ? ` (iterate ${K})` : ''}`,
      columns: ['n', 'x'],
      rows,
      summary: [{ name: `${p} = ${r}`, value: cls.kind === 'none' ? 'no period found' : `period ${cls.period}`, note: describeClass(cls) }],
      extra: { family: family.name, r, x0, iterate: K, classification: classRecord(cls) },
    },
    svg,
  };
}

export const ORBIT_OPTIONS: readonly OptionSpec[] = [
  { flags: '--r <values>', description: 'parameters R[,R2,...] (logistic: in [0, 4]; required, no default)' },
  { flags: '--x0 <x>', description: 'start (default 0.2 for the logistic family)' },
  { flags: '--iterations <n>', description: 'steps shown (default 60)' },
  { flags: '--transient <n>', description: 'steps skipped before those shown (default 0)' },
  {
    flags: '--digits <n>',
    description: 'print to n digits after the point, computed in decimal arithmetic, with the count of trusted steps (default: doubles, 12 significant digits)',
  },
  { flags: '--family <name>', description: 'the unimodal family (default logistic)' },
  { flags: '--json', description: 'write the table as JSON to stdout (default: aligned text)' },
  { flags: '--csv', description: 'write the table as CSV to stdout (default: aligned text)' },
  { flags: '--out <file>', description: 'figure: .svg (main output) or .png (the same figure) (default: table only)' },
];

export const COBWEB_OPTIONS: readonly OptionSpec[] = [
  { flags: '--r <value>', description: 'the parameter R (logistic: in [0, 4]; required, no default)' },
  { flags: '--x0 <x>', description: 'start (default 0.2 for the logistic family)' },
  { flags: '--iterations <n>', description: 'staircase steps (default 80)' },
  { flags: '--iterate <k>', description: 'draw f^K and step by it (default 1)' },
  { flags: '--family <name>', description: 'the unimodal family (default logistic)' },
  { flags: '--json', description: 'write the orbit as JSON to stdout (default: aligned text)' },
  { flags: '--csv', description: 'write the orbit as CSV to stdout (default: aligned text)' },
  { flags: '--out <file>', description: 'figure: .svg (main output) or .png (the same figure) (default: table only)' },
];

/** Registers `orbit` and `cobweb` under `section`. */
export function registerOrbitCommands(section: Command): void {
  const orbitCmd = addOptions(
    section.command('orbit').description('orbits x_0, x_1, ... for one or more parameters: table, classification, and a plot of x_n against n'),
    ORBIT_OPTIONS,
  );
  orbitCmd.action(async (values: Values) => {
    const format = tableFormat(values);
    const run = await orbitFigure(values);
    const { formatTable } = await import('../../section/section-table.js');
    process.stdout.write(formatTable(run.table, format));
  });
  const cobweb = addOptions(section.command('cobweb').description('the cobweb of one orbit: the graph of f (or f^K), the diagonal and the staircase'), COBWEB_OPTIONS);
  cobweb.action(async (values: Values) => {
    const format = tableFormat(values);
    const run = await cobwebFigure(values);
    const { formatTable } = await import('../../section/section-table.js');
    process.stdout.write(formatTable(run.table, format));
  });
}

/** `section orbit` without printing: computes the orbits and writes the figure when values.out is set. */
export async function orbitFigure(values: Values): Promise<OrbitRun> {
  const file = values['out'] === undefined ? null : parseOut(values['out'], '');
  const run = await orbitRun(values);
  if (file !== null) {
    const { orbitPlotSvg } = await import('../../section/orbit-figures.js');
    const p = run.family.parameter;
    await writeFigure(file, (lettering) =>
      orbitPlotSvg(
        {
          title: `Orbits of ${run.family.formula} from x_0 = ${run.x0}`,
          series: run.series.map((s) => ({ label: `${p} = ${s.r}`, values: s.values })),
          yRange: run.family.stateRange,
          first: run.first,
        },
        lettering,
      ),
    );
  }
  return run;
}

/** `section cobweb` without printing: computes the staircase and writes the figure (default out/cobweb.svg). */
export async function cobwebFigure(values: Values): Promise<{ table: SectionTable }> {
  const file = parseOut(values['out'], 'out/cobweb.svg');
  const run = await cobwebRun(values);
  await writeFigure(file, run.svg);
  return run;
}
