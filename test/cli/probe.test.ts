import { describe, expect, it } from 'vitest';
import { runCli } from '../helpers/run-cli.js';

describe('quadatlas describe, real c', () => {
  it('links c = -1.76 to the period-3 window whose onset is r = 1 + sqrt(8) (docs/checks.md: period-3 window onset)', () => {
    const r = runCli(['probe', '--json', '--', '-1.76,0']);
    expect(r.status, r.stderr).toBe(0);
    const out = JSON.parse(r.stdout) as { window: { period: number; word: string; onsetR: string } };
    expect(out.window.period).toBe(3);
    // MSS word of the period-3 window: RL (Metropolis-Stein-Stein 1973; docs/methods.md E5).
    expect(out.window.word).toBe('RL');
    expect(Number(out.window.onsetR)).toBeCloseTo(1 + Math.sqrt(8), 13);
  });
});
