// Where a value sits in a clock file's text, for the quick fixes that edit the clock file (the
// system-clock retune, the coupling capacitor): the range of the scalar at a key path.

import { TextDocument } from 'vscode-languageserver-textdocument';
import { isScalar, parseDocument } from 'yaml';
import type { Range } from 'vscode-languageserver/node';

/** Range (LSP positions and text offsets) of the scalar at `path`, or undefined. */
export function clockValueRange(text: string, path: readonly string[]): { range: Range; offsets: [number, number] } | undefined {
  const doc = parseDocument(text, { keepSourceTokens: true });
  const node = doc.getIn(path, true);
  if (!isScalar(node) || !node.range) return undefined;
  const td = TextDocument.create('file:///clock', 'yaml', 0, text);
  return { range: { start: td.positionAt(node.range[0]), end: td.positionAt(node.range[1]) }, offsets: [node.range[0], node.range[1]] };
}
