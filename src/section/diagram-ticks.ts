/**
 * Tick marks of the parameter axis drawn into a 16-bit ink image (row-major):
 * short dark lines at the top and bottom edges at the pixel columns of the
 * given axis fractions. The labels travel in the metadata, not as pixels.
 */
export function drawTicks(ink: Uint16Array, width: number, height: number, fractions: readonly number[], length: number): void {
  const len = Math.min(length, height);
  for (const u of fractions) {
    const i = Math.round(u * width - 0.5);
    if (i < 0 || i >= width) continue;
    for (let j = 0; j < len; j++) {
      ink[j * width + i] = 0;
      ink[(height - 1 - j) * width + i] = 0;
    }
  }
}
