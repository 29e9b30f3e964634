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
  /**
   * The closed contours of `text` as polygons (x, y, x, y, ...) in a y-down
   * page, baseline from (x, y), `size` units tall, each curve cut into
   * chords within `tolerance` of it (a chord of a quadratic Bezier strays
   * |p0 - 2 p1 + p2| / 4 from it, a quarter as far per halving): for
   * coverage rasterisers (colour/fill-coverage.ts).
   */
  contours(text: string, size: number, x: number, y: number, tolerance: number): number[][];
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
    contours(text, size, x, y, tolerance) {
      const run = font.layout(text);
      const k = size / em;
      const polys: number[][] = [];
      let poly: number[] = [];
      let pen = 0;
      const close = (): void => {
        if (poly.length >= 6) polys.push(poly);
        poly = [];
      };
      run.glyphs.forEach((g, i) => {
        const pos = run.positions[i]!;
        const ox = x + (pen + pos.xOffset) * k;
        const oy = y - pos.yOffset * k;
        const px = (a: number): number => ox + a * k;
        const py = (a: number): number => oy - a * k;
        for (const c of g.path.commands) {
          const a = c.args;
          if (c.command === 'moveTo') {
            close();
            poly.push(px(a[0]!), py(a[1]!));
          } else if (c.command === 'lineTo') poly.push(px(a[0]!), py(a[1]!));
          else if (c.command === 'quadraticCurveTo' || c.command === 'bezierCurveTo') {
            const x0 = poly[poly.length - 2]!;
            const y0 = poly[poly.length - 1]!;
            const pts = [x0, y0];
            for (let j = 0; j < a.length; j += 2) pts.push(px(a[j]!), py(a[j + 1]!));
            // second differences bound the chord's distance from the curve
            let dd = 0;
            for (let j = 0; j + 5 < pts.length; j += 2) dd = Math.max(dd, Math.hypot(pts[j]! - 2 * pts[j + 2]! + pts[j + 4]!, pts[j + 1]! - 2 * pts[j + 3]! + pts[j + 5]!));
            const deg = pts.length / 2 - 1;
            const n = Math.max(1, Math.ceil(Math.sqrt(((deg === 2 ? 0.25 : 0.75) * dd) / tolerance)));
            for (let s = 1; s <= n; s++) {
              const t = s / n;
              const u = 1 - t;
              if (deg === 2) poly.push(u * u * pts[0]! + 2 * u * t * pts[2]! + t * t * pts[4]!, u * u * pts[1]! + 2 * u * t * pts[3]! + t * t * pts[5]!);
              else
                poly.push(
                  u * u * u * pts[0]! + 3 * u * u * t * pts[2]! + 3 * u * t * t * pts[4]! + t * t * t * pts[6]!,
                  u * u * u * pts[1]! + 3 * u * u * t * pts[3]! + 3 * u * t * t * pts[5]! + t * t * t * pts[7]!,
                );
            }
          } else close();
        }
        close();
        pen += pos.xAdvance;
      });
      return polys;
    },
  };
  return cached;
}
