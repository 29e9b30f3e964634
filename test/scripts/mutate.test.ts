// The mutation check (scripts/mutate.mjs): both mutations named in
// docs/certificates.md must make the census tests fail (about 10 s).
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from '../helpers/run-cli.js';

describe('npm run mutate', () => {
  it('catches both mutations: nuclei moved by 1% of their size, and ray ends reported as nuclei', () => {
    const r = spawnSync(process.execPath, [path.join(ROOT, 'scripts/mutate.mjs')], { cwd: ROOT, encoding: 'utf8' });
    expect(r.stdout).toMatch(/caught +shift/);
    expect(r.stdout).toMatch(/caught +ray-ends/);
    expect(r.status, r.stdout + r.stderr).toBe(0);
  }, 1_200_000);
});
