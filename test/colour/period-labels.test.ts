import { describe, expect, it } from 'vitest';
import { labelHeightPixels, layoutPeriodLabels as layout, type LabelPoint } from '../../src/colour/period-labels.js';
import { figureFont } from '../../src/figure/figure-font.js';

const layoutPeriodLabels = (points: LabelPoint[], dpi: number, w: number, h: number) => layout(points, dpi, w, h, figureFont());

/** Alpha of a sprite at plate pixel (x, y), or 0 outside it. */
function alphaAt(s: { x: number; y: number; width: number; height: number; rgba: Float64Array }, x: number, y: number): number {
  if (x < s.x || y < s.y || x >= s.x + s.width || y >= s.y + s.height) return 0;
  return s.rgba[4 * ((y - s.y) * s.width + (x - s.x)) + 3]!;
}

describe('layoutPeriodLabels', () => {
  it('puts opaque ink on the nucleus pixel (the dot) with the number above it', () => {
    const [s] = layoutPeriodLabels([{ x: 200.5, y: 150.5, period: 12 }], 300, 400, 300);
    expect(s).toBeDefined();
    expect(alphaAt(s!, 200, 150)).toBe(1);
    expect(s!.y + s!.height).toBeGreaterThan(150);
    expect(s!.y).toBeLessThan(150 - labelHeightPixels(300) / 2);
  });

  it('drops a label that overlaps an earlier one or leaves the plate, keeping the order as priority', () => {
    const labels = layoutPeriodLabels(
      [
        { x: 100, y: 100, period: 1 },
        { x: 102, y: 101, period: 2 },
        { x: 1, y: 1, period: 3 },
        { x: 150, y: 100, period: 4 },
      ],
      150,
      300,
      200,
    );
    expect(labels).toHaveLength(2);
    expect(alphaAt(labels[1]!, 150, 100)).toBe(1);
  });
});
