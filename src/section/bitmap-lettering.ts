/**
 * A Lettering (orbit-figures.ts) that draws text as filled SVG paths of our
 * 5 x 9 bitmap letters (letter-glyphs.ts), one unit square per ink cell, so a
 * PNG made from the figure never depends on the fonts of the machine. The
 * cap height (7 cells) is set to 0.72 of the requested font size.
 */
import type { Lettering } from './orbit-figures.js';
import { LETTER_W, letterRows } from './letter-glyphs.js';

/** Advance per letter in cells (one blank column). */
const ADVANCE = LETTER_W + 1;

function glyphPath(s: string): { d: string; width: number } {
  let d = '';
  let x = 0;
  for (const ch of s) {
    const rows = letterRows(ch);
    rows.forEach((row, j) => {
      let i = 0;
      while (i < row.length) {
        if (row[i] !== '#') {
          i++;
          continue;
        }
        let e = i;
        while (e < row.length && row[e] === '#') e++;
        d += `M${x + i} ${j - 7}h${e - i}v1h${i - e}z`;
        i = e;
      }
    });
    x += ADVANCE;
  }
  return { d, width: Math.max(0, x - 1) };
}

export const BITMAP_LETTERING: Lettering = {
  text(s, x, y, size, anchor, fill, rotate = false) {
    const { d, width } = glyphPath(s);
    const k = (0.72 * size) / 7;
    const shift = anchor === 'start' ? 0 : anchor === 'middle' ? -width / 2 : -width;
    const turn = rotate ? ' rotate(-90)' : '';
    return `<path transform="translate(${x.toFixed(1)} ${y.toFixed(1)})${turn} scale(${k.toFixed(4)}) translate(${shift} 0)" d="${d}" fill="${fill}"/>`;
  },
};
