/**
 * `quadatlas section constants`: Feigenbaum's alpha and delta for a maximum
 * of order Z from the renormalisation fixed point (docs/methods.md
 * E9). Two truncations run on two
 * workers; only the digits both agree on are written, truncated (not
 * rounded) to `--digits` places after the point. The run time goes to
 * stderr, so stdout is the same bytes for any worker count.
 */
import { getHeapStatistics } from 'node:v8';
import type { Command } from 'commander';
import { agreeingDigits, constantsPlan, MAX_ORDER, MIN_ORDER, type ConstantsPlan } from '../../section/constants/feigenbaum-constants.js';
import { formatTable, integerCell, type SectionTable } from '../../section/section-table.js';
import { UserError } from '../../check/user-error.js';
import { optionalInteger } from '../../check/fields.js';
import { createProgress } from '../../render/progress.js';
import { PROGRESS_JSON_OPTION } from '../option-spec.js';
import {
  addOptions,
  clearProgress,
  CSV_OPTION,
  guarded,
  JSON_OPTION,
  parseWorkers,
  progressLine,
  tableFormat,
  WORKERS_OPTION,
  type SectionOption,
  type Values,
  writeStdout,
} from './section-options.js';

const DEFAULT_DIGITS = 50;
const MAX_DIGITS = 100000;

export const CONSTANTS_OPTIONS: readonly SectionOption[] = [
  {
    flags: '--digits <digits>',
    description: `digits after the decimal point of alpha and delta, 1 to what memory allows (default ${DEFAULT_DIGITS}); only digits two truncations agree on are shown`,
  },
  { flags: '--order <Z>', description: `order of the maximum: the family x -> r - |x|^Z, an integer from ${MIN_ORDER} to ${MAX_ORDER} (default 2)` },
  WORKERS_OPTION,
  JSON_OPTION,
  CSV_OPTION,
  PROGRESS_JSON_OPTION,
];

/** The order Z: an integer from 2 to 16; a non-integer order is refused by name (the series is in |x|^Z with integer Z). */
export function parseOrder(value: unknown): number {
  if (value === undefined) return 2;
  const text = String(value).trim();
  const z = /^[+-]?(\d+(\.\d*)?|\.\d+)([eE][+-]?\d+)?$/.test(text) ? Number(text) : NaN;
  if (Number.isNaN(z)) throw new UserError('--order', `a number: the order of the maximum, an integer from ${MIN_ORDER} to ${MAX_ORDER}`, value);
  if (!Number.isInteger(z))
    throw new UserError('--order', `an integer order from ${MIN_ORDER} to ${MAX_ORDER} (the fixed point is a series in |x|^Z; non-integer orders are not supported)`, value);
  if (z < MIN_ORDER || z > MAX_ORDER) throw new UserError('--order', `an integer order from ${MIN_ORDER} to ${MAX_ORDER}`, value);
  return z;
}

/** Heap one truncation may use: 60% of one thread's V8 heap limit (BigInts live on the heap). */
export function heapBudget(): number {
  return 0.6 * getHeapStatistics().heap_size_limit;
}

/** The plan for `digits`, refused (naming --digits) when its memory estimate exceeds the budget. */
export function checkedPlan(order: number, digits: number, budget: number, received: unknown): ConstantsPlan {
  const plan = constantsPlan(order, digits);
  if (plan.bytes <= budget) return plan;
  let lo = 1;
  let hi = digits;
  while (hi - lo > 1) {
    const mid = Math.floor((lo + hi) / 2);
    if (constantsPlan(order, mid).bytes <= budget) lo = mid;
    else hi = mid;
  }
  const mib = (b: number): string => `${Math.round(b / 2 ** 20)} MiB`;
  throw new UserError('--digits', `at most ${lo} digits at order ${order} (estimated ${mib(plan.bytes)} per truncation, ${mib(budget)} allowed)`, received);
}

