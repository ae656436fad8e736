// Found by the fuzz harness (seed 20261203, cases 170 and 220): a YAML error the parser places on
// the CR of a CR LF pair got a range ending between the CR and the LF, one character past the
// line's end (LSP 3.17, "Position": CR LF ends a line and is not part of it). The oracle for
// positions is vscode-languageserver-textdocument.

import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import { LineIndex } from '../../../server/src/spec/source';
import { diagnosticProblems } from '../../support/ranges';

describe('an offset inside a CR LF pair', () => {
  it('is the end of its line, as the general-purpose text document places it', () => {
    const text = 'a: 1\r\nbb: 2\r\n';
    const doc = TextDocument.create('file:///x.wave.yaml', 'yaml', 1, text);
    const lines = new LineIndex(text);
    for (let offset = 0; offset <= text.length; offset++) {
      // The library puts an offset between CR and LF at the line's end too.
      expect(lines.position(offset), `offset ${offset}`).toStrictEqual(doc.positionAt(offset));
    }
  });

  it('gives a YAML error at a line end a range on the line', () => {
    const text = 'outputs:\r\n  x:\r\n    frequency:\t\r\n k1:\r\n';
    const a = analyze('/nowhere/x.wave.yaml', text, { readFile: () => undefined });
    expect(a.diagnostics.map((d) => d.code)).toContain('yaml-syntax');
    expect(diagnosticProblems(a.diagnostics, text)).toStrictEqual([]);
  });
});
