// parseArgs reads a command line against the commands' option tables as
// main does, without running anything (src/cli/main.ts): the command line's
// shape is tested here without a process.
import { Command, type Option } from 'commander';
import { describe, expect, it } from 'vitest';
import { parseArgs } from '../../src/cli/main.js';

describe('parseArgs', () => {
  it('reads a plate line: flags by their commander names, nothing rendered', async () => {
    const p = await parseArgs(['plate', '--size', '100x50', '--span', '3', '--json', '--out', '/nonexistent/dir/x.png']);
    expect(p.command).toEqual(['plate']);
    expect(p.values).toMatchObject({ size: '100x50', span: '3', json: true, out: '/nonexistent/dir/x.png' });
  });

  it('reads subcommands and gives the declared defaults', async () => {
    const e = await parseArgs(['section', 'entropy', '--r-from', '3.5']);
    expect(e.command).toEqual(['section', 'entropy']);
    expect(e.values['rFrom']).toBe('3.5');
    const c = await parseArgs(['components', '--period', '3']);
    expect(c.values).toMatchObject({ period: '3', digits: '20' });
  });

  it('keeps a negative number as a positional of probe', async () => {
    const p = await parseArgs(['probe', '-0.12,0.75', '--digits', '8']);
    expect(p.positionals[0]).toBe('-0.12,0.75');
    expect(p.values['digits']).toBe('8');
  });

  // (components without --period is refused when it runs, since --misiurewicz K,P may stand in its place: test/cli/locate-misiurewicz.test.ts)
  it('refuses in one line what commander refuses: an unknown flag, a missing value', async () => {
    for (const [argv, pattern] of [
      [['plate', '--zoom', '4'], /unknown option '--zoom'/],
      [['locate', '--near'], /--near/],
    ] as const) {
      const err = await parseArgs(argv).then(
        () => null,
        (e: unknown) => e as Error,
      );
      expect(err, argv.join(' ')).toBeInstanceOf(Error);
      expect(err!.message).toMatch(pattern);
      expect(err!.message.split('\n')).toHaveLength(1);
    }
  });

  it('--help shows the help text and runs nothing', async () => {
    const h = await parseArgs(['section', 'cascade', '--help']);
    expect(h.shown).toMatch(/--window <word>/);
  });
});

describe('every option of every command', () => {
  it('states its default (or that it is required) in its help line', async () => {
    const modules = [
      import('../../src/cli/plate.js'),
      import('../../src/cli/julia.js'),
      import('../../src/cli/presets.js'),
      import('../../src/cli/section.js'),
      import('../../src/cli/pyramid.js'),
      import('../../src/cli/worker.js'),
      import('../../src/cli/components.js'),
      import('../../src/cli/locate.js'),
      import('../../src/cli/probe.js'),
      import('../../src/cli/palettes.js'),
    ];
    const missing: string[] = [];
    const walk = (cmd: Command, path: string): void => {
      for (const o of cmd.options as Option[]) {
        if (o.long === '--help' || o.long === '--version') continue;
        const said = /default|required|always|never changes/i.test(o.description) || o.defaultValue !== undefined;
        if (!said) missing.push(`${path} ${o.flags}`);
      }
      for (const sub of cmd.commands) walk(sub, `${path} ${sub.name()}`);
    };
    for (const loading of modules) {
      const program = new Command('quadatlas');
      (await loading).register(program);
      walk(program, 'quadatlas');
    }
    expect(missing).toEqual([]);
  });
});
