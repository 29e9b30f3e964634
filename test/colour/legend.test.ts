import { describe, expect, it } from 'vitest';
import { parseColourSettings } from '../../src/colour/colour-settings.js';
import {
  LEGEND_TITLE,
  firstPeriods,
  LEGEND_MIN_PIXELS,
  layoutLegend,
  legendBounds,
  legendPlacement,
  presentPeriods,
  legendScale,
  legendSvg,
  paintLegendRect,
  paintLegendRows,
} from '../../src/colour/legend.js';
import { periodHex, periodLinear } from '../../src/colour/period-palette.js';
import { figureFont } from '../../src/figure/figure-font.js';

const font = figureFont();

const inset = (extra: Record<string, unknown> = {}) => parseColourSettings({ legend: 'inset', ...extra });

describe('legendScale', () => {
  it('gives a cap height near 2.5 mm: 4 px per cell at 300 dpi, 1 at 72 dpi', () => {
    // 2.5 mm at 300 dpi = 29.5 px; 7 cells -> 4.2 -> 4 (cap 28 px = 2.37 mm). At 72 dpi: 7.1 px -> 1.
    expect(legendScale(300)).toBe(4);
    expect(legendScale(72)).toBe(1);
    expect(legendScale(600)).toBe(8);
    for (const dpi of [150, 300, 600, 1200]) {
      const capMm = ((7 * legendScale(dpi)) / dpi) * 25.4;
      expect(Math.abs(capMm - 2.5)).toBeLessThan(0.3);
    }
  });
});

describe('layoutLegend', () => {
  it('returns null unless the legend is inset', () => {
    expect(layoutLegend(parseColourSettings({ legend: 'none' }), 1000, 800, 300, firstPeriods(12), font)).toBeNull();
    expect(layoutLegend(parseColourSettings({ legend: 'beside' }), 1000, 800, 300, firstPeriods(12), font)).toBeNull();
  });

  it('places the legend inside the plate in the chosen corner', () => {
    for (const corner of ['top-left', 'top-right', 'bottom-left', 'bottom-right']) {
      const L = layoutLegend(inset({ legendCorner: corner }), 3000, 2000, 300, firstPeriods(12), font)!;
      expect(L.scale).toBe(4);
      expect(L.x).toBeGreaterThanOrEqual(0);
      expect(L.y).toBeGreaterThanOrEqual(0);
      expect(L.x + L.width).toBeLessThanOrEqual(3000);
      expect(L.y + L.height).toBeLessThanOrEqual(2000);
      expect(L.x + L.width / 2 < 1500).toBe(corner.endsWith('left'));
      expect(L.y + L.height / 2 < 1000).toBe(corner.startsWith('top'));
    }
  });

  it('draws at the placement legendPlacement gives', () => {
    for (const [W, H, dpi] of [
      [3000, 2000, 300],
      [400, 300, 600],
    ] as const) {
      const L = layoutLegend(inset({ legendCorner: 'bottom-right' }), W, H, dpi, firstPeriods(12), font)!;
      expect({ x: L.x, y: L.y, width: L.width, height: L.height, scale: L.scale }).toEqual(
        legendPlacement(inset({ legendCorner: 'bottom-right' }), W, H, dpi, firstPeriods(12), font),
      );
    }
  });

  it('steps the scale down to fit a small plate', () => {
    const L = layoutLegend(inset({ legendPeriods: 64 }), 400, 300, 600, firstPeriods(64), font)!;
    expect(L.scale).toBeLessThan(legendScale(600));
    expect(L.x + L.width).toBeLessThanOrEqual(400);
    expect(L.y + L.height).toBeLessThanOrEqual(300);
  });

  it('draws each period swatch in its palette colour (some opaque pixel equals periodLinear(p))', () => {
    const L = layoutLegend(inset({ legendPeriods: 16 }), 3000, 2000, 300, firstPeriods(16), font)!;
    for (let p = 1; p <= 16; p++) {
      const c = periodLinear(p, [0, 0, 0]);
      let found = false;
      for (let k = 0; k < L.width * L.height && !found; k++) found = L.rgba[4 * k + 3] === 1 && L.rgba[4 * k] === c[0] && L.rgba[4 * k + 1] === c[1] && L.rgba[4 * k + 2] === c[2];
      expect(found, `period ${p}`).toBe(true);
    }
  });

  it("sets its title and numbers in the DejaVu outlines: the ink of the title row covers the outlines' area (shoelace formula)", () => {
    const L = layoutLegend(inset({ legendPeriods: 3 }), 3000, 2000, 300, firstPeriods(3), font)!;
    // the title's outline at the legend's size and place: capitals 7 cells tall from cell row 4 (PAD)
    const size = (7 * L.scale) / font.capHeight;
    const polys = font.contours(LEGEND_TITLE, size, 4 * L.scale, 11 * L.scale, 0.01);
    // signed area of each closed polygon (shoelace); outer contours and holes have opposite signs
    let area = 0;
    for (const p of polys) for (let i = 0; i < p.length; i += 2) area += (p[i]! * p[(i + 3) % p.length]! - p[(i + 2) % p.length]! * p[i + 1]!) / 2;
    // ink in the title band: alpha above the panel's 0.9, as a fraction a of the way to 1, and the coverage
    // behind it, 1 - (1 - a)^(1/2.2) (legend.ts lays ink 1 - (1 - coverage)^2.2 over the panel)
    let ink = 0;
    for (let j = 0; j < 13 * L.scale; j++) for (let i = 0; i < L.width; i++) ink += 1 - (1 - Math.max(0, (L.rgba[4 * (j * L.width + i) + 3]! - 0.9) / 0.1)) ** (1 / 2.2);
    expect(Math.abs(area)).toBeGreaterThan(100);
    // coverage is exact across x and within 1/16 pixel per row edge in y (fill-coverage.ts)
    expect(Math.abs(ink - Math.abs(area)) / Math.abs(area)).toBeLessThan(0.02);
  });
});

