// Well-formedness oracle: the strict mode of `sax`, a general-purpose streaming XML parser
// (present in node_modules through xml2js); it rejects unbalanced tags, bad entities and
// unquoted attributes as the XML 1.0 recommendation requires.

import { createRequire } from 'node:module';

interface SaxParser {
  onerror: (e: Error) => void;
  onopentag: (node: { name: string; attributes: Record<string, string> }) => void;
  write(s: string): SaxParser;
  close(): void;
}
const sax = createRequire(import.meta.url)('sax') as { parser(strict: boolean): SaxParser };

export interface XmlSummary {
  root: string;
  elements: Array<{ name: string; attributes: Record<string, string> }>;
}

/** Parses strictly; throws with the parser's message on the first well-formedness error. */
export function parseXml(text: string): XmlSummary {
  const parser = sax.parser(true);
  const elements: XmlSummary['elements'] = [];
  parser.onerror = (e) => {
    throw e;
  };
  parser.onopentag = (node) => {
    elements.push({ name: node.name, attributes: node.attributes });
  };
  parser.write(text).close();
  if (elements.length === 0) throw new Error('no root element');
  return { root: elements[0].name, elements };
}

export function byClass(x: XmlSummary, cls: string): XmlSummary['elements'] {
  return x.elements.filter((e) => e.attributes.class === cls);
}
