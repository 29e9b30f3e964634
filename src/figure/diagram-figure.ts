/**
 * The figure model of a bifurcation diagram of the real slice: the density
 * image as the plate, the parameter r along the bottom, the state x at the
 * left, and for the logistic family the quadratic family's c along the top
 * (c = r (2 - r) / 4, docs/methods.md E1, conjugacy.ts; c falls as r grows on
 * r >= 1, so its ticks run right to left). Ticks at round values from
 * d3-scale as on plates (axis-ticks.ts); positions from the exact decimal
 * edges of the sheet (pixel columns span r.from .. r.to, rows x.to at the
 * top .. x.from at the bottom).
 */
import { Decimal } from 'decimal.js';
import { scaleLinear } from 'd3-scale';
import { cToR, rToC } from '../section/conjugacy.js';
import { axisTicks, printDecimal, type AxisTicks } from './axis-ticks.js';
import { MIN_TICKS, TICK_SPACING_PT, type FigureModel } from './figure-model.js';
import { figureFont } from './figure-font.js';
import { LABEL_PT } from './layout-figure.js';

export interface DiagramFigureOptions {
  readonly width: number;
  readonly height: number;
  readonly dpi: number;
  readonly parameter: string;
  readonly r: { readonly from: string; readonly to: string };
  readonly x: { readonly from: string; readonly to: string };
  /** Draw the c axis on top (the logistic family, with r.from >= 1). */
  readonly cAxis: boolean;
  readonly caption: string;
  /** Periodic windows to shade (onset to end, in the parameter) with their period, labelled at the top. */
  readonly windows?: ReadonlyArray<{ readonly from: number; readonly to: number; readonly period: number }>;
  /** Period-doubling points of the cascade to mark with a line each, labelled beside it where there is room. */
  readonly doublings?: ReadonlyArray<{ readonly at: number; readonly label: string }>;
}

function mid(a: string, b: string): { centre: string; extent: string } {
  const D = Decimal.clone({ precision: Math.max(a.length, b.length) + 20 });
  return { centre: new D(a).plus(b).div(2).toString(), extent: new D(b).minus(a).toString() };
}

/** Ticks of c along the top: round c values in the range, placed at r = 1 + sqrt(1 - 4c). */
export function cAxisTicks(from: string, to: string, pixels: number, count: number): AxisTicks {
  const D = Decimal.clone({ precision: 40 });
  const c0 = Number(rToC(to, 20));
  const c1 = Number(rToC(from, 20));
  const values = scaleLinear().domain([c0, c1]).ticks(count);
  const step = values.length > 1 ? values[1]! - values[0]! : Math.abs(c1 - c0);
  const decimals = Math.max(0, -Math.floor(Math.log10(step) + 1e-9));
  const r0 = new D(from);
  const extent = new D(to).minus(from);
  const ticks = values.map((t) => {
    const v = new D(t).toDecimalPlaces(decimals);
    const r = new D(cToR(v.toFixed(decimals), 30));
    return { value: v.toFixed(decimals), label: printDecimal(v, decimals), at: r.minus(r0).div(extent).times(pixels).toNumber() };
  });
  return { title: 'c = r(2 \u2212 r)/4', offset: null, ticks: ticks.filter((t) => t.at >= 0 && t.at <= pixels).sort((a, b) => a.at - b.at) };
}

export function diagramFigureModel(o: DiagramFigureOptions): FigureModel {
  const widthPt = (o.width / o.dpi) * 72;
  const heightPt = (o.height / o.dpi) * 72;
  const r = mid(o.r.from, o.r.to);
  const x = mid(o.x.from, o.x.to);
  const countW = Math.max(MIN_TICKS, Math.round(widthPt / TICK_SPACING_PT));
  const countH = Math.max(MIN_TICKS, Math.round(heightPt / TICK_SPACING_PT));
  const re = axisTicks(o.parameter, r.centre, r.extent, o.width, countW, false);
  const im = axisTicks('x', x.centre, x.extent, o.height, countH, true);
  const top = o.cAxis ? cAxisTicks(o.r.from, o.r.to, o.width, countW) : null;
  // the view only carries the page's pixel size and the plot's centre here (layout-figure.ts reads width and height)
  const view = { centerRe: r.centre, centerIm: x.centre, span: r.extent, width: o.width, height: o.height, rotation: 0 };
  const r0 = Number(o.r.from);
  const r1 = Number(o.r.to);
  const px = (v: number): number => ((v - r0) / (r1 - r0)) * o.width;
  const bands = (o.windows ?? []).map((w) => ({ x0: px(w.from), x1: px(w.to) }));
  // window labels just below the top edge: half the label's box (capitals and 1.2 pt backing, layout-figure.ts) and 1.5 pt more
  const labelY = (((figureFont().capHeight * LABEL_PT) / 2 + 1.2 + 1.5) / 72) * o.dpi;
  const marks = (o.windows ?? []).map((w) => ({ kind: 'window', label: String(w.period), x: px((w.from + w.to) / 2), y: labelY }));
  const curves = (o.doublings ?? [])
    .filter((d) => d.at >= Math.min(r0, r1) && d.at <= Math.max(r0, r1))
    .map((d) => ({ kind: 'cascade', label: d.label, points: verticalLine(px(d.at), o.height) }));
  return { view, axes: { re, im, ...(top === null ? {} : { top }) }, caption: o.caption, curves, marks, scaleBar: null, points: [], legend: [], bands };
}

/** A vertical line at x from the bottom edge up, in 32 pieces (the label goes beside one of its points, the lowest with room). */
function verticalLine(x: number, height: number): Float64Array {
  const pts = new Float64Array(66);
  for (let k = 0; k <= 32; k += 1) {
    pts[2 * k] = x;
    pts[2 * k + 1] = height * (1 - k / 32);
  }
  return pts;
}
