/**
 * The comparison plate as an SVG document: a strip of the c-plane along the
 * real axis above the logistic bifurcation diagram, both on one parameter
 * axis linear in c (so the plane keeps its geometry; c grows to the right
 * and therefore r = 1 + sqrt(1 - 4c) grows to the left, docs/methods.md E1).
 * Ticks in c run along the top, ticks in r along the bottom. Each marked
 * parameter is a vertical line through both panels: the period doublings of
 * the cascade, and each window's nucleus, labelled by its period, where the
 * window's component sits on the real axis in the strip above it.
 * Pure string building: the two rasters arrive as PNG data, text is set and
 * measured by the caller's Lettering (lettering.ts).
 */
import { wrapLines, type Lettering } from './lettering.js';
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
  /** The diagram's state axis: x at the bottom and top edges (default 0 and 1). */
  stateFrom?: number;
  stateTo?: number;
}

/** Text boxes that may not overlap: each label is drawn only where it covers no earlier one. */
class Labels {
  private readonly boxes: Array<[number, number, number, number]> = [];

  constructor(private readonly lettering: Lettering) {}

  /** Reserves the box of `text` at size `size` anchored at (x, baseline y); false (and nothing reserved) when it would overlap. */
  take(text: string, x: number, y: number, size: number, anchor: 'start' | 'middle' | 'end'): boolean {
    const w = this.lettering.width(text, size);
    const x0 = anchor === 'middle' ? x - w / 2 : anchor === 'end' ? x - w : x;
    const box: [number, number, number, number] = [x0 - 2, y - 0.8 * size, x0 + w + 2, y + 0.25 * size];
    if (this.boxes.some((b) => b[0] < box[2] && box[0] < b[2] && b[1] < box[3] && box[1] < b[3])) return false;
    this.boxes.push(box);
    return true;
  }
}

const C_TITLE = 'c (the plane z -> z^2 + c; real axis through the middle of the strip)';
const R_TITLE = 'r (logistic x -> r x (1 - x)), with c = r/2 - r^2/4: r grows to the left';
const FOOTNOTE = "red: period doublings of the cascade; blue dashed: nucleus of each window's component, labelled by period; shaded: window onset to end";

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

