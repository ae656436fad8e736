// Go to definition on a wave spec's `clock:` (key or value) opens the clock file it resolves to.

import type { Location } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { Analysis } from '../spec/types';
import type { SyntaxTree } from './yaml-path';

export function clockDefinition(
  doc: TextDocument,
  tree: SyntaxTree,
  analysis: Analysis,
  offset: number,
  uriOf: (path: string) => string,
): Location[] {
  if (analysis.kind !== 'wave' || !analysis.clockPath) return [];
  const at = tree.nodeAt(offset);
  if (!at || at.path.length !== 1 || at.path[0] !== 'clock') return [];
  const start = { line: 0, character: 0 };
  return [{ uri: uriOf(analysis.clockPath), range: { start, end: start } }];
}
