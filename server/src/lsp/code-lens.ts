// Code lenses on the `outputs:` line of a wave spec: export the spec's plans as C, and open its
// plan report. They run the VS Code client's commands (which show the outcome to the user and call
// the server's waveplan.exportC / waveplan.htmlReport), not the server's own: a lens that ran a
// server command directly would drop its answer on the floor.

import { isMap, isPair, isScalar, type Document, type Node } from 'yaml';
import type { CodeLens } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';

/** Client commands (client/src/export.ts, client/src/report-view.ts); argument: the spec's URI. */
export const EXPORT_C_FOR_FILE = 'waveplan.exportCForFile';
export const OPEN_REPORT = 'waveplan.openReport';

/** `generated` → `generated/`, as the lens names the folder. */
export function folderLabel(directory: string): string {
  const trimmed = directory.replace(/[\\/]+$/, '');
  return `${trimmed === '' ? '.' : trimmed}/`;
}

function outputsKey(tree: Document): Node | undefined {
  if (!isMap(tree.contents)) return undefined;
  for (const pair of tree.contents.items) {
    if (isPair(pair) && isScalar(pair.key) && pair.key.value === 'outputs' && pair.key.range) return pair.key;
  }
  return undefined;
}

export function codeLenses(doc: TextDocument, tree: Document, exportDirectory: string): CodeLens[] {
  if (!/\.wave\.yaml$/.test(doc.uri)) return [];
  const key = outputsKey(tree);
  if (!key?.range) return [];
  const range = { start: doc.positionAt(key.range[0]), end: doc.positionAt(key.range[1]) };
  return [
    { range, command: { title: `Export C to ${folderLabel(exportDirectory)}`, command: EXPORT_C_FOR_FILE, arguments: [doc.uri] } },
    { range, command: { title: 'Open plan report', command: OPEN_REPORT, arguments: [doc.uri] } },
  ];
}
