// The mutation check (scripts/mutate.mjs) under CI=true: both mutations named in
// docs/certificates.md must make the census tests fail. Several minutes, so CI only.
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from '../helpers/run-cli.js';

describe.runIf(process.env['CI'] === 'true')('npm run mutate (CI=true)', () => {
  it('catches both mutations: nuclei moved by 1% of their size, and ray ends reported as nuclei', () => {
    const r = spawnSync(process.execPath, [path.join(ROOT, 'scripts/mutate.mjs')], { cwd: ROOT, encoding: 'utf8' });
    expect(r.stdout).toMatch(/caught {2}shift/);
    expect(r.stdout).toMatch(/caught {2}ray-ends/);
    expect(r.status, r.stdout + r.stderr).toBe(0);
  }, 1_200_000);
});
