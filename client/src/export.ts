// "waveplan: Export C for this spec" (and the "Export C to …" code lens): asks the server to write
// the spec's C header and source — the server uses the unsaved editor text and refuses while the
// spec has errors — and tells the user where the files went or why nothing was written.
// The server's own command is waveplan.exportC; this UI wrapper needs a different id, because the
// language client registers every server command under the server's id already.

import * as vscode from 'vscode';
import { ExecuteCommandRequest, type LanguageClient } from 'vscode-languageclient/node';

export const EXPORT_FOR_FILE_COMMAND = 'waveplan.exportCForFile';
const SERVER_EXPORT_COMMAND = 'waveplan.exportC';

/**
 * The wave spec a command is about: its argument (a URI string from a code lens, a Uri from the
 * explorer) or else the active editor's file. Undefined, after telling the user, when there is none.
 */
export function specTarget(argument: unknown, action: string): vscode.Uri | undefined {
  if (argument instanceof vscode.Uri) return argument;
  if (typeof argument === 'string' && argument !== '') return vscode.Uri.parse(argument, true);
  const document = vscode.window.activeTextEditor?.document;
  if (document && /\.wave\.yaml$/.test(document.uri.path)) return document.uri;
  void vscode.window.showInformationMessage(`waveplan: open a .wave.yaml file to ${action}.`);
  return undefined;
}

/**
 * Runs one server command on a spec. The answer is `{ error }` when the server refused; a thrown
 * request error (server down, crashed) becomes the same shape, so callers handle one case.
 */
export async function askServer(
  runningClient: () => LanguageClient | undefined,
  command: string,
  spec: vscode.Uri,
): Promise<Record<string, unknown>> {
  const client = runningClient();
  if (!client) return { error: 'the language server is not running; see the "waveplan" output' };
  try {
    const answer: unknown = await client.sendRequest(ExecuteCommandRequest.type, { command, arguments: [spec.toString()] });
    return answer && typeof answer === 'object' ? (answer as Record<string, unknown>) : { error: 'the server sent no answer' };
  } catch (error) {
    return { error: error instanceof Error ? error.message : String(error) };
  }
}

export function registerExport(runningClient: () => LanguageClient | undefined): vscode.Disposable {
  return vscode.commands.registerCommand(EXPORT_FOR_FILE_COMMAND, async (argument?: unknown) => {
    const spec = specTarget(argument, 'export its plans as C');
    if (!spec) return;
    const answer = await askServer(runningClient, SERVER_EXPORT_COMMAND, spec);
    const written = Array.isArray(answer.written) ? answer.written.filter((f): f is string => typeof f === 'string') : undefined;
    if (!written) {
      void vscode.window.showErrorMessage(`waveplan: ${typeof answer.error === 'string' ? answer.error : 'the export failed'}`);
      return;
    }
    const files = written.map((f) => vscode.Uri.file(f));
    const folder = files.length > 0 ? vscode.workspace.asRelativePath(vscode.Uri.joinPath(files[0], '..'), false) : '';
    const names = files.map((f) => f.path.split('/').pop()).join(', ');
    const header = files.find((f) => f.path.endsWith('.h'));
    const choice = await vscode.window.showInformationMessage(
      `waveplan: exported ${names} to ${folder}/`,
      ...(header ? ['Open header'] : []),
    );
    if (choice === 'Open header' && header) await vscode.window.showTextDocument(header, { preview: true });
  });
}
