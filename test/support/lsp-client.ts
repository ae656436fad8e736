// A small JSON-RPC client over stdio for the protocol tests and the LSP benchmark: it spawns the
// built server (`node dist/waveplan.js serve --stdio`), answers the server's own requests
// (configuration, capability registration, progress, refreshes) and records what it pushes.

import { spawn, spawnSync, type ChildProcess } from 'node:child_process';
import * as fs from 'node:fs';
import * as os from 'node:os';
import * as path from 'node:path';
import { pathToFileURL } from 'node:url';
import {
  CancellationTokenSource,
  createMessageConnection,
  StreamMessageReader,
  StreamMessageWriter,
  type MessageConnection,
} from 'vscode-jsonrpc/node';

export const ROOT = path.resolve(__dirname, '../..');
export const SERVER = path.join(ROOT, 'dist', 'waveplan.js');

const newestMtime = (dir: string): number => {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const full = path.join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestMtime(full));
    else if (entry.name.endsWith('.ts') || entry.name.endsWith('.json')) newest = Math.max(newest, fs.statSync(full).mtimeMs);
  }
  return newest;
};

/**
 * Runs `npm run build` unless dist/waveplan.js is newer than every source file. Test files run in
 * parallel workers, so a lock directory keeps two builds from writing the bundle at once.
 */
export function ensureBuilt(): void {
  const lock = path.join(os.tmpdir(), 'waveplan-lsp-build.lock');
  const deadline = Date.now() + 180_000;
  for (;;) {
    try {
      fs.mkdirSync(lock);
      break;
    } catch {
      if (Date.now() > deadline) throw new Error(`build lock ${lock} held for over 3 minutes`);
      Atomics.wait(new Int32Array(new SharedArrayBuffer(4)), 0, 0, 200);
    }
  }
  try {
    const sources = Math.max(newestMtime(path.join(ROOT, 'server', 'src')), newestMtime(path.join(ROOT, 'shared-schema', 'src')));
    const built = fs.existsSync(SERVER) ? fs.statSync(SERVER).mtimeMs : 0;
    if (built > sources) return;
    const run = spawnSync('npm', ['run', 'build'], { cwd: ROOT, encoding: 'utf8' });
    if (run.status !== 0) throw new Error(`npm run build failed:\n${run.stdout}\n${run.stderr}`);
  } finally {
    fs.rmdirSync(lock);
  }
}

export const uriOf = (file: string): string => pathToFileURL(file).href;

export interface Published {
  uri: string;
  version?: number;
  diagnostics: LspDiagnostic[];
}

export interface LspDiagnostic {
  range: { start: { line: number; character: number }; end: { line: number; character: number } };
  severity?: number;
  code?: string | number;
  source?: string;
  message: string;
  data?: unknown;
}

export interface ClientOptions {
  /** Workspace folders (absolute paths). */
  folders?: string[];
  /** The `waveplan` section answered to workspace/configuration. */
  settings?: Record<string, unknown>;
  /** Advertise a client that answers workspace/configuration (default true). */
  configuration?: boolean;
  /** Flags for the server's node, as an editor's client may pass them (e.g. heap sizing). */
  nodeArgs?: string[];
}

export class LspClient {
  readonly published: Published[] = [];
  readonly logs: string[] = [];
  readonly progress: unknown[] = [];
  readonly serverRequests: string[] = [];
  /** The params of every client/registerCapability request, in order. */
  readonly registrations: unknown[] = [];
  settings: Record<string, unknown>;
  /** Called before the client answers a server request; tests use it to act at a known moment. */
  beforeAnswer: (method: string) => void = () => {};
  private readonly waiters = new Set<() => void>();
  private stderr = '';

  private constructor(
    readonly process: ChildProcess,
    readonly connection: MessageConnection,
    options: ClientOptions,
  ) {
    this.settings = options.settings ?? {};
  }

  static async start(options: ClientOptions = {}): Promise<LspClient> {
    const child = spawn(process.execPath, [...(options.nodeArgs ?? []), SERVER, 'serve', '--stdio'], { cwd: ROOT, stdio: ['pipe', 'pipe', 'pipe'] });
    const connection = createMessageConnection(new StreamMessageReader(child.stdout!), new StreamMessageWriter(child.stdin!));
    const client = new LspClient(child, connection, options);
    child.stderr!.on('data', (chunk: Buffer) => (client.stderr += chunk.toString()));
    client.wire();
    connection.listen();
    const folders = (options.folders ?? []).map((f) => ({ uri: uriOf(f), name: path.basename(f) }));
    const exited = new Promise<never>((_, reject) =>
      child.once('exit', (code) => reject(new Error(`server exited (${code}) during initialize: ${client.stderr.slice(-2000)}`))),
    );
    exited.catch(() => undefined);
    const initialize = connection.sendRequest('initialize', {
      processId: process.pid,
      rootUri: folders[0]?.uri ?? null,
      workspaceFolders: folders.length ? folders : null,
      capabilities: {
        workspace: {
          configuration: options.configuration ?? true,
          didChangeWatchedFiles: { dynamicRegistration: true },
          inlayHint: { refreshSupport: true },
          workspaceFolders: true,
        },
        window: { workDoneProgress: true },
        textDocument: {
          publishDiagnostics: { versionSupport: true },
          hover: { contentFormat: ['markdown', 'plaintext'] },
          codeAction: { codeActionLiteralSupport: { codeActionKind: { valueSet: ['quickfix'] } }, isPreferredSupport: true },
          documentSymbol: { hierarchicalDocumentSymbolSupport: true },
          // As VS Code's client says it (LSP 3.17 §completion): an item may replace the rest of a word.
          completion: { completionItem: { insertReplaceSupport: true } },
          inlayHint: {},
        },
      },
    });
    await Promise.race([initialize, exited]);
    connection.sendNotification('initialized', {});
    return client;
  }

