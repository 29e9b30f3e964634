import { PNG } from 'pngjs';
import { describe, expect, it } from 'vitest';
import { iiifInfo, iiifTilePath } from '../../src/io/iiif-info.js';
import { encodePngTile } from '../../src/io/iiif-tile-file.js';
import { planPyramid, pyramidTileAt } from '../../src/view/pyramid-plan.js';

describe('iiifTilePath', () => {
  it('iiifTilePath writes {region}/{size}/0/default.{format} with region x,y,w,h and size w,h', () => {
    // IIIF Image API 3.0 section 2.1: {region}/{size}/{rotation}/{quality}.{format}; 4.1 region
    // "x,y,w,h" in full-image pixels; 4.2 size "w,h"; section 4.7 canonical forms.
    const plan = planPyramid(1000, 700, 256);
    expect(iiifTilePath(plan, pyramidTileAt(plan, 1), 'png')).toBe('0,0,512,512/256,256/0/default.png');
    expect(iiifTilePath(plan, pyramidTileAt(plan, 4), 'jpg')).toBe('512,512,488,188/244,94/0/default.jpg');
    expect(iiifTilePath(plan, pyramidTileAt(plan, 16), 'png')).toBe('768,512,232,188/232,188/0/default.png');
  });

  it('iiifTilePath uses region full for a tile that is the whole image, and size max only at full size', () => {
    // ecosystem.md section 1: sharp's iiif3 tree names the smallest level of a 1000x700 image full/250,175.
    const plan = planPyramid(1000, 700, 256);
    expect(iiifTilePath(plan, pyramidTileAt(plan, 0), 'png')).toBe('full/250,175/0/default.png');
    const small = planPyramid(200, 100, 256);
    expect(iiifTilePath(small, pyramidTileAt(small, 0), 'jpg')).toBe('full/max/0/default.jpg');
  });
});

describe('iiifInfo', () => {
  it('iiifInfo holds the fields Image API 3.0 section 5 requires, tiles with every scale factor, and sizes of whole-image levels', () => {
    const info = iiifInfo(planPyramid(1000, 700, 256), 'https://example.org/pyr/tiles/', 'png');
    // Required: @context, id (no trailing slash), type, protocol, profile, width, height (section 5.1-5.3).
    expect(info['@context']).toBe('http://iiif.io/api/image/3/context.json');
    expect(info.id).toBe('https://example.org/pyr/tiles');
    expect(info.type).toBe('ImageService3');
    expect(info.protocol).toBe('http://iiif.io/api/image');
    expect(info.profile).toBe('level0');
    expect([info.width, info.height]).toEqual([1000, 700]);
    expect(info.tiles).toEqual([{ width: 256, height: 256, scaleFactors: [1, 2, 4] }]);
    expect(info.sizes).toEqual([{ width: 250, height: 175 }]);
    expect(info.preferredFormats).toEqual(['png']);
    expect(info.extraFormats).toEqual(['png']);
  });

  it('iiifInfo for JPEG tiles lists no extra format (jpg is the level-0 format)', () => {
    const info = iiifInfo(planPyramid(300, 300, 256), 'file:///x/tiles', 'jpg');
    expect(info.extraFormats).toBeUndefined();
    expect(info.preferredFormats).toBeUndefined();
  });
});

describe('encodePngTile', () => {
  it('encodePngTile decodes with pngjs to the same 8-bit RGB pixels', () => {
    const w = 37;
    const h = 23;
    const pixels = new Uint8Array(w * h * 3);
    for (let i = 0; i < pixels.length; i++) pixels[i] = (i * 7919 + (i >> 5) * 31) & 255;
    const png = PNG.sync.read(encodePngTile(pixels, w, h));
    expect([png.width, png.height]).toEqual([w, h]);
    let diff = 0;
    for (let p = 0; p < w * h; p++) for (let c = 0; c < 3; c++) diff += Math.abs(png.data[4 * p + c]! - pixels[3 * p + c]!);
    expect(diff).toBe(0);
  });
});
