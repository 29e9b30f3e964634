import type { Vec3 } from './oklab.js';

/**
 * Simulated colour vision deficiencies, for choosing colours that stay apart
 * for viewers with them (period-palette.ts).
 *
 * Source: G. M. Machado, M. M. Oliveira and L. A. F. Fernandes, "A
 * physiologically-based model for simulation of color vision deficiency",
 * IEEE Transactions on Visualization and Computer Graphics 15(6), 2009,
 * 1291-1298. The three matrices below are the paper's severity-1.0 matrices
 * (protanopia, deuteranopia, tritanopia; six decimals as published), applied
 * to linear-light sRGB. Each row sums to 1, so white and every grey map to
 * themselves.
 *
 * Greyscale is the relative luminance of linear sRGB, Y = 0.2126 R + 0.7152 G
 * + 0.0722 B (IEC 61966-2-1 / ITU-R BT.709 primaries, D65): how a colour prints
 * on a monochrome device that keeps luminance.
 */
export type VisionKind = 'protanopia' | 'deuteranopia' | 'tritanopia';
export const VISION_KINDS: readonly VisionKind[] = ['protanopia', 'deuteranopia', 'tritanopia'];

export const MACHADO_2009: Readonly<Record<VisionKind, readonly (readonly [number, number, number])[]>> = {
  protanopia: [
    [0.152286, 1.052583, -0.204868],
    [0.114503, 0.786281, 0.099216],
    [-0.003882, -0.048116, 1.051998],
  ],
  deuteranopia: [
    [0.367322, 0.860646, -0.227968],
    [0.280085, 0.672501, 0.047413],
    [-0.01182, 0.04294, 0.968881],
  ],
  tritanopia: [
    [1.255528, -0.076749, -0.178779],
    [-0.078411, 0.930809, 0.147602],
    [0.004733, 0.691367, 0.3039],
  ],
};

/** Linear sRGB as seen with a deficiency (clipped to [0, 1]), into out. Aliasing-safe. */
export function simulateVision<T extends Vec3>(kind: VisionKind, r: number, g: number, b: number, out: T): T {
  const m = MACHADO_2009[kind];
  for (let i = 0; i < 3; i++) {
    const row = m[i]!;
    const v = row[0] * r + row[1] * g + row[2] * b;
    out[i] = v < 0 ? 0 : v > 1 ? 1 : v;
  }
  return out;
}

/** Relative luminance Y of linear sRGB (BT.709 / sRGB primaries). */
export function luminance(r: number, g: number, b: number): number {
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}
