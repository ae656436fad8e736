// "waveplan: Re-check workspace". The language client registers every command the server
// advertises under the same id, so the palette entry normally reaches the server with no code here.
// Registering it ourselves as well would make the client's own registration throw; we add it only
// when the server did not advertise it, so the palette entry never dangles.

import * as vscode from 'vscode';
import { ExecuteCommandRequest, type LanguageClient } from 'vscode-languageclient/node';

export const RECHECK_COMMAND = 'waveplan.recheckWorkspace';

export async function registerRecheckFallback(client: LanguageClient): Promise<vscode.Disposable> {
  const known = await vscode.commands.getCommands(true);
  if (known.includes(RECHECK_COMMAND)) return new vscode.Disposable(() => undefined);
  return vscode.commands.registerCommand(RECHECK_COMMAND, async () => {
    try {
      await client.sendRequest(ExecuteCommandRequest.type, { command: RECHECK_COMMAND, arguments: [] });
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      void vscode.window.showErrorMessage(`waveplan: the server could not re-check the workspace: ${reason}`);
    }
  });
}
