// The test command: type-check, check the formatting (prettier), build, run vitest, and end with one plain line
// "N passed, N failed" (a type error or a file that fails to import counts as failed).
import { spawnSync } from 'node:child_process';
import { readFileSync, rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const env = { ...process.env, NO_COLOR: '1', FORCE_COLOR: '0' };
const formatted = ['src/**/*.ts', 'test/**/*.ts', 'bench/**/*.ts', 'scripts/**/*.mjs', 'examples/**/*.{ts,mjs}', 'vitest.config.ts'];
const step = (cmd, args) => spawnSync(cmd, args, { cwd: root, stdio: 'inherit', env }).status === 0;
let extraFailed = 0;
if (!step(process.execPath, [path.join(root, 'node_modules/typescript/bin/tsc'), '--noEmit'])) {
  console.log('type check failed');
  extraFailed += 1;
}
if (!step(process.execPath, [path.join(root, 'node_modules/prettier/bin/prettier.cjs'), '--check', '--log-level', 'warn', ...formatted])) {
  console.log('format check failed: run npm run format');
  extraFailed += 1;
}
if (!step(process.execPath, [path.join(root, 'scripts/build.mjs')])) {
  console.log('0 passed, 1 failed');
  process.exit(1);
}
const results = path.join(root, 'test-results.json');
rmSync(results, { force: true });
step(process.execPath, [path.join(root, 'node_modules/vitest/vitest.mjs'), 'run', ...process.argv.slice(2)]);
let passed = 0,
  failed = extraFailed,
  skipped = 0,
  ok = false;
try {
  const r = JSON.parse(readFileSync(results, 'utf8'));
  const broken = r.testResults.filter((f) => f.status === 'failed' && !f.assertionResults.some((a) => a.status === 'failed')).length;
  passed = r.numPassedTests;
  failed += r.numFailedTests + broken;
  skipped = r.numPendingTests + r.numTodoTests;
  ok = r.success;
} catch {
  failed += 1;
}
console.log(`${passed} passed, ${failed} failed` + (skipped ? `, ${skipped} skipped` : ''));
process.exitCode = ok && failed === 0 ? 0 : 1;
