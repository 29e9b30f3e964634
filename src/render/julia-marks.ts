import { hexToLinear } from '../colour/oklab.js';
import type { Stroke } from '../colour/paint-strokes.js';
import { criticalOrbit } from '../dynamic/critical-orbit.js';
import { dynamicRay, rayAngle, DEFAULT_RAY_OPTIONS } from '../dynamic/dynamic-ray.js';
import { fixedPoints } from '../dynamic/fixed-points.js';
import { rayLanding } from '../dynamic/ray-landing.js';
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

/** The marks of a Julia sheet in z (doubles), before any drawing: for the plate's strokes and the figure's vector annotations alike. */
export interface JuliaMarkPoints {
  /** Each ray from radius R inward, z values (re, im, ...), ending at its landing point where Newton found it. */
  readonly rays: ReadonlyArray<{ readonly angle: string; readonly points: readonly number[] }>;
  /** The critical orbit's first points (re, im, ...), or null. */
  readonly orbit: readonly number[] | null;
  /** The cycle's points (re, im, ...), or null when not asked for (or no cycle). */
  readonly cycle: readonly number[] | null;
  readonly fixedPoints: { readonly alpha: readonly [number, number]; readonly beta: readonly [number, number] } | null;
  /** What is marked, in z, for the summary. */
  readonly record: Record<string, unknown>;
}

/** Mark colours (sRGB hex), shared by plates and figures. */
export const JULIA_MARK_COLOURS = { ink: INK, orbit: ORBIT, cycle: CYCLE, alpha: ALPHA, beta: BETA, ray: RAY } as const;

/** Computes the marks of a Julia sheet in z: rays traced to RAY_DEPTH levels, the critical orbit, the cycle, the fixed points. */
export function juliaMarkPoints(marks: JuliaMarks, cRe: number, cIm: number, cycle: JuliaCycle): JuliaMarkPoints {
  const record: Record<string, unknown> = {};
  const rays: Array<{ angle: string; points: number[] }> = [];
  if (marks.rays.length > 0) {
    const summary: Array<{ angle: string; end: { re: number; im: number }; landing: { re: number; im: number } | null; points: number }> = [];
    for (const text of marks.rays) {
      const [num, den] = rayAngle(text)!;
      const zs = dynamicRay(cRe, cIm, num, den, { ...DEFAULT_RAY_OPTIONS, depth: RAY_DEPTH });
      // finished at its landing point where Newton finds it (the trace alone may stop short of a weakly repelling point)
      const landing = rayLanding(cRe, cIm, num, den, zs, DEFAULT_RAY_OPTIONS.sharpness);
      rays.push({ angle: `${num}/${den}`, points: landing === null ? zs : [...zs, ...landing] });
      summary.push({
        angle: `${num}/${den}`,
        end: { re: zs[zs.length - 2]!, im: zs[zs.length - 1]! },
        landing: landing === null ? null : { re: landing[0], im: landing[1] },
        points: zs.length / 2,
      });
    }
    record['rays'] = summary;
  }
  let orbit: number[] | null = null;
  if (marks.orbit > 0) {
    orbit = criticalOrbit(cRe, cIm, marks.orbit);
    record['orbit'] = { points: orbit.length / 2, last: { re: orbit[orbit.length - 2], im: orbit[orbit.length - 1] } };
  }
  let cyclePoints: number[] | null = null;
  if (marks.cycle && cycle.pointsRe.length > 0) {
    cyclePoints = cycle.pointsRe.flatMap((re, j) => [re, cycle.pointsIm[j]!]);
    record['cycle'] = cycle.pointsRe.length;
  }
  let fixed: JuliaMarkPoints['fixedPoints'] = null;
  if (marks.fixedPoints) {
    const f = fixedPoints(cRe, cIm);
    fixed = { alpha: [f.alphaRe, f.alphaIm], beta: [f.betaRe, f.betaIm] };
    record['fixedPoints'] = { alpha: { re: f.alphaRe, im: f.alphaIm, colour: ALPHA }, beta: { re: f.betaRe, im: f.betaIm, colour: BETA } };
  }
  return { rays, orbit, cycle: cyclePoints, fixedPoints: fixed, record };
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
  const ink = colour(INK);
  const at = juliaMarkPoints(marks, cRe, cIm, cycle);
  const ringed = (re: number, im: number, radiusMm: number, fill: string): void => {
    const [x, y] = cToPixel(grid, re, im);
    strokes.push({ shape: 'disc', points: [x, y], size: radiusMm * mm + 0.18 * mm, colour: ink, alpha: 1 });
    strokes.push({ shape: 'disc', points: [x, y], size: radiusMm * mm, colour: colour(fill), alpha: 1 });
  };
  for (const ray of at.rays) {
    const px = toPixels(grid, ray.points);
    strokes.push({ shape: 'line', points: px, size: 0.55 * mm, colour: ink, alpha: 0.8 });
    strokes.push({ shape: 'line', points: px, size: 0.3 * mm, colour: colour(RAY), alpha: 1 });
  }
  if (at.orbit !== null) {
    const zs = at.orbit;
    strokes.push({ shape: 'line', points: toPixels(grid, zs), size: 0.18 * mm, colour: colour(ORBIT), alpha: 0.7 });
    for (let i = 0; i + 1 < zs.length; i += 2) ringed(zs[i]!, zs[i + 1]!, 0.45, ORBIT);
  }
  if (at.cycle !== null) {
    for (let j = 0; j + 1 < at.cycle.length; j += 2) {
      const [x, y] = cToPixel(grid, at.cycle[j]!, at.cycle[j + 1]!);
      strokes.push({ shape: 'ring', points: [x, y, 1.1 * mm], size: 0.55 * mm, colour: ink, alpha: 1 });
      strokes.push({ shape: 'ring', points: [x, y, 1.1 * mm], size: 0.28 * mm, colour: colour(CYCLE), alpha: 1 });
    }
  }
  if (at.fixedPoints !== null) {
    ringed(at.fixedPoints.alpha[0], at.fixedPoints.alpha[1], 0.7, ALPHA);
    ringed(at.fixedPoints.beta[0], at.fixedPoints.beta[1], 0.7, BETA);
  }
  return { strokes, record: at.record };
}
