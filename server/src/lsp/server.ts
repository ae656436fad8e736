// Wiring only: the connection, the capabilities, and one handler per feature module.
// `waveplan serve --stdio` calls startServer(); createConnection() reads --stdio from argv.
// Nothing here writes to stdout: logs go to connection.console.

import {
  CodeActionKind,
  CodeLensRefreshRequest,
  createConnection,
  DidChangeWatchedFilesNotification,
  FileChangeType,
  ProposedFeatures,
  TextDocumentSyncKind,
  type InitializeParams,
  type InitializeResult,
  type WorkspaceFolder,
} from 'vscode-languageserver/node';
import { analyze, analyzeInSteps } from '../spec/analyze';
import { clockReference, sampleReferences } from '../spec/clock-reference';
import { syntaxOf } from '../spec/syntax';
import { SyntaxTrees } from './yaml-path';
import { codeActions } from './code-actions';
import { codeLenses } from './code-lens';
import { COMMANDS, PLAN_REPORT, planReport, RECHECK_WORKSPACE, recheckWorkspace } from './commands';
import { completions } from './completion';
import { clockDefinition } from './definition';
import { Dependencies, findSpecFiles } from './dependencies';
import { DiagnosticsPublisher } from './diagnostics';
import { SpecDocuments, isSpecPath, uriToPath } from './documents';
import { EXPORT_C, exportC, HTML_REPORT, htmlReport } from './export-commands';
import { hover } from './hover';
import { inlayHints } from './inlay-hints';
import { guard, guardNotification, yieldToEvents } from './safe';
import { SampleWatch } from './sample-watch';
import { SettingsCache } from './settings';
import { clockSymbols, waveSymbols } from './symbols';

/** Wave specs analysed at startup between two yields to the event loop. */
const SCAN_SLICE = 20;

