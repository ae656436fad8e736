// Found by the fuzz harness (seed 20261203, cases 20, 50, 80): completion asked at a position past
// the last line, or past a line's end, answered items whose edit ranges lay outside the document,
// which an editor refuses. Positions are counted as LSP 3.17 counts them ("Position"); the oracle
// for the document's lines is vscode-languageserver-textdocument.

import * as path from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { uriOf } from '../support/lsp-client';
import { linesOf, rangeProblem } from '../support/ranges';
import { serverOnScratch } from './workspace';

const server = serverOnScratch();

interface Item {
  label: string;
  textEdit?: { range: { start: { line: number; character: number }; end: { line: number; character: number } }; newText: string };
}

describe('completion past the end of the text', () => {
  it('answers edits inside the document for positions past the last line and past a line’s end', async () => {
    const text = 'clock: ./lab.clock.yaml\r\noutputs:\r\n  tone:\r\n    shape: sine\r\n    '; // CR LF, the cursor on an indented last line
    const uri = uriOf(path.join(server.ws.dir, 'past-the-end.wave.yaml'));
    server.client.open(uri, text);
    const lines = linesOf(TextDocument.create(uri, 'yaml', 1, text).getText());
    const asked = [
      { line: lines.length, character: 4 },
      { line: lines.length + 2, character: 0 },
      { line: lines.length - 1, character: 40 },
      { line: 2, character: 30 },
    ];
    let items = 0;
    for (const position of asked) {
      const answer = await server.client.request<Item[]>('textDocument/completion', { textDocument: { uri }, position });
      for (const item of answer) {
        items++;
        expect(rangeProblem(item.textEdit!.range, lines), `${item.label} at ${JSON.stringify(position)}`).toBeUndefined();
      }
    }
    // The last line's indentation offers the output keys: the answers were not empty.
    expect(items).toBeGreaterThan(0);
    server.client.close(uri);
  });
});
