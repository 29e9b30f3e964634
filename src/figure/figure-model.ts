/**
 * What a figure shows, in c coordinates and plate pixels, before any page
 * layout: the view, its two axes (ticks from axis-ticks.ts), the caption,
 * and the annotation curves (rays). Writers never see c; layout.ts maps the
 * model onto the page.
 */
import { Decimal } from 'decimal.js';
import type { View } from '../view/view.js';
import { periodHex } from '../colour/period-palette.js';
import { axisTicks, offsetExponentFor, PLAIN_DIGITS, type AxisTicks } from './axis-ticks.js';

export interface FigureOptions {
  /** Frame, ticks, tick labels and axis titles outside the image. */
  readonly axes: boolean;
  /** Text drawn below the figure ('' for none). */
  readonly caption: string;
  /** A bar of a round length in c inside the plate's lower left corner, labelled with that length. */
  readonly scaleBar?: boolean;
  /** Periods to list in a legend beside the frame (swatch and number each), [] for none. */
  readonly legendPeriods?: readonly number[];
  /** The plane's variable in the axis titles: 'c' (default) for the parameter plane, 'z' for the dynamical plane. */
  readonly variable?: 'c' | 'z';
}

/** A bar of `length` (c units, a decimal string) that is `pixels` plate pixels long. */
export interface ScaleBar {
  readonly length: string;
  readonly label: string;
  readonly pixels: number;
}

/** One row of the period legend beside the frame. */
export interface LegendEntry {
  readonly period: number;
  /** The period's colour from the palette, '#rrggbb'. */
  readonly colour: string;
}

/** A curve of the figure in continuous plate pixel coordinates (x right, y down), with its label. */
export interface FigureCurve {
  readonly kind: string;
  readonly label: string;
  /** x0, y0, x1, y1, ... in plate pixels; the layout clips it to the image. */
  readonly points: Float64Array;
}

/** A labelled point of the figure (a nucleus and its period), in continuous plate pixels. */
export interface FigureMark {
  readonly kind: string;
  readonly label: string;
  readonly x: number;
  readonly y: number;
}

/**
 * A point from the sheet's marks, in continuous plate pixels: a ring at the
 * point (or a disc), its label beside it ('' for none).
 */
export interface FigurePoint {
  readonly label: string;
  readonly x: number;
  readonly y: number;
  /** 'ring' (default): a white ring over a black halo; 'disc': a disc filled with `fill` over a black halo. */
  readonly shape?: 'ring' | 'disc';
  /** The disc's fill, '#rrggbb'. */
  readonly fill?: string;
  /** Radius in points (default POINT_RADIUS_PT of layout-figure.ts). */
  readonly radius?: number;
}

export interface FigureModel {
  readonly view: View;
  /** re along the bottom, im at the left, and an optional second scale along the top (the real slice's c). */
  readonly axes: { readonly re: AxisTicks; readonly im: AxisTicks; readonly top?: AxisTicks } | null;
  readonly caption: string;
  readonly curves: readonly FigureCurve[];
  /** Placed after the curves' labels, each only where it covers no curve and no other label. */
  readonly marks: readonly FigureMark[];
  readonly scaleBar: ScaleBar | null;
  /** Labelled points, placed before every other label. */
  readonly points: readonly FigurePoint[];
  /** Empty for no legend. */
  readonly legend: readonly LegendEntry[];
  /** Shaded spans across the plate (the real slice's periodic windows), in plate pixels along x; optional. */
  readonly bands?: ReadonlyArray<{ readonly x0: number; readonly x1: number }>;
}

/** One tick per this many points of axis length, at most (d3's count is a hint). */
export const TICK_SPACING_PT = 55;
/** d3's count hint never below this, so a small plate still gets four or more ticks an axis (d3 may give one fewer). */
export const MIN_TICKS = 5;

/**
 * The model of a figure of `view` printed at `dpi`. Axes need a view
 * without rotation: their ticks run along Re c and Im c.
 */
export function figureModel(
  view: View,
  dpi: number,
  options: FigureOptions,
  curves: readonly FigureCurve[] = [],
  marks: readonly FigureMark[] = [],
  points: readonly FigurePoint[] = [],
): FigureModel {
  let axes: FigureModel['axes'] = null;
  if (options.axes) {
    if (view.rotation !== 0) throw new Error('figureModel: axes need a view without rotation');
    const widthPt = (view.width / dpi) * 72;
    const heightPt = (view.height / dpi) * 72;
    const spanIm = spanOf(view.span, view.height, view.width);
    const exponent = offsetExponentFor(view.width >= view.height ? view.span : spanIm);
    const variable = options.variable ?? 'c';
    axes = {
      re: axisTicks(`Re ${variable}`, view.centerRe, view.span, view.width, Math.max(MIN_TICKS, Math.round(widthPt / TICK_SPACING_PT)), false, exponent),
      im: axisTicks(`Im ${variable}`, view.centerIm, spanIm, view.height, Math.max(MIN_TICKS, Math.round(heightPt / TICK_SPACING_PT)), true, exponent),
    };
  }
  const scaleBar = options.scaleBar === true ? scaleBarFor(view.span, view.width) : null;
  const legend = (options.legendPeriods ?? []).map((period) => ({ period, colour: periodHex(period) }));
  return { view, axes, caption: options.caption, curves, marks, scaleBar, points, legend };
}

/** A scale bar covers at most this fraction of the plate's width. */
export const SCALE_BAR_FRACTION = 0.25;

/**
 * The scale bar of a view `span` wide over `width` pixels: the largest
 * length 1, 2 or 5 times a power of ten not above SCALE_BAR_FRACTION of the
 * span, its pixel length from the exact decimal span. Labelled as a plain
 * decimal when that takes at most PLAIN_DIGITS digits, else as "2e−12".
 */
export function scaleBarFor(span: string, width: number): ScaleBar {
  const D = Decimal.clone({ precision: span.length + 40 });
  const target = new D(span).times(SCALE_BAR_FRACTION);
  const e = target.log(10).floor().toNumber();
  const unit = new D(10).pow(e);
  const mantissa = [5, 2, 1].find((m) => unit.times(m).lte(target)) ?? 1;
  const length = unit.times(mantissa);
  const decimals = Math.max(0, -e);
  const label = decimals + Math.max(1, e + 1) <= PLAIN_DIGITS ? length.toFixed(decimals) : `${mantissa}e${e < 0 ? '\u2212' : ''}${Math.abs(e)}`;
  return { length: length.toFixed(), label, pixels: length.div(span).times(width).toNumber() };
}

/** The extent of `pixels` pixels at span/width per pixel, as a decimal string (40 digits beyond the span's). */
function spanOf(span: string, pixels: number, width: number): string {
  const D = Decimal.clone({ precision: span.length + 40 });
  return new D(span).times(pixels).div(width).toString();
}
