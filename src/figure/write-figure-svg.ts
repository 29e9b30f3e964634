/**
 * A figure scene as SVG: the plate as an `<image>` (a PNG data URL, or a
 * link to a PNG beside the SVG when the caller says it is too large to
 * inline), strokes as polylines, and text as the figure font's glyph
 * outlines, each carrying its string in `aria-label` (so no reader's fonts
 * change the figure, and screen readers and tests still read the text).
 */
import type { FigureFont } from './figure-font.js';
import type { FigureScene } from './figure-scene.js';

function num(v: number): string {
  const r = Math.round(v * 1000) / 1000;
  return Object.is(r, -0) ? '0' : String(r);
}

function escapeAttr(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}

/** `href`: a data URL or a relative file name for the plate image. */
export function figureSvg(scene: FigureScene, href: string, font: FigureFont, title: string): string {
  const p = scene.plate;
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${num(scene.width)}pt" height="${num(scene.height)}pt" viewBox="0 0 ${num(scene.width)} ${num(scene.height)}">`,
  );
  if (title !== '') out.push(`<title>${escapeAttr(title)}</title>`);
  out.push(`<defs><clipPath id="plate"><rect x="${num(p.x)}" y="${num(p.y)}" width="${num(p.width)}" height="${num(p.height)}"/></clipPath></defs>`);
  out.push(`<rect width="100%" height="100%" fill="#ffffff"/>`);
  out.push(`<image x="${num(p.x)}" y="${num(p.y)}" width="${num(p.width)}" height="${num(p.height)}" preserveAspectRatio="none" xlink:href="${escapeAttr(href)}"/>`);
  annotations(scene, font, out);
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}

/** Strokes, fills and text outlines of the scene, in page points, appended to `out`. */
function annotations(scene: FigureScene, font: FigureFont, out: string[]): void {
  for (const s of scene.strokes) {
    if (s.points.length < 4) continue;
    const pts: string[] = [];
    for (let i = 0; i + 1 < s.points.length; i += 2) pts.push(`${num(s.points[i]!)},${num(s.points[i + 1]!)}`);
    out.push(
      `<polyline points="${pts.join(' ')}" fill="none" stroke="${s.colour}" stroke-width="${num(s.width)}" stroke-linejoin="round"${s.clip ? ' clip-path="url(#plate)"' : ''}/>`,
    );
  }
  for (const f of scene.fills) {
    out.push(`<rect x="${num(f.x)}" y="${num(f.y)}" width="${num(f.width)}" height="${num(f.height)}" fill="${f.colour}" fill-opacity="${num(f.opacity)}"/>`);
  }
  for (const t of scene.texts) {
    const d = font.outline(t.text, t.size, t.x, t.y);
    const fill = t.colour;
    const turn = t.rotate === 0 ? '' : ` transform="rotate(${t.rotate} ${num(t.x)} ${num(t.y)})"`;
    out.push(`<path role="img" class="${t.role}" aria-label="${escapeAttr(t.text)}" fill="${fill}"${turn} d="${d}"/>`);
  }
}

/** Where the overlay of a raster figure sits: `scale` pixels a point, the page's origin at (dx, dy) pixels. */
export interface OverlayPlacement {
  readonly width: number;
  readonly height: number;
  readonly scale: number;
  readonly dx: number;
  readonly dy: number;
}

/**
 * The scene's annotations alone (no plate, no page background: transparent
 * elsewhere) as an SVG of `placement.width` x `placement.height` pixels,
 * for rasterising over the plate. Text is glyph outlines as in figureSvg, so
 * the rasteriser never sets type in the machine's fonts.
 */
export function figureOverlaySvg(scene: FigureScene, font: FigureFont, placement: OverlayPlacement): string {
  const p = scene.plate;
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${placement.width}" height="${placement.height}" viewBox="0 0 ${placement.width} ${placement.height}">`);
  out.push(`<defs><clipPath id="plate"><rect x="${num(p.x)}" y="${num(p.y)}" width="${num(p.width)}" height="${num(p.height)}"/></clipPath></defs>`);
  out.push(`<g transform="translate(${placement.dx} ${placement.dy}) scale(${placement.scale})">`);
  annotations(scene, font, out);
  out.push('</g>');
  out.push('</svg>');
  return `${out.join('\n')}\n`;
}
