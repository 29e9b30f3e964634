/** One command-line option of a plate-like command: its flags, help line and how it writes into the raw sheet. */
export interface OptionSpec {
  readonly flags: string;
  readonly description: string;
  /** Writes the flag's value into the raw sheet object (before validation). */
  readonly apply?: (sheet: Record<string, unknown>, value: string) => void;
}
