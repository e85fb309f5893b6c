import { SaxesParser } from 'saxes';

/**
 * A thin streaming XML walk over saxes: element names without their
 * namespace prefix (writers differ in prefixes: x:c, c, ss:c), attributes by
 * local name, and text delivered to the element it sits in.
 */
export interface XmlHandlers {
  open(name: string, attrs: Record<string, string>): void;
  close(name: string): void;
  text?(text: string): void;
}

export function localName(qname: string): string {
  const i = qname.indexOf(':');
  return i < 0 ? qname : qname.slice(i + 1);
}

export function createXmlWalker(h: XmlHandlers): SaxesParser {
  const parser = new SaxesParser({ position: false });
  parser.on('opentag', (tag) => {
    const attrs: Record<string, string> = {};
    const raw = tag.attributes as Record<string, string>;
    for (const k in raw) attrs[localName(k)] = raw[k];
    h.open(localName(tag.name), attrs);
  });
  parser.on('closetag', (tag) => h.close(localName(tag.name)));
  if (h.text) parser.on('text', h.text);
  return parser;
}

const decoder = new TextDecoder('utf-8');

/** Walks a small part in one go. */
export function walkXml(bytes: Uint8Array, h: XmlHandlers): void {
  const p = createXmlWalker(h);
  p.write(decoder.decode(bytes));
  p.close();
}
