/**
 * QUADATLAS_QUICK: an environment variable that shrinks every image a command
 * writes (to at most QUICK_SIDE pixels a side and 4 samples), so that the
 * README's commands can all be run in a minute or two (the README test sets
 * it). A shrunk run says so on stderr, and the sheet it records is the shrunk
 * one, so `--again` reproduces what was written, not what was asked.
 */
import type { Sheet } from '../view/sheet.js';

export const QUICK_SIDE = 240;

export function quickMode(env: NodeJS.ProcessEnv = process.env): boolean {
  const v = env['QUADATLAS_QUICK'];
  return v !== undefined && v !== '' && v !== '0';
}

/** The size and samples a quick run uses for a W x H image, or null when it is small enough already. */
export function quickSize(width: number, height: number): { width: number; height: number } | null {
  const side = Math.max(width, height);
  if (side <= QUICK_SIDE) return null;
  const k = QUICK_SIDE / side;
  return { width: Math.max(1, Math.round(width * k)), height: Math.max(1, Math.round(height * k)) };
}

/** The sheet a quick run renders (the sheet itself when QUADATLAS_QUICK is not set), with the note printed. */
export function quickSheet<T extends Sheet>(sheet: T): T {
  if (!quickMode()) return sheet;
  const size = quickSize(sheet.width, sheet.height);
  const samples = Math.min(sheet.samples, 4);
  if (size === null && samples === sheet.samples) return sheet;
  const { width, height } = size ?? sheet;
  const dpi = Math.max(1, Math.round((sheet.dpi * width) / sheet.width));
  process.stderr.write(
    `quadatlas: note: QUADATLAS_QUICK is set: rendering ${width}x${height} at ${samples} samples instead of ${sheet.width}x${sheet.height} at ${sheet.samples}\n`,
  );
  return { ...sheet, width, height, samples, dpi };
}

/** The same for a section sheet's `pixels` (diagram, compare). */
export function quickPixels<T extends { readonly pixels: { readonly width: number; readonly height: number } }>(sheet: T): T {
  if (!quickMode()) return sheet;
  const size = quickSize(sheet.pixels.width, sheet.pixels.height);
  if (size === null) return sheet;
  process.stderr.write(`quadatlas: note: QUADATLAS_QUICK is set: rendering ${size.width}x${size.height} instead of ${sheet.pixels.width}x${sheet.pixels.height}\n`);
  return { ...sheet, pixels: size };
}
