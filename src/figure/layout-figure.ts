/**
 * Lays a figure model out on the page: the plate at its print size
 * (pixels / dpi inches), the frame and outward ticks around it, tick labels
 * centred on their ticks (Re below, Im at the left, read horizontally), the
 * axis titles (Im turned to read upwards) and the caption below, wrapped to
 * the page. Sizes follow common journal practice for a single-column figure
 * (7 pt labels, 8 pt titles, 0.5 pt lines); not a published rule.
 */
import type { FigureFont } from './figure-font.js';
import type { FigureModel } from './figure-model.js';
import type { FigureScene, Rect, SceneFill, SceneStroke, SceneText } from './figure-scene.js';
import { clipPolyline } from './clip-polyline.js';

export const LABEL_PT = 7;
export const TITLE_PT = 8;
export const CAPTION_PT = 8;
export const TICK_PT = 3.5;
export const LINE_PT = 0.5;
const PAD = 6;
const GAP = 2.5;
const INK = '#000000';
/** Rays: white over a black halo, legible over any exterior or interior colour. */
const RAY_INK = '#ffffff';
const RAY_HALO = '#000000';
export const RAY_PT = 0.75;
/** Component outlines: a thinner warm yellow, told apart from the white rays. */
export const OUTLINE_PT = 0.5;
const OUTLINE_INK = '#ffd84a';
/** Internal rays: as thin as outlines, in a pale blue told apart from both rays and outlines. */
const INTERNAL_INK = '#9ee7ff';
/** Period doublings on the real slice's diagram: thin red lines; periodic windows a pale blue shading. */
const CASCADE_INK = '#c0392b';
const BAND_INK = '#2a7fd4';
const BAND_OPACITY = 0.15;
/** A labelled point: a ring this wide (radius) in white over a black halo. */
const POINT_RADIUS_PT = 1.8;
/** Equipotentials: pale hairlines, under the rays and outlines. */
export const LEVEL_PT = 0.35;
const LEVEL_INK = '#e6eeff';
/** A Julia plate's critical orbit: a thin orange path (its points are discs, figure-model FigurePoint). */
export const ORBIT_PT = 0.4;
const ORBIT_INK = '#ff8a1e';
/** Ray labels: white on a half-transparent black backing. */
const RAY_LABEL_BACKING = 0.55;

/** The ring of a labelled point at the default radius, 16 sides (as drawn before radii were given). */
function circle16(cx: number, cy: number): number[] {
  const ring: number[] = [];
  for (let k = 0; k <= 16; k += 1) ring.push(cx + POINT_RADIUS_PT * Math.cos((k * Math.PI) / 8), cy + POINT_RADIUS_PT * Math.sin((k * Math.PI) / 8));
  return ring;
}

/** The black halo around a disc, in points beyond its radius. */
const HALO_PT = 0.5;

/** Greedy word wrap of `text` into lines no wider than `width` at `size`. */
function wrap(font: FigureFont, text: string, size: number, width: number): string[] {
  const lines: string[] = [];
  let line = '';
  for (const word of text.split(/\s+/).filter((w) => w !== '')) {
    const next = line === '' ? word : `${line} ${word}`;
    if (line !== '' && font.width(next, size) > width) {
      lines.push(line);
      line = word;
    } else line = next;
  }
  if (line !== '') lines.push(line);
  return lines;
}

