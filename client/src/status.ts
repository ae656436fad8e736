// A status bar item that counts the outputs the server reports as out of tolerance, across all
// open and checked files. It reads the editor's diagnostics, so it never disagrees with Problems.

import * as vscode from 'vscode';

export const OUT_OF_TOLERANCE_CODE = 'out-of-tolerance';
export const DIAGNOSTIC_SOURCE = 'waveplan';

/** The code of a diagnostic as a plain string, whichever of the API's shapes it came in. */
function codeOf(diagnostic: vscode.Diagnostic): string | undefined {
  const code = diagnostic.code;
  if (code === undefined) return undefined;
  return typeof code === 'object' ? String(code.value) : String(code);
}

export function countOutOfTolerance(entries: ReadonlyArray<readonly [vscode.Uri, readonly vscode.Diagnostic[]]>): number {
  let count = 0;
  for (const [, diagnostics] of entries) {
    for (const d of diagnostics) {
      if (d.source === DIAGNOSTIC_SOURCE && codeOf(d) === OUT_OF_TOLERANCE_CODE) count++;
    }
  }
  return count;
}

export class OutOfToleranceStatus implements vscode.Disposable {
  private readonly item = vscode.window.createStatusBarItem('waveplan.outOfTolerance', vscode.StatusBarAlignment.Left, 10);
  private readonly listener: vscode.Disposable;

  constructor() {
    this.item.name = 'waveplan: outputs out of tolerance';
    // The Problems panel lists each one with its range; that is where a click should lead.
    this.item.command = 'workbench.actions.view.problems';
    this.listener = vscode.languages.onDidChangeDiagnostics(() => this.update());
    this.update();
    this.item.show();
  }

  private update(): void {
    const count = countOutOfTolerance(vscode.languages.getDiagnostics());
    if (count === 0) {
      this.item.text = '$(pass) waveplan';
      this.item.tooltip = 'waveplan: every checked output is within its tolerance';
      this.item.backgroundColor = undefined;
    } else {
      const noun = count === 1 ? 'output' : 'outputs';
      this.item.text = `$(warning) waveplan: ${count} ${noun} out of tolerance`;
      this.item.tooltip = `${count} ${noun} miss their frequency tolerance; click to list them in Problems`;
      this.item.backgroundColor = new vscode.ThemeColor('statusBarItem.warningBackground');
    }
  }

  dispose(): void {
    this.listener.dispose();
    this.item.dispose();
  }
}
