import { hexToLinear } from '../colour/oklab.js';
import type { Stroke } from '../colour/paint-strokes.js';
import { criticalOrbit } from '../dynamic/critical-orbit.js';
import { dynamicRay, rayAngle, DEFAULT_RAY_OPTIONS } from '../dynamic/dynamic-ray.js';
import { fixedPoints } from '../dynamic/fixed-points.js';
import type { JuliaCycle } from '../dynamic/julia-cycle.js';
import type { JuliaMarks } from '../view/julia-sheet.js';
import { cToPixel, type DoubleGrid } from '../view/view.js';

/** Levels a drawn ray is traced to (potential 2^-48 ln R: well below a pixel at any double-precision view). */
export const RAY_DEPTH = 48;

const INK = '#111111';
const ORBIT = '#ff8a1e';
const CYCLE = '#ffffff';
const ALPHA = '#e8364f';
const BETA = '#2f9bff';
const RAY = '#f4f1e8';

function colour(hex: string): [number, number, number] {
  const c = hexToLinear(hex, [0, 0, 0]);
  return [c[0]!, c[1]!, c[2]!];
}

function toPixels(grid: DoubleGrid, zs: readonly number[]): number[] {
  const out: number[] = [];
  for (let i = 0; i + 1 < zs.length; i += 2) out.push(...cToPixel(grid, zs[i]!, zs[i + 1]!));
  return out;
}

export interface JuliaMarkGeometry {
  readonly strokes: Stroke[];
  /** What was drawn, in z, for the summary. */
  readonly record: Record<string, unknown>;
}

/**
 * The marks of a Julia plate as strokes in plate pixels, sized in millimetres
 * at the plate's dpi (so they read alike in print at any pixel size): rays
 * first (under everything), then the critical orbit (a thin path with dots),
 * the cycle (rings) and the fixed points alpha (red) and beta (blue), each
 * outlined in dark ink so it reads on light and dark ground.
 */
export function juliaMarks(marks: JuliaMarks, grid: DoubleGrid, dpi: number, cRe: number, cIm: number, cycle: JuliaCycle): JuliaMarkGeometry {
  const mm = dpi / 25.4;
  const strokes: Stroke[] = [];
  const record: Record<string, unknown> = {};
  const ink = colour(INK);
  const ringed = (re: number, im: number, radiusMm: number, fill: string): void => {
    const [x, y] = cToPixel(grid, re, im);
    strokes.push({ shape: 'disc', points: [x, y], size: radiusMm * mm + 0.18 * mm, colour: ink, alpha: 1 });
    strokes.push({ shape: 'disc', points: [x, y], size: radiusMm * mm, colour: colour(fill), alpha: 1 });
  };
  if (marks.rays.length > 0) {
    const rays: Array<{ angle: string; end: { re: number; im: number }; points: number }> = [];
    for (const text of marks.rays) {
      const [num, den] = rayAngle(text)!;
      const zs = dynamicRay(cRe, cIm, num, den, { ...DEFAULT_RAY_OPTIONS, depth: RAY_DEPTH });
      const px = toPixels(grid, zs);
      strokes.push({ shape: 'line', points: px, size: 0.55 * mm, colour: ink, alpha: 0.8 });
      strokes.push({ shape: 'line', points: px, size: 0.3 * mm, colour: colour(RAY), alpha: 1 });
      rays.push({ angle: `${num}/${den}`, end: { re: zs[zs.length - 2]!, im: zs[zs.length - 1]! }, points: zs.length / 2 });
    }
    record['rays'] = rays;
  }
  if (marks.orbit > 0) {
    const zs = criticalOrbit(cRe, cIm, marks.orbit);
    const px = toPixels(grid, zs);
    strokes.push({ shape: 'line', points: px, size: 0.18 * mm, colour: colour(ORBIT), alpha: 0.7 });
    for (let i = 0; i + 1 < zs.length; i += 2) ringed(zs[i]!, zs[i + 1]!, 0.45, ORBIT);
    record['orbit'] = { points: zs.length / 2, last: { re: zs[zs.length - 2], im: zs[zs.length - 1] } };
  }
  if (marks.cycle && cycle.pointsRe.length > 0) {
    for (let j = 0; j < cycle.pointsRe.length; j++) {
      const [x, y] = cToPixel(grid, cycle.pointsRe[j]!, cycle.pointsIm[j]!);
      strokes.push({ shape: 'ring', points: [x, y, 1.1 * mm], size: 0.55 * mm, colour: ink, alpha: 1 });
      strokes.push({ shape: 'ring', points: [x, y, 1.1 * mm], size: 0.28 * mm, colour: colour(CYCLE), alpha: 1 });
    }
    record['cycle'] = cycle.pointsRe.length;
  }
  if (marks.fixedPoints) {
    const f = fixedPoints(cRe, cIm);
    ringed(f.alphaRe, f.alphaIm, 0.7, ALPHA);
    ringed(f.betaRe, f.betaIm, 0.7, BETA);
    record['fixedPoints'] = { alpha: { re: f.alphaRe, im: f.alphaIm, colour: ALPHA }, beta: { re: f.betaRe, im: f.betaIm, colour: BETA } };
  }
  return { strokes, record };
}
