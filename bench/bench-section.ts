/**
 * The shape of one benchmark section: a named function that measures
 * something and returns rows of figures. bench/main.ts runs the sections of
 * its registry in order, prints each as a plain table and writes them all to
 * out/bench.json.
 */

/** One line of a section's table: what was measured and its figures. */
export interface BenchRow {
  readonly label: string;
  /** Column name -> value; numbers are printed rounded, strings as they are, null as "-". */
  readonly figures: Readonly<Record<string, number | string | null>>;
}

/** What every section is given. */
export interface BenchContext {
  /** The project root (the folder holding package.json). */
  readonly root: string;
  /** Records a remark printed under the section's table (a skipped part, a check). */
  note(text: string): void;
}

export interface BenchSection {
  /** Short name, used to pick sections on the command line and as the key in bench.json. */
  readonly name: string;
  /** One line saying what the section measures. */
  readonly title: string;
  run(context: BenchContext): BenchRow[] | Promise<BenchRow[]>;
}
