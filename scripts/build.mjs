// Compiles the TypeScript sources into dist/ (and the WebAssembly kernels, when present).
import { spawnSync } from 'node:child_process';
import { chmodSync, cpSync, existsSync, rmSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import path from 'node:path';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const run = (cmd, args) => {
  const r = spawnSync(cmd, args, { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
};
rmSync(path.join(root, 'dist'), { recursive: true, force: true });
run(process.execPath, [path.join(root, 'node_modules/typescript/bin/tsc'), '-p', 'tsconfig.build.json']);
// The survey page's own files (served from a fixed list) sit beside the server module.
cpSync(path.join(root, 'src/serve/page'), path.join(root, 'dist/src/serve/page'), { recursive: true });
const wasmBuild = path.join(root, 'scripts/build-wasm.mjs');
if (existsSync(wasmBuild)) run(process.execPath, [wasmBuild]);
// The bin must stay executable: npx links it once and runs it directly after every rebuild.
chmodSync(path.join(root, 'dist/src/cli/main.js'), 0o755);
