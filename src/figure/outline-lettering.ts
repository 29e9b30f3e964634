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

/** Subscript forms in Unicode (U+2080..U+209C) of the digits and the letters that have one; DejaVu Sans draws them all. */
const SUBSCRIPT: Readonly<Record<string, string>> = Object.fromEntries([
  ...[...'0123456789'].map((d, i) => [d, String.fromCodePoint(0x2080 + i)]),
  ...[...'aeoxhklmnpst'].map((c) => [
    c,
    String.fromCodePoint({ a: 0x2090, e: 0x2091, o: 0x2092, x: 0x2093, h: 0x2095, k: 0x2096, l: 0x2097, m: 0x2098, n: 0x2099, p: 0x209a, s: 0x209b, t: 0x209c }[c]!),
  ]),
]);

/**
 * Plain-text conventions of the real slice's labels set as type: "->" as an
 * arrow (U+2192), and "_n", "_0" (a run of letters or digits after an
 * underscore) as subscript characters where every one has a subscript form.
 */
export function typeset(s: string): string {
  return s
    .replace(/->/g, '\u2192')
    .replace(/_([a-z0-9]+)/g, (all, run: string) => ([...run].every((c) => SUBSCRIPT[c] !== undefined) ? [...run].map((c) => SUBSCRIPT[c]).join('') : all));
}

/**
 * The outline lettering, its font read on first use; with `typeset`, each
 * string goes through typeset() first (the aria-label keeps the string as
 * drawn).
 */
export function outlineLettering(options: { readonly typeset?: boolean } = {}): Lettering {
  const font = figureFont();
  const prepare = options.typeset === true ? typeset : (s: string): string => s;
  return {
    width: (s, size) => font.width(prepare(s), size),
    text(raw, x, y, size, anchor, fill, rotate = false, cls) {
      const s = prepare(raw);
      const w = font.width(s, size);
      const x0 = anchor === 'start' ? x : anchor === 'middle' ? x - w / 2 : x - w;
      const turn = rotate ? ` transform="rotate(-90 ${num(x)} ${num(y)})"` : '';
      const c = cls === undefined ? '' : ` class="${cls}"`;
      return `<path role="img"${c} aria-label="${escapeAttr(s)}" fill="${fill}"${turn} d="${font.outline(s, size, x0, y)}"/>`;
    },
  };
}
