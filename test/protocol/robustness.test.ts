// The server keeps running whatever one request or document does: malformed YAML gets a ranged
// diagnostic, a failing handler answers empty, a cancelled request answers RequestCancelled.

import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CancellationTokenSource, ensureBuilt, LspClient, uriOf } from '../support/lsp-client';
import { scratchCopy } from './workspace';

let client: LspClient;
let ws: ReturnType<typeof scratchCopy>;

beforeAll(async () => {
  ensureBuilt();
  ws = scratchCopy();
  client = await LspClient.start({ folders: [ws.dir] });
});

afterAll(async () => {
  await client?.stop();
  ws?.remove();
});

const hoverAt = (uri: string, line: number, character: number) =>
  client.request<unknown>('textDocument/hover', { textDocument: { uri }, position: { line, character } });

describe('robustness', () => {
  it('gives a malformed document a ranged diagnostic and keeps serving it', async () => {
    const uri = uriOf(path.join(ws.dir, 'broken.wave.yaml'));
    client.open(uri, 'clock: ./lab.clock.yaml\noutputs:\n  tone: {shape: sine, frequency: [\n  \t- what\n');
    const published = await client.diagnosticsFor(uri);
    expect(published.diagnostics.length).toBeGreaterThan(0);
    const d = published.diagnostics[0];
    expect(d.code).toBe('yaml-syntax');
    expect(d.range.start.line).toBeGreaterThanOrEqual(0);
    expect(d.range.start.line).toBeLessThanOrEqual(3);
    // Every feature answers something sensible on it.
    const hover = await hoverAt(uri, 2, 4);
    expect(hover === null || typeof hover === 'object').toBe(true);
    const hints = await client.request<unknown[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 9, character: 0 } } });
    expect(hints).toEqual([]);
    const symbols = await client.request<unknown[]>('textDocument/documentSymbol', { textDocument: { uri } });
    expect(Array.isArray(symbols)).toBe(true);
  });

  it('answers positions far outside the text and unknown documents without failing', async () => {
    const uri = uriOf(ws.lab);
    client.open(uri, 'clock: ./lab.clock.yaml\noutputs: {}\n');
    expect(await hoverAt(uri, 9999, 9999)).toBeNull();
    expect(await hoverAt(uriOf(path.join(ws.dir, 'never-opened.wave.yaml')), 0, 0)).toBeNull();
    const actions = await client.request<unknown[]>('textDocument/codeAction', {
      textDocument: { uri: uriOf(path.join(ws.dir, 'never-opened.wave.yaml')) },
      range: { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } },
      context: { diagnostics: [] },
    });
    expect(actions).toEqual([]);
    client.close(uri);
  });

  it('logs a failing handler, answers empty and keeps running', async () => {
    const before = client.logs.length;
    const answer = await client.request<unknown>('workspace/executeCommand', { command: 'waveplan.planReport', arguments: [] });
    expect(answer).toBeNull();
    await client.waitFor(() => (client.logs.slice(before).some((m) => m.includes('command failed')) ? true : undefined), 'the error in the log');
    expect(client.alive).toBe(true);
    const other = await client.request<unknown>('workspace/executeCommand', { command: 'waveplan.noSuchCommand', arguments: [] });
    expect(other).toBeNull();
    expect(client.alive).toBe(true);
  });

  it('answers a cancelled request with RequestCancelled (−32800, LSP 3.17 §Cancellation)', async () => {
    const source = new CancellationTokenSource();
    // Cancel at a known moment: while the server waits for its progress token, i.e. mid-request.
    client.beforeAnswer = (method) => {
      if (method === 'window/workDoneProgress/create') source.cancel();
    };
    const pending = client.request('workspace/executeCommand', { command: 'waveplan.recheckWorkspace', arguments: [] }, source);
    try {
      await expect(pending).rejects.toMatchObject({ code: -32800 });
    } finally {
      client.beforeAnswer = () => {};
    }
    expect(client.alive).toBe(true);
  });

  it('never writes anything but protocol to stdout', async () => {
    // Any stray byte would have broken the message framing and failed every request above;
    // one more round trip after all of them proves the stream is still in sync.
    const uri = uriOf(path.join(ws.dir, 'after.wave.yaml'));
    client.open(uri, 'clock: ./lab.clock.yaml\noutputs: {}\n');
    const published = await client.diagnosticsFor(uri);
    expect(Array.isArray(published.diagnostics)).toBe(true);
    expect(client.alive).toBe(true);
  });
});
