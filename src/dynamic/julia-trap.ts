import type { JuliaCycle } from './julia-cycle.js';
import { createJuliaSampleSet, sampleJulia, type JuliaTrap } from './sample-julia.js';

/** Iterations allowed for placing the critical point in its class (parabolic orbits are slow). */
const CRITICAL_ITERATIONS = 10_000_000;

/**
 * The kernel's trap data for a cycle, with the class offset chosen so that
 * the critical point 0 lies in class 0 (its orbit is attracted by the cycle
 * by construction, Fatou; see julia-cycle.ts).
 */
export function juliaTrap(cycle: JuliaCycle, cRe: number, cIm: number, escapeRadius: number): JuliaTrap {
  const base: JuliaTrap = {
    kind: cycle.kind,
    basinPeriod: cycle.basinPeriod,
    w0Re: cycle.pointsRe[0] ?? 0,
    w0Im: cycle.pointsIm[0] ?? 0,
    trapRadius: cycle.trapRadius,
    trapContraction: cycle.trapContraction,
    petals: cycle.petals,
    classOffset: 0,
  };
  if (cycle.kind === 'none' || cycle.kind === 'siegel') return base;
  const out = createJuliaSampleSet(1);
  sampleJulia(new Float64Array([0]), new Float64Array([0]), 1, { cRe, cIm, maxIterations: CRITICAL_ITERATIONS, escapeRadius }, base, out);
  const cls = out.basin[0]!;
  if (cls < 0) return base;
  const P = cycle.basinPeriod;
  return { ...base, classOffset: (P - cls) % P };
}
