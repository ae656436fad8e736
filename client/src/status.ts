// A status bar item that counts the outputs the server reports as out of tolerance, and the files
// with any other error (a YAML syntax error, a schema problem, an unreadable clock), across all
// open and checked files. It reads the editor's diagnostics, so it never disagrees with Problems,
// and it shows the all-clear mark only when no waveplan error is left anywhere: a file that does
// not parse is never summarised as good.

import * as vscode from 'vscode';
import { countStatus, statusText } from './status-summary';

/** The code of a diagnostic as a plain string, whichever of the API's shapes it came in. */
function codeOf(diagnostic: vscode.Diagnostic): string | undefined {
  const code = diagnostic.code;
  if (code === undefined) return undefined;
  return typeof code === 'object' ? String(code.value) : String(code);
}

export class OutOfToleranceStatus implements vscode.Disposable {
  private readonly item = vscode.window.createStatusBarItem('waveplan.outOfTolerance', vscode.StatusBarAlignment.Left, 10);
  private readonly listener: vscode.Disposable;

  constructor() {
    this.item.name = 'waveplan: outputs out of tolerance and files with errors';
    // The Problems panel lists each one with its range; that is where a click should lead.
    this.item.command = 'workbench.actions.view.problems';
    this.listener = vscode.languages.onDidChangeDiagnostics(() => this.update());
    this.update();
    this.item.show();
  }

  private update(): void {
    const shown = statusText(countStatus(vscode.languages.getDiagnostics().map(([, ds]) => ds.map((d) => ({ source: d.source, code: codeOf(d), error: d.severity === vscode.DiagnosticSeverity.Error })))));
    this.item.text = shown.text;
    this.item.tooltip = shown.tooltip;
    this.item.backgroundColor =
      shown.level === 'ok' ? undefined : new vscode.ThemeColor(shown.level === 'error' ? 'statusBarItem.errorBackground' : 'statusBarItem.warningBackground');
  }

  dispose(): void {
    this.listener.dispose();
    this.item.dispose();
  }
}
