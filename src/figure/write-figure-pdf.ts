/**
 * A figure scene as PDF, by pdfkit: the plate embedded from its PNG (pdfkit
 * copies the PNG's compressed rows, so a 16-bit PNG stays 16 bits per
 * component), strokes as vector paths, text in an embedded subset of the
 * figure font (selectable; pdftotext reads it back).
 *
 * Same scene, same bytes: pdfkit stamps the creation date and derives the
 * document ID from it; both are fixed here (the date to `FIXED_DATE`, the
 * ID to a SHA-256 prefix of the page's inputs), and nothing else in pdfkit's
 * output depends on the clock or on chance.
 */
import { createHash } from 'node:crypto';
import PDFDocument from 'pdfkit';
import type { FigureFont } from './figure-font.js';
import type { FigureScene } from './figure-scene.js';
import { PDF_METADATA_KEY } from './pdf-metadata-key.js';

/** The creation and modification date of every figure: a sheet has no time (the metadata names the version). */
export const FIXED_DATE = new Date(Date.UTC(2000, 0, 1, 0, 0, 0));

export interface PdfDocInfo {
  readonly title: string;
  readonly creator: string;
  /** The metadata JSON text (tool, version, sheet). */
  readonly metadata: string;
}

/** The figure as PDF bytes; `png` is the plate image. */
export async function figurePdf(scene: FigureScene, png: Uint8Array, font: FigureFont, info: PdfDocInfo): Promise<Buffer> {
  const doc = new PDFDocument({
    size: [scene.width, scene.height],
    margin: 0,
    autoFirstPage: true,
    compress: true,
    info: {
      Title: info.title,
      Creator: info.creator,
      Producer: info.creator,
      CreationDate: FIXED_DATE,
      ModDate: FIXED_DATE,
      [PDF_METADATA_KEY]: info.metadata,
    } as PDFKit.DocumentInfo,
  });
  const hash = createHash('sha256');
  hash.update(info.metadata);
  hash.update(png);
  hash.update(JSON.stringify(scene));
  // pdfkit writes the ID in the trailer at end(); replacing it before then is enough.
  (doc as unknown as { _id: Buffer })._id = hash.digest().subarray(0, 16);
  const chunks: Buffer[] = [];
  doc.on('data', (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve, reject) => {
    doc.on('end', () => resolve());
    doc.on('error', reject);
  });
  doc.registerFont('figure', Buffer.from(font.bytes));
  const p = scene.plate;
  doc.image(Buffer.from(png), p.x, p.y, { width: p.width, height: p.height });
  for (const s of scene.strokes) {
    if (s.points.length < 4) continue;
    doc.save();
    if (s.clip) doc.rect(p.x, p.y, p.width, p.height).clip();
    doc.moveTo(s.points[0]!, s.points[1]!);
    for (let i = 2; i + 1 < s.points.length; i += 2) doc.lineTo(s.points[i]!, s.points[i + 1]!);
    doc.lineWidth(s.width).lineJoin('round').lineCap('butt').strokeColor(s.colour).stroke();
    doc.restore();
  }
  for (const f of scene.fills) {
    doc.save();
    doc.rect(f.x, f.y, f.width, f.height).fillOpacity(f.opacity).fillColor(f.colour).fill();
    doc.restore();
  }
  for (const t of scene.texts) {
    doc.save();
    if (t.rotate !== 0) doc.rotate(t.rotate, { origin: [t.x, t.y] });
    doc.fillColor(t.colour);
    doc.font('figure').fontSize(t.size).text(t.text, t.x, t.y, { lineBreak: false, baseline: 'alphabetic' });
    doc.restore();
  }
  doc.end();
  await done;
  return Buffer.concat(chunks);
}
