// Regression tests for the trips a new user met in the first hour: each one
// reproduces the failure as the user met it, from the command line.
import { spawn, spawnSync } from 'node:child_process';
import { cpSync, existsSync, mkdirSync, readdirSync, readFileSync, statSync, symlinkSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { CLI, ROOT, runCli, tempDir } from '../helpers/run-cli.js';

function oneLine(stderr: string): string {
  const lines = stderr.trim().split('\n');
  expect(lines, stderr).toHaveLength(1);
  return lines[0]!;
}

/** Waits until `test()` holds, polling; fails after `ms`. */
async function until(test: () => boolean, ms: number, what: string): Promise<void> {
  const end = Date.now() + ms;
  while (!test()) {
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

const temps = (dir: string): string[] => readdirSync(dir).filter((f) => f.endsWith('.tmp'));

describe('npx quadatlas after a rebuild', () => {
  it('runs through npx, and again after the build has deleted and rewritten dist/', () => {
    // A copy of the project, so rebuilding does not pull dist/ from under the other tests.
    const dir = tempDir();
    for (const f of ['package.json', 'tsconfig.json', 'tsconfig.build.json', 'scripts', 'src', 'bench']) cpSync(path.join(ROOT, f), path.join(dir, f), { recursive: true });
    symlinkSync(path.join(ROOT, 'node_modules'), path.join(dir, 'node_modules'));
    const build = (): void => {
      const b = spawnSync(process.execPath, ['scripts/build.mjs'], { cwd: dir, encoding: 'utf8' });
      expect(b.status, b.stderr).toBe(0);
    };
    const npx = (): ReturnType<typeof spawnSync> => spawnSync('npx', ['--offline', 'quadatlas', '--version'], { cwd: dir, encoding: 'utf8' });
    build();
    const first = npx();
    expect(first.status, String(first.stderr)).toBe(0);
    expect(String(first.stdout).trim()).toBe(JSON.parse(readFileSync(path.join(ROOT, 'package.json'), 'utf8')).version);
    build();
    // The execute bit is what npx needs; the previous build wrote the bin without it.
    expect(statSync(path.join(dir, 'dist/src/cli/main.js')).mode & 0o111).not.toBe(0);
    const second = npx();
    expect(second.status, String(second.stderr)).toBe(0);
  }, 300_000);
});

describe('presets show', () => {
  it('prints a sheet that presets check accepts and plate renders to the same bytes as the preset', () => {
    const dir = tempDir();
    const shown = runCli(['presets', 'show', 'edges-triad-copy']);
    expect(shown.status, shown.stderr).toBe(0);
    const file = path.join(dir, 'shown.json');
    writeFileSync(file, shown.stdout);
    expect(runCli(['presets', 'check', file]).status).toBe(0);
    // The same small override on both sides keeps the test quick; it proves the shown sheet equals the preset file.
    const small = ['--size', '160x120', '--samples', '4', '--no-sidecar'];
    const a = runCli(['plate', file, ...small, '--out', path.join(dir, 'a.png')]);
    const b = runCli(['plate', path.join(ROOT, 'presets/edges-triad-copy.json'), ...small, '--out', path.join(dir, 'b.png')]);
    expect(a.status, a.stderr).toBe(0);
    expect(b.status, b.stderr).toBe(0);
    expect(readFileSync(path.join(dir, 'a.png')).equals(readFileSync(path.join(dir, 'b.png')))).toBe(true);
  });
});

describe('plate --out naming an existing directory', () => {
  it('is refused in one line with exit 2 before any rendering', () => {
    const dir = tempDir();
    mkdirSync(path.join(dir, 'x.png'));
    // 20000x20000 at 100000 iterations would take minutes: only a check before rendering returns at once.
    const r = runCli(['plate', '--size', '20000x20000', '--iterations', '100000', '--out', path.join(dir, 'x.png')]);
    expect(r.status).toBe(2);
    expect(oneLine(r.stderr)).toMatch(
      /^quadatlas: Expected a file name \(not an existing directory\) for --out \(sheet field output\.file\) but received .*x\.png \(a directory\)$/,
    );
  });
});

describe('interrupted plates', () => {
  for (const [signal, code] of [
    ['SIGINT', 130],
    ['SIGTERM', 143],
  ] as const) {
    it(`remove their temporary files on ${signal} and leave no final file`, async () => {
      const dir = tempDir();
      const out = path.join(dir, 'big.png');
      const child = spawn(process.execPath, [CLI, 'plate', '--size', '4000x3000', '--iterations', '20000', '--samples', '16', '--data', path.join(dir, 'data'), '--out', out], {
        stdio: 'ignore',
      });
      const exited = new Promise<number | null>((resolve) => child.on('exit', (c) => resolve(c)));
      // The image's own temporary file (a writability probe may come and go before it).
      await until(() => temps(dir).some((n) => n.startsWith('.big.png.')), 60_000, 'the temporary image file');
      const name = temps(dir).find((n) => n.startsWith('.big.png.'))!;
      // The process id stands in the name, so a later run can tell a live writer from a dead one.
      expect(name).toMatch(new RegExp(`^\\.big\\.png\\.${child.pid}\\.[0-9a-f]+\\.tmp$`));
      child.kill(signal);
      expect(await exited).toBe(code);
      expect(temps(dir)).toEqual([]);
      expect(existsSync(path.join(dir, 'data')) ? temps(path.join(dir, 'data')) : []).toEqual([]);
      expect(existsSync(out)).toBe(false);
    });
  }

  it('a later run removes temporary files of processes that are gone, never those of a live process', async () => {
    const dir = tempDir();
    const dead = spawnSync(process.execPath, ['-e', 'process.pid']).pid!;
    const sleeper = spawn(process.execPath, ['-e', 'setTimeout(() => {}, 60000)'], { stdio: 'ignore' });
    try {
      const stale = `.p.png.${dead}.00aa11.tmp`;
      const live = `.p.png.${sleeper.pid}.00bb22.tmp`;
      const other = `.q.png.${dead}.00cc33.tmp`;
      for (const f of [stale, live, other]) writeFileSync(path.join(dir, f), 'partial');
      const r = runCli(['plate', '--size', '40x30', '--samples', '1', '--no-sidecar', '--out', path.join(dir, 'p.png')]);
      expect(r.status, r.stderr).toBe(0);
      const left = temps(dir).sort();
      // Only temporaries of p.png are looked at; the dead writer's goes, the live one's stays.
      expect(left).toEqual([live, other].sort());
    } finally {
      sleeper.kill();
    }
  });
});

describe('sheet FILE', () => {
  it('prints the sheet of a PNG and of its sidecar; plate renders it to the same bytes; --again takes the sidecar', () => {
    const dir = tempDir();
    const a = path.join(dir, 'a.png');
    expect(runCli(['plate', '--center', '-0.1,0.8', '--span', '0.5', '--size', '120x90', '--samples', '4', '--out', a]).status).toBe(0);
    const fromPng = runCli(['sheet', a]);
    const fromSidecar = runCli(['sheet', `${a}.json`]);
    expect(fromPng.status, fromPng.stderr).toBe(0);
    expect(JSON.parse(fromSidecar.stdout)).toEqual(JSON.parse(fromPng.stdout));
    const sheet = JSON.parse(fromPng.stdout) as { kind: string; schema: number; writtenBy: string; view: { re: string } };
    expect(sheet.kind).toBe('plate');
    expect(sheet.schema).toBe(1);
    expect(sheet.writtenBy).toMatch(/^quadatlas \d+\.\d+\.\d+/);
    expect(sheet.view.re).toBe('-0.1');
    const file = path.join(dir, 'x.json');
    writeFileSync(file, fromPng.stdout);
    expect(runCli(['plate', file, '--out', path.join(dir, 'b.png')]).status).toBe(0);
    expect(readFileSync(path.join(dir, 'b.png')).equals(readFileSync(a))).toBe(true);
    expect(runCli(['plate', '--again', `${a}.json`, '--out', path.join(dir, 'c.png')]).status).toBe(0);
    expect(readFileSync(path.join(dir, 'c.png')).equals(readFileSync(a))).toBe(true);
  });

  it('refuses a file with no sheet, and a sheet of a newer schema, in one line', () => {
    const dir = tempDir();
    const plain = path.join(dir, 'plain.json');
    writeFileSync(plain, '{"a": 1}');
    const r = runCli(['sheet', plain]);
    expect(r.status).toBe(2);
    expect(oneLine(r.stderr)).toMatch(/for file but received .*plain\.json \(none found\)/);
    const newer = path.join(dir, 'newer.json');
    writeFileSync(newer, JSON.stringify({ kind: 'plate', schema: 99 }));
    const p = runCli(['plate', newer]);
    expect(p.status).toBe(2);
    expect(oneLine(p.stderr)).toMatch(/at most 1; a newer quadatlas wrote this one\) for sheet\.schema but received 99/);
  });

  it('migrates a sheet without kind or schema (schema 0) as a plate', () => {
    const dir = tempDir();
    const old = path.join(dir, 'old.json');
    writeFileSync(old, JSON.stringify({ view: { re: '-0.75', im: '0', span: '3' }, pixels: { width: 40, height: 30 }, samples: 1 }));
    const r = runCli(['plate', old, '--out', path.join(dir, 'old.png')]);
    expect(r.status, r.stderr).toBe(0);
    expect(JSON.parse(runCli(['sheet', path.join(dir, 'old.png')]).stdout).kind).toBe('plate');
  });
});

describe('citation and version', () => {
  it('CITATION.cff names the version in package.json, which every sheet records', () => {
    const version = (JSON.parse(readFileSync(path.join(ROOT, 'package.json'), 'utf8')) as { version: string }).version;
    const cff = readFileSync(path.join(ROOT, 'CITATION.cff'), 'utf8');
    expect(cff).toMatch(/^cff-version: 1\.2\.0$/m);
    expect(cff).toMatch(new RegExp(`^version: ${version.replace(/\./g, '\\.')}$`, 'm'));
    const shown = JSON.parse(runCli(['presets', 'show', 'edges-whole']).stdout) as { writtenBy: string };
    expect(shown.writtenBy).toBe(`quadatlas ${version}`);
  });
});

describe('--help of every command', () => {
  const commands = [
    ['plate'],
    ['pyramid'],
    ['worker'],
    ['components'],
    ['locate'],
    ['probe'],
    ['palettes'],
    ['presets', 'list'],
    ['presets', 'render'],
    ['section', 'convert'],
    ['section', 'cascade'],
    ['section', 'windows'],
    ['section', 'lyapunov'],
    ['section', 'diagram'],
    ['section', 'compare'],
  ];
  it('states a default on every option line, and uses lowercase placeholders', () => {
    const missing: string[] = [];
    for (const c of commands) {
      const r = runCli([...c, '--help']);
      expect(r.status, c.join(' ')).toBe(0);
      const options = r.stdout.split('Options:')[1] ?? '';
      const entries = options
        .split(/\n(?= {2}-)/)
        .map((e) => e.replace(/\s+/g, ' ').trim())
        .filter((e) => e.startsWith('-') && !e.startsWith('-h, --help'));
      expect(entries.length, c.join(' ')).toBeGreaterThan(0);
      for (const e of entries) {
        if (!/default/i.test(e)) missing.push(`${c.join(' ')}: ${e}`);
        // Placeholders: a lowercase word or a format sample (WxH, re,im, a/b, i/n).
        const placeholder = /^--\S+ <([^>]+)>/.exec(e)?.[1];
        if (placeholder !== undefined && !/^([a-z][a-z0-9,./|-]*|WxH|WxHmm|1-2-4)$/.test(placeholder)) missing.push(`${c.join(' ')}: placeholder <${placeholder}>`);
      }
    }
    expect(missing).toEqual([]);
  });

  it('pyramid --help lists only what applies to pyramids', () => {
    const help = runCli(['pyramid', '--help']).stdout;
    for (const flag of ['--out <file>', '--data', '--legend', '--label-periods', '--depth', '--arith', '--no-sidecar']) expect(help, flag).not.toContain(flag);
    for (const flag of ['--out-dir', '--tile-size', '--exterior', '--format']) expect(help, flag).toContain(flag);
  });
});
