import { itxtChunk, METADATA_KEYWORD, PNG_SIGNATURE } from './png-chunk.js';

/**
 * Metadata for files that are not streamed through a plate sink: SVG plots
 * and PNG images made in one piece (sharp, pngjs). The text is the same JSON
 * a plate carries (`{ tool, version, sheet, ... }`), so `quadatlas sheet` and
 * `--again` read every kind of output the same way.
 */

/** The id of the SVG `<metadata>` element that carries the JSON text. */
export const SVG_METADATA_ID = 'quadatlas-sheet';

function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

function unescapeXml(s: string): string {
  return s
    .replace(/&lt;/g, '<')
    .replace(/&gt;/g, '>')
    .replace(/&quot;/g, '"')
    .replace(/&apos;/g, "'")
    .replace(/&amp;/g, '&');
}

/** Inserts `<metadata id="quadatlas-sheet">JSON</metadata>` right after the root `<svg ...>` tag. */
export function svgWithMetadata(svg: string, json: string): string {
  const open = /<svg\b[^>]*>/.exec(svg);
  if (open === null) throw new Error('svgWithMetadata: no <svg> element');
  const at = open.index + open[0].length;
  return `${svg.slice(0, at)}\n<metadata id="${SVG_METADATA_ID}">${escapeXml(json)}</metadata>${svg.slice(at)}`;
}

/** The JSON text of the quadatlas `<metadata>` element of an SVG, or undefined. */
export function metadataFromSvg(svg: string): string | undefined {
  const m = new RegExp(`<metadata id="${SVG_METADATA_ID}">([\\s\\S]*?)</metadata>`).exec(svg);
  return m === null ? undefined : unescapeXml(m[1]!);
}

/**
 * A whole PNG file with the metadata iTXt chunk inserted before the first
 * IDAT (PNG spec, W3C 2nd ed., 5.6: iTXt may stand anywhere between IHDR and
 * IEND; before IDAT lets a reader stop at the image data).
 */
export function pngWithMetadata(png: Uint8Array, json: string): Buffer {
  const buf = Buffer.from(png.buffer, png.byteOffset, png.byteLength);
  if (!buf.subarray(0, 8).equals(PNG_SIGNATURE)) throw new Error('pngWithMetadata: not a PNG');
  let at = 8;
  while (at + 8 <= buf.length) {
    const len = buf.readUInt32BE(at);
    if (buf.toString('latin1', at + 4, at + 8) === 'IDAT') break;
    at += 12 + len;
  }
  return Buffer.concat([buf.subarray(0, at), itxtChunk(METADATA_KEYWORD, json), buf.subarray(at)]);
}