export function layoutFigure(model: FigureModel, dpi: number, font: FigureFont): FigureScene {
  const { view } = model;
  const pw = (view.width / dpi) * 72;
  const ph = (view.height / dpi) * 72;
  const cap = (size: number): number => font.capHeight * size;
  let left = 0;
  let top = 0;
  let right = 0;
  let below = 0;
  const axes = model.axes;
  let imLabelWidth = 0;
  let imTitleOver = 0;
  let reTitleWidth = 0;
  if (axes !== null) {
    // A long (offset form) Im title, turned upright, may be taller than the plate: the page grows to hold it.
    imTitleOver = Math.max(0, (font.width(axes.im.title, TITLE_PT) - ph) / 2);
    reTitleWidth = font.width(axes.re.title, TITLE_PT);
    imLabelWidth = Math.max(0, ...axes.im.ticks.map((t) => font.width(t.label, LABEL_PT)));
    left = TICK_PT + GAP + imLabelWidth + 1.5 * GAP + font.descent * TITLE_PT + cap(TITLE_PT) + PAD;
    const lastRe = axes.re.ticks.at(-1);
    const overhang = lastRe === undefined ? 0 : font.width(lastRe.label, LABEL_PT) / 2 - (view.width - lastRe.at) * (pw / view.width);
    right = Math.max(PAD, overhang + 4);
    top = PAD + imTitleOver;
    if (axes.top !== undefined) top = Math.max(top, PAD + cap(TITLE_PT) + font.descent * TITLE_PT + 1.5 * GAP + cap(LABEL_PT) + font.descent * LABEL_PT + GAP + TICK_PT);
    below = TICK_PT + GAP + cap(LABEL_PT) + font.descent * LABEL_PT + 1.5 * GAP + cap(TITLE_PT) + font.descent * TITLE_PT;
  }
  const plate: Rect = { x: left, y: top, width: pw, height: ph };
  const legend = legendColumns(font, model, ph);
  if (legend !== null) right = Math.max(right, LEGEND_GAP + legend.width + PAD);
  const pageWidth = Math.max(left + pw + right, left + pw / 2 + reTitleWidth / 2 + PAD);
  const captionLines = model.caption === '' ? [] : wrap(font, model.caption, CAPTION_PT, pageWidth - 2 * PAD);
  const lineHeight = 1.25 * CAPTION_PT;
  const captionTop = top + ph + below + (captionLines.length > 0 ? 1.5 * GAP : 0);
  const pageHeight = Math.max(
    captionTop + captionLines.length * lineHeight + (axes !== null || captionLines.length > 0 ? PAD : 0),
    top + ph + imTitleOver + (axes !== null ? PAD : 0),
  );
  const strokes: SceneStroke[] = [];
  const texts: SceneText[] = [];
  const sx = pw / view.width;
  const sy = ph / view.height;
  const fills: SceneFill[] = [];
  const placed: Rect[] = [];
  const curveRuns = model.curves.map((curve) => {
    const pts: number[] = [];
    for (let i = 0; i + 1 < curve.points.length; i += 2) pts.push(plate.x + curve.points[i]! * sx, plate.y + curve.points[i + 1]! * sy);
    // Keep coordinates near the page: clip to the plate grown by a tenth (the writers clip to the plate itself).
    return clipPolyline(pts, plate.x - pw / 10, plate.y - ph / 10, plate.x + pw * 1.1, plate.y + ph * 1.1);
  });
  const allRuns = curveRuns.flat();
  for (const b of model.bands ?? []) {
    const a = Math.max(0, Math.min(b.x0, b.x1));
    const e = Math.min(view.width, Math.max(b.x0, b.x1));
    if (e > a) fills.push({ x: plate.x + a * sx, y: plate.y, width: Math.max(0.3, (e - a) * sx), height: ph, colour: BAND_INK, opacity: BAND_OPACITY });
  }
  // The scale bar first, so that no label covers it.
  const bar = model.scaleBar;
  if (bar !== null) {
    const len = bar.pixels * sx;
    const w = font.width(bar.label, LABEL_PT);
    const h = font.capHeight * LABEL_PT;
    const pad = 2;
    const boxW = Math.max(len, w) + 2 * pad;
    const boxH = h + GAP + SCALE_BAR_PT + 2 * pad;
    const box = { x: plate.x + SCALE_BAR_INSET, y: plate.y + ph - SCALE_BAR_INSET - boxH, width: boxW, height: boxH };
    if (box.x + box.width <= plate.x + pw && box.y >= plate.y) {
      placed.push(box);
      fills.push({ ...box, colour: RAY_HALO, opacity: RAY_LABEL_BACKING });
      fills.push({ x: box.x + (boxW - len) / 2, y: box.y + boxH - pad - SCALE_BAR_PT, width: len, height: SCALE_BAR_PT, colour: RAY_INK, opacity: 1 });
      texts.push({ text: bar.label, x: box.x + (boxW - w) / 2, y: box.y + pad + h, size: LABEL_PT, rotate: 0, role: 'scale-bar', colour: RAY_INK });
    }
  }
  // halos first, so a curve crossing another stays unbroken
  const widthOf = (kind: string): number =>
    kind === 'outline' || kind === 'internal-ray' || kind === 'cascade' ? OUTLINE_PT : kind === 'equipotential' ? LEVEL_PT : kind === 'orbit' ? ORBIT_PT : RAY_PT;
  const inkOf = (kind: string): string =>
    kind === 'cascade'
      ? CASCADE_INK
      : kind === 'outline'
        ? OUTLINE_INK
        : kind === 'internal-ray'
          ? INTERNAL_INK
          : kind === 'equipotential'
            ? LEVEL_INK
            : kind === 'orbit'
              ? ORBIT_INK
              : RAY_INK;
  curveRuns.forEach((runs, k) => {
    const kind = model.curves[k]!.kind;
    if (kind === 'equipotential' || kind === 'cascade') return; // hairlines need no halo
    for (const run of runs) strokes.push({ points: run, width: 2.5 * widthOf(kind), colour: RAY_HALO, clip: true });
  });
  curveRuns.forEach((runs, k) => {
    const kind = model.curves[k]!.kind;
    for (const run of runs) strokes.push({ points: run, width: widthOf(kind), colour: inkOf(kind), clip: true });
  });
  const drawnPoints: Array<{ index: number; labelled: boolean }> = [];
  for (const [index, point] of model.points.entries()) {
    const cx = plate.x + point.x * sx;
    const cy = plate.y + point.y * sy;
    if (cx < plate.x || cy < plate.y || cx > plate.x + pw || cy > plate.y + ph) continue;
    const radius = point.radius ?? POINT_RADIUS_PT;
    const circle = (r: number): number[] => {
      const ring: number[] = [];
      for (let k = 0; k <= 24; k += 1) ring.push(cx + r * Math.cos((k * Math.PI) / 12), cy + r * Math.sin((k * Math.PI) / 12));
      return ring;
    };
    if (point.shape === 'disc') {
      // a disc as a circle of half its radius stroked as wide as the radius (the writers have strokes, not filled paths)
      strokes.push({ points: circle((radius + HALO_PT) / 2), width: radius + HALO_PT, colour: RAY_HALO, clip: true });
      strokes.push({ points: circle(radius / 2), width: radius, colour: point.fill ?? RAY_INK, clip: true });
    } else {
      const ring = radius === POINT_RADIUS_PT ? circle16(cx, cy) : circle(radius);
      strokes.push({ points: ring, width: 3 * LINE_PT, colour: RAY_HALO, clip: true });
      strokes.push({ points: ring, width: 1.2 * LINE_PT, colour: RAY_INK, clip: true });
    }
    const ringBox = { x: cx - radius - 1, y: cy - radius - 1, width: 2 * radius + 2, height: 2 * radius + 2 };
    placed.push(ringBox);
    const label = point.label === '' ? null : placePointLabel(font, point.label, cx, cy, radius, plate, placed, allRuns);
    if (label !== null) {
      placed.push(label.box);
      fills.push({ ...label.box, colour: RAY_HALO, opacity: RAY_LABEL_BACKING });
      texts.push({ text: point.label, x: label.x, y: label.y, size: LABEL_PT, rotate: 0, role: 'mark', colour: RAY_INK });
    }
    drawnPoints.push({ index, labelled: label !== null });
  }
  for (const [k, curve] of model.curves.entries()) {
    const runs = curveRuns[k]!;
    const label = curve.label === '' ? null : placeRayLabel(font, curve.label, runs, plate, placed, allRuns);
    if (label !== null) {
      placed.push(label.box);
      fills.push({ ...label.box, colour: RAY_HALO, opacity: RAY_LABEL_BACKING });
      texts.push({ text: curve.label, x: label.x, y: label.y, size: LABEL_PT, rotate: 0, role: 'ray', colour: RAY_INK });
    }
  }
  // Period labels: centred on the nucleus, skipped where they would cover a curve or another label.
  const drawnMarks: number[] = [];
  for (const [m, mark] of model.marks.entries()) {
    const w = font.width(mark.label, LABEL_PT);
    const h = font.capHeight * LABEL_PT;
    const pad = 1.2;
    const cx = plate.x + mark.x * sx;
    const cy = plate.y + mark.y * sy;
    const box = { x: cx - w / 2 - pad, y: cy - h / 2 - pad, width: w + 2 * pad, height: h + 2 * pad };
    if (box.x < plate.x || box.y < plate.y || box.x + box.width > plate.x + pw || box.y + box.height > plate.y + ph) continue;
    if (placed.some((b) => overlaps(b, box)) || allRuns.some((r) => hitsRun(r, box))) continue;
    placed.push(box);
    drawnMarks.push(m);
    fills.push({ ...box, colour: RAY_HALO, opacity: RAY_LABEL_BACKING });
    texts.push({ text: mark.label, x: cx - w / 2, y: cy + h / 2, size: LABEL_PT, rotate: 0, role: mark.kind, colour: RAY_INK });
  }
  if (axes !== null) {
    const x0 = plate.x;
    const y0 = plate.y;
    const x1 = x0 + pw;
    const y1 = y0 + ph;
    strokes.push({ points: [x0, y0, x1, y0, x1, y1, x0, y1, x0, y0], width: LINE_PT, colour: INK, clip: false });
    for (const t of axes.re.ticks) {
      const x = x0 + t.at * sx;
      strokes.push({ points: [x, y1, x, y1 + TICK_PT], width: LINE_PT, colour: INK, clip: false });
      texts.push({ text: t.label, x: x - font.width(t.label, LABEL_PT) / 2, y: y1 + TICK_PT + GAP + cap(LABEL_PT), size: LABEL_PT, rotate: 0, role: 're-tick', colour: INK });
    }
    for (const t of axes.im.ticks) {
      const y = y0 + t.at * sy;
      strokes.push({ points: [x0 - TICK_PT, y, x0, y], width: LINE_PT, colour: INK, clip: false });
      texts.push({ text: t.label, x: x0 - TICK_PT - GAP - font.width(t.label, LABEL_PT), y: y + cap(LABEL_PT) / 2, size: LABEL_PT, rotate: 0, role: 'im-tick', colour: INK });
    }
    if (axes.top !== undefined) {
      for (const t of axes.top.ticks) {
        const x = x0 + t.at * sx;
        strokes.push({ points: [x, y0, x, y0 - TICK_PT], width: LINE_PT, colour: INK, clip: false });
        texts.push({
          text: t.label,
          x: x - font.width(t.label, LABEL_PT) / 2,
          y: y0 - TICK_PT - GAP - font.descent * LABEL_PT,
          size: LABEL_PT,
          rotate: 0,
          role: 'top-tick',
          colour: INK,
        });
      }
      const topTitleY = y0 - TICK_PT - GAP - font.descent * LABEL_PT - cap(LABEL_PT) - 1.5 * GAP - font.descent * TITLE_PT;
      texts.push({ text: axes.top.title, x: x0 + pw / 2 - font.width(axes.top.title, TITLE_PT) / 2, y: topTitleY, size: TITLE_PT, rotate: 0, role: 'title', colour: INK });
    }
    const reTitleY = y1 + TICK_PT + GAP + cap(LABEL_PT) + font.descent * LABEL_PT + 1.5 * GAP + cap(TITLE_PT);
    texts.push({ text: axes.re.title, x: x0 + pw / 2 - font.width(axes.re.title, TITLE_PT) / 2, y: reTitleY, size: TITLE_PT, rotate: 0, role: 'title', colour: INK });
    const imTitleX = x0 - TICK_PT - GAP - imLabelWidth - 1.5 * GAP - font.descent * TITLE_PT;
    // Turned to read upwards, the text runs from the bottom: its start sits below the middle by half its length.
    texts.push({ text: axes.im.title, x: imTitleX, y: y0 + ph / 2 + font.width(axes.im.title, TITLE_PT) / 2, size: TITLE_PT, rotate: -90, role: 'title', colour: INK });
  }
  if (legend !== null) {
    const x0 = plate.x + pw + LEGEND_GAP;
    texts.push({ text: LEGEND_HEADING, x: x0, y: plate.y + cap(TITLE_PT), size: TITLE_PT, rotate: 0, role: 'legend-title', colour: INK });
    legend.rows.forEach((entry, i) => {
      const column = Math.floor(i / legend.perColumn);
      const row = i % legend.perColumn;
      const x = x0 + column * legend.columnWidth;
      const y = plate.y + legend.headingHeight + row * LEGEND_ROW_PT;
      fills.push({ x, y, width: LEGEND_SWATCH_PT, height: LEGEND_SWATCH_PT, colour: entry.colour, opacity: 1 });
      strokes.push({
        points: [x, y, x + LEGEND_SWATCH_PT, y, x + LEGEND_SWATCH_PT, y + LEGEND_SWATCH_PT, x, y + LEGEND_SWATCH_PT, x, y],
        width: LEGEND_SWATCH_LINE_PT,
        colour: INK,
        clip: false,
      });
      texts.push({
        text: String(entry.period),
        x: x + LEGEND_SWATCH_PT + GAP,
        y: y + LEGEND_SWATCH_PT / 2 + cap(LABEL_PT) / 2,
        size: LABEL_PT,
        rotate: 0,
        role: 'legend',
        colour: INK,
      });
    });
  }
  captionLines.forEach((line, i) => {
    texts.push({ text: line, x: PAD, y: captionTop + cap(CAPTION_PT) + i * lineHeight, size: CAPTION_PT, rotate: 0, role: 'caption', colour: INK });
  });
  return { width: pageWidth, height: pageHeight, plate, strokes, fills, texts, drawnMarks, drawnPoints };
}

