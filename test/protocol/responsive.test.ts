// The server keeps answering while a large file is planned: the analysis runs in slices with
// other messages let in between (LSP 3.17 §Cancellation: cancellation is cooperative, so long work
// must yield), the client is shown its progress (§WorkDoneProgress), a version replaced before its
// analysis is done is dropped and the newest is planned first, and annotations answered meanwhile
// are refreshed once the analysis is complete (§workspace/inlayHint/refresh).

import * as fs from 'node:fs';
import * as path from 'node:path';
import { performance } from 'node:perf_hooks';
import { describe, expect, it } from 'vitest';
import { seededRandom } from '../support/seeded';
import { uriOf } from '../support/lsp-client';
import { lineOf, serverOnScratch } from './workspace';

const BOARD = `# big.clock.yaml — an invented board with a wide divider, so each plan is a real search.
system-clock: 200 MHz
divider: { integer: { min: 1, max: 131071 }, fraction-bits: 5 }
dac: { bits: 12, sample-bytes: 2, full-scale: 2.5 V, max-sample-rate: 20 MHz }
memory: { budget: 64 MiB, table-length: { min: 32, max: 8192 } }
`;

/** Outputs at seeded odd frequencies with tight tolerances: hundreds of fresh searches. */
function bigSpec(seed: number, count: number): string {
  const random = seededRandom(seed);
  const lines = ['clock: ./big.clock.yaml', 'outputs:'];
  for (let i = 0; i < count; i++) {
    lines.push(`  out-${i}:`, `    shape: ${i % 2 ? 'square' : 'sine'}`, `    frequency: ${(10 ** (2 + random() * 4)).toFixed(4)} Hz`, '    tolerance: 0.001 ppm', '    jitter: allow');
  }
  return `${lines.join('\n')}\n`;
}

const server = serverOnScratch({}, (dir) => fs.writeFileSync(path.join(dir, 'big.clock.yaml'), BOARD));

interface ProgressNote {
  token: unknown;
  value: { kind: string; title?: string; message?: string };
}

describe('a large file being planned', () => {
  it('leaves the server answering other requests, shows progress and refreshes what it answered partially', async () => {
    const { client, ws } = server;
    const lab = fs.readFileSync(ws.lab, 'utf8');
    const labUri = uriOf(ws.lab);
    client.open(labUri, lab);
    await client.diagnosticsFor(labUri);

    const bigUri = uriOf(path.join(ws.dir, 'big.wave.yaml'));
    const requestsBefore = client.serverRequests.length;
    const progressBefore = client.progress.length;
    const opened = performance.now();
    client.open(bigUri, bigSpec(1, 500));
    // While it is planned: a hover on the other file, and inlay hints of the big one.
    const answered: number[] = [];
    let partialHints = Infinity;
    let published = false;
    const done = client.diagnosticsFor(bigUri).then(() => (published = true));
    while (!published) {
      const t0 = performance.now();
      await client.request('textDocument/hover', { textDocument: { uri: labUri }, position: { line: lineOf(lab, 'beacon:'), character: 4 } });
      const hints = await client.request<unknown[]>('textDocument/inlayHint', { textDocument: { uri: bigUri }, range: { start: { line: 0, character: 0 }, end: { line: 3000, character: 0 } } });
      if (!published) {
        answered.push(performance.now() - t0);
        partialHints = Math.min(partialHints, hints.length);
      }
      await new Promise((r) => setTimeout(r, 20));
    }
    await done;
    const planningMs = performance.now() - opened;
    // Several requests were answered while the file was planned, each well within a second.
    expect(answered.length, `planning took ${planningMs.toFixed(0)} ms`).toBeGreaterThanOrEqual(2);
    expect(Math.max(...answered)).toBeLessThan(1000);
    // Answered partially meanwhile (fewer annotations than the planned outputs), so the editor is asked to refresh them.
    const after = await client.request<unknown[]>('textDocument/inlayHint', { textDocument: { uri: bigUri }, range: { start: { line: 0, character: 0 }, end: { line: 3000, character: 0 } } });
    const outline = await client.request<unknown[]>('textDocument/documentSymbol', { textDocument: { uri: bigUri } });
    expect(after.length).toBe(outline.length);
    expect(partialHints).toBeLessThan(after.length);
    expect(client.serverRequests.slice(requestsBefore)).toContain('workspace/inlayHint/refresh');
    // Progress: begun with a title, ended.
    const notes = (client.progress.slice(progressBefore) as ProgressNote[]).map((p) => p.value);
    expect(notes.find((v) => v.kind === 'begin')?.title).toBe('waveplan: planning');
    expect(notes.some((v) => v.kind === 'report' || v.kind === 'begin' ? /of 500 outputs planned/.test(v.message ?? '') : false)).toBe(true);
    expect(notes[notes.length - 1]?.kind).toBe('end');
    client.close(bigUri);
    client.close(labUri);
  }, 120_000);

  it('drops a version replaced before its analysis is done, and plans the newest first', async () => {
    const { client, ws } = server;
    const uri = uriOf(path.join(ws.dir, 'replaced.wave.yaml'));
    // Large enough that its analysis cannot be done before the edit arrives, on any machine: at
    // about 0.2 ms a plan, 1 500 outputs take hundreds of milliseconds; the edit follows 20 ms after.
    const text = bigSpec(2, 1500);
    const mark = client.published.length;
    client.open(uri, text, 1);
    // Let its analysis start, then replace the text: one output's frequency changes.
    await new Promise((r) => setTimeout(r, 20));
    const line = text.split('\n').findIndex((l) => l.startsWith('    frequency:'));
    client.edit(uri, 2, { start: { line, character: 0 }, end: { line, character: text.split('\n')[line].length } }, '    frequency: 1 kHz');
    const published = await client.diagnosticsFor(uri, (p) => p.version === 2, mark);
    expect(published.diagnostics.every((d) => d.code !== 'internal-error')).toBe(true);
    expect(client.published.slice(mark).filter((p) => p.uri === uri).map((p) => p.version)).toStrictEqual([2]);
    client.close(uri);
  }, 120_000);
});
