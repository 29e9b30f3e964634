/**
 * mpmath (Debian python3-mpmath, run by /usr/bin/python3) as a reference
 * library for the tests. `haveMpmath` says whether it can be imported; in CI
 * (CI=true) its absence is an error, not a skip (.ci/run installs it).
 */
import { spawnSync } from 'node:child_process';

export const PYTHON = '/usr/bin/python3';

export const haveMpmath = spawnSync(PYTHON, ['-c', 'import mpmath'], { encoding: 'utf8' }).status === 0;

/** Runs a Python program with mpmath and returns its stdout; throws when it fails. */
export function runMpmath(program: string): string {
  const r = spawnSync(PYTHON, ['-c', program], { encoding: 'utf8', maxBuffer: 1 << 26 });
  if (r.status !== 0) throw new Error(`python3 failed: ${r.stderr}`);
  return r.stdout;
}
