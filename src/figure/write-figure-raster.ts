/**
 * A figure scene as raster pixels, for PNG and TIFF output: the page at the
 * plate's own resolution (dpi / 72 pixels a point), white, the plate copied
 * in pixel for pixel at a whole-pixel offset (never resampled), and the
 * annotations rasterised over it from their SVG, glyph outlines included
 * (figureOverlaySvg: no <text> reaches the rasteriser, so the machine's
 * fonts never enter the figure). librsvg (through sharp) rasterises the
 * overlay to 8-bit RGBA; it is laid over the plate here with the "over"
 * operator in sRGB values, as an SVG viewer composites (Porter & Duff,
 * "Compositing digital images", SIGGRAPH 1984), scaled to 16 bits by 257
 * for a 16-bit plate. Same scene and plate, same pixels.
 */
import sharp from 'sharp';
import type { FigureFont } from './figure-font.js';
import type { FigureScene } from './figure-scene.js';
import { figureOverlaySvg } from './write-figure-svg.js';

export interface RasterFigure {
  readonly width: number;
  readonly height: number;
  /** Interleaved RGB, 8 or 16 bits a sample. */
  readonly pixels: Uint8Array | Uint16Array;
  /** Where the plate's top left pixel went on the page. */
  readonly plateX: number;
  readonly plateY: number;
}

/** Most pixels of a page the overlay is rasterised for in one piece. */
export const MAX_RASTER_FIGURE_PIXELS = 120_000_000;

/** The page size in pixels and the plate's whole-pixel offset for a scene printed at `dpi`. */
export function rasterPlacement(
  scene: FigureScene,
  dpi: number,
  plateWidth: number,
  plateHeight: number,
): { width: number; height: number; plateX: number; plateY: number; scale: number } {
  const scale = dpi / 72;
  const plateX = Math.round(scene.plate.x * scale);
  const plateY = Math.round(scene.plate.y * scale);
  const width = Math.max(plateX + plateWidth, Math.round(scene.width * scale));
  const height = Math.max(plateY + plateHeight, Math.round(scene.height * scale));
  return { width, height, plateX, plateY, scale };
}

/** The figure's pixels from the plate (a PNG, 8 or 16 bits) and the scene laid out around it. */
export async function rasterFigure(scene: FigureScene, png: Uint8Array, dpi: number, font: FigureFont): Promise<RasterFigure> {
  const image = sharp(Buffer.from(png));
  const meta = await image.metadata();
  const deep = meta.depth === 'ushort';
  // without toColourspace('rgb16') libvips hands back 16-bit samples cut to 8 bits and cast (ecosystem.md §1)
  const { data: plate, info } = await (deep ? image.removeAlpha().toColourspace('rgb16').raw({ depth: 'ushort' }) : image.removeAlpha().raw()).toBuffer({
    resolveWithObject: true,
  });
  if (info.channels !== 3) throw new Error(`rasterFigure: a plate of ${info.channels} channels`);
  const pw = info.width;
  const ph = info.height;
  const place = rasterPlacement(scene, dpi, pw, ph);
  const { width, height, plateX, plateY, scale } = place;
  // the page's origin so that the plate's rectangle lands on its whole-pixel offset
  const svg = figureOverlaySvg(scene, font, { width, height, scale, dx: plateX - scene.plate.x * scale, dy: plateY - scene.plate.y * scale });
  const overlay = await sharp(Buffer.from(svg), { density: 72, limitInputPixels: MAX_RASTER_FIGURE_PIXELS }).ensureAlpha().raw().toBuffer();
  const max = deep ? 65535 : 255;
  const unit = deep ? 257 : 1;
  const out = deep ? new Uint16Array(width * height * 3) : new Uint8Array(width * height * 3);
  out.fill(max);
  const src = deep ? new Uint16Array(plate.buffer, plate.byteOffset, plate.byteLength / 2) : plate;
  for (let y = 0; y < ph; y += 1) {
    const row = ((plateY + y) * width + plateX) * 3;
    out.set(src.subarray(y * pw * 3, (y + 1) * pw * 3), row);
  }
  for (let i = 0, o = 0; i < width * height; i += 1, o += 4) {
    const a = overlay[o + 3]!;
    if (a === 0) continue;
    for (let c = 0; c < 3; c += 1) {
      const base = out[3 * i + c]!;
      // over: C a + B (1 - a), a = alpha / 255, rounded to the nearest sample
      out[3 * i + c] = Math.round((overlay[o + c]! * unit * a + base * (255 - a)) / 255);
    }
  }
  return { width, height, pixels: out, plateX, plateY };
}
