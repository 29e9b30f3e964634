/** The unimodal families the section commands know, by command-line name. */
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
