// Found by the fuzz harness (seed 20261203, case 190): on a file of mixed line breaks, a quick fix
// that adds a line (a missing key's placeholder) wrote the file's first break (CR LF) after a line
// that ends in a lone CR. Each added line must carry the break of the line it follows (LSP 3.17,
// "Position", counts CR LF, CR and LF as breaks; edits applied with vscode-languageserver-textdocument).

import * as path from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { breaksIn, insertedBreakProblems } from '../support/line-breaks';
import { uriOf, type LspDiagnostic } from '../support/lsp-client';
import { serverOnScratch } from './workspace';

const server = serverOnScratch();

interface Action {
  title: string;
  edit?: { changes?: Record<string, { range: LspDiagnostic['range']; newText: string }[]> };
}

describe('a line added to a file of mixed breaks', () => {
  it('ends with the break of the line it follows', async () => {
    // CR LF first, then LF, then lone CR on the entry that lacks its frequency.
    const text = 'clock: ./lab.clock.yaml\r\noutputs:\n  tone:\r    shape: sine\r    tolerance: 20 ppm\r';
    const uri = uriOf(path.join(server.ws.dir, 'mixed-added.wave.yaml'));
    server.client.open(uri, text);
    const published = await server.client.diagnosticsFor(uri, (p) => p.version === 1);
    const missing = published.diagnostics.find((d) => d.code === 'missing-key');
    expect(missing, JSON.stringify(published.diagnostics.map((d) => d.code))).toBeDefined();
    const actions = await server.client.request<Action[]>('textDocument/codeAction', { textDocument: { uri }, range: missing!.range, context: { diagnostics: [missing], only: ['quickfix'] } });
    const add = actions.find((a) => a.title.startsWith('Add `frequency:'));
    expect(add, actions.map((a) => a.title).join('; ')).toBeDefined();
    const doc = TextDocument.create(uri, 'yaml', 1, text);
    const edits = add!.edit!.changes![uri];
    expect(insertedBreakProblems(doc, edits)).toStrictEqual([]);
    const after = TextDocument.applyEdits(doc, edits);
    // One more lone CR, nothing else new.
    expect(breaksIn(after).filter((b) => b === '\r').length).toBe(breaksIn(text).filter((b) => b === '\r').length + 1);
    expect(breaksIn(after).filter((b) => b !== '\r')).toStrictEqual(breaksIn(text).filter((b) => b !== '\r'));
    server.client.close(uri);
  });
});
