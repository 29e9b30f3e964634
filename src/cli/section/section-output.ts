/**
 * Writing what a `section` subcommand made: the metadata text stored in the
 * file (the same `{ tool, version, ..., sheet }` JSON a plate carries), the
 * output itself (temp file + rename), and the JSON sidecar FILE.json holding
 * `{ metadata, summary }` as plates write it.
 */
import { writeFileAtomic } from '../../io/write-file-atomic.js';
import { prepareOutputFile } from '../../io/check-writable-directory.js';
import type { Json } from '../../section/sheet-fields.js';
import { Received, UserError } from '../../check/user-error.js';
import { toolVersion } from '../../io/tool-version.js';

/** The metadata JSON text: tool, version, derived values (for the reader), then the sheet. */
export function sectionMetadata(record: Json, derived: Json = {}): string {
  return JSON.stringify({ tool: 'quadatlas', version: toolVersion(), ...derived, sheet: record });
}

/** Checks, before any work, that `file` can be written (io/check-writable-directory.ts). */
export const prepareOutput = prepareOutputFile;

export async function writeOutput(file: string, data: string | Uint8Array, field: string): Promise<void> {
  try {
    await writeFileAtomic(file, data);
  } catch (err) {
    throw new UserError(field, 'a writable file path', new Received(`${file} (${(err as NodeJS.ErrnoException).code ?? (err as Error).message})`));
  }
}

/** Writes FILE.json = { metadata, summary } and returns its name. */
export async function writeSidecar(file: string, metadata: string, summary: Json, field: string): Promise<string> {
  const sidecar = `${file}.json`;
  await writeOutput(sidecar, `${JSON.stringify({ metadata: JSON.parse(metadata) as unknown, summary }, null, 2)}\n`, field);
  return sidecar;
}

/** The plot file's bytes: the SVG with its sheet in <metadata>, or a PNG (sharp, 144 dpi) with it in an iTXt chunk. */
export async function plotFileBytes(svg: string, metadata: string, file: string): Promise<string | Buffer> {
  const { pngWithMetadata, svgWithMetadata } = await import('../../io/embed-metadata.js');
  if (!file.toLowerCase().endsWith('.png')) return svgWithMetadata(svg, metadata);
  return pngWithMetadata(await rasterisePlot(svg, 144), metadata);
}

/**
 * A plot's SVG as PNG through sharp (librsvg) at `density` dpi. Text must
 * arrive as outlines (figure/outline-lettering.ts): a <text> element would be
 * set in whatever fonts the machine has, so the bytes would depend on it;
 * such an SVG is refused (a programming error, not bad input).
 */
export async function rasterisePlot(svg: string, density = 72): Promise<Buffer> {
  if (/<text[\s>]/.test(svg)) throw new Error('rasterisePlot: the SVG holds a <text> element; set its text as outlines');
  const sharp = (await import('sharp')).default;
  return sharp(Buffer.from(svg), { density }).png().toBuffer();
}
