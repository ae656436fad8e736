// Minimal text edits: replace a value where it is written, or add one `key: value` line with the
// mapping's own indentation (or one item of a flow mapping). Comments and layout elsewhere are
// untouched, and an added line keeps the file's own line breaks.

import type { Position, TextEdit } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { isMap, isScalar, type Document, type Node } from 'yaml';
import { lineBreakAt } from '../spec/line-breaks';
import type { OutputAnalysis } from '../spec/types';

function lineText(doc: TextDocument, line: number): string {
  return doc.getText({ start: { line, character: 0 }, end: { line: line + 1, character: 0 } }).replace(/(?:\r\n|\r|\n)$/, '');
}

/** The break ending `line` (else the line before's, else the file's own): mixed files keep each line's own. */
export function lineBreak(doc: TextDocument, line: number): string {
  return lineBreakAt(doc.getText(), line);
}

/** Replaces the written value of `key` with `text`; undefined when the entry has no such key. */
export function replaceValue(output: OutputAnalysis, key: string, text: string): TextEdit | undefined {
  const range = output.valueRanges[key];
  return range ? { range, newText: text } : undefined;
}

const after = (a: Position, b: Position): boolean => a.line > b.line || (a.line === b.line && a.character > b.character);

/** Adds `key: value` to the entry, as a new line of a block mapping or a new item of a flow mapping. */
export function addKey(doc: TextDocument, output: OutputAnalysis, key: string, value: string): TextEdit | undefined {
  const ranges = Object.values(output.valueRanges);
  if (ranges.length === 0) return undefined;
  let last = ranges[0].end;
  for (const r of ranges) if (after(r.end, last)) last = r.end;
  const first = ranges.reduce((a, r) => (after(a.start, r.start) ? r : a)).start;
  if (first.line === output.nameRange.start.line) {
    // `name: { shape: sine, frequency: 1 kHz }` — a flow mapping on the name's line.
    return { range: { start: last, end: last }, newText: `, ${key}: ${value}` };
  }
  // A block value's range can end at column 0 of the next line; that line is not the entry's.
  if (last.character === 0 && last.line > first.line) last = { line: last.line - 1, character: 0 };
  const indent = /^\s*/.exec(lineText(doc, first.line))?.[0] ?? '  ';
  const end = { line: last.line, character: lineText(doc, last.line).length };
  return { range: { start: end, end }, newText: `${lineBreak(doc, end.line)}${indent}${key}: ${value}` };
}

/** Sets `key` to `value`: in place when written, added to the entry otherwise. */
export function setKey(doc: TextDocument, output: OutputAnalysis, key: string, value: string): TextEdit | undefined {
  return replaceValue(output, key, value) ?? addKey(doc, output, key, value);
}

/** The end of the last line a block node's text reaches (its range may run to the next line's start). */
function lastLineEnd(doc: TextDocument, startOffset: number, endOffset: number): Position {
  const text = doc.getText();
  let end = endOffset;
  while (end > startOffset && /\s/.test(text[end - 1])) end--;
  const at = doc.positionAt(end);
  return { line: at.line, character: lineText(doc, at.line).length };
}

/**
 * Adds `key: value` to the mapping at `path` of the parsed tree: a new line with the items' own
 * indentation in a block mapping, a new item before the `}` of a flow mapping. Undefined when the
 * path is not a mapping in the tree.
 */
export function addToMapping(doc: TextDocument, tree: Document, path: readonly (string | number)[], key: string, value: string): TextEdit | undefined {
  let node: unknown = tree.contents;
  for (const part of path) {
    if (!isMap(node)) return undefined;
    const pair = node.items.find((p) => isScalar(p.key) && String(p.key.value) === String(part));
    node = pair?.value;
  }
  if (!isMap(node) || !node.range) return undefined;
  const items = node.items.filter((p) => isScalar(p.key) && (p.key as Node).range);
  const text = doc.getText();
  if (node.flow) {
    const close = text.lastIndexOf('}', node.range[1]);
    if (close < node.range[0]) return undefined;
    let at = close;
    while (at > node.range[0] && /\s/.test(text[at - 1])) at--;
    const position = doc.positionAt(at);
    return { range: { start: position, end: position }, newText: items.length > 0 ? `, ${key}: ${value}` : ` ${key}: ${value} ` };
  }
  if (items.length === 0) return undefined;
  const first = (items[0].key as Node).range!;
  const last = items[items.length - 1];
  const lastEnd = ((last.value as Node | null)?.range ?? (last.key as Node).range!)[1];
  const indent = ' '.repeat(doc.positionAt(first[0]).character);
  const end = lastLineEnd(doc, first[0], lastEnd);
  return { range: { start: end, end }, newText: `${lineBreak(doc, end.line)}${indent}${key}: ${value}` };
}
