/**
 * A Lettering (section/lettering.ts) that draws text as the glyph outlines
 * of the figure font (figure-font.ts: DejaVu Sans through fontkit), each a
 * <path role="img"> carrying its string in aria-label, as the figure SVG
 * writer does. No <text> reaches a rasteriser, so a PNG of a plot has the
 * same bytes on every machine, and the SVG reads the same in any viewer.
 */
import type { Lettering } from '../section/lettering.js';
import { figureFont } from './figure-font.js';

function escapeAttr(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

const num = (v: number): string => String(Math.round(v * 100) / 100);

/** The outline lettering, its font read on first use. */
export function outlineLettering(): Lettering {
  const font = figureFont();
  return {
    width: (s, size) => font.width(s, size),
    text(s, x, y, size, anchor, fill, rotate = false, cls) {
      const w = font.width(s, size);
      const x0 = anchor === 'start' ? x : anchor === 'middle' ? x - w / 2 : x - w;
      const turn = rotate ? ` transform="rotate(-90 ${num(x)} ${num(y)})"` : '';
      const c = cls === undefined ? '' : ` class="${cls}"`;
      return `<path role="img"${c} aria-label="${escapeAttr(s)}" fill="${fill}"${turn} d="${font.outline(s, size, x0, y)}"/>`;
    },
  };
}
