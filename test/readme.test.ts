// Every fenced shell command in README.md runs as pasted, in order, from the
// project root, with QUADATLAS_QUICK=1 (documented in the README: it shrinks
// every image to at most 240 pixels a side and 4 samples, and each shrunk run
// says so on stderr). Three commands are not run here, by name: `npm install`
// (the test runs inside an installed tree), `npm test` (this is it) and
// `npm run bench` (minutes of benchmarks; .ci/run does not time anything).
import { spawnSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from './helpers/run-cli.js';

const NOT_RUN = [/^npm install\b/, /^npm test\b/, /^npm run bench\b/];

/** The shell commands of README.md's ```sh blocks, with comments stripped and continuations joined. */
export function readmeCommands(markdown: string): string[] {
  const commands: string[] = [];
  const blocks = markdown.matchAll(/^```(sh|bash|shell)\n([\s\S]*?)^```/gm);
  for (const block of blocks) {
    let pending = '';
    for (const raw of block[2]!.split('\n')) {
      const line = raw.replace(/\s+#(?![^"']*["'][^"']*$).*$/, '').trimEnd();
      if (line.trim() === '' || line.trim().startsWith('#')) continue;
      if (line.endsWith('\\')) {
        pending += `${line.slice(0, -1)} `;
        continue;
      }
      commands.push((pending + line).trim());
      pending = '';
    }
  }
  return commands;
}

const readme = readFileSync(path.join(ROOT, 'README.md'), 'utf8');
const commands = readmeCommands(readme);

describe('README.md', () => {
  it('begins with one paragraph stating the job, then a quick start of exactly the two commands', () => {
    const lines = readme.split('\n');
    expect(lines[0]).toBe('# quadatlas');
    const start = readme.indexOf('## Quick start');
    expect(start).toBeGreaterThan(0);
    const quick = readmeCommands(readme.slice(start, readme.indexOf('\n## ', start + 5)));
    expect(quick.map((c) => c.replace(/\s+/g, ' '))).toEqual(['npm install && npm start', 'npm test']);
  });

  it('has no placeholders in its commands', () => {
    for (const c of commands) {
      expect(c, c).not.toMatch(/\.\.\.|\b[A-Z]{2,}(,[A-Z]+)*\b(?![=_])|<[a-z]+>|\[[A-Z]+\]/);
      expect(c, c).not.toMatch(/ \| (show|check|render)\b/);
    }
  });

  // Each command is its own test, in README order (later commands may read what earlier ones wrote).
  for (const command of commands) {
    if (NOT_RUN.some((re) => re.test(command))) continue;
    it(`runs: ${command}`, () => {
      const r = spawnSync('bash', ['-c', command], {
        cwd: ROOT,
        encoding: 'utf8',
        env: { ...process.env, QUADATLAS_QUICK: '1', NO_COLOR: '1' },
        timeout: 300_000,
        maxBuffer: 1 << 26,
      });
      expect(r.status, `${command}\n${r.stderr}`).toBe(0);
      expect(r.stderr, command).not.toMatch(/internal error|\n\s+at /);
    }, 320_000);
  }
});
