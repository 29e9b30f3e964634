#!/usr/bin/env node
/**
 * The quadatlas command line. Each command lives in its own file and is
 * imported only when it runs, so `quadatlas --help` stays fast.
 * Errors the user caused print one line and exit 2; anything else is a bug
 * and prints its stack and exits 1.
 */
import { realpathSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { Command, CommanderError } from 'commander';
import { removeLiveTemps } from '../io/temp-path.js';
import { UserError } from '../check/user-error.js';
import { toolVersion } from '../io/tool-version.js';

/** A command module registers itself on the program. */
export interface CommandModule {
  register(program: Command): void;
}

/** name, one-line summary, loader: the summary is shown in --help without loading the module. */
const COMMANDS: ReadonlyArray<readonly [string, string, () => Promise<CommandModule>]> = [
  ['plate', 'render one image of a view of the c-plane', () => import('./plate.js')],
  ['julia', 'render one image of the dynamical plane of one c', () => import('./julia.js')],
  ['presets', 'list, show, check and render the sheets in presets/', () => import('./presets.js')],
  ['section', 'the real slice: convert, cascade, windows, lyapunov, diagram, compare, orbit, cobweb, constants, universality, entropy', () => import('./section.js')],
  ['pyramid', 'write a deep-zoom tile pyramid of a view, with an offline viewer page', () => import('./pyramid.js')],
  ['worker', 'take tile jobs from a shared queue (cluster mode)', () => import('./worker.js')],
  ['components', 'list or count the hyperbolic components of a period', () => import('./components.js')],
  ['locate', 'Newton to one nucleus from a guess, an external angle or an internal address', () => import('./locate.js')],
  ['probe', 'everything known about one parameter c', () => import('./probe.js')],
  ['survey', 'explore the c-plane live in a browser, probe points, save the view as a sheet', () => import('./survey.js')],
  ['sheet', 'print the sheet stored in an image, plot or sidecar quadatlas wrote', () => import('./sheet.js')],
  ['palettes', 'list and show the exterior gradients, interior styles and period colours', () => import('./palettes.js')],
];

/** Commands whose positional arguments are numbers that may be negative (e.g. `probe -0.12,0.75`). */
const NUMERIC_POSITIONALS = new Set(['probe']);

/**
 * For commands whose positional arguments are numbers ("probe -0.12,0.75",
 * "probe -1.76 0"), puts every positional argument, in order, behind a
 * "--", where commander reads a leading minus as part of an argument rather
 * than as an unknown option. Options and their values stay in front. Pure.
 */
export function protectNegativeNumbers(argv: readonly string[]): string[] {
  if (!NUMERIC_POSITIONALS.has(argv[0] ?? '') || argv.includes('--') || !argv.some((t, i) => i > 0 && /^-[0-9.]/.test(t))) return [...argv];
  const flagsWithoutValue = new Set(['--json', '--csv', '--help', '-h']);
  const options: string[] = [];
  const positionals: string[] = [];
  for (let i = 1; i < argv.length; i++) {
    const token = argv[i]!;
    if (/^-[0-9.]/.test(token) || !token.startsWith('-')) {
      positionals.push(token);
    } else {
      options.push(token);
      if (!flagsWithoutValue.has(token) && !token.includes('=') && i + 1 < argv.length) options.push(argv[++i]!);
    }
  }
  return [argv[0]!, ...options, '--', ...positionals];
}

/** The program with the wanted command registered (the others as stubs for --help); output goes through `write`. */
async function buildProgram(wanted: string | undefined, write: { out: (s: string) => void; err: (s: string) => void }): Promise<Command> {
  const program = new Command('quadatlas')
    .description('Plates, components, the real slice and deep-zoom pyramids for z -> z^2 + c.')
    .version(toolVersion(), '-V, --version')
    .exitOverride()
    .configureOutput({
      writeOut: write.out,
      writeErr: write.err,
      // commander's own errors (unknown flag, missing value) in the one message style: one line, prefixed.
      outputError: (text, w) =>
        w(
          `${text.startsWith('quadatlas:') ? '' : 'quadatlas: '}${text
            .replace(/^error: /, '')
            .trim()
            .replace(/\s*\n\s*/g, ' ')}\n`,
        ),
    });
  for (const [name, summary, load] of COMMANDS) {
    if (name === wanted) (await load()).register(program);
    else program.command(name).description(summary).allowUnknownOption().helpOption(false);
  }
  return program;
}

export async function main(argv: readonly string[]): Promise<number> {
  const program = await buildProgram(argv[0], { out: (s) => process.stdout.write(s), err: (s) => process.stderr.write(s) });
  try {
    await program.parseAsync(protectNegativeNumbers(argv), { from: 'user' });
    return typeof process.exitCode === 'number' ? process.exitCode : 0;
  } catch (err) {
    return reportError(err);
  }
}

/** A command line read against the option tables: the command path, the option values (commander's names) and the positionals. */
export interface ParsedArgs {
  readonly command: readonly string[];
  readonly values: Readonly<Record<string, unknown>>;
  readonly positionals: readonly unknown[];
  /** Help or version text, when the line asked for it (nothing else is read then). */
  readonly shown?: string;
}

class Parsed extends Error {
  constructor(readonly parsed: ParsedArgs) {
    super('parsed');
  }
}

/**
 * Reads a command line exactly as `main` does, but runs nothing: no action,
 * no output, no exit. What commander refuses (unknown flag, missing value or
 * argument) comes back as a UserError-like one-line message in an Error.
 * Pure, so the option tables of every command are tested without a process.
 */
export async function parseArgs(argv: readonly string[]): Promise<ParsedArgs> {
  let text = '';
  const program = await buildProgram(argv[0], { out: (s) => (text += s), err: (s) => (text += s) });
  program.hook('preAction', (_root, action) => {
    const path: string[] = [];
    for (let c: Command | null = action; c !== null && c !== program; c = c.parent) path.unshift(c.name());
    throw new Parsed({ command: path, values: { ...action.opts() }, positionals: [...action.processedArgs] });
  });
  try {
    await program.parseAsync(protectNegativeNumbers(argv), { from: 'user' });
  } catch (err) {
    if (err instanceof Parsed) return err.parsed;
    if (err instanceof CommanderError) {
      if (err.exitCode === 0) return { command: [], values: {}, positionals: [], shown: text };
      throw new Error(text.trim() || err.message);
    }
    throw err;
  }
  throw new Error(`quadatlas: no command in ${argv.join(' ')}`);
}

/** Prints a user error as one line and returns its exit code; rethrows bugs. */
export function reportError(err: unknown): number {
  if (err instanceof UserError) {
    process.stderr.write(`quadatlas: ${err.message}\n`);
    return 2;
  }
  if (err instanceof CommanderError) {
    if (err.exitCode === 0) return 0;
    // commander has already printed its one-line message.
    return 2;
  }
  throw err;
}

function invokedDirectly(): boolean {
  const script = process.argv[1];
  if (script === undefined) return false;
  try {
    return realpathSync(script) === fileURLToPath(import.meta.url);
  } catch {
    return false;
  }
}

/** Commands that stop cleanly on a signal by themselves (they finish the job in hand first). */
const OWN_SIGNAL_HANDLING = new Set(['worker', 'survey']);

/** Sweeps of the temporary files after a signal, 20 ms apart, before the process exits. */
const SIGNAL_SWEEPS = 5;
let stopping = false;

/**
 * On SIGINT or SIGTERM, removes the temporary files the run still holds
 * (nothing half-written stays behind; a later run also removes those of a
 * killed process) and exits with 128 + the signal number.
 */
function removeTempsOnSignal(): void {
  for (const [signal, code] of [
    ['SIGINT', 130],
    ['SIGTERM', 143],
  ] as const) {
    process.on(signal, () => {
      if (stopping) return;
      stopping = true;
      removeLiveTemps();
      process.stderr.write(`\nquadatlas: stopped by ${signal}; partial files removed\n`);
      // Opens already in flight may still create a registered file: sweep a few more times, then exit.
      let sweeps = 0;
      const timer = setInterval(() => {
        removeLiveTemps();
        if (++sweeps === SIGNAL_SWEEPS) {
          clearInterval(timer);
          process.exit(code);
        }
      }, 20);
    });
  }
}

const isMain = invokedDirectly();
if (isMain) {
  if (!OWN_SIGNAL_HANDLING.has(process.argv[2] ?? '')) removeTempsOnSignal();
  main(process.argv.slice(2)).then(
    (code) => {
      process.exitCode = code;
    },
    (err: unknown) => {
      process.stderr.write(`quadatlas: internal error: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}\n`);
      process.exitCode = 1;
    },
  );
}
