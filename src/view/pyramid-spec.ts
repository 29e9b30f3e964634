/**
 * What fixes every byte of a pyramid: the sheet's render record (view,
 * pixels, iterations, samples, colouring) plus the tile size, format and
 * JPEG quality. It is written once into the output folder as pyramid.json
 * (io/iiif-manifest.ts), so a resumed run, a shard, `--finish` and a queue
 * worker on another machine all work from the same record.
 */
import { renderRecord, type Sheet } from './sheet.js';

/** The tile image format of a pyramid. */
export type TileFormat = 'png' | 'jpg';

export interface PyramidSpec {
  readonly tool: 'quadatlas';
  readonly kind: 'pyramid';
  /** The quadatlas version that started the pyramid (a different version may give different bytes). */
  readonly version: string;
  /** renderRecord of the sheet: everything that fixes the pixels. */
  readonly sheet: Record<string, unknown>;
  readonly tileSize: number;
  readonly format: TileFormat;
  /** JPEG quality (recorded for PNG too, where it has no effect). */
  readonly quality: number;
}

export function pyramidSpec(sheet: Sheet, tileSize: number, format: TileFormat, quality: number, version: string): PyramidSpec {
  return { tool: 'quadatlas', kind: 'pyramid', version, sheet: renderRecord(sheet, version), tileSize, format, quality };
}

/** The parts of two specs that decide the pixels and paths (everything but the version). */
export function sameSpec(a: PyramidSpec, b: PyramidSpec): boolean {
  const key = (s: PyramidSpec): string => JSON.stringify([s.sheet, s.tileSize, s.format, s.format === 'jpg' ? s.quality : 0]);
  return key(a) === key(b);
}
