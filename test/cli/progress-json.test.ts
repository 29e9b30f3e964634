// --progress-json on the census, the listing, section constants and pyramid: every JSON line on stderr
// parses with done, total, eta_s and phase, done never exceeds total, and each phase ends at done = total.
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';

interface Line {
  done: number;
  total: number;
  eta_s: number | null;
  phase: string;
}

function progressLines(stderr: string): Line[] {
  const lines = stderr
    .split('\n')
    .filter((l) => l.startsWith('{'))
    .map((l) => JSON.parse(l) as Line);
  for (const l of lines) {
    expect(Object.keys(l).slice(0, 4)).toEqual(['done', 'total', 'eta_s', 'phase']);
    expect(l.done).toBeLessThanOrEqual(l.total);
    expect(l.eta_s === null || l.eta_s >= 0).toBe(true);
  }
  return lines;
}

function last(lines: Line[], phase: string): Line {
  const of = lines.filter((l) => l.phase === phase);
  expect(of.length, phase).toBeGreaterThan(0);
  return of[of.length - 1]!;
}

describe('--progress-json', () => {
  it('components --period 12 --count: pairing, then landing ending at (A000740(12) + A000048(12)) / 2 = 1090 rays', () => {
    const r = runCli(['components', '--period', '12', '--count', '--progress-json', '--workers', '2']);
    expect(r.status).toBe(0);
    const lines = progressLines(r.stderr);
    expect(lines[0]!.phase).toBe('pairing');
    // one ray per mirror couple of non-real components plus one per real one: (2010 - 170) / 2 + 170 (OEIS A000740, A000048)
    const l = last(lines, 'landing');
    expect([l.done, l.total]).toEqual([1090, 1090]);
  });
  it('--certify reports its nuclei: components --period 10 --count --certify ends at (495 + 51) / 2 = 273 (OEIS A000740, A000048)', () => {
    const r = runCli(['components', '--period', '10', '--count', '--certify', '--progress-json', '--workers', '2']);
    expect(r.status).toBe(0);
    const l = last(progressLines(r.stderr), 'certifying');
    expect([l.done, l.total]).toEqual([273, 273]);
  });
  it('the listing reports its rows: components --period 6 ends at A000740(6) = 27 rows', () => {
    const r = runCli(['components', '--period', '6', '--csv', '--progress-json', '--workers', '1']);
    expect(r.status).toBe(0);
    const l = last(progressLines(r.stderr), 'listing');
    expect([l.done, l.total]).toEqual([27, 27]);
  });
  it('section constants --digits 12 reports thousandths of its work up to 1000/1000', () => {
    const r = runCli(['section', 'constants', '--digits', '12', '--progress-json']);
    expect(r.status).toBe(0);
    const lines = progressLines(r.stderr);
    expect(lines.length).toBeGreaterThan(0);
    expect(lines.every((l) => l.total === 1000)).toBe(true);
    expect(lines[lines.length - 1]!.done).toBe(1000);
  });
  it('pyramid reports its tiles up to the total of its own --json summary', () => {
    const dir = path.join(tempDir(), 'p');
    const r = runCli(['pyramid', '--span', '3', '--size', '128x128', '--iterations', '100', '--tile-size', '64', '--out-dir', dir, '--json', '--progress-json']);
    expect(r.status, r.stderr).toBe(0);
    const total = (JSON.parse(r.stdout) as { tiles: { total: number } }).tiles.total;
    const l = last(progressLines(r.stderr), 'tiles');
    expect([l.done, l.total]).toEqual([total, total]);
  });
});