/** The legend's heading: the legend lists the interior periods present in the plate. */
export const LEGEND_HEADING = 'Period';
const LEGEND_GAP = 10;
const LEGEND_SWATCH_PT = 6;
const LEGEND_SWATCH_LINE_PT = 0.25;
const LEGEND_ROW_PT = 9;
/** The scale bar: a white bar this thick, its label above it, on a backing in the plate's lower left corner. */
const SCALE_BAR_PT = 1.5;
const SCALE_BAR_INSET = 6;

/**
 * The legend beside the frame in columns of rows (swatch, period) as tall
 * as the plate holds, top aligned with the plate; null for no legend.
 */
function legendColumns(
  font: FigureFont,
  model: FigureModel,
  plateHeight: number,
): { rows: FigureModel['legend']; perColumn: number; columnWidth: number; width: number; headingHeight: number } | null {
  if (model.legend.length === 0) return null;
  const headingHeight = font.capHeight * TITLE_PT + font.descent * TITLE_PT + GAP;
  const perColumn = Math.max(1, Math.floor((plateHeight - headingHeight) / LEGEND_ROW_PT));
  const widest = Math.max(...model.legend.map((e) => font.width(String(e.period), LABEL_PT)));
  const columnWidth = LEGEND_SWATCH_PT + GAP + widest + 2 * GAP;
  const columns = Math.ceil(model.legend.length / perColumn);
  const width = Math.max(font.width(LEGEND_HEADING, TITLE_PT), columns * columnWidth - 2 * GAP);
  return { rows: model.legend, perColumn, columnWidth, width, headingHeight };
}

