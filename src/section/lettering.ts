/**
 * How the real slice's plots set their text: a Lettering turns one line of
 * text into an SVG element and measures it, so a plot can be built with
 * real SVG text or with glyph outlines (figure/outline-lettering.ts: the
 * bundled DejaVu Sans, so a PNG never depends on the fonts of the machine)
 * from the same layout code. Layout reserves boxes from `width`, never from
 * an estimate of a font it does not know.
 */
export interface Lettering {
  /**
   * One line of text at (x, y) (baseline), size in px, anchored start, middle
   * or end; with `rotate`, turned -90 degrees about (x, y); `cls` becomes the
   * element's class.
   */
  text(s: string, x: number, y: number, size: number, anchor: 'start' | 'middle' | 'end', fill: string, rotate?: boolean, cls?: string): string;
  /** Advance width of `s` at `size` px. */
  width(s: string, size: number): number;
}

/**
 * `text` broken at spaces into lines each at most `maxWidth` wide at `size`
 * (greedy, first fit); a word wider than maxWidth stands alone on its line.
 */
export function wrapLines(lettering: Lettering, text: string, size: number, maxWidth: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(' ')) {
    const next = line === '' ? word : `${line} ${word}`;
    if (line !== '' && lettering.width(next, size) > maxWidth) {
      lines.push(line);
      line = word;
    } else line = next;
  }
  if (line !== '') lines.push(line);
  return lines;
}
