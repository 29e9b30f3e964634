import type { Stroke } from '../colour/paint-strokes.js';
import type { BasinStyle } from '../colour/shade-julia.js';
import type { JuliaTrap } from '../dynamic/sample-julia.js';
import type { JuliaReferences } from '../dynamic/sample-julia-deep.js';

/**
 * What a tile worker needs, beyond the plate job, to render the dynamical
 * plane of one c: plain data (structured-cloned once). The plate's grid is
 * then a grid in z.
 */
export interface JuliaJob {
  readonly cRe: number;
  readonly cIm: number;
  readonly trap: JuliaTrap;
  readonly basin: BasinStyle;
  /** Marks (orbit, cycle, fixed points, rays) in plate pixels, painted over the plate. */
  readonly strokes: readonly Stroke[];
  /** Deep views: the reference orbits of the centre and of the critical point; samples are then offsets from the centre. */
  readonly deep?: JuliaReferences;
}