function overlaps(a: Rect, b: Rect): boolean {
  return a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;
}

/** Whether segment (ax, ay)-(bx, by) meets rectangle r (Liang-Barsky on the one segment). */
function segmentMeets(ax: number, ay: number, bx: number, by: number, r: Rect): boolean {
  return clipPolyline([ax, ay, bx, by], r.x, r.y, r.x + r.width, r.y + r.height).length > 0;
}

/**
 * Where a ray's label goes: beside a point of the ray, a little to one side
 * of it (left of the inward direction first, then right), trying the points
 * from outside inwards, at the first place where the box lies inside the
 * plate and covers neither another label nor any ray; null when there is
 * no such place.
 */
function placeRayLabel(
  font: FigureFont,
  text: string,
  runs: readonly number[][],
  plate: Rect,
  placed: readonly Rect[],
  allRuns: readonly number[][],
): { x: number; y: number; box: Rect } | null {
  const w = font.width(text, LABEL_PT);
  const h = font.capHeight * LABEL_PT;
  const pad = 1.2;
  const inset = 2;
  const gap = 2.5;
  const bw = w + 2 * pad;
  const bh = h + 2 * pad;
  for (const run of runs) {
    let travelled = 0;
    for (let i = 2; i + 1 < run.length; i += 2) {
      const px = run[i]!;
      const py = run[i + 1]!;
      const dx = px - run[i - 2]!;
      const dy = py - run[i - 1]!;
      const len = Math.hypot(dx, dy);
      travelled += len;
      if (len === 0 || travelled < 4) continue;
      if (px < plate.x + inset || px > plate.x + plate.width - inset || py < plate.y + inset || py > plate.y + plate.height - inset) continue;
      for (const side of [1, -1]) {
        // unit normal to the left (side 1) or right (side -1) of the inward direction, in a y-down page
        const nx = (side * dy) / len;
        const ny = (-side * dx) / len;
        // the box's centre sits off the ray by the gap plus the box's half extent along the normal
        const reach = gap + Math.abs(nx) * (bw / 2) + Math.abs(ny) * (bh / 2);
        const box = { x: px + nx * reach - bw / 2, y: py + ny * reach - bh / 2, width: bw, height: bh };
        if (box.x < plate.x + inset || box.y < plate.y + inset || box.x + bw > plate.x + plate.width - inset || box.y + bh > plate.y + plate.height - inset) continue;
        if (placed.some((b) => overlaps(b, box))) continue;
        if (allRuns.some((r) => hitsRun(r, box))) continue;
        return { x: box.x + pad, y: box.y + pad + h, box };
      }
    }
  }
  return null;
}

