/**
 * The census certificate's kernel: certify a list of double-double nuclei
 * at one precision (certify-nucleus.ts). Pure; run in this thread or in
 * certify-worker.ts.
 */
import { fixedScale, fromNumber } from '../../precise/fixed.js';
import { certifyNucleusFixed } from './certify-nucleus.js';

/** Values per nucleus in the input: reHi, reLo, imHi, imLo. */
export const CENTRE_RECORD = 4;

export interface ChunkCertificates {
  /** Existence radius per nucleus in units of 2^-bits (0 when the test failed). */
  readonly radii: bigint[];
  /** null where certified, else why not. */
  readonly reasons: (string | null)[];
}

/** The fixed-point centre of a double-double nucleus (each double rounded to the nearest unit). */
export function centreOf(centres: Float64Array, i: number, bits: number): { re: bigint; im: bigint } {
  const s = fixedScale(bits);
  const o = i * CENTRE_RECORD;
  return {
    re: fromNumber(centres[o]!, s) + fromNumber(centres[o + 1]!, s),
    im: fromNumber(centres[o + 2]!, s) + fromNumber(centres[o + 3]!, s),
  };
}

export function certifyChunk(period: number, centres: Float64Array, bits: number): ChunkCertificates {
  const n = centres.length / CENTRE_RECORD;
  const radii: bigint[] = [];
  const reasons: (string | null)[] = [];
  for (let i = 0; i < n; i += 1) {
    const c = centreOf(centres, i, bits);
    const cert = certifyNucleusFixed(period, c.re, c.im, bits);
    radii.push(cert.ok ? cert.radius : 0n);
    reasons.push(cert.reason);
  }
  return { radii, reasons };
}
