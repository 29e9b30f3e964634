/**
 * Timing against the previous commit built beside this one: when
 * QUADATLAS_BENCH_BASE names a built checkout of it (its
 * dist/src/cli/main.js present), a section runs the same measurement there
 * and here, interleaved in the same run, and reports "faster" = its seconds /
 * ours per pair. For example
 * `git worktree add ../base HEAD~1 && (cd ../base && npm ci && npm run build)`.
 */
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import path from 'node:path';
import type { BenchContext } from './bench-section.js';

/** Median, least and greatest of some figures. */
export interface Spread {
  readonly median: number;
  readonly min: number;
  readonly max: number;
}

/** The spread of `values` (at least one); the median of an even count is the upper middle value. */
export function spread(values: readonly number[]): Spread {
  const s = [...values].sort((a, b) => a - b);
  return { median: s[Math.floor(s.length / 2)]!, min: s[0]!, max: s[s.length - 1]! };
}

/** The checkout QUADATLAS_BENCH_BASE names when it is built, else undefined. */
export function benchBase(env: NodeJS.ProcessEnv = process.env): string | undefined {
  const base = env['QUADATLAS_BENCH_BASE'];
  if (base === undefined || base === '' || !existsSync(path.join(base, 'dist/src/cli/main.js'))) return undefined;
  return base;
}

/** How a base checkout is named in a note: its commit when git can tell, and whether it is a worktree or a clone. */
function describeBase(base: string): string {
  const git = path.join(base, '.git');
  const kind = existsSync(git) ? (statSync(git).isFile() ? 'a worktree' : 'a clone') : 'not a git checkout';
  const head = spawnSync('git', ['-C', base, 'rev-parse', '--short', 'HEAD'], { encoding: 'utf8' });
  return head.status === 0 ? `${head.stdout.trim()}, ${kind}` : kind;
}

/** Both sides of a comparison with the base checkout, pair by pair. */
export interface BaseComparison<T> {
  readonly base: string;
  /** The base checkout's measurements, in run order. */
  readonly before: T[];
  /** This checkout's, in run order; pair k is before[k], after[k]. */
  readonly after: T[];
  /** before seconds / after seconds over the pairs. */
  readonly faster: Spread;
}

/**
 * Measures the base checkout and this one `runs` times each, interleaved
 * (base first in every pair), and notes what was compared. Returns undefined,
 * noting why, when QUADATLAS_BENCH_BASE is unset or not built.
 */
export function compareWithBase<T>(
  context: BenchContext,
  runs: number,
  measure: (root: string) => T,
  seconds: (t: T) => number,
  env: NodeJS.ProcessEnv = process.env,
): BaseComparison<T> | undefined {
  const base = benchBase(env);
  if (base === undefined) {
    context.note('QUADATLAS_BENCH_BASE unset (or not built): the comparison with the previous commit was skipped');
    return undefined;
  }
  const before: T[] = [];
  const after: T[] = [];
  for (let k = 0; k < runs; k++) {
    before.push(measure(base));
    after.push(measure(context.root));
  }
  const faster = spread(before.map((b, k) => seconds(b) / seconds(after[k]!)));
  context.note(`previous commit: the checkout at ${base} (${describeBase(base)}); faster = its seconds / ours, ${runs} paired run${runs === 1 ? '' : 's'} in this run`);
  return { base, before, after, faster };
}
