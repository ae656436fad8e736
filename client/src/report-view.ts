// "waveplan: Open plan report" (and the code lens of the same name): shows the server's HTML
// report of one wave spec — the page `waveplan report --html` writes — in a webview beside the
// editor. One panel, retitled for the spec it shows, re-rendered when a spec file is saved.
// The page is static: no scripts, and a policy that admits only inline styles and data: images.

import * as vscode from 'vscode';
import type { LanguageClient } from 'vscode-languageclient/node';
import { askServer, specTarget } from './export';

export const OPEN_REPORT_COMMAND = 'waveplan.openReport';
const SERVER_HTML_COMMAND = 'waveplan.htmlReport';
const VIEW_TYPE = 'waveplan.planReportView';

/** Our own policy, placed before anything in the page; a page policy can only narrow it further. */
const POLICY = `<meta http-equiv="Content-Security-Policy" content="default-src 'none'; img-src data:; style-src 'unsafe-inline'">`;

export function withPolicy(html: string): string {
  const head = /<head[^>]*>/i.exec(html);
  if (!head) return `<!doctype html><html><head>${POLICY}</head><body>${html}</body></html>`;
  const at = head.index + head[0].length;
  return html.slice(0, at) + POLICY + html.slice(at);
}

function escapeHtml(text: string): string {
  return text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);
}

function fileName(uri: vscode.Uri): string {
  return uri.path.split('/').pop() ?? uri.toString();
}

class ReportView implements vscode.Disposable {
  private panel: vscode.WebviewPanel | undefined;
  private shown: vscode.Uri | undefined;
  /** Renders in flight are numbered so a slow older answer never replaces a newer one. */
  private rendering = 0;

  constructor(private readonly runningClient: () => LanguageClient | undefined) {}

  async open(spec: vscode.Uri): Promise<void> {
    if (!this.panel) {
      this.panel = vscode.window.createWebviewPanel(
        VIEW_TYPE,
        '',
        { viewColumn: vscode.ViewColumn.Beside, preserveFocus: true },
        { enableScripts: false, enableForms: false, enableCommandUris: false, localResourceRoots: [] },
      );
      this.panel.onDidDispose(() => {
        this.panel = undefined;
        this.shown = undefined;
      });
    } else {
      this.panel.reveal(vscode.ViewColumn.Beside, true);
    }
    this.shown = spec;
    this.panel.title = `Plan report: ${fileName(spec)}`;
    await this.render();
  }

  /** A saved spec may be the one shown or the clock file it reads. */
  async saved(document: vscode.TextDocument): Promise<void> {
    if (!this.shown || !/\.(wave|clock)\.yaml$/.test(document.uri.path)) return;
    const isShown = document.uri.toString() === this.shown.toString();
    if (isShown || document.uri.path.endsWith('.clock.yaml')) await this.render();
  }

  private async render(): Promise<void> {
    const spec = this.shown;
    if (!spec || !this.panel) return;
    const ticket = ++this.rendering;
    const answer = await askServer(this.runningClient, SERVER_HTML_COMMAND, spec);
    if (ticket !== this.rendering || !this.panel) return;
    if (typeof answer.html === 'string') {
      this.panel.webview.html = withPolicy(answer.html);
      return;
    }
    const reason = typeof answer.error === 'string' ? answer.error : 'the server sent no report';
    this.panel.webview.html = withPolicy(
      `<!doctype html><html lang="en"><head><meta charset="utf-8"></head><body><p>waveplan could not build the plan report of ${escapeHtml(fileName(spec))}: ${escapeHtml(reason)}</p></body></html>`,
    );
  }

  dispose(): void {
    this.panel?.dispose();
  }
}

export function registerReportView(runningClient: () => LanguageClient | undefined): vscode.Disposable {
  const view = new ReportView(runningClient);
  return vscode.Disposable.from(
    view,
    vscode.commands.registerCommand(OPEN_REPORT_COMMAND, async (argument?: unknown) => {
      const spec = specTarget(argument, 'see its plan report');
      if (spec) await view.open(spec);
    }),
    vscode.workspace.onDidSaveTextDocument((document) => void view.saved(document)),
  );
}
