// "waveplan: Show plan report": asks the server for the markdown of the current file's outputs
// and shows it in the editor's own markdown preview. The markdown lives in a read-only virtual
// document, so closing the preview never asks to save anything.

import * as vscode from 'vscode';
import { ExecuteCommandRequest, type LanguageClient } from 'vscode-languageclient/node';

export const SHOW_REPORT_COMMAND = 'waveplan.showPlanReport';
/** The server command that answers with the markdown of every output of one file. */
export const SERVER_REPORT_COMMAND = 'waveplan.planReport';
const SCHEME = 'waveplan-report';

const SPEC_LANGUAGES = new Set(['waveplan-wave', 'waveplan-clock']);

function isSpec(document: vscode.TextDocument): boolean {
  return SPEC_LANGUAGES.has(document.languageId) || /\.(wave|clock)\.yaml$/.test(document.uri.path);
}

/** The server may answer with the markdown itself or wrap it in an object; accept both. */
function markdownOf(answer: unknown): string | undefined {
  if (typeof answer === 'string') return answer;
  if (answer && typeof answer === 'object' && typeof (answer as { markdown?: unknown }).markdown === 'string') {
    return (answer as { markdown: string }).markdown;
  }
  return undefined;
}

class ReportDocuments implements vscode.TextDocumentContentProvider {
  private readonly texts = new Map<string, string>();
  private readonly changed = new vscode.EventEmitter<vscode.Uri>();
  readonly onDidChange = this.changed.event;

  /** One report document per spec file; showing it again replaces its text. */
  put(spec: vscode.Uri, markdown: string): vscode.Uri {
    const name = spec.path.split('/').pop() ?? 'spec';
    const uri = vscode.Uri.from({ scheme: SCHEME, path: `/${name}.plan.md`, query: spec.toString() });
    this.texts.set(uri.toString(), markdown);
    this.changed.fire(uri);
    return uri;
  }

  provideTextDocumentContent(uri: vscode.Uri): string {
    return this.texts.get(uri.toString()) ?? '';
  }

  dispose(): void {
    this.changed.dispose();
  }
}

export function registerPlanReport(runningClient: () => LanguageClient | undefined): vscode.Disposable {
  const documents = new ReportDocuments();
  const show = async (): Promise<void> => {
    const editor = vscode.window.activeTextEditor;
    if (!editor || !isSpec(editor.document)) {
      void vscode.window.showInformationMessage('waveplan: open a .wave.yaml or .clock.yaml file to see its plan report.');
      return;
    }
    const client = runningClient();
    if (!client) {
      void vscode.window.showErrorMessage('waveplan: the language server is not running; see the "waveplan" output.');
      return;
    }
    const spec = editor.document.uri;
    let markdown: string | undefined;
    try {
      const answer = await client.sendRequest(ExecuteCommandRequest.type, {
        command: SERVER_REPORT_COMMAND,
        arguments: [spec.toString()],
      });
      markdown = markdownOf(answer);
    } catch (error) {
      const reason = error instanceof Error ? error.message : String(error);
      void vscode.window.showErrorMessage(`waveplan: the server could not build the plan report: ${reason}`);
      return;
    }
    if (markdown === undefined) {
      void vscode.window.showErrorMessage('waveplan: the server sent no plan report for this file.');
      return;
    }
    const uri = documents.put(spec, markdown);
    await vscode.commands.executeCommand('markdown.showPreviewToSide', uri);
  };
  return vscode.Disposable.from(
    documents,
    vscode.workspace.registerTextDocumentContentProvider(SCHEME, documents),
    vscode.commands.registerCommand(SHOW_REPORT_COMMAND, show),
  );
}
