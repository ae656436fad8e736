// Answers belong to the document version they were asked about: a request that waits (here for
// the client's settings) while newer text arrives still answers about its own version, and a
// client that sends new text under a version number it used before gets the new text's
// analysis (LSP 3.17, "VersionedTextDocumentIdentifier": the server must not assume versions
// are unique, and the document's content is what the notifications made it).

import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { uriOf, type LspDiagnostic } from '../support/lsp-client';
import { lineOf, serverOnScratch } from './workspace';

const server = serverOnScratch();

type Range = LspDiagnostic['range'];
interface Hover {
  contents: { value: string };
  range: Range;
}

describe('document versions', () => {
  it('a hover that waited for settings answers with the range of the version it was asked about', async () => {
    const text = fs.readFileSync(server.ws.lab, 'utf8');
    const uri = uriOf(path.join(server.ws.dir, 'waiting.wave.yaml'));
    server.client.open(uri, text, 1);
    await server.client.diagnosticsFor(uri, (p) => p.version === 1);
    const line = lineOf(text, 'beacon:');
    // While the server waits for its settings, three lines arrive at the top of the file.
    let edited = false;
    server.client.beforeAnswer = (method) => {
      if (method !== 'workspace/configuration' || edited) return;
      edited = true;
      server.client.edit(uri, 2, { start: { line: 0, character: 0 }, end: { line: 0, character: 0 } }, '# a\n# b\n# c\n');
    };
    try {
      const answer = await server.client.request<Hover>('textDocument/hover', { textDocument: { uri }, position: { line, character: 4 } });
      expect(edited).toBe(true);
      expect(answer.contents.value).toContain('beacon');
      // The key `beacon` at column 2 of its line in version 1 (derived from the fixture's text).
      expect(answer.range).toStrictEqual({ start: { line, character: 2 }, end: { line, character: 2 + 'beacon'.length } });
    } finally {
      server.client.beforeAnswer = () => {};
    }
    // And version 2 is what the next request sees.
    const next = await server.client.request<Hover>('textDocument/hover', { textDocument: { uri }, position: { line: line + 3, character: 4 } });
    expect(next.range.start.line).toBe(line + 3);
    server.client.close(uri);
  });

  it('new text under a version number used before gets its own analysis', async () => {
    const text = fs.readFileSync(server.ws.lab, 'utf8');
    const uri = uriOf(path.join(server.ws.dir, 'reused.wave.yaml'));
    server.client.open(uri, text, 7);
    await server.client.diagnosticsFor(uri, (p) => p.version === 7);
    const symbols = async () => (await server.client.request<{ name: string }[]>('textDocument/documentSymbol', { textDocument: { uri } })).map((s) => s.name);
    expect(await symbols()).toStrictEqual(['probe-drive', 'beacon', 'legacy-chirp']);
    // Same version number, other text: the beacon renamed and the chirp removed.
    const renamed = text.replace('  beacon:', '  marker:').replace(/ {2}# Off on purpose: pinned[^]*$/, '');
    const mark = server.client.published.length;
    server.client.change(uri, 7, renamed);
    expect(await symbols()).toStrictEqual(['probe-drive', 'marker']);
    const published = await server.client.diagnosticsFor(uri, () => true, mark);
    expect(published.diagnostics.some((d) => d.code === 'seam-glitch')).toBe(false);
    expect(published.diagnostics.some((d) => d.code === 'out-of-tolerance')).toBe(true);
    server.client.close(uri);
  });
});
