// createProgress, the one progress reporter: --progress-json lines on any stream, terminal lines only on a terminal.
import { describe, expect, it } from 'vitest';
import { createProgress } from '../../src/render/progress.js';

function sink(isTTY: boolean): { stream: NodeJS.WritableStream & { isTTY: boolean }; text: () => string } {
  let text = '';
  const stream = { isTTY, write: (s: string) => ((text += s), true) } as unknown as NodeJS.WritableStream & { isTTY: boolean };
  return { stream, text: () => text };
}

describe('createProgress', () => {
  it('with json writes one parseable line per update with done, total, eta_s and phase, even off a terminal, and always the last', () => {
    const s = sink(false);
    const p = createProgress('census', { json: true, stream: s.stream, phase: 'landing' });
    p.update(0, 10);
    p.update(5, 10); // within the same second: left out
    p.update(10, 10);
    p.update(10, 10); // after the end: left out
    p.end();
    const lines = s
      .text()
      .trim()
      .split('\n')
      .map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(lines.map((l) => [l['done'], l['total'], l['phase']])).toEqual([
      [0, 10, 'landing'],
      [10, 10, 'landing'],
    ]);
    expect(lines[0]!['eta_s']).toBeNull(); // nothing done yet: no estimate
    expect(lines[1]!['eta_s']).toBe(0);
  });
  it('without json writes nothing off a terminal, and on a terminal nothing before delayMs', () => {
    const off = sink(false);
    createProgress('x', { stream: off.stream }).update(1, 2);
    expect(off.text()).toBe('');
    const tty = sink(true);
    createProgress('x', { stream: tty.stream, delayMs: 60_000 }).update(1, 2);
    expect(tty.text()).toBe('');
    const shown = sink(true);
    createProgress('census', { stream: shown.stream, unit: 'rays' }).update(1, 2);
    expect(shown.text()).toMatch(/census +50% 1\/2 rays, .* eta /);
  });
});
