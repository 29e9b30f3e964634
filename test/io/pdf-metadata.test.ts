import { describe, expect, it } from 'vitest';
import { metadataFromPdf } from '../../src/io/pdf-metadata.js';

describe('metadataFromPdf', () => {
  it('reads a literal string with escapes and nested parentheses (ISO 32000-1, 7.3.4.2)', () => {
    const pdf = '%PDF-1.3\n7 0 obj\n(a \\(b\\) (c) \\\\ d\\n\\101)\nendobj\n9 0 obj\n<<\n/QuadatlasSheet 7 0 R\n>>\nendobj\n';
    expect(metadataFromPdf(pdf)).toBe('a (b) (c) \\ d\nA');
  });

  it('decodes a UTF-16BE text string after the byte order mark FE FF (7.9.2.2)', () => {
    const utf16 = Buffer.from('\ufeff{"t":"Ω é"}', 'utf16le').swap16().toString('latin1');
    const pdf = `%PDF-1.3\n3 0 obj\n(${utf16.replace(/[()\\]/g, (c) => `\\${c}`)})\nendobj\n<< /QuadatlasSheet 3 0 R >>\n`;
    expect(metadataFromPdf(pdf)).toBe('{"t":"Ω é"}');
  });

  it('returns undefined for a PDF without the key', () => {
    expect(metadataFromPdf('%PDF-1.3\n1 0 obj\n<< /Title (x) >>\nendobj\n')).toBeUndefined();
  });
});
