/**
 * Which share of a pyramid's tiles this process renders: `--shard I/N`, or
 * from the batch scheduler's environment. Tile t belongs to shard t mod N, so
 * every shard gets tiles of every level and the shards' work is balanced.
 *
 * - Slurm job arrays (sbatch --array; Slurm's job_array documentation):
 *   SLURM_ARRAY_TASK_ID, with SLURM_ARRAY_TASK_MIN and SLURM_ARRAY_TASK_STEP
 *   (indexes may be 1-7:2 or similar) and SLURM_ARRAY_TASK_COUNT; the shard
 *   is (ID - MIN) / STEP of COUNT.
 * - Kubernetes Indexed Jobs (completionMode: Indexed): JOB_COMPLETION_INDEX
 *   is the shard; the number of completions is not in the environment, so it
 *   comes from `--shards N`.
 */
import { UserError } from '../check/user-error.js';

export interface Shard {
  readonly index: number;
  readonly count: number;
}

export const MAX_SHARDS = 1_000_000;

export function parseShard(text: string, field = '--shard'): Shard {
  const m = /^\s*(\d+)\s*\/\s*(\d+)\s*$/.exec(text);
  const index = m ? Number(m[1]) : NaN;
  const count = m ? Number(m[2]) : NaN;
  if (!m || !(count >= 1 && count <= MAX_SHARDS) || !(index < count)) {
    throw new UserError(field, `I/N with 0 <= I < N <= ${MAX_SHARDS} (e.g. 0/8)`, text);
  }
  return { index, count };
}

function envInteger(env: NodeJS.ProcessEnv, name: string): number | undefined {
  const v = env[name];
  if (v === undefined || v.trim() === '') return undefined;
  if (!/^\d+$/.test(v.trim())) throw new UserError(name, 'a non-negative integer', v);
  return Number(v);
}

/**
 * The shard from flags and environment: `--shard` wins; then Slurm; then a
 * Kubernetes Indexed Job (with `--shards`). Null means all tiles.
 */
export function resolveShard(flag: string | undefined, shards: string | undefined, env: NodeJS.ProcessEnv): Shard | null {
  if (flag !== undefined) {
    if (shards !== undefined) throw new UserError('--shards', 'no --shards beside --shard I/N', shards);
    return parseShard(flag);
  }
  const count = shards === undefined ? undefined : parseShard(`0/${shards}`, '--shards').count;
  const slurmId = envInteger(env, 'SLURM_ARRAY_TASK_ID');
  if (slurmId !== undefined) {
    const min = envInteger(env, 'SLURM_ARRAY_TASK_MIN') ?? 0;
    const step = Math.max(1, envInteger(env, 'SLURM_ARRAY_TASK_STEP') ?? 1);
    const max = envInteger(env, 'SLURM_ARRAY_TASK_MAX');
    const n = count ?? envInteger(env, 'SLURM_ARRAY_TASK_COUNT') ?? (max === undefined ? undefined : Math.floor((max - min) / step) + 1);
    if (n === undefined) throw new UserError('--shards', 'the number of shards (SLURM_ARRAY_TASK_COUNT is not set)', undefined);
    const i = (slurmId - min) / step;
    if (!Number.isInteger(i) || i < 0 || i >= n) {
      throw new UserError('SLURM_ARRAY_TASK_ID', `an index MIN + k STEP with 0 <= k < ${n}`, `${slurmId} (MIN ${min}, STEP ${step})`);
    }
    return { index: i, count: n };
  }
  const k8s = envInteger(env, 'JOB_COMPLETION_INDEX');
  if (k8s !== undefined) {
    if (count === undefined) throw new UserError('--shards', 'the number of shards with JOB_COMPLETION_INDEX (a Kubernetes Indexed Job does not tell it)', undefined);
    if (k8s >= count) throw new UserError('JOB_COMPLETION_INDEX', `an index below --shards ${count}`, k8s);
    return { index: k8s, count };
  }
  if (count !== undefined) throw new UserError('--shards', '--shards only with SLURM_ARRAY_TASK_ID or JOB_COMPLETION_INDEX set (or use --shard I/N)', shards);
  return null;
}