describe('paintLegendRows', () => {
  const W = 400;
  const H = 300;
  /** Number of positions where two arrays differ (vitest's deep equality is slow on 360k doubles). */
  const differences = (a: Float64Array, b: Float64Array): number => {
    let n = a.length === b.length ? 0 : 1;
    for (let k = 0; k < a.length; k++) if (a[k] !== b[k]) n++;
    return n;
  };
  const plate = (): Float64Array => {
    const a = new Float64Array(W * H * 3);
    for (let k = 0; k < a.length; k++) a[k] = ((k * 37) % 101) / 100;
    return a;
  };

  it('paints only inside its rectangle, and changes it', () => {
    const L = layoutLegend(inset({ legendCorner: 'bottom-left' }), W, H, 150, firstPeriods(12), font)!;
    const before = plate();
    const after = plate();
    paintLegendRows(L, 0, H, W, after);
    let changedInside = 0;
    let changedOutside = 0;
    for (let y = 0; y < H; y++)
      for (let x = 0; x < W; x++) {
        const inside = x >= L.x && x < L.x + L.width && y >= L.y && y < L.y + L.height;
        for (let c = 0; c < 3; c++) {
          const k = 3 * (y * W + x) + c;
          if (after[k] !== before[k]) {
            if (inside) changedInside++;
            else changedOutside++;
          }
        }
      }
    expect(changedOutside).toBe(0);
    expect(changedInside).toBeGreaterThan(0.9 * L.width * L.height * 3);
  });

  it('painting band by band (bands of 7 rows) equals painting at once', () => {
    const L = layoutLegend(inset({ legendCorner: 'top-right', legendPeriods: 24 }), W, H, 150, firstPeriods(24), font)!;
    const once = plate();
    paintLegendRows(L, 0, H, W, once);
    const banded = plate();
    for (let y0 = 0; y0 < H; y0 += 7) {
      const rows = Math.min(7, H - y0);
      const band = banded.slice(3 * y0 * W, 3 * (y0 + rows) * W);
      paintLegendRows(L, y0, rows, W, band);
      banded.set(band, 3 * y0 * W);
    }
    expect(differences(banded, once)).toBe(0);
    expect(differences(once, plate())).toBeGreaterThan(0);
  });

  it('paintLegendRect over 64 x 48 tiles equals paintLegendRows over the whole plate', () => {
    const L = layoutLegend(inset({ legendCorner: 'bottom-right', legendPeriods: 30 }), W, H, 150, firstPeriods(30), font)!;
    const once = plate();
    paintLegendRows(L, 0, H, W, once);
    const tiled = plate();
    for (let ty = 0; ty < H; ty += 48)
      for (let tx = 0; tx < W; tx += 64) {
        const w = Math.min(64, W - tx);
        const h = Math.min(48, H - ty);
        const tile = new Float64Array(3 * w * h);
        for (let j = 0; j < h; j++) tile.set(tiled.subarray(3 * ((ty + j) * W + tx), 3 * ((ty + j) * W + tx + w)), 3 * j * w);
        paintLegendRect(L, tx, ty, w, h, tile);
        for (let j = 0; j < h; j++) tiled.set(tile.subarray(3 * j * w, 3 * (j + 1) * w), 3 * ((ty + j) * W + tx));
      }
    expect(differences(tiled, once)).toBe(0);
  });

  it('over a white plate, an opaque swatch pixel shows the swatch and the panel blends 90/10 (Porter-Duff over)', () => {
    const L = layoutLegend(inset({ legendCorner: 'top-left' }), W, H, 150, firstPeriods(12), font)!;
    const white = new Float64Array(W * H * 3).fill(1);
    paintLegendRows(L, 0, H, W, white);
    // The panel's top-left pixel: 0.9 * panel + 0.1 * 1.
    const k = 3 * (L.y * W + L.x);
    expect(white[k]).toBeCloseTo(L.rgba[0]! + 0.1, 14);
  });
});

