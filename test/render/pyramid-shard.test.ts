import { describe, expect, it } from 'vitest';
import { UserError } from '../../src/check/user-error.js';
import { shareSize } from '../../src/render/pyramid-run.js';
import { parseShard, resolveShard } from '../../src/render/pyramid-shard.js';

describe('parseShard', () => {
  it('parseShard reads I/N and refuses I >= N, N = 0 and other text with a UserError', () => {
    expect(parseShard('2/5')).toEqual({ index: 2, count: 5 });
    for (const bad of ['5/5', '0/0', '-1/3', '1', 'a/b', '1/2/3']) expect(() => parseShard(bad)).toThrow(UserError);
    expect(() => parseShard('3/3')).toThrow('Expected I/N with 0 <= I < N');
  });
});

describe('resolveShard', () => {
  it('resolveShard takes --shard first, and all tiles when nothing is set', () => {
    expect(resolveShard('1/4', undefined, { SLURM_ARRAY_TASK_ID: '3', SLURM_ARRAY_TASK_COUNT: '8' })).toEqual({ index: 1, count: 4 });
    expect(resolveShard(undefined, undefined, {})).toBeNull();
  });

  it('resolveShard maps Slurm array ids MIN + k STEP to shard k of COUNT', () => {
    // Slurm job_array docs: --array=1-7:2 runs ids 1, 3, 5, 7, with SLURM_ARRAY_TASK_MIN=1, _STEP=2, _COUNT=4.
    const env = { SLURM_ARRAY_TASK_ID: '5', SLURM_ARRAY_TASK_MIN: '1', SLURM_ARRAY_TASK_MAX: '7', SLURM_ARRAY_TASK_STEP: '2', SLURM_ARRAY_TASK_COUNT: '4' };
    expect(resolveShard(undefined, undefined, env)).toEqual({ index: 2, count: 4 });
    expect(resolveShard(undefined, undefined, { SLURM_ARRAY_TASK_ID: '0', SLURM_ARRAY_TASK_MAX: '9' })).toEqual({ index: 0, count: 10 });
    expect(() => resolveShard(undefined, undefined, { ...env, SLURM_ARRAY_TASK_ID: '4' })).toThrow(UserError);
  });

  it('resolveShard takes JOB_COMPLETION_INDEX with --shards, and asks for --shards without it', () => {
    expect(resolveShard(undefined, '6', { JOB_COMPLETION_INDEX: '5' })).toEqual({ index: 5, count: 6 });
    expect(() => resolveShard(undefined, undefined, { JOB_COMPLETION_INDEX: '5' })).toThrow('for --shards');
    expect(() => resolveShard(undefined, '6', { JOB_COMPLETION_INDEX: '6' })).toThrow(UserError);
    expect(() => resolveShard(undefined, '6', {})).toThrow(UserError);
  });
});

describe('shareSize', () => {
  it('shareSize over all shards adds up to the tile count', () => {
    for (const total of [0, 1, 17, 100]) {
      for (const count of [1, 2, 3, 7, 200]) {
        let sum = 0;
        for (let index = 0; index < count; index++) sum += shareSize(total, { index, count });
        expect(sum).toBe(total);
      }
    }
  });
});
