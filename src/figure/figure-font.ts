/**
 * The one typeface of every figure: DejaVu Sans (Bitstream Vera licence,
 * from the `dejavu-fonts-ttf` package), read with fontkit. Text is measured
 * here so that the layout, the PDF (which embeds a subset of the same file)
 * and the SVG (which draws the glyph outlines) agree on every advance; no
 * output depends on the fonts of the machine. opentype.js 2.0 was dropped:
 * it throws on DejaVu Sans's contextual substitution tables.
 */
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import * as fontkit from 'fontkit';

export interface FigureFont {
  /** The TrueType file's bytes (for the PDF writer to embed). */
  readonly bytes: Uint8Array;
  /** Advance width of `text` at `size` points. */
  width(text: string, size: number): number;
  /**
   * The outline of `text` as an SVG path, its baseline starting at (x, y) in
   * a y-down page, `size` points tall; coordinates rounded to 1/100 pt.
   */
  outline(text: string, size: number, x: number, y: number): string;
  /** Height of the capitals above the baseline per point of size (for vertical centring). */
  readonly capHeight: number;
  /** Descent below the baseline per point of size (positive). */
  readonly descent: number;
}

let cached: FigureFont | undefined;

/** The path of DejaVuSans.ttf inside the installed package. */
export function figureFontPath(): string {
  return createRequire(import.meta.url).resolve('dejavu-fonts-ttf/ttf/DejaVuSans.ttf');
}

function fmt(v: number): string {
  const r = Math.round(v * 100) / 100;
  return Object.is(r, -0) ? '0' : String(r);
}

export function figureFont(): FigureFont {
  if (cached !== undefined) return cached;
  const bytes = readFileSync(figureFontPath());
  const font = fontkit.create(bytes);
  const em = font.unitsPerEm;
  const capGlyph = font.layout('H').glyphs[0]!;
  let capTop = 0;
  for (const c of capGlyph.path.commands) for (let i = 1; i < c.args.length; i += 2) capTop = Math.max(capTop, c.args[i]!);
  cached = {
    bytes,
    capHeight: capTop / em,
    descent: -font.descent / em,
    width(text, size) {
      const run = font.layout(text);
      let w = 0;
      for (const p of run.positions) w += p.xAdvance;
      return (w / em) * size;
    },
    outline(text, size, x, y) {
      const run = font.layout(text);
      const k = size / em;
      const parts: string[] = [];
      let pen = 0;
      run.glyphs.forEach((g, i) => {
        const pos = run.positions[i]!;
        const ox = x + (pen + pos.xOffset) * k;
        const oy = y - pos.yOffset * k;
        for (const c of g.path.commands) {
          const a = c.args;
          const pt = (j: number): string => `${fmt(ox + a[j]! * k)} ${fmt(oy - a[j + 1]! * k)}`;
          if (c.command === 'moveTo') parts.push(`M${pt(0)}`);
          else if (c.command === 'lineTo') parts.push(`L${pt(0)}`);
          else if (c.command === 'quadraticCurveTo') parts.push(`Q${pt(0)} ${pt(2)}`);
          else if (c.command === 'bezierCurveTo') parts.push(`C${pt(0)} ${pt(2)} ${pt(4)}`);
          else parts.push('Z');
        }
        pen += pos.xAdvance;
      });
      return parts.join('');
    },
  };
  return cached;
}
