/**
 * Shards of a census: shard I of N holds the components whose lower external
 * angle n/(2^p - 1) has floor(I·d/N) <= n < floor((I+1)·d/N), d = 2^p - 1.
 * The ranges tile [0, d) without gaps or overlaps for any N, every component
 * has one lower angle, so each belongs to exactly one shard; and a shard's
 * rows, in the census' order (by lower angle), follow the previous shard's.
 *
 * The header a shard file carries (one comment line before the CSV header,
 * `# quadatlas components shard {...}`), and the checks `components merge`
 * runs on a set of them: one period, one N, every I once, the ranges of this
 * rule (so no gaps and no overlaps), each row in its shard's range, lower
 * angles increasing across the whole table, and no two nuclei within 1e-3 of
 * the smaller size estimate of each other (the census' own test for one
 * component reached twice, C5 "counting checks"), compared in the decimal
 * digits the rows carry.
 */
import { UserError } from '../check/user-error.js';

export interface ShardSpec {
  readonly index: number;
  readonly count: number;
}

/** The half-open range [from, to) of lower-angle numerators over den = 2^p - 1 that shard I/N holds. */
export function shardAngleRange(period: number, shard: ShardSpec): { from: number; to: number; den: number } {
  const den = 2 ** period - 1;
  const at = (i: number): number => Number((BigInt(i) * BigInt(den)) / BigInt(shard.count));
  return { from: at(shard.index), to: at(shard.index + 1), den };
}

/** What a shard file records about itself. */
export interface ShardHeader {
  readonly period: number;
  readonly shard: string;
  /** Lower angles from (inclusive) and to (exclusive), as numerator/(2^p - 1). */
  readonly angleFrom: string;
  readonly angleTo: string;
  readonly rows: number;
}

export const SHARD_COMMENT = '# quadatlas components shard ';

export function shardHeader(period: number, shard: ShardSpec, rows: number): ShardHeader {
  const r = shardAngleRange(period, shard);
  return { period, shard: `${shard.index}/${shard.count}`, angleFrom: `${r.from}/${r.den}`, angleTo: `${r.to}/${r.den}`, rows };
}

export function shardCommentLine(h: ShardHeader): string {
  return `${SHARD_COMMENT}${JSON.stringify(h)}`;
}

/** The header of a shard file's first line, or null when the line is not one. */
export function parseShardComment(line: string): ShardHeader | null {
  if (!line.startsWith(SHARD_COMMENT)) return null;
  try {
    const h = JSON.parse(line.slice(SHARD_COMMENT.length)) as Partial<ShardHeader>;
    if (typeof h.period !== 'number' || typeof h.shard !== 'string' || typeof h.angleFrom !== 'string' || typeof h.angleTo !== 'string' || typeof h.rows !== 'number') return null;
    return h as ShardHeader;
  } catch {
    return null;
  }
}

/** A shard as merge reads it: its header, the file it came from and its rows' lower angle, nucleus and size cells. */
export interface ShardRows {
  readonly file: string;
  readonly header: ShardHeader;
  readonly rows: number;
  readonly angleLo: readonly string[];
  readonly nucleusRe: readonly string[];
  readonly nucleusIm: readonly string[];
  readonly size: readonly string[];
}

function fraction(text: string): [bigint, bigint] | null {
  const m = /^(\d+)(?:\/(\d+))?$/.exec(text.trim());
  return m === null || BigInt(m[2] ?? '1') === 0n ? null : [BigInt(m[1]!), BigInt(m[2] ?? '1')];
}

/** a/b < c/d for fractions with positive denominators. */
function below(x: [bigint, bigint], y: [bigint, bigint]): boolean {
  return x[0] * y[1] < y[0] * x[1];
}

/**
 * Checks a set of shards (already read) and returns them in shard order; any
 * problem is a UserError naming `field` (the folder), so nothing is written.
 */
