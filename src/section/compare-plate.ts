/**
 * The comparison plate as an SVG document: a strip of the c-plane along the
 * real axis above the logistic bifurcation diagram, both on one parameter
 * axis linear in c (so the plane keeps its geometry; c grows to the right
 * and therefore r = 1 + sqrt(1 - 4c) grows to the left, docs/methods.md E1).
 * Ticks in c run along the top, ticks in r along the bottom. Each marked
 * parameter is a vertical line through both panels: the period doublings of
 * the cascade, and each window's nucleus, labelled by its period, where the
 * window's component sits on the real axis in the strip above it.
 * Pure string building: the two rasters arrive as PNG data.
 */
import { niceTicks } from './plot-svg.js';

export interface CompareMark {
  /** Position in c. */
  c: number;
  label: string;
  kind: 'doubling' | 'window';
  /** For windows: onset and end in c, shaded in the diagram. */
  from?: number;
  to?: number;
}

export interface CompareSpec {
  from: number;
  to: number;
  width: number;
  stripHeight: number;
  diagramHeight: number;
  stripPng: string;
  diagramPng: string;
  marks: readonly CompareMark[];
  title: string;
}

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function comparePlateSvg(spec: CompareSpec): string {
  const { from, to, width: W, stripHeight: hs, diagramHeight: hd } = spec;
  const left = 60;
  const right = 60;
  const top = 116;
  const bottom = 80;
  const totalW = W + left + right;
  const totalH = top + hs + hd + bottom;
  const x = (c: number): number => left + ((c - from) / (to - from)) * W;
  const f = (v: number): string => v.toFixed(2);
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${totalW}" height="${totalH}" viewBox="0 0 ${totalW} ${totalH}" font-family="sans-serif" font-size="14">`);
  out.push(`<rect width="${totalW}" height="${totalH}" fill="white"/>`);
  out.push(`<text x="${left}" y="28" font-size="18">${esc(spec.title)}</text>`);
  out.push(`<image x="${left}" y="${top}" width="${W}" height="${hs}" xlink:href="data:image/png;base64,${spec.stripPng}"/>`);
  out.push(`<image x="${left}" y="${top + hs}" width="${W}" height="${hd}" xlink:href="data:image/png;base64,${spec.diagramPng}"/>`);
  for (const m of spec.marks) {
    if (m.kind === 'window' && m.from !== undefined && m.to !== undefined) {
      const a = x(Math.min(m.from, m.to));
      const b = x(Math.max(m.from, m.to));
      out.push(`<rect x="${f(a)}" y="${top + hs}" width="${f(Math.max(0.5, b - a))}" height="${hd}" fill="#2a7fd4" fill-opacity="0.12"/>`);
    }
  }
  let lastLabel = -Infinity;
  for (const m of [...spec.marks].sort((a, b) => a.c - b.c)) {
    if (m.c < Math.min(from, to) || m.c > Math.max(from, to)) continue;
    const xm = x(m.c);
    const colour = m.kind === 'doubling' ? '#c0392b' : '#1f5f99';
    out.push(`<line x1="${f(xm)}" y1="${top - 8}" x2="${f(xm)}" y2="${top + hs + hd}" stroke="${colour}" stroke-width="0.8" stroke-dasharray="${m.kind === 'window' ? '5 4' : 'none'}"><title>${esc(m.label)}</title></line>`);
    if (xm - lastLabel >= 18) {
      out.push(`<text x="${f(xm)}" y="${top - 12}" text-anchor="middle" font-size="12" fill="${colour}">${esc(m.label)}</text>`);
      lastLabel = xm;
    }
  }
  out.push(`<rect x="${left}" y="${top}" width="${W}" height="${hs + hd}" fill="none" stroke="black"/>`);
  out.push(`<line x1="${left}" y1="${top + hs}" x2="${left + W}" y2="${top + hs}" stroke="black"/>`);
  for (const t of niceTicks(Math.min(from, to), Math.max(from, to), 12)) {
    out.push(`<line x1="${f(x(t))}" y1="${top - 6}" x2="${f(x(t))}" y2="${top}" stroke="black"/>`);
    out.push(`<text x="${f(x(t))}" y="${top - 32}" text-anchor="middle" font-size="12">${t}</text>`);
  }
  const rOf = (c: number): number => 1 + Math.sqrt(Math.max(0, 1 - 4 * c));
  const [rA, rB] = [rOf(to), rOf(from)];
  for (const r of niceTicks(Math.min(rA, rB), Math.max(rA, rB), 12)) {
    const c = r / 2 - (r * r) / 4;
    const y = top + hs + hd;
    out.push(`<line x1="${f(x(c))}" y1="${y}" x2="${f(x(c))}" y2="${y + 6}" stroke="black"/>`);
    out.push(`<text x="${f(x(c))}" y="${y + 22}" text-anchor="middle" font-size="12">${r}</text>`);
  }
  out.push(`<text x="${left + W / 2}" y="${top - 56}" text-anchor="middle">c (the plane z -> z^2 + c; real axis through the middle of the strip)</text>`);
  out.push(`<text x="${left + W / 2}" y="${top + hs + hd + 50}" text-anchor="middle">r (logistic x -> r x (1 - x)), with c = r/2 - r^2/4: r grows to the left</text>`);
  out.push(`<text x="${left + W}" y="${totalH - 8}" text-anchor="end" font-size="11" fill="#555">red: period doublings of the cascade; blue dashed: nucleus of each window's component, labelled by period; shaded: window onset to end</text>`);
  out.push('</svg>\n');
  return out.join('\n');
}
