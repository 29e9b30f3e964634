import path from 'node:path';

/**
 * The one "wrote" line every command prints on stderr when it has written
 * files: `quadatlas: wrote out/a.png, out/a.png.json (2.1 s)`. Paths are
 * shown relative to the working directory when they lie below it.
 */
export function wroteLine(files: readonly string[], seconds?: number, detail?: string): string {
  const shown = files.map((f) => {
    const rel = path.relative(process.cwd(), path.resolve(f));
    return rel.startsWith('..') || path.isAbsolute(rel) ? f : rel;
  });
  const notes = [...(detail === undefined ? [] : [detail]), ...(seconds === undefined ? [] : [`${seconds.toFixed(1)} s`])];
  return `quadatlas: wrote ${shown.join(', ')}${notes.length === 0 ? '' : ` (${notes.join(', ')})`}\n`;
}

/** Prints wroteLine on stderr. */
export function reportWrote(files: readonly string[], seconds?: number, detail?: string): void {
  process.stderr.write(wroteLine(files, seconds, detail));
}
