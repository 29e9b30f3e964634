/**
 * The two orbit figures of the real slice as SVG documents (W3C SVG 1.1):
 * x_n against n for several parameters on one set of axes, and the cobweb
 * (the graph of f or f^K, the diagonal and the staircase of an orbit). Pure
 * string building, no I/O. Text goes through a `Lettering` so the same
 * figure can carry SVG text (SVG_TEXT, the library default) or glyph
 * outlines (figure/outline-lettering.ts: what the command line writes, in
 * SVG and PNG, so no system font is ever rasterised).
 */
import { niceTicks } from './plot-svg.js';

/** Series colours: the Okabe-Ito colour-blind-safe palette (M. Okabe, K. Ito, "Color Universal Design", 2008). */
export const SERIES_COLOURS = ['#0072b2', '#d55e00', '#009e73', '#cc79a7', '#e69f00', '#56b4e9', '#000000', '#f0e442'];

export interface Lettering {
  /** One line of text at (x, y) (baseline), size in px, anchored start, middle or end. */
  text(s: string, x: number, y: number, size: number, anchor: 'start' | 'middle' | 'end', fill: string, rotate?: boolean): string;
}

function esc(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

/** Real SVG text in a generic sans-serif family. */
/** Real SVG text in a generic sans-serif family; "->" becomes an arrow and "x_n" a subscript. */
export const SVG_TEXT: Lettering = {
  text(s, x, y, size, anchor, fill, rotate = false) {
    const t = rotate ? ` transform="rotate(-90 ${x.toFixed(1)} ${y.toFixed(1)})"` : '';
    const body = esc(s.replace(/->/g, '\u2192')).replace(/_([A-Za-z0-9]+)/g, `<tspan baseline-shift="sub" font-size="${(0.72 * size).toFixed(1)}">$1</tspan>`);
    return `<text x="${x.toFixed(1)}" y="${y.toFixed(1)}" font-size="${size}" text-anchor="${anchor}" fill="${fill}"${t}>${body}</text>`;
  },
};

const f2 = (v: number): string => v.toFixed(2);

function frame(W: number, H: number): string[] {
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="DejaVu Sans, Helvetica, Arial, sans-serif">`,
    `<rect width="${W}" height="${H}" fill="white"/>`,
  ];
}

function tickLabel(t: number): string {
  const s = String(Number(t.toPrecision(10)));
  return s.startsWith('-') ? `\u2212${s.slice(1)}` : s;
}

export interface OrbitSeries {
  readonly label: string;
  /** x_0 .. x_N. */
  readonly values: ArrayLike<number>;
}

export interface OrbitPlotSpec {
  readonly title: string;
  readonly series: readonly OrbitSeries[];
  /** The y range shown (the family's state interval). */
  readonly yRange: readonly [number, number];
  /** Index of the first value shown (the transient before it is not drawn). */
  readonly first: number;
  readonly width?: number;
  readonly height?: number;
}

/** x_n against n, one coloured line with dots per series, a legend naming each. */
export function orbitPlotSvg(spec: OrbitPlotSpec, lettering: Lettering = SVG_TEXT): string {
  const W = spec.width ?? 1000;
  const H = spec.height ?? 560;
  const m = { l: 72, r: 180, t: 48, b: 58 };
  const pw = W - m.l - m.r,
    ph = H - m.t - m.b;
  const n = Math.max(...spec.series.map((s) => s.values.length)) - 1;
  const x0 = spec.first,
    x1 = Math.max(spec.first + 1, spec.first + n);
  const [yLo, yHi] = spec.yRange;
  const sx = (i: number): number => m.l + ((i - x0) / (x1 - x0)) * pw;
  const sy = (y: number): number => m.t + ((yHi - Math.max(yLo, Math.min(yHi, y))) / (yHi - yLo)) * ph;
  const parts = frame(W, H);
  parts.push(lettering.text(spec.title, m.l, 30, 17, 'start', '#111'));
  for (const t of niceTicks(yLo, yHi, 5)) {
    parts.push(`<line x1="${m.l}" y1="${f2(sy(t))}" x2="${m.l + pw}" y2="${f2(sy(t))}" stroke="#e4e4e4"/>`);
    parts.push(`<line x1="${m.l - 5}" y1="${f2(sy(t))}" x2="${m.l}" y2="${f2(sy(t))}" stroke="#111"/>`);
    parts.push(lettering.text(tickLabel(t), m.l - 9, sy(t) + 4.5, 13, 'end', '#111'));
  }
  for (const t of niceTicks(x0, x1, 10).filter((t) => Number.isInteger(t))) {
    parts.push(`<line x1="${f2(sx(t))}" y1="${m.t + ph}" x2="${f2(sx(t))}" y2="${m.t + ph + 5}" stroke="#111"/>`);
    parts.push(lettering.text(tickLabel(t), sx(t), m.t + ph + 20, 13, 'middle', '#111'));
  }
  const dots = n <= 160;
  spec.series.forEach((s, k) => {
    const colour = SERIES_COLOURS[k % SERIES_COLOURS.length]!;
    let d = '';
    for (let i = 0; i < s.values.length; i++) d += `${i === 0 ? 'M' : 'L'}${f2(sx(x0 + i))} ${f2(sy(s.values[i]!))}`;
    parts.push(`<path d="${d}" fill="none" stroke="${colour}" stroke-width="1.4" stroke-linejoin="round" opacity="0.85"/>`);
    if (dots) for (let i = 0; i < s.values.length; i++) parts.push(`<circle cx="${f2(sx(x0 + i))}" cy="${f2(sy(s.values[i]!))}" r="2.6" fill="${colour}"/>`);
    const ly = m.t + 14 + 24 * k;
    parts.push(`<line x1="${m.l + pw + 18}" y1="${ly - 4.5}" x2="${m.l + pw + 46}" y2="${ly - 4.5}" stroke="${colour}" stroke-width="2.4"/>`);
    if (dots) parts.push(`<circle cx="${m.l + pw + 32}" cy="${ly - 4.5}" r="3" fill="${colour}"/>`);
    parts.push(lettering.text(s.label, m.l + pw + 54, ly, 14, 'start', '#111'));
  });
  parts.push(`<rect x="${m.l}" y="${m.t}" width="${pw}" height="${ph}" fill="none" stroke="#111"/>`);
  parts.push(lettering.text('n', m.l + pw / 2, H - 14, 15, 'middle', '#111'));
  parts.push(lettering.text('x_n', 22, m.t + ph / 2, 15, 'middle', '#111', true));
  parts.push('</svg>\n');
  return parts.join('\n');
}

export interface CobwebSpec {
  readonly title: string;
  readonly subtitle: string;
  /** The map drawn (f^K), sampled by the figure over the state interval. */
  readonly map: (x: number) => number;
  readonly mapLabel: string;
  /** The staircase: x_0, f^K(x_0), f^2K(x_0), ... */
  readonly steps: ArrayLike<number>;
  /** Cycle points to mark on the diagonal (the attracting cycle of f^K, if any). */
  readonly marks: readonly number[];
  readonly range: readonly [number, number];
  readonly size?: number;
}

/** The cobweb: graph of the map, the diagonal, and the orbit's staircase fading in from faint (early) to dark (late). */
export function cobwebSvg(spec: CobwebSpec, lettering: Lettering = SVG_TEXT): string {
  const S = spec.size ?? 760;
  const m = { l: 70, r: 28, t: 70, b: 58 };
  const W = S,
    H = S + m.t - 40;
  const pw = W - m.l - m.r,
    ph = H - m.t - m.b;
  const [lo, hi] = spec.range;
  const sx = (x: number): number => m.l + ((x - lo) / (hi - lo)) * pw;
  const sy = (y: number): number => m.t + ((hi - Math.max(lo, Math.min(hi, y))) / (hi - lo)) * ph;
  const parts = frame(W, H);
  parts.push(lettering.text(spec.title, m.l, 28, 17, 'start', '#111'));
  parts.push(lettering.text(spec.subtitle, m.l, 50, 12, 'start', '#444'));
  for (const t of niceTicks(lo, hi, 5)) {
    parts.push(`<line x1="${f2(sx(t))}" y1="${m.t}" x2="${f2(sx(t))}" y2="${m.t + ph}" stroke="#ececec"/>`);
    parts.push(`<line x1="${m.l}" y1="${f2(sy(t))}" x2="${m.l + pw}" y2="${f2(sy(t))}" stroke="#ececec"/>`);
    parts.push(lettering.text(tickLabel(t), sx(t), m.t + ph + 20, 13, 'middle', '#111'));
    parts.push(lettering.text(tickLabel(t), m.l - 9, sy(t) + 4.5, 13, 'end', '#111'));
  }
  parts.push(`<line x1="${f2(sx(lo))}" y1="${f2(sy(lo))}" x2="${f2(sx(hi))}" y2="${f2(sy(hi))}" stroke="#777" stroke-width="1.2" stroke-dasharray="6 4"/>`);
  let curve = '';
  const samples = 1200;
  for (let i = 0; i <= samples; i++) {
    const x = lo + ((hi - lo) * i) / samples;
    curve += `${i === 0 ? 'M' : 'L'}${f2(sx(x))} ${f2(sy(spec.map(x)))}`;
  }
  parts.push(`<path d="${curve}" fill="none" stroke="#0072b2" stroke-width="2"/>`);
  const n = spec.steps.length - 1;
  let px = spec.steps[0]!,
    py = lo;
  for (let k = 0; k < n; k++) {
    const next = spec.steps[k + 1]!;
    const opacity = (0.18 + 0.82 * ((k + 1) / n) ** 1.5).toFixed(3);
    parts.push(`<path d="M${f2(sx(px))} ${f2(sy(py))}V${f2(sy(next))}H${f2(sx(next))}" fill="none" stroke="#d55e00" stroke-width="1.3" opacity="${opacity}"/>`);
    px = next;
    py = next;
  }
  parts.push(`<circle cx="${f2(sx(spec.steps[0]!))}" cy="${f2(sy(lo))}" r="4" fill="#d55e00"/>`);
  for (const x of spec.marks) parts.push(`<circle cx="${f2(sx(x))}" cy="${f2(sy(x))}" r="5" fill="white" stroke="#111" stroke-width="1.6"/>`);
  parts.push(`<rect x="${m.l}" y="${m.t}" width="${pw}" height="${ph}" fill="none" stroke="#111"/>`);
  parts.push(lettering.text('x', m.l + pw / 2, H - 14, 15, 'middle', '#111'));
  parts.push(lettering.text(spec.mapLabel, 22, m.t + ph / 2, 15, 'middle', '#111', true));
  parts.push('</svg>\n');
  return parts.join('\n');
}
