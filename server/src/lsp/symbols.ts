// The outline: a wave spec's outputs (from the analysis), a clock file's top-level sections
// (from the tree). VS Code drops the whole answer when a selectionRange is outside its range,
// so every symbol's range is widened to hold its selection.

import { SymbolKind, type DocumentSymbol, type Position, type Range } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { isMap, isPair, isScalar, type Document, type Node } from 'yaml';
import type { Analysis } from '../spec/types';
import { hintText } from './inlay-hints';
import { VERDICT_WORDS } from './plan-card';

const before = (a: Position, b: Position): boolean => a.line < b.line || (a.line === b.line && a.character < b.character);

/** The smallest range holding both. */
export function cover(range: Range, selection: Range): Range {
  return {
    start: before(selection.start, range.start) ? selection.start : range.start,
    end: before(range.end, selection.end) ? selection.end : range.end,
  };
}

function symbol(name: string, detail: string, kind: SymbolKind, range: Range, selectionRange: Range): DocumentSymbol {
  return { name: name === '' ? '(unnamed)' : name, detail, kind, range: cover(range, selectionRange), selectionRange };
}

export function waveSymbols(analysis: Analysis): DocumentSymbol[] {
  return analysis.outputs.map((output) => {
    const plan = output.planning.plan;
    const detail = plan ? hintText(plan) : VERDICT_WORDS[output.planning.verdict];
    return symbol(output.name, detail, SymbolKind.Event, output.entryRange, output.nameRange);
  });
}

export function clockSymbols(doc: TextDocument, tree: Document): DocumentSymbol[] {
  const root = tree.contents as Node | null;
  if (!isMap(root)) return [];
  const out: DocumentSymbol[] = [];
  for (const pair of root.items) {
    if (!isPair(pair) || !isScalar(pair.key) || !pair.key.range) continue;
    const key = pair.key.range;
    const end = (pair.value as Node | null)?.range?.[1] ?? key[1];
    const selection = { start: doc.positionAt(key[0]), end: doc.positionAt(key[1]) };
    const range = { start: doc.positionAt(key[0]), end: doc.positionAt(end) };
    out.push(symbol(String(pair.key.value), '', SymbolKind.Module, range, selection));
  }
  return out;
}
