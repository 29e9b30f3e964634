/**
 * `quadatlas section universality`: Feigenbaum's alpha and delta by order of
 * the maximum for the family x -> r - |x|^Z, from the renormalisation fixed
 * point (docs/methods.md E9), with the cascade's own estimate beside them
 * where the project has a family of that order (docs/methods.md E2, E3, E8):
 * the logistic map for Z = 2 (affinely conjugate to x -> r - x^2) and the
 * quartic family x -> r - x^4 for Z = 4. Odd orders use |x|^Z (Z = 3 is the
 * class of |x|^3, not of x^3, which has no maximum).
 */
import type { Command } from 'commander';
import { agreeingDigits, MAX_ORDER, MIN_ORDER, roundedAgreement } from '../../section/constants/feigenbaum-constants.js';
import { formatTable, integerCell, type Cell, type SectionTable } from '../../section/section-table.js';
import type { UnimodalFamily } from '../../section/unimodal-family.js';
import { UserError } from '../../check/user-error.js';
import { optionalInteger } from '../../check/fields.js';
import { checkedPlan, heapBudget, parseOrder } from './constants.js';
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

const DEFAULT_DIGITS = 30;

export const UNIVERSALITY_OPTIONS: readonly SectionOption[] = [
  { flags: '--orders <list>', description: `orders Z of the maximum, comma-separated integers from ${MIN_ORDER} to ${MAX_ORDER} (default 2,3,4,6,8)` },
  { flags: '--digits <digits>', description: `digits after the decimal point of alpha and delta, 1 to 200 (default ${DEFAULT_DIGITS})` },
  { flags: '--cascade-levels <n>', description: 'levels of the cascade estimate where a family of that order exists, 0 (none) or 4 to 16 (default 12)' },
  WORKERS_OPTION,
  JSON_OPTION,
  CSV_OPTION,
];

/** "2,4,6" -> [2, 4, 6]: each an order as parseOrder reads it, no repeats. */
export function parseOrders(value: unknown): number[] {
  if (value === undefined) return [2, 3, 4, 6, 8];
  const parts = String(value)
    .split(',')
    .map((p) => p.trim());
  if (parts.some((p) => p === '')) throw new UserError('--orders', `comma-separated orders, integers from ${MIN_ORDER} to ${MAX_ORDER} (e.g. 2,4,6,8)`, value);
  const orders = parts.map((p) => {
    try {
      return parseOrder(p);
    } catch (err) {
      if (err instanceof UserError) throw new UserError('--orders', `comma-separated orders, each ${err.expected}`, value);
      throw err;
    }
  });
  if (new Set(orders).size !== orders.length) throw new UserError('--orders', 'each order once', value);
  return orders;
}

/** The project's family whose maximum has this order, and how it relates to x -> r - |x|^Z. */
async function cascadeFamily(order: number): Promise<{ family: UnimodalFamily; relation: string } | undefined> {
  const { logistic, quartic } = await import('../../section/families/index.js');
  if (order === 2) return { family: logistic, relation: 'logistic r x (1 - x), affinely conjugate to r - x^2' };
  if (order === 4) return { family: quartic, relation: 'quartic r - x^4' };
  return undefined;
}

export async function universalityTable(values: Values, progress: (s: string) => void): Promise<SectionTable> {
  const orders = parseOrders(values['orders']);
  const digits = optionalInteger(values['digits'], '--digits', 1, 200) ?? DEFAULT_DIGITS;
  const workers = parseWorkers(values['workers']);
  const levelsGiven = values['cascadeLevels'] === undefined ? undefined : (optionalInteger(values['cascadeLevels'], '--cascade-levels', 0, 16) ?? 0);
  if (levelsGiven !== undefined && levelsGiven > 0 && levelsGiven < 4) throw new UserError('--cascade-levels', '0 (none) or an integer from 4 to 16', values['cascadeLevels']);
  const plans = orders.map((z) => checkedPlan(z, digits, heapBudget(), values['digits']));
  const { constantsOnWorkers } = await import('../../render/feigenbaum-pool.js');
  const { computeCascade } = await import('../../section/cascade.js');
  const { cascadeSolverFor } = await import('../../section/cascade-solver-for.js');
  const rows: Cell[][] = [];
  const cascades: Record<string, unknown>[] = [];
  for (const plan of plans) {
    const z = plan.order;
    progress(`order ${z}: fixed point with ${plan.terms.join(' and ')} terms`);
    const [a, b] = await constantsOnWorkers(plan, Math.min(workers, 2), digits + 4);
    const cut = (x: string, y: string): string => {
      const t = agreeingDigits(x, y).text;
      const point = t.indexOf('.');
      return point >= 0 && t.length - point - 1 > digits ? t.slice(0, point + 1 + digits) : t;
    };
    const alpha = cut(a!.alpha, b!.alpha);
    const delta = cut(a!.delta, b!.delta);
    const row: Cell[] = [integerCell(z), `even, in |x|^${z}`, alpha, delta];
    const known = await cascadeFamily(z);
    const levels = levelsGiven ?? 12;
    if (known !== undefined && levels > 0) {
      progress(`order ${z}: cascade of the ${known.family.name} family, ${levels} levels`);
      const work = Math.max(30, Math.ceil(1.4 * levels) + 24);
      const c = computeCascade(cascadeSolverFor(known.family, work).solver, levels, work);
      const est = (v: { value: { toPrecision(n: number): string }; digits: number }): string => (v.digits > 0 ? v.value.toPrecision(v.digits) : 'not trusted');
      const ca = est(c.alpha);
      const cd = est(c.delta);
      const agree = (x: string, y: string): number => (x === 'not trusted' ? 0 : roundedAgreement(x, y));
      row.push(known.relation, ca, integerCell(agree(ca, alpha)), cd, integerCell(agree(cd, delta)));
      cascades.push({ order: z, family: known.family.name, levels, alpha: ca, delta: cd });
    } else row.push(known === undefined ? 'none in the project' : 'not run', '', '', '', '');
    rows.push(row);
  }
  return {
    title: `Feigenbaum's constants by order Z of the maximum, family x -> r - |x|^Z: fixed point of g(x) = -alpha g(g(-x/alpha)) beside the cascade estimate`,
    columns: ['order', 'function_class', 'alpha', 'delta', 'cascade_family', 'cascade_alpha', 'alpha_digits_agreeing', 'cascade_delta', 'delta_digits_agreeing'],
    rows,
    summary: [
      { name: 'fixed point', value: `digits two truncations agree on, truncated to ${digits} places`, note: 'docs/methods.md E9' },
      { name: 'cascade', value: 'repeated Aitken on the doubling ratios, trusted digits only', note: 'docs/methods.md E2, E3' },
      { name: 'odd orders', value: 'g is a function of |x|^Z: Z = 3 is the class of |x|^3', note: 'x^3 itself has no maximum' },
    ],
    extra: { family: 'x -> r - |x|^Z', digits, orders, cascades },
  };
}

export function register(section: Command): void {
  const cmd = section.command('universality').description('alpha and delta by order of the maximum (x -> r - |x|^Z), fixed point beside the cascade');
  addOptions(cmd, UNIVERSALITY_OPTIONS);
  cmd.action(
    guarded(async (values: Values) => {
      const format = tableFormat(values);
      const table = await universalityTable(values, progressLine);
      clearProgress();
      writeStdout(formatTable(table, format));
    }),
  );
}

export { roundedAgreement };
