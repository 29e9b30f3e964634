/**
 * The one shape of a command-line option, for every command: its flags and
 * help line, an optional default (shown in --help and given when the flag is
 * absent), and how a plate-like or section command writes it into a raw sheet
 * (`apply`, or `field` with `value`). Commands declare a table of these and
 * hand it to addOptions; main.ts's parseArgs reads any command line against
 * the same tables without running anything.
 */
import type { Command } from 'commander';

export interface OptionSpec {
  readonly flags: string;
  readonly description: string;
  /** Default text, as commander shows and returns it when the flag is absent. */
  readonly default?: string;
  /** commander refuses the command line without it. */
  readonly required?: boolean;
  /** Writes the flag's value into the raw sheet object (before validation): plate, julia, pyramid. */
  readonly apply?: (sheet: Record<string, unknown>, value: string) => void;
  /** The sheet field the flag sets (dotted path): section commands. */
  readonly field?: string;
  /** Text -> raw sheet value for `field`; the sheet's checker validates it. Default: the text itself. */
  readonly value?: (text: string) => unknown;
}

/** Declares every option of the table on the command. */
export function addOptions(cmd: Command, options: readonly OptionSpec[]): Command {
  for (const o of options) {
    const declare = o.required === true ? cmd.requiredOption.bind(cmd) : cmd.option.bind(cmd);
    if (o.default === undefined) declare(o.flags, o.description);
    else declare(o.flags, o.description, o.default);
  }
  return cmd;
}

/** `--progress-json`, the same on every long command (census and listing, pyramid, section constants); render/progress.ts writes the lines. */
export const PROGRESS_JSON_OPTION: OptionSpec = {
  flags: '--progress-json',
  description: 'progress on stderr as one JSON line per update, {"done","total","eta_s","phase"}, at most one a second (default: a line on a terminal only)',
};
