// Code lenses on the `outputs:` line of a wave spec: export the spec's plans as C, and open its
// plan report. They run the VS Code client's commands (which show the outcome to the user and call
// the server's waveplan.exportC / waveplan.htmlReport), not the server's own: a lens that ran a
// server command directly would drop its answer on the floor.
// When the export command would refuse (errors, no hardware), the export lens says so instead of
// offering a dead action: its title names the refusal and the first finding, and it runs nothing
// (a lens whose command id is empty is shown as plain text).

import type { CodeLens } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { exportDecision, refusalWords } from '../export/refusal';
import type { Analysis } from '../spec/types';
import { uriToPath } from './documents';
import type { SyntaxTree } from './yaml-path';

/** Client commands (client/src/export.ts, client/src/report-view.ts); argument: the spec's URI. */
export const EXPORT_C_FOR_FILE = 'waveplan.exportCForFile';
export const OPEN_REPORT = 'waveplan.openReport';

/** `generated` → `generated/`, as the lens names the folder. */
export function folderLabel(directory: string): string {
  const trimmed = directory.replace(/[\\/]+$/, '');
  return `${trimmed === '' ? '.' : trimmed}/`;
}

/** The export lens: the action when the export would write, else why it would not. */
function exportLens(doc: TextDocument, analysis: Analysis, exportDirectory: string): CodeLens['command'] {
  const decision = exportDecision({ file: uriToPath(doc.uri), analysis });
  if (decision.kind === 'ready') return { title: `Export C to ${folderLabel(exportDirectory)}`, command: EXPORT_C_FOR_FILE, arguments: [doc.uri] };
  const first = decision.findings[0];
  const where = first ? ` — first: line ${first.range.start.line + 1}, ${first.code}` : '';
  return { title: `C export blocked: ${refusalWords(decision)}${where}`, command: '' };
}

export function codeLenses(doc: TextDocument, tree: SyntaxTree, analysis: Analysis, exportDirectory: string): CodeLens[] {
  if (!/\.wave\.yaml$/.test(doc.uri)) return [];
  const key = tree.topLevel().find((k) => k.key === 'outputs');
  if (!key) return [];
  const range = { start: doc.positionAt(key.start), end: doc.positionAt(key.end) };
  return [
    { range, command: exportLens(doc, analysis, exportDirectory) },
    { range, command: { title: 'Open plan report', command: OPEN_REPORT, arguments: [doc.uri] } },
  ];
}
