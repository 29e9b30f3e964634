/**
 * The per-plate part of the deep arithmetic (issue: plates beyond double
 * precision), prepared once on the main thread and shared with every worker:
 * the reference orbit in BigInt fixed point, the bilinear-approximation table
 * and the geometry that turns a pixel coordinate into an offset from the
 * reference (see src/plane/deep/sample-deep.ts for the method and its sources).
 *
 * Everything a pixel needs is fixed here per plate, so a pixel's bytes do not
 * depend on tiling or worker count.
 */
import { Decimal } from 'decimal.js';
import { buildBlaTable, shareBlaTable, type BlaTable } from './bla-table.js';
import type { DeepGeometry } from './offsets.js';
import { computeReferenceOrbit, referenceOffset, shareReferenceOrbit, type ReferenceOrbit } from '../../precise/reference-orbit.js';
import { rotationCosSin } from '../rotation.js';

export interface DeepJob {
  readonly reference: ReferenceOrbit;
  readonly bla: BlaTable | null;
  readonly geometry: DeepGeometry;
  /** Offsets and distances are in units of 2^unitExponent. */
  readonly unitExponent: number;
  /** Pixel spacing in those units (for distance shading). */
  readonly spacingUnits: number;
}

export interface DeepView {
  readonly re: string;
  readonly im: string;
  readonly span: string;
  readonly rotation: number;
  readonly width: number;
  readonly height: number;
}

export interface DeepPrepared {
  readonly job: DeepJob;
  readonly referenceSeconds: number;
  readonly tableSeconds: number;
}

/** x 2^-U as a double, from an exact decimal (keeps spans like 1e-1000 representable as offsets). */
function scaled(text: Decimal, unitExponent: number): number {
  return text.times(new Decimal(2).pow(-unitExponent)).toNumber();
}

/**
 * Builds the deep job for a view: the reference point is `reference` (a
 * nucleus, with its period, for a periodic reference) or else the view centre.
 */
export function prepareDeepJob(
  view: DeepView,
  bits: number,
  unitExponent: number,
  iterations: number,
  escapeRadius: number,
  skip: boolean,
  reference?: { readonly re: string; readonly im: string; readonly period: number },
): DeepPrepared {
  const D = Decimal.clone({ precision: 40, toExpNeg: -9e15, toExpPos: 9e15, minE: -9e15, maxE: 9e15 });
  const t0 = performance.now();
  const centre = reference ?? { re: view.re, im: view.im };
  const orbit = computeReferenceOrbit(
    { re: centre.re, im: centre.im },
    bits,
    reference === undefined ? iterations : Math.min(iterations, reference.period),
    { escapeRadius, ...(reference === undefined ? {} : { period: reference.period }) },
  );
  const t1 = performance.now();
  // Offset of the view centre from the reference (exact, 0 when the reference is the centre).
  const centreOffset = referenceOffset(orbit, { re: view.re, im: view.im }, unitExponent);
  const spacing = scaled(new D(view.span).div(view.width), unitExponent);
  const { cos, sin } = rotationCosSin(view.rotation);
  // Pixel (0, 0) centre relative to the view centre: u = (0.5 - W/2) s, v = (H/2 - 0.5) s.
  const u0 = (0.5 - view.width / 2) * spacing;
  const v0 = (view.height / 2 - 0.5) * spacing;
  const geometry: DeepGeometry = {
    originRe: centreOffset.re + (u0 * cos - v0 * sin),
    originIm: centreOffset.im + (u0 * sin + v0 * cos),
    stepXRe: spacing * cos,
    stepXIm: spacing * sin,
    stepYRe: spacing * sin,
    stepYIm: -spacing * cos,
  };
  // The largest offset component over the plate (its corners, one pixel beyond for the refinement apron).
  let deltaMax = 0;
  for (const [x, y] of [[-1.5, -1.5], [view.width + 0.5, -1.5], [-1.5, view.height + 0.5], [view.width + 0.5, view.height + 0.5]] as const) {
    const re = geometry.originRe + x * geometry.stepXRe + y * geometry.stepYRe;
    const im = geometry.originIm + x * geometry.stepXIm + y * geometry.stepYIm;
    deltaMax = Math.max(deltaMax, Math.abs(re), Math.abs(im));
  }
  const bla = skip ? shareBlaTable(buildBlaTable(orbit, unitExponent, deltaMax)) : null;
  const t2 = performance.now();
  return {
    job: { reference: shareReferenceOrbit(orbit), bla, geometry, unitExponent, spacingUnits: spacing },
    referenceSeconds: (t1 - t0) / 1000,
    tableSeconds: (t2 - t1) / 1000,
  };
}