  private wire(): void {
    const c = this.connection;
    const note = (method: string) => this.serverRequests.push(method);
    c.onRequest('workspace/configuration', (params: { items: { section?: string }[] }) => {
      note('workspace/configuration');
      this.beforeAnswer('workspace/configuration');
      return params.items.map(() => this.settings);
    });
    for (const method of ['client/registerCapability', 'client/unregisterCapability', 'window/workDoneProgress/create', 'workspace/inlayHint/refresh', 'workspace/diagnostic/refresh', 'workspace/codeLens/refresh', 'workspace/semanticTokens/refresh']) {
      c.onRequest(method, (params: unknown) => {
        note(method);
        if (method === 'client/registerCapability') this.registrations.push(params);
        this.beforeAnswer(method);
        this.wake();
        return null;
      });
    }
    c.onNotification('textDocument/publishDiagnostics', (params: Published) => {
      this.published.push(params);
      this.wake();
    });
    c.onNotification('window/logMessage', (params: { message: string }) => {
      this.logs.push(params.message);
      this.wake();
    });
    c.onNotification('$/progress', (params: unknown) => {
      this.progress.push(params);
      this.wake();
    });
  }

  private wake(): void {
    for (const w of [...this.waiters]) w();
  }

  /** Resolves once `check` returns a value (re-checked on every message from the server). */
  waitFor<T>(check: () => T | undefined, what: string, timeoutMs = 15_000): Promise<T> {
    return new Promise((resolve, reject) => {
      const attempt = (): boolean => {
        const value = check();
        if (value === undefined) return false;
        cleanup();
        resolve(value);
        return true;
      };
      const timer = setTimeout(() => {
        cleanup();
        reject(new Error(`timed out waiting for ${what}; server stderr: ${this.stderr.slice(-2000)}`));
      }, timeoutMs);
      const waiter = () => void attempt();
      const cleanup = () => {
        clearTimeout(timer);
        this.waiters.delete(waiter);
      };
      this.waiters.add(waiter);
      attempt();
    });
  }

  /** The first diagnostics published for `uri` after `since` (an index into `published`) that pass `accept`. */
  diagnosticsFor(uri: string, accept: (p: Published) => boolean = () => true, since = 0): Promise<Published> {
    return this.waitFor(() => this.published.slice(since).find((p) => p.uri === uri && accept(p)), `diagnostics for ${uri}`);
  }

  open(uri: string, text: string, version = 1): void {
    this.connection.sendNotification('textDocument/didOpen', { textDocument: { uri, languageId: 'yaml', version, text } });
  }

  /** A whole-text change (the server syncs incrementally, and a full change is a valid increment). */
  change(uri: string, version: number, text: string): void {
    this.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [{ text }] });
  }

  /** A ranged change, as an editor sends for a keystroke. */
  edit(uri: string, version: number, range: LspDiagnostic['range'], text: string): void {
    this.connection.sendNotification('textDocument/didChange', { textDocument: { uri, version }, contentChanges: [{ range, text }] });
  }

  close(uri: string): void {
    this.connection.sendNotification('textDocument/didClose', { textDocument: { uri } });
  }

  request<R>(method: string, params: unknown, token?: CancellationTokenSource): Promise<R> {
    // Pass the token only when there is one: an undefined extra argument would be sent as a parameter.
    return (token ? this.connection.sendRequest(method, params, token.token) : this.connection.sendRequest(method, params)) as Promise<R>;
  }

  notify(method: string, params: unknown): void {
    this.connection.sendNotification(method, params);
  }

  get alive(): boolean {
    return this.process.exitCode === null && this.process.signalCode === null;
  }

  get serverStderr(): string {
    return this.stderr;
  }

  async stop(): Promise<void> {
    if (this.alive) {
      try {
        await Promise.race([this.connection.sendRequest('shutdown'), new Promise((r) => setTimeout(r, 2000))]);
        this.connection.sendNotification('exit');
      } catch {
        // the process may already be gone
      }
    }
    await new Promise<void>((resolve) => {
      if (!this.alive) return resolve();
      const timer = setTimeout(() => {
        this.process.kill('SIGKILL');
        resolve();
      }, 2000);
      this.process.once('exit', () => {
        clearTimeout(timer);
        resolve();
      });
    });
    this.connection.dispose();
  }
}

export { CancellationTokenSource };

/** Applies LSP text edits to a string (edits must not overlap; applied from the end). */
export function applyEdits(text: string, edits: { range: LspDiagnostic['range']; newText: string }[]): string {
  const lineStarts = [0];
  for (let i = 0; i < text.length; i++) if (text[i] === '\n') lineStarts.push(i + 1);
  const offset = (p: { line: number; character: number }) => Math.min(text.length, (lineStarts[p.line] ?? text.length) + p.character);
  const sorted = [...edits].sort((a, b) => offset(b.range.start) - offset(a.range.start));
  let out = text;
  for (const e of sorted) out = out.slice(0, offset(e.range.start)) + e.newText + out.slice(offset(e.range.end));
  return out;
}
