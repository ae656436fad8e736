// An edit as an editor sends it: the smallest range that turns one text into the next (the common
// start and end kept), never splitting a CR LF pair.

import type { Range } from '../ranges';
import type { TextDocument } from 'vscode-languageserver-textdocument';

export interface RangedEdit {
  range: Range;
  text: string;
}

export function rangedEdit(doc: TextDocument, next: string): RangedEdit {
  const text = doc.getText();
  let start = 0;
  const most = Math.min(text.length, next.length);
  while (start < most && text[start] === next[start]) start++;
  let end = 0;
  while (end < most - start && text[text.length - 1 - end] === next[next.length - 1 - end]) end++;
  // Keep CR LF pairs whole on both sides of the cut.
  if (start > 0 && text[start - 1] === '\r' && (text[start] === '\n' || next[start] === '\n')) start--;
  if (end > 0 && text[text.length - end] === '\n' && text[text.length - end - 1] === '\r') end--;
  const from = start;
  const to = text.length - end;
  return { range: { start: doc.positionAt(from), end: doc.positionAt(to) }, text: next.slice(from, next.length - end) };
}
