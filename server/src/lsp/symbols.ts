// The outline: every output entry of a wave spec, broken ones included, each with its state in
// `detail` (what its plan achieves, or why it has none: see output-states.ts); a clock file's
// top-level sections with their findings. Entries come from the trees the analysis read
// (spec/syntax.ts: a piece that does not parse is still an entry), plans from the analysis.
// VS Code drops the whole answer when a selectionRange is outside its range, so every symbol's
// range is widened to hold its selection.

import { SymbolKind, type DocumentSymbol, type Position, type Range } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Analysis, OutputAnalysis } from '../spec/types';
import type { SyntaxTree, TopLevelKey } from './yaml-path';
import { type Findings, findingsByOutput, findingsIn, findingsText, plannedState, unplannedState } from './output-states';

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

// A planned output's symbol depends on its analysis object, which the spec layer hands out again
// while the output is untouched and stays on its line, and on its findings: an edit elsewhere reuses it.
const outputSymbols = new WeakMap<OutputAnalysis, { findings: string; symbol: DocumentSymbol }>();

function plannedSymbol(output: OutputAnalysis, findings: Findings | undefined): DocumentSymbol {
  const key = findingsText(findings);
  let found = outputSymbols.get(output);
  if (found?.findings !== key) {
    found = { findings: key, symbol: symbol(output.name, plannedState(output, findings), SymbolKind.Event, output.entryRange, output.nameRange) };
    outputSymbols.set(output, found);
  }
  return found.symbol;
}

/** Where an entry's value ends before the line breaks and spaces a block's range takes in. */
function contentEnd(text: string, k: TopLevelKey): number {
  let end = k.valueEnd;
  while (end > k.end && /\s/.test(text.charAt(end - 1))) end--;
  return end;
}

const at = (p: Position): string => `${p.line}:${p.character}`;

/**
 * Every output entry in file order. `partial` while the analysis is still being made in slices
 * (an output not planned yet is said to be so, not to have no plan).
 */
export function waveSymbols(doc: TextDocument, analysis: Analysis, tree: SyntaxTree, partial = false): DocumentSymbol[] {
  const planned = new Map(analysis.outputs.map((o) => [at(o.nameRange.start), o]));
  const findings = findingsByOutput(analysis);
  const out: DocumentSymbol[] = [];
  const text = doc.getText();
  const range = (entry: TopLevelKey) => ({
    selection: { start: doc.positionAt(entry.start), end: doc.positionAt(entry.end) },
    whole: { start: doc.positionAt(entry.start), end: doc.positionAt(contentEnd(text, entry)) },
  });
  for (const entry of tree.outputEntries()) {
    const { selection, whole } = range(entry);
    const output = planned.get(at(selection.start));
    if (output) {
      planned.delete(at(selection.start));
      out.push(plannedSymbol(output, findings.get(output.name)));
    } else {
      out.push(symbol(entry.key, unplannedState(doc, analysis, entry.key, whole, partial), SymbolKind.Event, whole, selection));
    }
  }
  // A planned output the tree did not list (never expected): shown rather than lost.
  for (const output of planned.values()) out.push(plannedSymbol(output, findings.get(output.name)));
  // The tree keeps only the first of two outputs with one name; the other is an entry too.
  for (const d of analysis.diagnostics) {
    if (d.code === 'duplicate-output') out.push(symbol(d.output ?? doc.getText(d.range), unplannedState(doc, analysis, '', d.range, partial), SymbolKind.Event, d.range, d.range));
  }
  return out.sort((a, b) => a.range.start.line - b.range.start.line || a.range.start.character - b.range.start.character);
}

/** A one-line value as written (`120 MHz`), or '' for a section or a long text. */
function shortValue(doc: TextDocument, k: TopLevelKey): string {
  const text = doc.getText().slice(k.end, k.valueEnd).replace(/^\s*:\s*/, '');
  return /[\r\n]/.test(text) || text.length > 40 ? '' : text;
}

/** A clock file's top-level keys: a value as written, and the findings on each one's lines. */
export function clockSymbols(doc: TextDocument, analysis: Analysis, tree: SyntaxTree): DocumentSymbol[] {
  return tree.topLevel().map((k) => {
    const selection = { start: doc.positionAt(k.start), end: doc.positionAt(k.end) };
    const range = { start: doc.positionAt(k.start), end: doc.positionAt(contentEnd(doc.getText(), k)) };
    const detail = [shortValue(doc, k), findingsText(findingsIn(analysis, range))].filter(Boolean).join(' · ');
    return symbol(k.key, detail, SymbolKind.Module, range, selection);
  });
}
