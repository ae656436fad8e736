// Code lenses on the `outputs:` line of a wave spec: export the spec's plans as C, and open its
// plan report. They run the VS Code client's commands (which show the outcome to the user and call
// the server's waveplan.exportC / waveplan.htmlReport), not the server's own: a lens that ran a
// server command directly would drop its answer on the floor.

import type { CodeLens } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import type { SyntaxTree } from './yaml-path';

/** Client commands (client/src/export.ts, client/src/report-view.ts); argument: the spec's URI. */
export const EXPORT_C_FOR_FILE = 'waveplan.exportCForFile';
export const OPEN_REPORT = 'waveplan.openReport';

/** `generated` → `generated/`, as the lens names the folder. */
export function folderLabel(directory: string): string {
  const trimmed = directory.replace(/[\\/]+$/, '');
  return `${trimmed === '' ? '.' : trimmed}/`;
}

export function codeLenses(doc: TextDocument, tree: SyntaxTree, exportDirectory: string): CodeLens[] {
  if (!/\.wave\.yaml$/.test(doc.uri)) return [];
  const key = tree.topLevel().find((k) => k.key === 'outputs');
  if (!key) return [];
  const range = { start: doc.positionAt(key.start), end: doc.positionAt(key.end) };
  return [
    { range, command: { title: `Export C to ${folderLabel(exportDirectory)}`, command: EXPORT_C_FOR_FILE, arguments: [doc.uri] } },
    { range, command: { title: 'Open plan report', command: OPEN_REPORT, arguments: [doc.uri] } },
  ];
}
