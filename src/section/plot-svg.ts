/**
 * A line plot of one quantity along the parameter axis as an SVG document
 * (W3C SVG 1.1), with marked parameters (vertical lines, e.g. period
 * doublings) and marked bands (shaded intervals, e.g. periodic windows).
 * Pure string building: no I/O, no measurement of fonts.
 */
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
  for (let t = Math.ceil(lo / step) * step; t <= hi + step * 1e-9; t += step) ticks.push(Number(t.toPrecision(12)));
  return ticks;
}

export function plotSvg(spec: PlotSpec): string {
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
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" font-family="sans-serif" font-size="12">`);
  parts.push(`<rect width="${W}" height="${H}" fill="white"/>`);
  parts.push(`<text x="${m.l}" y="24" font-size="15">${esc(spec.title)}</text>`);
  for (const b of spec.bands) {
    const a = sx(Math.max(x0, Math.min(b.from, b.to)));
    const e = sx(Math.min(x1, Math.max(b.from, b.to)));
    if (e <= a) continue;
    parts.push(`<rect x="${f(a)}" y="${m.t}" width="${f(Math.max(0.5, e - a))}" height="${ph}" fill="#cfe3f7"><title>${esc(b.label)}</title></rect>`);
    if (e - a > 14) parts.push(`<text x="${f((a + e) / 2)}" y="${m.t + 12}" text-anchor="middle" font-size="10" fill="#2a5a8a">${esc(b.label)}</text>`);
  }
  for (const t of niceTicks(x0, x1, 10)) {
    parts.push(`<line x1="${f(sx(t))}" y1="${m.t + ph}" x2="${f(sx(t))}" y2="${m.t + ph + 5}" stroke="black"/>`);
    parts.push(`<text x="${f(sx(t))}" y="${m.t + ph + 18}" text-anchor="middle">${t}</text>`);
  }
  for (const t of niceTicks(yLo, yHi, 6)) {
    parts.push(`<line x1="${m.l - 5}" y1="${f(sy(t))}" x2="${m.l}" y2="${f(sy(t))}" stroke="black"/>`);
    parts.push(`<text x="${m.l - 8}" y="${f(sy(t) + 4)}" text-anchor="end">${t}</text>`);
  }
  if (yLo < 0 && yHi > 0) parts.push(`<line x1="${m.l}" y1="${f(sy(0))}" x2="${m.l + pw}" y2="${f(sy(0))}" stroke="#888" stroke-dasharray="4 3"/>`);
  let lastLabel = -Infinity;
  for (const mk of [...spec.marks].sort((a, b) => a.at - b.at)) {
    if (mk.at < Math.min(x0, x1) || mk.at > Math.max(x0, x1)) continue;
    parts.push(`<line x1="${f(sx(mk.at))}" y1="${m.t}" x2="${f(sx(mk.at))}" y2="${m.t + ph}" stroke="#c0392b" stroke-width="0.8"><title>${esc(mk.label)}</title></line>`);
    // Labels of crowded marks (the cascade accumulates) are left to the <title>.
    if (sx(mk.at) - lastLabel < 40) continue;
    lastLabel = sx(mk.at);
    parts.push(`<text x="${f(sx(mk.at) + 2)}" y="${m.t + ph - 4}" font-size="10" fill="#c0392b">${esc(mk.label)}</text>`);
  }
  let d = '';
  for (let i = 0; i < spec.xs.length; i++) {
    if (!Number.isFinite(spec.ys[i]!)) continue;
    d += `${d === '' ? 'M' : 'L'}${f(sx(spec.xs[i]!))} ${f(sy(spec.ys[i]!))}`;
  }
  parts.push(`<path d="${d}" fill="none" stroke="black" stroke-width="0.7"/>`);
  parts.push(`<rect x="${m.l}" y="${m.t}" width="${pw}" height="${ph}" fill="none" stroke="black"/>`);
  parts.push(`<text x="${m.l + pw / 2}" y="${H - 18}" text-anchor="middle">${esc(spec.xLabel)}</text>`);
  parts.push(`<text x="18" y="${m.t + ph / 2}" text-anchor="middle" transform="rotate(-90 18 ${m.t + ph / 2})">${esc(spec.yLabel)}</text>`);
  parts.push('</svg>\n');
  return parts.join('\n');
}
