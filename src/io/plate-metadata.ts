import type { FileHandle } from 'node:fs/promises';
import { open } from 'node:fs/promises';
import { inflateSync } from 'node:zlib';
import { METADATA_KEYWORD, PNG_SIGNATURE } from './png-chunk.js';
import { jsonFromXmp } from './xmp-packet.js';
import { metadataFromSvg } from './embed-metadata.js';
import { readFile } from 'node:fs/promises';
import { readPdfMetadata } from './pdf-metadata.js';

/**
 * The metadata JSON text a plate sink stored in the file at `path`, or
 * undefined when the file holds none. PNG: the iTXt (compressed or not) or
 * tEXt chunk with keyword "quadatlas-sheet", read chunk by chunk up to the
 * first IDAT without loading the image data (PNG spec 11.3.4). TIFF: the
 * quadatlas:sheet element of the XMP packet (tag 700), via sharp's header
 * read. PDF: the information dictionary's QuadatlasSheet string
 * (pdf-metadata.ts). SVG: the `<metadata id="quadatlas-sheet">` element. JSON: a sidecar
 * `{ metadata, summary }` or a metadata object itself. Other files: undefined.
 */
export async function readPlateMetadata(path: string): Promise<string | undefined> {
  const fh = await open(path, 'r');
  let kind: 'png' | 'tiff' | 'other';
  try {
    const head = Buffer.alloc(8);
    const { bytesRead } = await fh.read(head, 0, 8, 0);
    if (bytesRead === 8 && head.equals(PNG_SIGNATURE)) return await pngMetadata(fh);
    const magic = head.toString('latin1', 0, 4);
    if (magic === '%PDF') return await readPdfMetadata(path);
    kind = magic === 'II*\0' || magic === 'MM\0*' || magic === 'II+\0' || magic === 'MM\0+' ? 'tiff' : 'other';
    if (kind === 'other' && bytesRead > 0) return await textMetadata(path);
  } finally {
    await fh.close();
  }
  if (kind === 'tiff') {
    const { default: sharp } = await import('sharp');
    const { xmpAsString } = await sharp(path, { limitInputPixels: false }).metadata();
    return xmpAsString === undefined ? undefined : jsonFromXmp(xmpAsString);
  }
  return undefined;
}

async function pngMetadata(fh: FileHandle): Promise<string | undefined> {
  let at = 8;
  const head = Buffer.alloc(8);
  for (;;) {
    const { bytesRead } = await fh.read(head, 0, 8, at);
    if (bytesRead < 8) return undefined;
    const len = head.readUInt32BE(0);
    const type = head.toString('latin1', 4, 8);
    if (type === 'IDAT' || type === 'IEND') return undefined;
    if (type === 'iTXt' || type === 'tEXt') {
      const data = Buffer.alloc(len);
      await fh.read(data, 0, len, at + 8);
      const nul = data.indexOf(0);
      if (nul >= 0 && data.toString('latin1', 0, nul) === METADATA_KEYWORD) {
        if (type === 'tEXt') return data.toString('latin1', nul + 1);
        // iTXt: flag, method, language tag NUL, translated keyword NUL, text.
        const compressed = data[nul + 1] === 1;
        const langEnd = data.indexOf(0, nul + 3);
        const transEnd = data.indexOf(0, langEnd + 1);
        const text = data.subarray(transEnd + 1);
        return (compressed ? inflateSync(text) : text).toString('utf8');
      }
    }
    at += 12 + len;
  }
}

/** SVG and JSON files: read whole (they are small), look for the metadata. */
async function textMetadata(path: string): Promise<string | undefined> {
  const text = await readFile(path, 'utf8');
  const start = text.trimStart()[0];
  if (start === '{') {
    let value: unknown;
    try {
      value = JSON.parse(text);
    } catch {
      return undefined;
    }
    if (typeof value !== 'object' || value === null) return undefined;
    const o = value as Record<string, unknown>;
    const meta = typeof o['metadata'] === 'object' && o['metadata'] !== null ? o['metadata'] : o;
    return (meta as Record<string, unknown>)['tool'] === 'quadatlas' ? JSON.stringify(meta) : undefined;
  }
  if (start === '<') return metadataFromSvg(text);
  return undefined;
}
