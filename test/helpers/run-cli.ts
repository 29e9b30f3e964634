import { spawnSync } from 'node:child_process';
import { mkdtempSync, rmSync } from 'node:fs';
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

const made = new Set<string>();

/** A fresh folder under the system's temporary directory, removed after the test file (test/setup.ts). */
export function tempDir(prefix = 'quadatlas-'): string {
  const dir = mkdtempSync(path.join(os.tmpdir(), prefix));
  made.add(dir);
  return dir;
}

/** Removes every folder tempDir made in this test file (set up for all files in vitest.config.ts). */
export function removeTempDirs(): void {
  for (const dir of made) rmSync(dir, { recursive: true, force: true });
  made.clear();
}