describe('legendSvg', () => {
  it('lists the periods it is given, and says so when there are none', () => {
    const svg = legendSvg([3, 6, 427], font);
    for (const p of [3, 6, 427]) expect(svg).toContain(`id="period-${p}"`);
    expect(svg).not.toContain('id="period-1"');
    expect(legendSvg([], font)).toContain('aria-label="no interior period in view"');
    // text as outlines only (no <text> set in a reader's fonts), each number labelled
    expect(svg).not.toMatch(/<text[\s>]/);
    for (const p of [3, 6, 427]) expect(svg).toContain(`aria-label="${p}"`);
  });

  it('lists every period with its swatch colour and number, deterministically', () => {
    const s = inset({ legendPeriods: 20 });
    const svg = legendSvg(firstPeriods(s.legendPeriods), font);
    expect(svg.startsWith('<?xml')).toBe(true);
    expect(svg).toContain('xmlns="http://www.w3.org/2000/svg"');
    for (let p = 1; p <= 20; p++) {
      expect(svg).toContain(`id="period-${p}"`);
      expect(svg).toContain(`fill="${periodHex(p)}"`);
    }
    expect(svg).not.toContain('id="period-21"');
    expect(legendSvg(firstPeriods(s.legendPeriods), font)).toBe(svg);
  });
});

describe('presentPeriods', () => {
  it(`lists the periods with at least LEGEND_MIN_PIXELS (${LEGEND_MIN_PIXELS}) pixels, in increasing order`, () => {
    const hist = { 3: 5000, 6: 40, 9: LEGEND_MIN_PIXELS, 12: LEGEND_MIN_PIXELS - 1, 7: 1 };
    expect(presentPeriods(hist, { legendPeriods: 12 })).toEqual([3, 6, 9]);
  });
  it('keeps the legendPeriods periods with the most pixels when more are present (ties to the lower period)', () => {
    const hist = { 1: 900, 2: 50, 3: 700, 4: 50, 5: 60, 30: 800 };
    expect(presentPeriods(hist, { legendPeriods: 4 })).toEqual([1, 3, 5, 30]);
    expect(presentPeriods(hist, { legendPeriods: 5 })).toEqual([1, 2, 3, 5, 30]);
    expect(presentPeriods({}, { legendPeriods: 5 })).toEqual([]);
  });
});

describe('layoutLegend of the periods present', () => {
  it('draws nothing when no period is present', () => {
    expect(layoutLegend(inset(), 800, 600, 150, [], font)).toBeNull();
  });
  it('draws exactly the listed periods: their colours appear, an unlisted one does not', () => {
    const L = layoutLegend(inset(), 3000, 2000, 300, [3, 6, 79, 158], font)!;
    const has = (p: number): boolean => {
      const c = periodLinear(p, [0, 0, 0]);
      for (let k = 0; k < L.width * L.height; k++) if (L.rgba[4 * k + 3] === 1 && [0, 1, 2].every((i) => L.rgba[4 * k + i] === c[i])) return true;
      return false;
    };
    for (const p of [3, 6, 79, 158]) expect(has(p), String(p)).toBe(true);
    expect(has(1)).toBe(false);
  });
  it('legendBounds holds every layout of 1..legendPeriods entries with numbers up to the stated digits, in every corner', () => {
    for (const corner of ['top-left', 'top-right', 'bottom-left', 'bottom-right']) {
      for (const [W, H, dpi] of [
        [3000, 2000, 300],
        [400, 300, 150],
        [120, 90, 600],
      ] as const) {
        const s = inset({ legendCorner: corner, legendPeriods: 20 });
        const b = legendBounds(s, W, H, dpi, 4, font)!;
        for (let n = 1; n <= 20; n++) {
          for (const top of [9, 99, 999, 9999]) {
            const periods = Array.from({ length: n }, (_, i) => top - i)
              .filter((p) => p > 0)
              .sort((a, c) => a - c);
            // the placement layoutLegend draws at (legendPlacement, its first step), without drawing 960 legends
            const L = legendPlacement(s, W, H, dpi, periods, font)!;
            const x1 = Math.min(W, L.x + L.width);
            const y1 = Math.min(H, L.y + L.height);
            expect(L.x >= b.x && x1 <= b.x + b.width && L.y >= b.y && y1 <= b.y + b.height, `${corner} ${W}x${H} n=${n} top=${top}`).toBe(true);
          }
        }
      }
    }
  });
});
