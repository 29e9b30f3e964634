/** Entries in the period palette; periods beyond reuse it cyclically (build-period-palette.ts). */
export const PERIOD_PALETTE_SIZE = 64;
export const PERIOD_LIGHTNESS_MIN = 0.6;
export const PERIOD_LIGHTNESS_MAX = 0.88;

/** The first this many periods also differ in greyscale lightness. */
export const PERIOD_GREYSCALE_DISTINCT = 5;
