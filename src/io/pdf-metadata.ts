/**
 * The metadata JSON a figure's PDF carries: the document information
 * dictionary's `/QuadatlasSheet` entry, an indirect string object (PDF 1.7,
 * ISO 32000-1, 7.3.4.2 literal strings and 7.9.2.2 text strings: PDFDocEncoding,
 * or UTF-16BE after the byte order mark FE FF).
 */
import { readFile } from 'node:fs/promises';
import { PDF_METADATA_KEY } from '../figure/pdf-metadata-key.js';

const ESCAPES: Record<string, string> = { n: '\n', r: '\r', t: '\t', b: '\b', f: '\f', '(': '(', ')': ')', '\\': '\\' };

/** The bytes of the PDF literal string starting at `at` (the opening parenthesis), unescaped. */
function literalString(text: string, at: number): string | undefined {
  let depth = 0;
  let out = '';
  for (let i = at; i < text.length; i += 1) {
    const ch = text[i]!;
    if (ch === '\\') {
      const next = text[i + 1]!;
      if (/[0-7]/.test(next)) {
        const oct = /^[0-7]{1,3}/.exec(text.slice(i + 1, i + 4))![0];
        out += String.fromCharCode(parseInt(oct, 8));
        i += oct.length;
      } else if (next === '\r' || next === '\n') {
        i += next === '\r' && text[i + 2] === '\n' ? 2 : 1;
      } else {
        out += ESCAPES[next] ?? next;
        i += 1;
      }
      continue;
    }
    if (ch === '(') {
      depth += 1;
      if (depth === 1) continue;
    } else if (ch === ')') {
      depth -= 1;
      if (depth === 0) return out;
    }
    out += ch;
  }
  return undefined;
}

/** The metadata text of a PDF's bytes (latin1-decoded), or undefined when it has none. */
export function metadataFromPdf(latin1: string): string | undefined {
  const ref = new RegExp(`/${PDF_METADATA_KEY}\\s+(\\d+)\\s+0\\s+R`).exec(latin1);
  let raw: string | undefined;
  if (ref !== null) {
    const obj = new RegExp(`(?:^|[\\r\\n])${ref[1]!}\\s+0\\s+obj\\s*\\(`).exec(latin1);
    if (obj === null) return undefined;
    raw = literalString(latin1, obj.index + obj[0].length - 1);
  } else {
    const direct = new RegExp(`/${PDF_METADATA_KEY}\\s*\\(`).exec(latin1);
    if (direct === null) return undefined;
    raw = literalString(latin1, direct.index + direct[0].length - 1);
  }
  if (raw === undefined) return undefined;
  if (raw.charCodeAt(0) === 0xfe && raw.charCodeAt(1) === 0xff) {
    const bytes = Buffer.from(raw.slice(2), 'latin1');
    bytes.swap16();
    return bytes.toString('utf16le');
  }
  return raw;
}

export async function readPdfMetadata(path: string): Promise<string | undefined> {
  return metadataFromPdf((await readFile(path)).toString('latin1'));
}
