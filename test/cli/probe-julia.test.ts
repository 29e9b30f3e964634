import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli, tempDir } from '../helpers/run-cli.js';

describe('quadatlas describe: the matching julia command', () => {
  it('prints a julia command line that runs and finds the same period as probe (two independent cycle searches)', () => {
    const dir = tempDir();
    for (const c of ['-0.12256116687665,0.74486176661974', '-1,0', '-1.7548776662466927,0']) {
      const d = runCli(['probe', c, '--json', '--orbit', '4', '--digits', '12']);
      expect(d.status, d.stderr).toBe(0);
      const info = JSON.parse(d.stdout) as { period: number; juliaCommand: string; criticalOrbit: { points: unknown[]; cycle: { period: number } } };
      expect(info.juliaCommand).toBe(`quadatlas julia --c ${c}`);
      expect(info.criticalOrbit.points).toHaveLength(4);
      expect(info.criticalOrbit.cycle.period).toBe(info.period);
      const args = info.juliaCommand.split(' ').slice(1);
      const j = runCli([...args, '--size', '80x60', '--samples', '1', '--json', '--out', path.join(dir, 'j.png')]);
      expect(j.status, j.stderr).toBe(0);
      expect((JSON.parse(j.stdout) as { julia: { cycle: { period: number } } }).julia.cycle.period).toBe(info.period);
    }
  });

  it('locate prints the julia command of the nucleus it lands on (1/7: the rabbit, period 3) and of a Misiurewicz point (1/6: c = i)', () => {
    const dir = tempDir();
    const r = runCli(['locate', '--angle', '1/7', '--digits', '20', '--json']);
    expect(r.status, r.stderr).toBe(0);
    const cmd = (JSON.parse(r.stdout) as { juliaCommand: string }).juliaCommand;
    expect(cmd).toMatch(/^quadatlas julia --c -0\.1225611668766536\d*,0\.7448617666197442\d*$/);
    const j = runCli([...cmd.split(' ').slice(1), '--size', '80x60', '--samples', '1', '--json', '--out', path.join(dir, 'r.png')]);
    expect((JSON.parse(j.stdout) as { julia: { cycle: { period: number } } }).julia.cycle.period).toBe(3);
    const m = runCli(['locate', '--angle', '1/6', '--digits', '20', '--json']);
    const mcmd = (JSON.parse(m.stdout) as { juliaCommand: string }).juliaCommand;
    const jm = runCli([...mcmd.split(' ').slice(1), '--size', '80x60', '--samples', '1', '--json', '--out', path.join(dir, 'm.png')]);
    const s = JSON.parse(jm.stdout) as { pixels: { interior: number }; julia: { cycle: { kind: string } } };
    expect(s.julia.cycle.kind).toBe('none');
    expect(s.pixels.interior).toBe(0);
  });
});
