import { describe, expect, it, vi } from 'vitest';
import { PERIOD_LIGHTNESS_MAX, PERIOD_LIGHTNESS_MIN, PERIOD_PALETTE_SIZE, periodHex, periodLinear, periodOklab, periodsAdjacent } from '../../src/colour/period-palette.js';
import { linearToOklab, oklabDistance, oklabToLinear } from '../../src/colour/oklab.js';

const lab = (p: number): number[] => periodOklab(p, [0, 0, 0]) as number[];

describe('period palette', () => {
  it('periods 1..16 are pairwise at least 0.065 apart in OKLab', () => {
    // Threshold: a just-noticeable difference in OKLab is about 0.02 (CSS Color 4 uses
    // deltaEOK 0.02 as its JND); 0.065 asks for over three JNDs between any two. It was 0.09
    // before the palette also kept colours apart for colour-vision deficiencies
    // (period-palette-vision.test.ts), which costs some separation for normal vision.
    let min = Infinity;
    for (let p = 1; p <= 16; p++) for (let q = 1; q < p; q++) min = Math.min(min, oklabDistance(lab(p), lab(q)));
    expect(min).toBeGreaterThan(0.065);
  });

  it('periods that meet in the plane (p, p+1, p+2, and multiples) are at least 0.06 apart up to 64 (was 0.08, see above)', () => {
    let min = Infinity;
    for (let p = 2; p <= PERIOD_PALETTE_SIZE; p++) for (let q = 1; q < p; q++) if (periodsAdjacent(p, q)) min = Math.min(min, oklabDistance(lab(p), lab(q)));
    expect(min).toBeGreaterThan(0.06);
  });

  it('every colour lies in the sRGB gamut and in the stated lightness band', () => {
    const t = [0, 0, 0];
    for (let p = 1; p <= PERIOD_PALETTE_SIZE; p++) {
      const c = lab(p);
      oklabToLinear(c[0]!, c[1]!, c[2]!, t);
      for (const v of t) {
        expect(v).toBeGreaterThanOrEqual(-1e-9);
        expect(v).toBeLessThanOrEqual(1 + 1e-9);
      }
      expect(c[0]).toBeGreaterThanOrEqual(PERIOD_LIGHTNESS_MIN - 1e-12);
      expect(c[0]).toBeLessThanOrEqual(PERIOD_LIGHTNESS_MAX + 1e-12);
    }
  });

  it('periodLinear agrees with periodOklab converted to linear light', () => {
    const a = [0, 0, 0];
    for (let p = 1; p <= PERIOD_PALETTE_SIZE; p++) {
      periodLinear(p, a);
      const back = linearToOklab(a[0]!, a[1]!, a[2]!, [0, 0, 0]);
      // 1e-7: the published matrices round-trip to ~1e-8 (see oklab.test.ts); L, a, b move less than linear channels.
      expect(oklabDistance(back as number[], lab(p))).toBeLessThan(1e-7);
    }
  });

  it('periods beyond the table cycle: colour(p + 64) equals colour(p)', () => {
    expect(periodHex(1 + PERIOD_PALETTE_SIZE)).toBe(periodHex(1));
    expect(lab(37 + 2 * PERIOD_PALETTE_SIZE)).toEqual(lab(37));
  });

  it('is deterministic: a fresh import builds the same table', async () => {
    const before = Array.from({ length: PERIOD_PALETTE_SIZE }, (_, i) => periodHex(i + 1));
    vi.resetModules();
    const again = await import('../../src/colour/period-palette.js');
    const after = Array.from({ length: PERIOD_PALETTE_SIZE }, (_, i) => again.periodHex(i + 1) as string);
    expect(after).toEqual(before);
    expect(new Set(before).size).toBe(PERIOD_PALETTE_SIZE);
  });
});

describe('the period palette table', () => {
  it('holds exactly the colours the palette rule builds (scripts/period-palette-table.mjs wrote it)', async () => {
    const { buildPeriodPalette } = await import('../../src/colour/build-period-palette.js');
    const { PERIOD_PALETTE_LAB, PERIOD_PALETTE_LINEAR } = await import('../../src/colour/period-palette-table.js');
    const built = buildPeriodPalette();
    expect(Array.from(PERIOD_PALETTE_LAB)).toEqual(Array.from(built.lab));
    expect(Array.from(PERIOD_PALETTE_LINEAR)).toEqual(Array.from(built.linear));
  });
});
