// The same spec with LF, CR LF, lone CR and mixed line breaks: the editor and the checker give the
// same diagnostics at the same positions, every feature answers, and quick fixes keep the file's
// own line breaks. Lines are counted as LSP counts them (LSP 3.17, "Position": CR LF, CR and LF
// each end a line); the oracle for positions and applied edits is vscode-languageserver-textdocument,
// the general-purpose implementation of those rules.

import { spawnSync } from 'node:child_process';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { BREAKS, breaksIn, insertedBreakProblems, withBreaks } from '../support/line-breaks';
import { ROOT, uriOf, type LspDiagnostic } from '../support/lsp-client';
import { serverOnScratch } from './workspace';

type Range = LspDiagnostic['range'];
interface Symbol {
  name: string;
  range: Range;
  selectionRange: Range;
}
interface Action {
  title: string;
  edit?: { changes?: Record<string, { range: Range; newText: string }[]> };
}

const server = serverOnScratch();

/** Text under a range, read by the oracle library. */
const textAt = (doc: TextDocument, r: Range): string => doc.getText(r);

const key = (d: LspDiagnostic) => `${d.code}@${d.range.start.line}:${d.range.start.character}-${d.range.end.line}:${d.range.end.character}`;

async function openVariant(name: string, text: string): Promise<{ uri: string; file: string; diagnostics: LspDiagnostic[] }> {
  const file = path.join(server.ws.dir, name);
  fs.writeFileSync(file, text);
  const uri = uriOf(file);
  server.client.open(uri, text);
  const published = await server.client.diagnosticsFor(uri, (p) => p.version === 1);
  return { uri, file, diagnostics: published.diagnostics };
}

