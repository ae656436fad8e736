// Line breaks as LSP counts them (LSP 3.17, "Position": CR LF, a lone CR and LF each end a line):
// converting a text to one kind or a mix, and checking that edits insert the file's own breaks.
// The oracle for positions is vscode-languageserver-textdocument.

import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Range } from './ranges';

export const BREAKS = { lf: '\n', crlf: '\r\n', cr: '\r' } as const;
export type BreakKind = keyof typeof BREAKS | 'mixed';

/** The text with every break replaced: one kind, or LF, CR LF and lone CR in turn. */
export function withBreaks(text: string, kind: BreakKind): string {
  const lines = text.split(/\r\n|\r|\n/);
  if (kind !== 'mixed') return lines.join(BREAKS[kind]);
  // A lone CR is always followed by a line that ends in CR LF, so it never pairs with an LF.
  return lines.map((l, i) => (i < lines.length - 1 ? l + ['\r\n', '\n', '\r'][i % 3] : l)).join('');
}

export const breaksIn = (text: string): string[] => text.match(/\r\n|\r|\n/g) ?? [];

/** The break that ends line `line` of the document (undefined on its last line). */
export function breakOfLine(doc: TextDocument, line: number): string | undefined {
  return breaksIn(doc.getText({ start: { line, character: 0 }, end: { line: line + 1, character: 0 } }))[0];
}

/**
 * Problems of edits on `doc` with its line breaks: each break an edit inserts must be the one
 * that ends the line it is inserted on (or, on the last line, the document's other breaks).
 */
export function insertedBreakProblems(doc: TextDocument, edits: readonly { range: Range; newText: string }[]): string[] {
  const problems: string[] = [];
  const kinds = new Set(breaksIn(doc.getText()));
  for (const e of edits) {
    const own = breakOfLine(doc, e.range.start.line) ?? breakOfLine(doc, Math.max(0, e.range.start.line - 1));
    for (const b of breaksIn(e.newText)) {
      const fits = own !== undefined ? b === own : kinds.size === 0 || kinds.has(b);
      if (!fits) problems.push(`inserts ${JSON.stringify(b)} on line ${e.range.start.line}, which ends in ${JSON.stringify(own)}`);
    }
  }
  return problems;
}
