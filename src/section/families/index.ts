/**
 * The unimodal families the section commands know, by command-line name.
 *
 * Adding a family: write one module beside these exporting a UnimodalFamily
 * (../unimodal-family.ts): f and df/dx in doubles; `jet` (f, f_x, f_r, f_xx,
 * f_xr) and `value` in decimal.js at the caller's precision; the critical
 * point (a maximum); `range` from the superstable fixed point to full chaos
 * (kneading increasing with the parameter); the seed of the cascade
 * (superstable parameters of periods 1 and 2), a first delta guess, the
 * fixed point's onset and the state interval of the diagram. Add it to the
 * map below; cascade, lyapunov and diagram then work for it, and windows if
 * its maximum is quadratic. Test it in test/section/ against a published
 * value (e.g. its delta, docs/methods.md E8).
 */
import type { UnimodalFamily } from '../unimodal-family.js';
import { logistic } from './logistic.js';
import { quartic } from './quartic.js';
import { sine } from './sine.js';

export const FAMILIES: ReadonlyMap<string, UnimodalFamily> = new Map([
  [logistic.name, logistic],
  [sine.name, sine],
  [quartic.name, quartic],
]);

export { logistic, quartic, sine };
