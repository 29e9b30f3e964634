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