const specs = (): { name: string; text: string }[] => [
  { name: 'lab', text: fs.readFileSync(server.ws.lab, 'utf8') },
  { name: 'demo', text: fs.readFileSync(server.ws.demo!, 'utf8').replace(/clock: \.\//, 'clock: ./demo/') },
];

describe('every line ending', () => {
  it('gives the same diagnostics at the same text in the editor and in the checker', async () => {
    for (const spec of specs()) {
      const lf = await openVariant(`${spec.name}-lf.wave.yaml`, spec.text);
      const lfDoc = TextDocument.create(lf.uri, 'yaml', 1, spec.text);
      expect(lf.diagnostics.length).toBeGreaterThan(0);
      for (const variant of ['crlf', 'cr', 'mixed'] as const) {
        const text = withBreaks(spec.text, variant);
        const opened = await openVariant(`${spec.name}-${variant}.wave.yaml`, text);
        const doc = TextDocument.create(opened.uri, 'yaml', 1, text);
        // Same codes at the same positions, and the positions point at the same text.
        expect(opened.diagnostics.map(key), `${spec.name} ${variant}`).toStrictEqual(lf.diagnostics.map(key));
        opened.diagnostics.forEach((d, i) => expect(textAt(doc, d.range)).toBe(textAt(lfDoc, lf.diagnostics[i].range)));
        // The checker reads the file from disk: 1-based lines and columns of the same findings (LSP 3.17 §Position is 0-based).
        const run = spawnSync(process.execPath, [path.join(ROOT, 'bin', 'waveplan.js'), 'check', opened.file, '--format', 'json'], { encoding: 'utf8' });
        const report = JSON.parse(run.stdout) as { files: { diagnostics: { code: string; line: number; column: number }[] }[] };
        const fromChecker = report.files[0].diagnostics.map((d) => `${d.code}@${d.line}:${d.column}`).sort();
        const fromEditor = opened.diagnostics.map((d) => `${d.code}@${d.range.start.line + 1}:${d.range.start.character + 1}`).sort();
        expect(fromChecker, `${spec.name} ${variant}`).toStrictEqual(fromEditor);
        server.client.close(opened.uri);
      }
      server.client.close(lf.uri);
    }
  });

  it('answers every feature on every line ending, as on LF', async () => {
    const text = fs.readFileSync(server.ws.lab, 'utf8');
    const lines = text.split('\n');
    const answers = async (uri: string) => {
      const wide = { start: { line: 0, character: 0 }, end: { line: lines.length, character: 0 } };
      const [hints, symbols, lenses] = await Promise.all([
        server.client.request<unknown[]>('textDocument/inlayHint', { textDocument: { uri }, range: wide }),
        server.client.request<Symbol[]>('textDocument/documentSymbol', { textDocument: { uri } }),
        server.client.request<unknown[]>('textDocument/codeLens', { textDocument: { uri } }),
      ]);
      const hovers: unknown[] = [];
      for (const [line, l] of lines.entries()) {
        for (const character of [2, Math.floor(l.length / 2), l.length - 1]) {
          if (character >= 0) hovers.push(await server.client.request('textDocument/hover', { textDocument: { uri }, position: { line, character } }));
        }
      }
      return { hints, symbols, lenses, hovers };
    };
    const lf = await openVariant('features-lf.wave.yaml', text);
    const expected = await answers(lf.uri);
    expect(expected.hints.length).toBe(3);
    for (const variant of ['crlf', 'cr', 'mixed'] as const) {
      const logsBefore = server.client.logs.length;
      const opened = await openVariant(`features-${variant}.wave.yaml`, withBreaks(text, variant));
      const got = await answers(opened.uri);
      expect(JSON.parse(JSON.stringify(got).replaceAll(opened.uri, lf.uri)), variant).toStrictEqual(expected);
      for (const s of got.symbols) {
        // VS Code drops the whole outline when a selectionRange leaves its range.
        const at = (p: Range['start']) => p.line * 1e6 + p.character;
        expect(at(s.selectionRange.start)).toBeGreaterThanOrEqual(at(s.range.start));
        expect(at(s.selectionRange.end)).toBeLessThanOrEqual(at(s.range.end));
      }
      // Completion at every third position of every line, and one past each line's end.
      for (const [line, l] of lines.entries()) {
        for (let character = 0; character <= l.length + 1; character += character > l.length - 1 ? 1 : 3) {
          const items = await server.client.request<unknown>('textDocument/completion', { textDocument: { uri: opened.uri }, position: { line, character } });
          expect(Array.isArray(items)).toBe(true);
        }
      }
      expect(server.client.logs.slice(logsBefore).filter((m) => m.includes('failed')), variant).toStrictEqual([]);
      server.client.close(opened.uri);
    }
    server.client.close(lf.uri);
  }, 60_000);

  it('applies quick fixes with the file’s own line breaks', async () => {
    // Without `jitter:` on the beacon, allowing a fractional divider adds a line.
    const text = fs.readFileSync(server.ws.lab, 'utf8').replace('    jitter: forbid\n', '');
    let applied = 0;
    let inserted = 0;
    for (const variant of ['lf', 'crlf', 'cr', 'mixed'] as const) {
      const original = withBreaks(text, variant);
      const opened = await openVariant(`fixes-${variant}.wave.yaml`, original);
      const doc = TextDocument.create(opened.uri, 'yaml', 1, original);
      for (const d of opened.diagnostics) {
        const actions = await server.client.request<Action[]>('textDocument/codeAction', { textDocument: { uri: opened.uri }, range: d.range, context: { diagnostics: [d] } });
        for (const action of actions) {
          const edits = action.edit?.changes?.[opened.uri] ?? [];
          if (edits.length === 0) continue;
          const after = TextDocument.applyEdits(doc, edits);
          applied++;
          if (edits.some((e) => breaksIn(e.newText).length > 0)) inserted++;
          if (variant === 'mixed') {
            // Each inserted break is the one that ends the line it is inserted on.
            expect(insertedBreakProblems(doc, edits), action.title).toStrictEqual([]);
          } else {
            expect(new Set(breaksIn(after)), `${variant}: ${action.title}`).toStrictEqual(new Set([BREAKS[variant]]));
          }
        }
      }
      server.client.close(opened.uri);
    }
    expect(applied).toBeGreaterThanOrEqual(8);
    expect(inserted).toBeGreaterThanOrEqual(4);
  });
});
