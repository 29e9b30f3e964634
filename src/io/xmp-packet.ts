/**
 * Our XMP element for a plate's metadata JSON. The namespace is ours (XMP
 * allows private schemas, Adobe XMP Specification Part 1, §7.2); the URN
 * form needs no web address.
 */
const NS = 'urn:quadatlas:sheet:1';

/**
 * An XMP packet (ISO 16684-1 / Adobe XMP Specification Part 1) holding the
 * JSON text in element quadatlas:sheet, XML-escaped, and the writing tool in
 * xmp:CreatorTool. Used for TIFF, whose ASCII ImageDescription cannot carry
 * UTF-8 and which sharp cannot set.
 */
export function xmpPacket(json: string, software: string): string {
  return (
    '<?xpacket begin="\ufeff" id="W5M0MpCehiHzreSzNTczkc9d"?>' +
    '<x:xmpmeta xmlns:x="adobe:ns:meta/"><rdf:RDF xmlns:rdf="http://www.w3.org/1999/02/22-rdf-syntax-ns#">' +
    `<rdf:Description rdf:about="" xmlns:xmp="http://ns.adobe.com/xap/1.0/" xmlns:quadatlas="${NS}">` +
    `<xmp:CreatorTool>${escapeXml(software)}</xmp:CreatorTool>` +
    `<quadatlas:sheet>${escapeXml(json)}</quadatlas:sheet>` +
    '</rdf:Description></rdf:RDF></x:xmpmeta><?xpacket end="w"?>'
  );
}

/** The JSON text xmpPacket stored, or undefined when the packet holds none. */
export function jsonFromXmp(xmp: string): string | undefined {
  const m = /<quadatlas:sheet>([^<]*)<\/quadatlas:sheet>/.exec(xmp);
  return m === null ? undefined : unescapeXml(m[1]!);
}

function escapeXml(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

function unescapeXml(s: string): string {
  return s.replace(/&(lt|gt|amp|quot|apos|#x[0-9a-fA-F]+|#[0-9]+);/g, (_, e: string) => {
    if (e === 'lt') return '<';
    if (e === 'gt') return '>';
    if (e === 'amp') return '&';
    if (e === 'quot') return '"';
    if (e === 'apos') return "'";
    return String.fromCodePoint(e[1] === 'x' ? parseInt(e.slice(2), 16) : parseInt(e.slice(1), 10));
  });
}
