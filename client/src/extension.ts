// The VS Code side of waveplan: starts the bundled language server and wires a few editor
// affordances to it. Everything about waveforms lives in the server; nothing here computes a plan.

import * as fs from 'node:fs';
import * as vscode from 'vscode';
import {
  LanguageClient,
  TransportKind,
  type LanguageClientOptions,
  type ServerOptions,
} from 'vscode-languageclient/node';
import { registerExport } from './export';
import { registerPlanReport } from './plan-report';
import { registerRecheckFallback } from './recheck';
import { registerReportView } from './report-view';
import { OutOfToleranceStatus } from './status';
import { SERVER_NODE_FLAGS } from './server-flags';

/** The file kinds the server understands; it tells them apart by file name. */
const documentSelector: LanguageClientOptions['documentSelector'] = [
  { language: 'waveplan-wave' },
  { language: 'waveplan-clock' },
  // Another extension may have claimed the files as plain YAML; the server still wants them.
  { language: 'yaml', pattern: '**/*.{wave,clock}.yaml' },
];

let client: LanguageClient | undefined;

export async function activate(context: vscode.ExtensionContext): Promise<void> {
  const output = vscode.window.createOutputChannel('waveplan', { log: true });
  context.subscriptions.push(output);

  const status = new OutOfToleranceStatus();
  context.subscriptions.push(status);

  const serverModule = context.asAbsolutePath('dist/waveplan.js');
  if (!fs.existsSync(serverModule)) {
    // A source checkout without `npm run build`, or a package that lost the bundle.
    await reportActivationFailure(output, `the server bundle is missing (${serverModule}); run "npm run build".`);
    return;
  }

  // The server reads `serve` as its sub-command; the client appends --stdio itself.
  const serverOptions: ServerOptions = {
    run: { module: serverModule, transport: TransportKind.stdio, args: ['serve'], options: { execArgv: [...SERVER_NODE_FLAGS] } },
    debug: {
      module: serverModule,
      transport: TransportKind.stdio,
      args: ['serve'],
      options: { execArgv: ['--nolazy', '--inspect=6019'] },
    },
  };
  const clientOptions: LanguageClientOptions = {
    documentSelector,
    outputChannel: output,
    // Push changes of our section; the server still pulls values per resource.
    synchronize: { configurationSection: 'waveplan' },
  };

  client = new LanguageClient('waveplan', 'waveplan language server', serverOptions, clientOptions);
  const started = client;
  const running = (): LanguageClient | undefined => (started.isRunning() ? started : undefined);
  context.subscriptions.push(registerPlanReport(running), registerExport(running), registerReportView(running));

  try {
    await started.start();
  } catch (error) {
    await reportActivationFailure(output, `the language server did not start: ${describe(error)}`);
    return;
  }
  context.subscriptions.push(await registerRecheckFallback(started));
}

export async function deactivate(): Promise<void> {
  const running = client;
  client = undefined;
  if (running?.isRunning()) await running.stop();
}

async function reportActivationFailure(output: vscode.LogOutputChannel, message: string): Promise<void> {
  output.error(message);
  const choice = await vscode.window.showErrorMessage(`waveplan: ${message}`, 'Show log');
  if (choice === 'Show log') output.show(true);
}

function describe(error: unknown): string {
  return error instanceof Error ? error.message : String(error);
}