export function checkShardSet(shards: readonly ShardRows[], field: string): ShardRows[] {
  if (shards.length === 0) throw new UserError(field, 'a folder holding the shard files (.csv with a "# quadatlas components shard" first line)', 'none found');
  const first = shards[0]!;
  const count = Number(first.header.shard.split('/')[1]);
  const byIndex = new Map<number, ShardRows>();
  for (const s of shards) {
    const m = /^(\d+)\/(\d+)$/.exec(s.header.shard);
    if (m === null) throw new UserError(field, 'shard headers with shard I/N', `${s.file}: shard ${s.header.shard}`);
    if (s.header.period !== first.header.period)
      throw new UserError(field, `shards of one period (${first.file} has period ${first.header.period})`, `${s.file}: period ${s.header.period}`);
    if (Number(m[2]) !== count) throw new UserError(field, `shards of one split (${first.file} is one of ${count})`, `${s.file}: shard ${s.header.shard}`);
    const i = Number(m[1]);
    const twin = byIndex.get(i);
    if (twin !== undefined) throw new UserError(field, `each shard once`, `shard ${s.header.shard} in both ${twin.file} and ${s.file}`);
    byIndex.set(i, s);
  }
  const missing: number[] = [];
  for (let i = 0; i < count; i++) if (!byIndex.has(i)) missing.push(i);
  if (missing.length > 0) {
    const shown = missing.slice(0, 8).map((i) => `${i}/${count}`);
    throw new UserError(field, `all ${count} shards of period ${first.header.period}`, `missing ${shown.join(', ')}${missing.length > 8 ? ` and ${missing.length - 8} more` : ''}`);
  }
  const period = first.header.period;
  const ordered = [...byIndex.entries()].sort((a, b) => a[0] - b[0]).map((e) => e[1]);
  let previous: [bigint, bigint] | null = null;
  let end = `0/${2 ** period - 1}`;
  for (const [i, s] of ordered.entries()) {
    const want = shardHeader(period, { index: i, count }, s.rows);
    // the ranges of the rule abut, so a range that differs leaves a gap or an overlap
    if (s.header.angleFrom !== end || s.header.angleTo !== want.angleTo) {
      throw new UserError(
        field,
        `shard ${i}/${count} to cover lower angles ${want.angleFrom} to ${want.angleTo} (a gap or an overlap otherwise)`,
        `${s.file}: ${s.header.angleFrom} to ${s.header.angleTo}`,
      );
    }
    end = s.header.angleTo;
    if (s.header.rows !== s.rows) throw new UserError(field, `the ${s.header.rows} rows its header records`, `${s.file}: ${s.rows} rows (cut short?)`);
    const from = fraction(s.header.angleFrom)!;
    const to = fraction(s.header.angleTo)!;
    for (let r = 0; r < s.rows; r++) {
      const a = fraction(s.angleLo[r]!);
      if (a === null) throw new UserError(field, 'an angle_lo fraction in every row', `${s.file} row ${r + 1}: ${s.angleLo[r]}`);
      if (below(a, from) || !below(a, to))
        throw new UserError(field, `rows of shard ${i}/${count} within its lower angles ${s.header.angleFrom} to ${s.header.angleTo}`, `${s.file} row ${r + 1}: ${s.angleLo[r]}`);
      if (previous !== null && !below(previous, a))
        throw new UserError(field, 'lower angles increasing across the shards (each component once)', `${s.file} row ${r + 1}: ${s.angleLo[r]}`);
      previous = a;
    }
  }
  checkDistinctNuclei(ordered, field);
  return ordered;
}

/** A decimal string as an integer times 10^-scale. */
function fixed(text: string, scale: number, field: string, where: string): bigint {
  const m = /^([+-]?)(\d*)(?:\.(\d*))?$/.exec(text.trim());
  if (m === null) throw new UserError(field, 'decimal nucleus_re and nucleus_im cells', `${where}: ${text}`);
  const frac = (m[3] ?? '').padEnd(scale, '0').slice(0, scale);
  const v = BigInt(`${m[2] || '0'}${frac}`);
  return m[1] === '-' ? -v : v;
}

/**
 * No two nuclei of the whole table within 1e-3 of the smaller size estimate
 * of each other: a sweep over the rows sorted by real part (doubles, with a
 * margin for their rounding), each close pair measured again in the rows'
 * decimal digits (doubles cannot part nuclei closer than 1e-16, and at
 * period 16 the smallest components are 1e-18 across).
 */
function checkDistinctNuclei(shards: readonly ShardRows[], field: string): void {
  const re: number[] = [];
  const size: number[] = [];
  const where: Array<[ShardRows, number]> = [];
  let scale = 0;
  for (const s of shards) {
    for (let r = 0; r < s.rows; r++) {
      re.push(Number(s.nucleusRe[r]));
      size.push(Number(s.size[r]));
      where.push([s, r]);
      for (const t of [s.nucleusRe[r]!, s.nucleusIm[r]!]) scale = Math.max(scale, (t.split('.')[1] ?? '').length);
    }
  }
  const order = re.map((_, i) => i).sort((a, b) => re[a]! - re[b]! || a - b);
  const unit = 10 ** -scale;
  for (let k = 1; k < order.length; k++) {
    const e = order[k]!;
    for (let j = k - 1; j >= 0; j--) {
      const g = order[j]!;
      if (re[e]! - re[g]! > 1e-3 * size[e]! + 1e-15 * Math.max(1, Math.abs(re[e]!))) break;
      const [se, re_] = where[e]!;
      const [sg, rg] = where[g]!;
      const at = (s: ShardRows, r: number): string => `${s.file} row ${r + 1}`;
      const dre = Number(fixed(se.nucleusRe[re_]!, scale, field, at(se, re_)) - fixed(sg.nucleusRe[rg]!, scale, field, at(sg, rg))) * unit;
      const dim = Number(fixed(se.nucleusIm[re_]!, scale, field, at(se, re_)) - fixed(sg.nucleusIm[rg]!, scale, field, at(sg, rg))) * unit;
      if (Math.hypot(dre, dim) <= 1e-3 * Math.min(size[e]!, size[g]!)) {
        throw new UserError(
          field,
          'distinct nuclei across the shards (one component listed twice otherwise)',
          `${sg.file} row ${rg + 1} and ${se.file} row ${re_ + 1} at ${se.nucleusRe[re_]}, ${se.nucleusIm[re_]}`,
        );
      }
    }
  }
}