function eta(seconds: number, fraction: number): string {
  if (fraction <= 0.02) return '';
  const left = (seconds * (1 - fraction)) / fraction;
  return left < 90 ? `, about ${Math.ceil(left)} s left` : `, about ${Math.ceil(left / 60)} min left`;
}

export async function constantsTable(
  values: Values,
  progress: (s: string, fraction: number, stage: string) => void,
  timing?: (seconds: number, workers: number) => void,
): Promise<SectionTable> {
  const order = parseOrder(values['order']);
  const digits = optionalInteger(values['digits'], '--digits', 1, MAX_DIGITS) ?? DEFAULT_DIGITS;
  const workers = parseWorkers(values['workers']);
  const plan = checkedPlan(order, digits, heapBudget(), values['digits']);
  const { constantsOnWorkers } = await import('../../render/feigenbaum-pool.js');
  const started = Date.now();
  const places = digits + 4;
  const [low, high] = await constantsOnWorkers(plan, Math.min(workers, 2), places, (fraction, step) => {
    const s = (Date.now() - started) / 1000;
    progress(`${step.stage} with ${step.terms} terms at ${step.bits} bits: ${Math.round(fraction * 100)}% in ${s.toFixed(1)} s${eta(s, fraction)}`, fraction, step.stage);
  });
  timing?.((Date.now() - started) / 1000, Math.min(workers, 2));
  const shown = (a: string, b: string): { text: string; significant: number } => {
    const agreed = agreeingDigits(a, b);
    const point = agreed.text.indexOf('.');
    const text = point >= 0 && agreed.text.length - point - 1 > digits ? agreed.text.slice(0, point + 1 + digits) : agreed.text;
    return { text, significant: text.replace('.', '').replace(/^0+/, '').length };
  };
  const alpha = shown(low!.alpha, high!.alpha);
  const delta = shown(low!.delta, high!.delta);
  const terms = `${plan.terms[0]} and ${plan.terms[1]}`;
  return {
    title: `Feigenbaum constants of order ${order} (the family x -> r - |x|^${order}) from the fixed point g(x) = -alpha g(g(-x/alpha)), g(0) = 1, g a function of |x|^${order}`,
    columns: ['constant', 'value', 'trusted_digits', 'terms'],
    rows: [
      ['alpha', alpha.text, integerCell(alpha.significant), terms],
      ['delta', delta.text, integerCell(delta.significant), terms],
    ],
    summary: [
      { name: 'alpha', value: alpha.text, note: `-1/g(1); ${alpha.significant} significant digits on which ${terms} Chebyshev terms agree, truncated` },
      {
        name: 'delta',
        value: delta.text,
        note: `eigenvalue of the linearised doubling operator; ${delta.significant} significant digits on which ${terms} terms agree, truncated`,
      },
    ],
    extra: { order, digits, bits: plan.bits, terms: plan.terms },
  };
}

export function register(section: Command): void {
  const cmd = section.command('constants').description("Feigenbaum's alpha and delta for a maximum of order Z, from the renormalisation fixed point");
  addOptions(cmd, CONSTANTS_OPTIONS);
  cmd.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      // --progress-json: the shared reporter, counting thousandths of the weighted work (the plan's own measure of progress)
      const json = values['progressJson'] === true ? createProgress('constants', { json: true }) : null;
      const report = json === null ? progressLine : (_: string, fraction: number, stage: string): void => json.update(Math.round(fraction * 1000), 1000, stage);
      const table = await constantsTable(values, report, (seconds, workers) => {
        // the truncations' own fractions stop short of 1 once their digits agree: the last line says the work is done
        json?.update(1000, 1000, 'done');
        clearProgress();
        process.stderr.write(`quadatlas: constants in ${seconds.toFixed(2)} s on ${workers} worker${workers === 1 ? '' : 's'}\n`);
      });
      writeStdout(formatTable(table, format));
    }),
  );
}
