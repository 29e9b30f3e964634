/**
 * A strip of the c-plane along the real axis for the comparison plate:
 * width x height pixels covering re c in [from, to] and im c symmetric about
 * 0 at the same scale, sampled once per pixel centre by the plane kernel
 * (sampleParameters, docs/methods.md A1-A6) and coloured by the plate colouring
 * (shadeSamples, encodePixels) with its default settings. Returns 8-bit sRGB.
 */
import { DEFAULT_COLOUR_SETTINGS } from '../colour/colour-settings.js';
import { encodePixels } from '../colour/encode-pixels.js';
import { shadeSamples } from '../colour/shade-samples.js';
import { createSampleScratch, DEFAULT_ESCAPE_RADIUS, sampleParameters } from '../plane/sample-parameters.js';
import { createSampleSet } from '../plane/sample-set.js';

export function planeStrip(from: number, to: number, width: number, height: number, maxIterations: number): Uint8Array {
  const spacing = (to - from) / width;
  const cr = new Float64Array(width);
  const ci = new Float64Array(width);
  const set = createSampleSet(width);
  const scratch = createSampleScratch(width);
  const linear = new Float64Array(3 * width);
  const out = new Uint8Array(3 * width * height);
  const row = new Uint8Array(3 * width);
  const settings = { maxIterations, escapeRadius: DEFAULT_ESCAPE_RADIUS, periodTolerance: 1e-3 * spacing };
  for (let j = 0; j < height; j++) {
    const im = (height / 2 - j - 0.5) * spacing;
    for (let i = 0; i < width; i++) {
      cr[i] = from + (i + 0.5) * spacing;
      ci[i] = im;
    }
    sampleParameters(cr, ci, width, settings, set, undefined, scratch);
    shadeSamples(set, 0, width, spacing, DEFAULT_COLOUR_SETTINGS, linear);
    encodePixels(linear, width, 1, 0, j, 8, row);
    out.set(row, 3 * width * j);
  }
  return out;
}
