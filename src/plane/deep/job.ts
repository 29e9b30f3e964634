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
import {
  extendReferenceOrbit,
  orbitBytes,
  orbitSnapshot,
  referenceOffset,
  shareReferenceOrbit,
  startReferenceOrbit,
  type ReferenceBuilder,
  type ReferenceOrbit,
} from '../../precise/reference-orbit.js';
import { rotationCosSin } from '../rotation.js';
import { Received, UserError } from '../../check/user-error.js';

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
  /** What the orbit and table hold: iterates stored and bytes. */
  readonly memory: DeepMemory;
}

export interface DeepMemory {
  readonly referenceIterates: number;
  readonly referenceBytes: number;
  readonly tableBytes: number;
}

/** x 2^-U as a double, from an exact decimal (keeps spans like 1e-1000 representable as offsets). */
function scaled(text: Decimal, unitExponent: number): number {
  return text.times(new Decimal(2).pow(-unitExponent)).toNumber();
}

/** A view's pixel geometry around a reference point, in tile units 2^unitExponent. */
export interface DeepFrame {
  readonly geometry: DeepGeometry;
  /** Pixel spacing in tile units. */
  readonly spacing: number;
  /** The largest offset component over the plate and one pixel beyond (the refinement apron). */
  readonly deltaMax: number;
}

/**
 * The geometry of `view` around the reference point `centre` (decimal
 * strings), resolved at `bits` fractional bits: pixel (0, 0)'s offset, the
 * steps, and the largest offset (for the table's validity radii).
 */
export function deepFrame(view: DeepView, centre: { readonly re: string; readonly im: string }, bits: number, unitExponent: number): DeepFrame {
  const D = Decimal.clone({ precision: 40, toExpNeg: -9e15, toExpPos: 9e15, minE: -9e15, maxE: 9e15 });
  // Offset of the view centre from the reference (exact, 0 when the reference is the centre).
  const centreOffset = referenceOffset({ centreRe: centre.re, centreIm: centre.im, bits }, { re: view.re, im: view.im }, unitExponent);
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
  let deltaMax = 0;
  for (const [x, y] of [
    [-1.5, -1.5],
    [view.width + 0.5, -1.5],
    [-1.5, view.height + 0.5],
    [view.width + 0.5, view.height + 0.5],
  ] as const) {
    const re = geometry.originRe + x * geometry.stepXRe + y * geometry.stepYRe;
    const im = geometry.originIm + x * geometry.stepXIm + y * geometry.stepYIm;
    deltaMax = Math.max(deltaMax, Math.abs(re), Math.abs(im));
  }
  return { geometry, spacing, deltaMax };
}

/** The reference point of a deep view: a nucleus with its period, or the view centre. */
export type DeepReference = { readonly re: string; readonly im: string; readonly period: number } | undefined;

/** A builder for the reference orbit of a view: one cycle of the nucleus, or the centre's orbit. */
export function startViewReference(view: DeepView, bits: number, escapeRadius: number, reference: DeepReference): ReferenceBuilder {
  const centre = reference ?? { re: view.re, im: view.im };
  return startReferenceOrbit({ re: centre.re, im: centre.im }, bits, { escapeRadius, ...(reference === undefined ? {} : { period: reference.period }) });
}

/**
 * A periodic reference must be a nucleus: the kernel rebases at m = p
 * (docs/methods.md B3), indexing one stored cycle modulo the period, which is
 * exact when Z_p = 0 and loses the pixel's digits when |Z_p| is of order 1.
 * 2^-64 is the lenient side of that (the deep path's fewest bits); nuclei
 * from `quadatlas locate` give |Z_p| below 1e-50 at the spans they are
 * used for. Throws a UserError once the cycle is computed; else does nothing.
 */
export function checkNucleus(b: ReferenceBuilder): void {
  if (b.period === 0 || b.escaped || b.length < b.period) {
    if (b.period > 0 && b.escaped)
      throw new UserError('reference', `a nucleus of period ${b.period} (its orbit of 0 returns to 0)`, new Received(`an orbit that escapes at iteration ${b.length}`));
    return;
  }
  const z = Math.hypot(b.re[b.period]!, b.im[b.period]!);
  if (!(z < NUCLEUS_TOLERANCE)) {
    throw new UserError('reference', `a nucleus of period ${b.period} (|z_${b.period}| below 2^-64 from the point given)`, new Received(`|z_${b.period}| = ${z.toPrecision(3)}`));
  }
}

const NUCLEUS_TOLERANCE = 2 ** -64;

/** Bytes held by a table's arrays. */
export function tableBytes(table: BlaTable | null): number {
  if (table === null) return 0;
  let total = 0;
  for (const v of Object.values(table)) if (ArrayBuffer.isView(v)) total += v.byteLength;
  return total;
}

/**
 * Builds the deep job for a view: the reference point is `reference` (a
 * nucleus, with its period, for a periodic reference) or else the view
 * centre. The orbit is computed to at most `iterations` (one cycle for a
 * nucleus), continuing `builder` when one is given (the probe of an `auto`
 * limit already computed its start; the iterates are the same either way).
 */
export function prepareDeepJob(
  view: DeepView,
  bits: number,
  unitExponent: number,
  iterations: number,
  escapeRadius: number,
  skip: boolean,
  reference?: DeepReference,
  builder?: ReferenceBuilder,
): DeepPrepared {
  const t0 = performance.now();
  const b = extendReferenceOrbit(builder ?? startViewReference(view, bits, escapeRadius, reference), iterations);
  checkNucleus(b);
  const orbit = orbitSnapshot(b);
  const t1 = performance.now();
  const { geometry, spacing, deltaMax } = deepFrame(view, { re: orbit.centreRe, im: orbit.centreIm }, bits, unitExponent);
  const bla = skip ? shareBlaTable(buildBlaTable(orbit, unitExponent, deltaMax)) : null;
  const t2 = performance.now();
  return {
    job: { reference: shareReferenceOrbit(orbit), bla, geometry, unitExponent, spacingUnits: spacing },
    referenceSeconds: (t1 - t0) / 1000,
    tableSeconds: (t2 - t1) / 1000,
    memory: { referenceIterates: orbit.length, referenceBytes: orbitBytes(orbit), tableBytes: tableBytes(bla) },
  };
}
