// The outline: a wave spec's outputs (from the analysis), a clock file's top-level sections
// (from the tree). VS Code drops the whole answer when a selectionRange is outside its range,
// so every symbol's range is widened to hold its selection.

import { SymbolKind, type DocumentSymbol, type Position, type Range } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Analysis, OutputAnalysis } from '../spec/types';
import type { SyntaxTree } from './yaml-path';
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

// An output's symbol depends on nothing but its analysis object, which the spec layer hands out
// again while the output is untouched and stays on its line: an edit elsewhere reuses it.
const outputSymbols = new WeakMap<OutputAnalysis, DocumentSymbol>();

function outputSymbol(output: OutputAnalysis): DocumentSymbol {
  let found = outputSymbols.get(output);
  if (!found) {
    const plan = output.planning.plan;
    const detail = plan ? hintText(plan) : VERDICT_WORDS[output.planning.verdict];
    found = symbol(output.name, detail, SymbolKind.Event, output.entryRange, output.nameRange);
    outputSymbols.set(output, found);
  }
  return found;
}

export function waveSymbols(analysis: Analysis): DocumentSymbol[] {
  return analysis.outputs.map(outputSymbol);
}

export function clockSymbols(doc: TextDocument, tree: SyntaxTree): DocumentSymbol[] {
  return tree.topLevel().map((k) => {
    const selection = { start: doc.positionAt(k.start), end: doc.positionAt(k.end) };
    const range = { start: doc.positionAt(k.start), end: doc.positionAt(k.valueEnd) };
    return symbol(k.key, '', SymbolKind.Module, range, selection);
  });
}