export function startServer(): void {
  const connection = createConnection(ProposedFeatures.all);
  const log = connection.console;
  const docs = new SpecDocuments(analyze, analyzeInSteps);
  const trees = new SyntaxTrees();
  const settings = new SettingsCache(connection);
  const publisher = new DiagnosticsPublisher(connection, docs);
  const deps = new Dependencies(docs, publisher);
  const sampleWatch = new SampleWatch(connection);
  publisher.onAnalysed = (analysis) => {
    deps.record(analysis);
    sampleWatch.watch(deps.sampleFiles());
  };

  let folders: string[] = [];
  let canWatchFiles = false;
  let canRefreshHints = false;
  let canRefreshLenses = false;
  let canCreateProgress = false;
  let canFollowFolders = false;
  const completionClient = { insertReplace: false };

  connection.onInitialize((params: InitializeParams): InitializeResult => {
    const caps = params.capabilities;
    settings.setPullSupported(!!caps.workspace?.configuration);
    canWatchFiles = !!caps.workspace?.didChangeWatchedFiles?.dynamicRegistration;
    sampleWatch.configure(canWatchFiles, !!caps.workspace?.didChangeWatchedFiles?.relativePatternSupport);
    canRefreshHints = !!caps.workspace?.inlayHint?.refreshSupport;
    canRefreshLenses = !!caps.workspace?.codeLens?.refreshSupport;
    canCreateProgress = !!caps.window?.workDoneProgress;
    publisher.progress = canCreateProgress ? () => connection.window.createWorkDoneProgress() : undefined;
    canFollowFolders = !!caps.workspace?.workspaceFolders;
    completionClient.insertReplace = !!caps.textDocument?.completion?.completionItem?.insertReplaceSupport;
    folders = (params.workspaceFolders ?? []).map((f: WorkspaceFolder) => uriToPath(f.uri));
    if (folders.length === 0 && params.rootUri) folders = [uriToPath(params.rootUri)];
    docs.workspace.setFolders(folders);
    return {
      capabilities: {
        textDocumentSync: TextDocumentSyncKind.Incremental,
        hoverProvider: true,
        inlayHintProvider: { resolveProvider: false },
        codeActionProvider: { codeActionKinds: [CodeActionKind.QuickFix] },
        codeLensProvider: { resolveProvider: false },
        completionProvider: { triggerCharacters: [' ', ':'] },
        documentSymbolProvider: true,
        definitionProvider: true,
        executeCommandProvider: { commands: COMMANDS },
        workspace: { workspaceFolders: { supported: true, changeNotifications: true } },
      },
      serverInfo: { name: 'waveplan' },
    };
  });

  connection.onInitialized(
    guardNotification(log, 'initialized', async () => {
      // The library refuses this handler before it knows the client sends folder changes.
      if (canFollowFolders) {
        connection.workspace.onDidChangeWorkspaceFolders(
          guardNotification(log, 'workspace folders', (event) => {
            const removed = new Set(event.removed.map((f) => uriToPath(f.uri)));
            folders = [...folders.filter((f) => !removed.has(f)), ...event.added.map((f) => uriToPath(f.uri))];
            docs.workspace.setFolders(folders);
            docs.invalidateAll();
          }),
        );
      }
      // Learn which wave specs read which clock file and sample files, so a change reaches closed
      // specs too: only their `clock:` lines (and, in a spec that has the key, its `sample-file:`
      // values) are read, nothing is planned. A small workspace is read before
      // any later message is handled; a large one in slices.
      const waves = findSpecFiles(folders).filter((p) => p.endsWith('.wave.yaml'));
      for (const [index, path] of waves.entries()) {
        if (index > 0 && index % SCAN_SLICE === 0) await yieldToEvents();
        if (docs.isOpen(path)) continue;
        const text = docs.hostFor(path).readFile(path);
        if (text === undefined) continue;
        deps.recordClock(path, clockReference(path, text));
        deps.recordSamples(path, sampleReferences(path, text));
      }
      sampleWatch.watch(deps.sampleFiles());
      if (canWatchFiles) {
        await connection.client.register(DidChangeWatchedFilesNotification.type, {
          watchers: [{ globPattern: '**/*.{wave,clock}.yaml' }],
        });
      }
    }),
  );

  const refreshViews = (): void => {
    if (canRefreshHints) void connection.languages.inlayHint.refresh().catch(() => undefined);
  };
  // Requests answered while an analysis was being made in slices saw it partial.
  publisher.onSliced = () => {
    refreshViews();
    if (canRefreshLenses) void connection.sendRequest(CodeLensRefreshRequest.type).catch(() => undefined);
  };

  /** A spec's text changed (buffer or disk): re-check it and everything that reads it. */
  const specChanged = async (uri: string): Promise<void> => {
    const path = uriToPath(uri);
    if (docs.get(uri)) publisher.schedule(uri);
    if (path.endsWith('.clock.yaml')) {
      await deps.recheckReaders(path);
      refreshViews();
    }
  };

  docs.documents.onDidOpen((e) => void specChanged(e.document.uri).catch((err) => log.error(String(err))));
  docs.documents.onDidChangeContent((e) => void specChanged(e.document.uri).catch((err) => log.error(String(err))));
  docs.documents.onDidClose(
    guardNotification(log, 'close', async (e) => {
      const path = uriToPath(e.document.uri);
      trees.forget(e.document.uri);
      settings.forget(e.document.uri);
      // Closed: the disk text counts again, for the file itself and for what reads it.
      if (isSpecPath(path) && !(await publisher.publishClosed(path))) publisher.clear(e.document.uri);
      if (path.endsWith('.clock.yaml')) await deps.recheckReaders(path);
    }),
  );

  connection.onDidChangeWatchedFiles(
    guardNotification(log, 'watched files', async (params) => {
      for (const change of params.changes) {
        const path = uriToPath(change.uri);
        if (docs.isOpen(path)) continue; // the buffer is what counts while open
        if (change.type === FileChangeType.Deleted) {
          deps.forget(path);
          publisher.clear(change.uri);
        } else if (path.endsWith('.wave.yaml')) {
          await publisher.publishClosed(path);
        }
        if (path.endsWith('.clock.yaml')) {
          if (change.type !== FileChangeType.Deleted) await publisher.publishClosed(path);
          await deps.recheckReaders(path);
        } else if (deps.isSampleFile(path)) {
          await deps.recheckReaders(path);
        }
      }
      refreshViews();
    }),
  );

  connection.onDidChangeConfiguration(
    guardNotification(log, 'configuration', () => {
      settings.clear();
      refreshViews();
      // The export lens names the folder from the settings.
      if (canRefreshLenses) void connection.sendRequest(CodeLensRefreshRequest.type).catch(() => undefined);
    }),
  );

  /**
   * The document as the request found it, with its analysis, taken before any await: the answer
   * is about that version even when newer text arrives while the request waits (settings, say).
   */
  const snapshot = (uri: string) => {
    const doc = docs.get(uri);
    return doc && { doc, analysis: docs.analysisOf(doc) };
  };

  connection.languages.inlayHint.on(
    guard(log, 'inlay hints', [], async (params) => {
      const at = snapshot(params.textDocument.uri);
      if (!at) return [];
      const { annotationsEnabled, annotationsSfdr } = await settings.get(at.doc.uri);
      return annotationsEnabled ? inlayHints(at.doc, at.analysis, params.range, { sfdr: annotationsSfdr }) : [];
    }),
  );

  connection.onHover(
    guard(log, 'hover', null, async (params) => {
      const at = snapshot(params.textDocument.uri);
      if (!at) return null;
      const { hoverPictures } = await settings.get(at.doc.uri);
      // Hover on a clock file's system-clock ranks its clocks for the wave specs that read it.
      const readers = () => deps.dependents(uriToPath(at.doc.uri)).flatMap((w) => (snapshot(docs.uriOfPath(w))?.analysis ?? docs.analyzeClosed(w)) ?? []);
      return hover(at.doc, syntaxOf(at.analysis), at.analysis, params.position, hoverPictures, readers);
    }),
  );

  connection.onCodeAction(
    guard(log, 'code actions', [], (params, token) => {
      const at = snapshot(params.textDocument.uri);
      if (!at) return [];
      const readFile = (path: string) => docs.hostFor(uriToPath(at.doc.uri)).readFile(path);
      return codeActions(at.doc, at.analysis, params.context.diagnostics, token, { recheck: (text) => docs.analyzeEdited(at.doc.uri, text), tree: () => trees.of(at.doc), readFile });
    }),
  );

  connection.onCodeLens(
    guard(log, 'code lens', [], async (params) => {
      const at = snapshot(params.textDocument.uri);
      if (!at) return [];
      return codeLenses(at.doc, syntaxOf(at.analysis), at.analysis, (await settings.get(at.doc.uri)).exportDirectory);
    }),
  );

  connection.onCompletion(
    guard(log, 'completion', [], (params) => {
      const doc = docs.get(params.textDocument.uri);
      // A position past a line's end or the last line is taken where the text ends, so every
      // item's edit range lies inside the document (the client's position may be stale).
      return doc ? completions(doc, doc.positionAt(doc.offsetAt(params.position)), params.context, completionClient) : [];
    }),
  );

  connection.onDocumentSymbol(
    guard(log, 'symbols', [], (params) => {
      const at = snapshot(params.textDocument.uri);
      if (!at) return [];
      const tree = syntaxOf(at.analysis);
      return at.analysis.kind === 'wave' ? waveSymbols(at.doc, at.analysis, tree, docs.isPartial(at.doc)) : clockSymbols(at.doc, at.analysis, tree);
    }),
  );

  connection.onDefinition(
    guard(log, 'definition', [], (params) => {
      const at = snapshot(params.textDocument.uri);
      if (!at) return [];
      return clockDefinition(at.doc, syntaxOf(at.analysis), at.analysis, at.doc.offsetAt(params.position), (p) => docs.uriOfPath(p));
    }),
  );

  connection.onExecuteCommand(
    guard(log, 'command', null, async (params, token) => {
      if (params.command === RECHECK_WORKSPACE) {
        const progress = canCreateProgress ? await connection.window.createWorkDoneProgress() : undefined;
        return recheckWorkspace(
          folders,
          {
            recheck: (path) => {
              const uri = docs.uriOfPath(path);
              const doc = docs.get(uri);
              if (!doc) return publisher.publishClosed(path);
              docs.invalidate(uri);
              return publisher.publishOpen(uri);
            },
          },
          progress,
          token,
        );
      }
      if (params.command === PLAN_REPORT) {
        const uri = typeof params.arguments?.[0] === 'string' ? params.arguments[0] : undefined;
        if (!uri) throw new Error('waveplan.planReport needs the URI of a spec as its argument');
        const open = docs.get(uri);
        const analysis = open ? (await docs.analysisInSlices(open))?.analysis : await docs.analyzeClosedInSlices(uriToPath(uri));
        if (!analysis) throw new Error(`cannot read ${uri}`);
        return planReport(analysis, uriToPath(uri).split(/[\\/]/).pop() ?? uri);
      }
      if (params.command === EXPORT_C) {
        const uri = params.arguments?.[0];
        // A bad argument is answered by exportC before the folder matters.
        const directory = typeof uri === 'string' ? (await settings.get(uri)).exportDirectory : '';
        return exportC(uri, directory, docs, folders);
      }
      if (params.command === HTML_REPORT) return htmlReport(params.arguments?.[0], docs, folders);
      throw new Error(`unknown command ${params.command}`);
    }),
  );

  // For the benchmark and for bug reports: how much memory and CPU the server has used.
  connection.onRequest(
    'waveplan/serverStats',
    guard(log, 'server stats', null, () => {
      const m = process.memoryUsage();
      const cpu = process.cpuUsage();
      return {
        rssBytes: m.rss,
        heapUsedBytes: m.heapUsed,
        heapTotalBytes: m.heapTotal,
        externalBytes: m.external,
        openDocuments: docs.documents.keys().length,
        // Server CPU since it started (user + system, microseconds): the benchmark's steady figure.
        cpuMicros: cpu.user + cpu.system,
      };
    }),
  );

  docs.documents.listen(connection);
  connection.listen();
  // A stray exception in a timer must not take the server down with it.
  process.on('uncaughtException', (error) => log.error(`waveplan: unexpected error: ${error.stack ?? error}`));
  process.on('unhandledRejection', (reason) => log.error(`waveplan: unexpected rejection: ${String(reason)}`));
}
