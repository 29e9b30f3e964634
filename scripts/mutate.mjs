// Mutation check: applies each mutation below to a copy of the project in a
// temporary folder, builds the copy and runs the census tests there, and
// asserts that they fail. Exit 0 when every mutation is caught.
//   npm run mutate            all mutations
//   npm run mutate -- shift   one of them by name
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync, readFileSync, rmSync, symlinkSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

/** Each mutation: a file, an exact text it must find once, and its replacement. */
export const MUTATIONS = [
  {
    name: 'shift',
    what: 'every census nucleus moved by 1% of its size estimate',
    file: 'src/components/census.ts',
    find: 'reHi: rec[o]!,\n        reLo: rec[o + 1]!,',
    replace: 'reHi: rec[o]! + 0.01 * rec[o + 4]!,\n        reLo: 0,',
  },
  {
    name: 'ray-ends',
    what: 'ray ends reported as nuclei (no Newton after the double trace)',
    file: 'src/components/land-rays.ts',
    find: 'res = nucleusDouble(period, end.reHi, end.imHi);\n        if (!res.ok) res = nucleusDD(period, end);\n        else if (res.size < DD_SIZE) res = nucleusDD(period, res);',
    replace: 'res = { ok: true, reHi: end.reHi, reLo: 0, imHi: end.imHi, imLo: 0, size: sizeModulusDouble(period, end.reHi, end.imHi) };',
    imports: ["import { nucleusDD, nucleusDouble } from './fast-nucleus.js';", "import { nucleusDD, nucleusDouble, sizeModulusDouble } from './fast-nucleus.js';"],
  },
];

const TESTS = ['test/components/census-independent.test.ts', 'test/components/census.test.ts', 'test/components/certify/certify-census.test.ts'];

function run(cwd, args) {
  return spawnSync(process.execPath, args, { cwd, encoding: 'utf8', env: { ...process.env, NO_COLOR: '1' } });
}

const wanted = process.argv.slice(2);
let survived = 0;
for (const m of MUTATIONS.filter((x) => wanted.length === 0 || wanted.includes(x.name))) {
  const dir = mkdtempSync(path.join(os.tmpdir(), `quadatlas-mutate-${m.name}-`));
  try {
    for (const part of ['src', 'test', 'scripts', 'bench', 'presets', 'package.json', 'tsconfig.json', 'tsconfig.build.json', 'vitest.config.ts']) {
      cpSync(path.join(root, part), path.join(dir, part), { recursive: true });
    }
    symlinkSync(path.join(root, 'node_modules'), path.join(dir, 'node_modules'));
    const file = path.join(dir, m.file);
    let text = readFileSync(file, 'utf8');
    if (text.split(m.find).length !== 2) throw new Error(`mutation ${m.name}: the text to mutate is not in ${m.file} exactly once`);
    text = text.replace(m.find, m.replace);
    if (m.imports) text = text.replace(m.imports[0], m.imports[1]);
    writeFileSync(file, text);
    const build = run(dir, ['scripts/build.mjs']);
    if (build.status !== 0) throw new Error(`mutation ${m.name}: the mutated copy does not build:\n${build.stdout}${build.stderr}`);
    const t = run(dir, ['node_modules/vitest/vitest.mjs', 'run', '--bail', '1', '--reporter', 'dot', ...TESTS]);
    const caught = t.status !== 0;
    if (!caught) survived += 1;
    console.log(`${caught ? 'caught  ' : 'SURVIVED'} ${m.name}: ${m.what}`);
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}
console.log(survived === 0 ? 'every mutation was caught' : `${survived} mutation(s) survived`);
process.exitCode = survived === 0 ? 0 : 1;
