/**
 * A line plot of one quantity along the parameter axis as an SVG document
 * (W3C SVG 1.1), with marked parameters (vertical lines, e.g. period
 * doublings) and marked bands (shaded intervals, e.g. periodic windows).
 * Pure string building, no I/O: text is set and measured by the caller's
 * Lettering (lettering.ts; the command line passes the DejaVu outlines).
 */
import type { Lettering } from './lettering.js';

export interface PlotMark {
  at: number;
  label: string;
}

export interface PlotBand {
  from: number;
  to: number;
  label: string;
}

export interface PlotSpec {
  title: string;
  xLabel: string;
  yLabel: string;
  xs: Float64Array;
  ys: Float64Array;
  marks: readonly PlotMark[];
  bands: readonly PlotBand[];
  width?: number;
  height?: number;
  /** Lower clip of the y axis (values below are drawn at the edge). */
  yMin?: number;
}

interface Box {
  x: number;
  y: number;
  width: number;
  height: number;
}

function overlap(a: Box, b: Box): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

/** Height of the strip above the bottom edge kept for the clip marks. */
const CLIP_STRIP = 8;

/** Runs [i0, i1] of indices whose value lies below `lo` (or is -infinity). */
export function clippedRuns(ys: Float64Array, lo: number): Array<[number, number]> {
  const runs: Array<[number, number]> = [];
  let start = -1;
  for (let i = 0; i <= ys.length; i++) {
    const below = i < ys.length && (ys[i]! < lo || ys[i] === -Infinity);
    if (below && start < 0) start = i;
    if (!below && start >= 0) {
      runs.push([start, i - 1]);
      start = -1;
    }
  }
  return runs;
}

function fmtTick(v: number): string {
  return Number(v.toPrecision(6)).toString();
}

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Round tick values covering [lo, hi], about `count` of them. */
export function niceTicks(lo: number, hi: number, count: number): number[] {
  const span = hi - lo;
  if (!(span > 0)) return [lo];
  const raw = span / count;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? 10 * mag;
  const ticks: number[] = [];
  // Multiples k * step, not a running sum: a sum drifts (0.1 + 0.1 + 0.1 ...), and near 0 would print as -1.7e-17.
  for (let k = Math.ceil(lo / step - 1e-9); k * step <= hi + step * 1e-9; k++) {
    const t = Number((k * step).toPrecision(12));
    ticks.push(k === 0 ? 0 : t);
  }
  return ticks;
}