export function comparePlateSvg(spec: CompareSpec, lettering: Lettering): string {
  const L = lettering;
  const { from, to, width: W, stripHeight: hs, diagramHeight: hd } = spec;
  const left = 84;
  const right = 60;
  const totalW = W + left + right;
  // Text rows from the top: title (18 px, wrapped to the page), the c axis title (14 px, wrapped, centred on the
  // panels), the c tick labels, the mark labels, then the panels; below them the r tick labels, the r axis
  // title and the footnote (11 px, wrapped, right-aligned). Each wrapped line pushes what follows down, so no
  // text runs off the page or onto a tick at any size; with one line each the rows sit as they always did.
  const centreHalf = Math.min(left + W / 2, totalW - left - W / 2) - 8;
  const titleLines = wrapLines(L, spec.title, 18, totalW - left - 8);
  const cTitleLines = wrapLines(L, C_TITLE, 14, 2 * centreHalf);
  const rTitleLines = wrapLines(L, R_TITLE, 14, 2 * centreHalf);
  const noteLines = wrapLines(L, FOOTNOTE, 11, left + W - 8);
  const cTitleY = 28 + 22 * (titleLines.length - 1) + 32;
  const top = cTitleY + 18 * (cTitleLines.length - 1) + 56;
  const bottomEdge = top + hs + hd;
  const rTitleY = bottomEdge + 50;
  const noteY = rTitleY + 18 * (rTitleLines.length - 1) + 22;
  const totalH = noteY + 14 * (noteLines.length - 1) + 8;
  const x = (c: number): number => left + ((c - from) / (to - from)) * W;
  const f = (v: number): string => v.toFixed(2);
  const out: string[] = [];
  out.push(`<svg xmlns="http://www.w3.org/2000/svg" xmlns:xlink="http://www.w3.org/1999/xlink" width="${totalW}" height="${totalH}" viewBox="0 0 ${totalW} ${totalH}">`);
  out.push(`<rect width="${totalW}" height="${totalH}" fill="white"/>`);
  titleLines.forEach((t, i) => out.push(L.text(t, left, 28 + 22 * i, 18, 'start', 'black', false, 'title')));
  out.push(`<image x="${left}" y="${top}" width="${W}" height="${hs}" xlink:href="data:image/png;base64,${spec.stripPng}"/>`);
  out.push(`<image x="${left}" y="${top + hs}" width="${W}" height="${hd}" xlink:href="data:image/png;base64,${spec.diagramPng}"/>`);
  for (const m of spec.marks) {
    if (m.kind === 'window' && m.from !== undefined && m.to !== undefined) {
      const a = x(Math.min(m.from, m.to));
      const b = x(Math.max(m.from, m.to));
      out.push(`<rect x="${f(a)}" y="${top + hs}" width="${f(Math.max(0.5, b - a))}" height="${hd}" fill="#2a7fd4" fill-opacity="0.12"/>`);
    }
  }
  const labels = new Labels(L);
  for (const m of [...spec.marks].sort((a, b) => a.c - b.c)) {
    if (m.c < Math.min(from, to) || m.c > Math.max(from, to)) continue;
    const xm = x(m.c);
    const colour = m.kind === 'doubling' ? '#c0392b' : '#1f5f99';
    out.push(
      `<line x1="${f(xm)}" y1="${top - 8}" x2="${f(xm)}" y2="${top + hs + hd}" stroke="${colour}" stroke-width="0.8" stroke-dasharray="${m.kind === 'window' ? '5 4' : 'none'}"><title>${esc(m.label)}</title></line>`,
    );
    // crowded marks (the cascade accumulates) keep their label in the <title> only
    if (labels.take(m.label, xm, top - 12, 12, 'middle')) out.push(L.text(m.label, xm, top - 12, 12, 'middle', colour, false, 'mark-label'));
  }
  out.push(`<rect x="${left}" y="${top}" width="${W}" height="${hs + hd}" fill="none" stroke="black"/>`);
  out.push(`<line x1="${left}" y1="${top + hs}" x2="${left + W}" y2="${top + hs}" stroke="black"/>`);
  // Tick counts follow the panel sizes, and a tick label that would overprint another is left out (its tick stays).
  for (const t of niceTicks(Math.min(from, to), Math.max(from, to), Math.max(2, Math.floor(W / 60)))) {
    out.push(`<line x1="${f(x(t))}" y1="${top - 6}" x2="${f(x(t))}" y2="${top}" stroke="black"/>`);
    if (labels.take(String(t), x(t), top - 32, 12, 'middle')) out.push(L.text(String(t), x(t), top - 32, 12, 'middle', 'black', false, 'c-label'));
  }
  const rOf = (c: number): number => 1 + Math.sqrt(Math.max(0, 1 - 4 * c));
  const [rA, rB] = [rOf(to), rOf(from)];
  for (const r of niceTicks(Math.min(rA, rB), Math.max(rA, rB), Math.max(2, Math.floor(W / 60)))) {
    const c = r / 2 - (r * r) / 4;
    const y = top + hs + hd;
    out.push(`<line x1="${f(x(c))}" y1="${y}" x2="${f(x(c))}" y2="${y + 6}" stroke="black"/>`);
    if (labels.take(String(r), x(c), y + 22, 12, 'middle')) out.push(L.text(String(r), x(c), y + 22, 12, 'middle', 'black', false, 'r-label'));
  }
  // Im c of the strip (square pixels, the real axis through its middle, planeStrip) and the diagram's state x, at the left.
  const imHalf = ((to - from) / W) * (hs / 2);
  const yIm = (v: number): number => top + hs / 2 - (v / imHalf) * (hs / 2);
  for (const t of niceTicks(-imHalf, imHalf, Math.max(2, Math.floor(hs / 45)))) {
    if (Math.abs(t) > imHalf) continue;
    out.push(`<line class="im-tick" x1="${left - 6}" y1="${f(yIm(t))}" x2="${left}" y2="${f(yIm(t))}" stroke="black"/>`);
    if (labels.take(String(t), left - 9, yIm(t) + 4, 12, 'end')) out.push(L.text(String(t), left - 9, yIm(t) + 4, 12, 'end', 'black', false, 'im-label'));
  }
  const s0 = spec.stateFrom ?? 0;
  const s1 = spec.stateTo ?? 1;
  const yX = (v: number): number => top + hs + hd - ((v - s0) / (s1 - s0)) * hd;
  for (const t of niceTicks(Math.min(s0, s1), Math.max(s0, s1), Math.max(2, Math.floor(hd / 60)))) {
    out.push(`<line class="x-tick" x1="${left - 6}" y1="${f(yX(t))}" x2="${left}" y2="${f(yX(t))}" stroke="black"/>`);
    if (labels.take(String(t), left - 9, yX(t) + 4, 12, 'end')) out.push(L.text(String(t), left - 9, yX(t) + 4, 12, 'end', 'black', false, 'x-label'));
  }
  out.push(L.text('Im c', 20, top + hs / 2, 14, 'middle', 'black', true, 'axis-title'));
  out.push(L.text('x', 20, top + hs + hd / 2, 14, 'middle', 'black', true, 'axis-title'));
  cTitleLines.forEach((t, i) => out.push(L.text(t, left + W / 2, cTitleY + 18 * i, 14, 'middle', 'black', false, 'axis-title')));
  rTitleLines.forEach((t, i) => out.push(L.text(t, left + W / 2, rTitleY + 18 * i, 14, 'middle', 'black', false, 'axis-title')));
  noteLines.forEach((t, i) => out.push(L.text(t, left + W, noteY + 14 * i, 11, 'end', '#555', false, 'footnote')));
  out.push('</svg>\n');
  return out.join('\n');
}