/** Where a point's label goes: right of the ring, then left, above, below, then the four diagonals; null when none of those is free. */
function placePointLabel(
  font: FigureFont,
  text: string,
  cx: number,
  cy: number,
  radius: number,
  plate: Rect,
  placed: readonly Rect[],
  allRuns: readonly number[][],
): { x: number; y: number; box: Rect } | null {
  const w = font.width(text, LABEL_PT);
  const h = font.capHeight * LABEL_PT;
  const pad = 1.2;
  const bw = w + 2 * pad;
  const bh = h + 2 * pad;
  const off = radius + 2;
  const candidates = [
    { x: cx + off, y: cy - bh / 2 },
    { x: cx - off - bw, y: cy - bh / 2 },
    { x: cx - bw / 2, y: cy - off - bh },
    { x: cx - bw / 2, y: cy + off },
    // then the diagonals, for a point where curves cross (a Julia plate's alpha, with its rays and the orbit)
    // (the box's corner off the ring's box by the same gap both ways)
    { x: cx + off - 1, y: cy - off + 1 - bh },
    { x: cx - off + 1 - bw, y: cy - off + 1 - bh },
    { x: cx + off - 1, y: cy + off - 1 },
    { x: cx - off + 1 - bw, y: cy + off - 1 },
  ];
  for (const c of candidates) {
    const box = { x: c.x, y: c.y, width: bw, height: bh };
    if (box.x < plate.x || box.y < plate.y || box.x + bw > plate.x + plate.width || box.y + bh > plate.y + plate.height) continue;
    if (placed.some((b) => overlaps(b, box))) continue;
    if (allRuns.some((r) => hitsRun(r, box))) continue;
    return { x: box.x + pad, y: box.y + pad + h, box };
  }
  return null;
}

function hitsRun(run: readonly number[], box: Rect): boolean {
  for (let i = 0; i + 3 < run.length; i += 2) if (segmentMeets(run[i]!, run[i + 1]!, run[i + 2]!, run[i + 3]!, box)) return true;
  return false;
}