export function plotSvg(spec: PlotSpec, lettering: Lettering): string {
  const L = lettering;
  const W = spec.width ?? 1200;
  const H = spec.height ?? 520;
  const m = { l: 70, r: 20, t: 40, b: 60 };
  const pw = W - m.l - m.r;
  const ph = H - m.t - m.b;
  const x0 = spec.xs[0]!;
  const x1 = spec.xs[spec.xs.length - 1]!;
  let yLo = Infinity;
  let yHi = -Infinity;
  for (const y of spec.ys) {
    if (Number.isFinite(y)) {
      yLo = Math.min(yLo, y);
      yHi = Math.max(yHi, y);
    }
  }
  if (spec.yMin !== undefined) yLo = Math.max(yLo, spec.yMin);
  if (!(yHi > yLo)) {
    yLo -= 1;
    yHi += 1;
  }
  const sx = (x: number): number => m.l + ((x - x0) / (x1 - x0)) * pw;
  const sy = (y: number): number => m.t + ((yHi - Math.max(yLo, Math.min(yHi, y))) / (yHi - yLo)) * ph;
  const f = (v: number): string => v.toFixed(2);
  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  parts.push(`<rect width="${W}" height="${H}" fill="white"/>`);
  parts.push(L.text(spec.title, m.l, 24, 15, 'start', 'black'));
  // Labels are placed only where their box (the lettering's advance) meets no other label and no mark line.
  const placed: Box[] = [];
  const markXs = spec.marks.filter((mk) => mk.at >= Math.min(x0, x1) && mk.at <= Math.max(x0, x1)).map((mk) => sx(mk.at));
  for (const b of spec.bands) {
    const a = sx(Math.max(x0, Math.min(b.from, b.to)));
    const e = sx(Math.min(x1, Math.max(b.from, b.to)));
    if (e <= a) continue;
    parts.push(`<rect x="${f(a)}" y="${m.t}" width="${f(Math.max(0.5, e - a))}" height="${ph}" fill="#cfe3f7"><title>${esc(b.label)}</title></rect>`);
    const w = L.width(b.label, 10);
    const box = { x: (a + e) / 2 - w / 2 - 1, y: m.t + 2, width: w + 2, height: 12 };
    if (box.x < m.l || box.x + box.width > m.l + pw || placed.some((q) => overlap(q, box)) || markXs.some((x) => x >= box.x && x <= box.x + box.width)) continue;
    placed.push(box);
    parts.push(L.text(b.label, (a + e) / 2, m.t + 12, 10, 'middle', '#2a5a8a', false, 'band-label'));
  }
  for (const t of niceTicks(x0, x1, 10)) {
    parts.push(`<line x1="${f(sx(t))}" y1="${m.t + ph}" x2="${f(sx(t))}" y2="${m.t + ph + 5}" stroke="black"/>`);
    parts.push(L.text(String(t), sx(t), m.t + ph + 18, 12, 'middle', 'black', false, 'x-tick'));
  }
  for (const t of niceTicks(yLo, yHi, 6)) {
    parts.push(`<line x1="${m.l - 5}" y1="${f(sy(t))}" x2="${m.l}" y2="${f(sy(t))}" stroke="black"/>`);
    parts.push(L.text(String(t), m.l - 8, sy(t) + 4, 12, 'end', 'black', false, 'y-tick'));
  }
  if (yLo < 0 && yHi > 0) parts.push(`<line x1="${m.l}" y1="${f(sy(0))}" x2="${m.l + pw}" y2="${f(sy(0))}" stroke="#888" stroke-dasharray="4 3"/>`);
  for (const mk of [...spec.marks].sort((a, b) => a.at - b.at)) {
    if (mk.at < Math.min(x0, x1) || mk.at > Math.max(x0, x1)) continue;
    parts.push(`<line x1="${f(sx(mk.at))}" y1="${m.t}" x2="${f(sx(mk.at))}" y2="${m.t + ph}" stroke="#c0392b" stroke-width="0.8"><title>${esc(mk.label)}</title></line>`);
  }
  // Mark labels above the bottom edge, right of their line or else left of it; crowded marks (the cascade
  // accumulates) keep their label in the <title> only. The bottom strip holds the clip mark, so labels sit above it.
  const labelY = m.t + ph - 4 - CLIP_STRIP;
  for (const mk of [...spec.marks].sort((a, b) => a.at - b.at)) {
    if (mk.at < Math.min(x0, x1) || mk.at > Math.max(x0, x1)) continue;
    const x = sx(mk.at);
    const w = L.width(mk.label, 10);
    for (const [bx, anchor, tx] of [
      [x + 1, 'start', x + 2],
      [x - w - 3, 'end', x - 2],
    ] as const) {
      const box = { x: bx, y: labelY - 9, width: w + 2, height: 12 };
      if (box.x < m.l || box.x + box.width > m.l + pw) continue;
      if (placed.some((q) => overlap(q, box)) || markXs.some((mx) => mx > box.x && mx < box.x + box.width)) continue;
      placed.push(box);
      parts.push(L.text(mk.label, tx, labelY, 10, anchor, '#c0392b', false, 'mark-label'));
      break;
    }
  }
  let d = '';
  for (let i = 0; i < spec.xs.length; i++) {
    if (!Number.isFinite(spec.ys[i]!)) continue;
    d += `${d === '' ? 'M' : 'L'}${f(sx(spec.xs[i]!))} ${f(sy(spec.ys[i]!))}`;
  }
  parts.push(`<path d="${d}" fill="none" stroke="black" stroke-width="0.7"/>`);
  // The clip at the bottom, drawn: a downward triangle under each run of values below the axis (or -infinity,
  // a superstable parameter), and a note of the clip level at the left.
  if (spec.yMin !== undefined) {
    const runs = clippedRuns(spec.ys, yLo);
    for (const [i0, i1] of runs) {
      const x = (sx(spec.xs[i0]!) + sx(spec.xs[i1]!)) / 2;
      const yb = m.t + ph;
      parts.push(`<path class="clip" d="M${f(x - 4)} ${f(yb - 7)}L${f(x + 4)} ${f(yb - 7)}L${f(x)} ${f(yb - 1)}Z" fill="#555555"><title>clipped: below ${yLo}</title></path>`);
    }
    if (runs.length > 0) {
      const ny = m.t + ph + 32;
      parts.push(`<path d="M${f(m.l)} ${f(ny - 8)}L${f(m.l + 8)} ${f(ny - 8)}L${f(m.l + 4)} ${f(ny - 2)}Z" fill="#555555"/>`);
      parts.push(L.text(`values below ${fmtTick(yLo)}, clipped`, m.l + 12, ny, 10, 'start', '#555555', false, 'clip-note'));
    }
  }
  parts.push(`<rect x="${m.l}" y="${m.t}" width="${pw}" height="${ph}" fill="none" stroke="black"/>`);
  parts.push(L.text(spec.xLabel, m.l + pw / 2, H - 18, 12, 'middle', 'black'));
  parts.push(L.text(spec.yLabel, 18, m.t + ph / 2, 12, 'middle', 'black', true));
  parts.push('</svg>\n');
  return parts.join('\n');
}
