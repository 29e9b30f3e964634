import { spawnSync } from 'node:child_process';
import { mkdtempSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../..');
/** The built CLI (npm test builds first); QUADATLAS_DIST may point at another build folder. */
export const CLI = path.join(ROOT, process.env['QUADATLAS_DIST'] ?? 'dist', 'src/cli/main.js');

export interface CliResult {
  status: number | null;
  stdout: string;
  stderr: string;
}

export function runCli(args: readonly string[], options: { cwd?: string; input?: string } = {}): CliResult {
  const r = spawnSync(process.execPath, [CLI, ...args], { cwd: options.cwd ?? ROOT, encoding: 'utf8', input: options.input ?? '', env: { ...process.env, NO_COLOR: '1' } });
  return { status: r.status, stdout: r.stdout, stderr: r.stderr };
}

export function tempDir(prefix = 'quadatlas-'): string {
  return mkdtempSync(path.join(os.tmpdir(), prefix));
}
