// Completion over stdio as an editor asks for it while keys are typed: a partial word at the key
// position (the item's edit covers it), under outputs of each shape (only the keys that apply), on
// a line that is a YAML error, after `shape:`, and the same on CR LF and lone-CR documents. Edits
// are applied with vscode-languageserver-textdocument, the general-purpose implementation of LSP
// positions and edits (LSP 3.17, "TextEdit", "InsertReplaceEdit"), as the oracle of the result.

import * as path from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { describe, expect, it } from 'vitest';
import { uriOf, type LspDiagnostic } from '../support/lsp-client';
import { BREAKS, type Break, withBreaks } from '../support/outline';
import { serverOnScratch } from './workspace';

type Range = LspDiagnostic['range'];
interface Item {
  label: string;
  filterText?: string;
  textEdit?: { range?: Range; insert?: Range; replace?: Range; newText: string };
}

const server = serverOnScratch();
let opened = 0;

/** Opens `lines` (LF-joined, then given the line break `b`) and asks at the `|` of line `line`. */
async function complete(lines: string[], b: Break = 'lf', context?: unknown): Promise<{ items: Item[]; doc: TextDocument; uri: string }> {
  const row = lines.findIndex((l) => l.includes('|'));
  const character = lines[row].indexOf('|');
  const text = withBreaks(lines.map((l) => l.replace('|', '')).join('\n'), b);
  const uri = uriOf(path.join(server.ws.dir, `typing-${opened++}.wave.yaml`));
  server.client.open(uri, text);
  const items = await server.client.request<Item[]>('textDocument/completion', { textDocument: { uri }, position: { line: row, character }, ...(context ? { context } : {}) });
  return { items, doc: TextDocument.create(uri, 'yaml', 1, text), uri };
}

/** The text after taking an item, as the editor writes it (the replace range when there is one). */
function take(doc: TextDocument, item: Item): string {
  const e = item.textEdit!;
  return TextDocument.applyEdits(doc, [{ range: e.replace ?? e.range ?? e.insert!, newText: e.newText }]);
}

const output = (shape: string, typed: string): string[] => ['clock: ./lab.clock.yaml', 'outputs:', '  tone:', `    shape: ${shape}`, `    ${typed}|`, ''];
const labels = (items: Item[]) => items.map((i) => i.label);

// Which keys apply to which shape, derived from the model (server/src/spec/wave-model.ts): the duty
// is read for a square only, a band-limited table is built for a square, triangle or sawtooth, and
// `harmonics` or `sample-file` defines a sine's table (custom-model.ts).
const ONLY: Record<string, string[]> = {
  duty: ['square'],
  'duty-tolerance': ['square'],
  'band-limit': ['square', 'triangle', 'sawtooth'],
  harmonics: ['sine'],
  'sample-file': ['sine'],
};

describe('completion while typing', () => {
  it('offers `frequency` after `fre`, its edit covering the partial word', async () => {
    const { items, doc } = await complete(output('sine', 'fre'));
    const item = items.find((i) => i.label === 'frequency')!;
    expect(item).toBeDefined();
    expect(item.textEdit!.range).toStrictEqual({ start: { line: 4, character: 4 }, end: { line: 4, character: 7 } });
    expect(take(doc, item).split('\n')[4]).toBe('    frequency: ');
    expect(labels(items)).not.toContain('shape'); // already written in this output
  });

  it('offers under each shape only the keys that apply to it', async () => {
    let cases = 0;
    for (const shape of ['sine', 'square', 'triangle', 'sawtooth']) {
      for (const typed of ['', 'du', 'ha', 'ba', 'sa']) {
        const { items } = await complete(output(shape, typed), 'lf', { triggerKind: 1 });
        for (const [key, shapes] of Object.entries(ONLY)) {
          expect(labels(items).includes(key), `${key} under a ${shape} after "${typed}"`).toBe(shapes.includes(shape));
        }
        // Every other key of an output is offered under every shape.
        expect(labels(items), shape).toEqual(expect.arrayContaining(['frequency', 'tolerance', 'jitter', 'amplitude', 'plan']));
        cases++;
      }
    }
    expect(cases).toBe(20);
    // No shape written yet (or one the schema does not know): every key, the shape-bound ones too.
    for (const shape of ['', 'sinus']) {
      const { items } = await complete(['clock: ./lab.clock.yaml', 'outputs:', '  tone:', ...(shape ? [`    shape: ${shape}`] : []), '    du|', '']);
      expect(labels(items), `shape "${shape}"`).toEqual(expect.arrayContaining(Object.keys(ONLY)));
    }
  });

  it('completes on a line that is a YAML error, in a file that does not parse', async () => {
    const lines = ['clock: ./lab.clock.yaml', 'outputs:', '  other:', '    shape: sine', '    frequency: "1 kHz', '  gate:', '    shape: square', '    du|', ''];
    const { items, uri } = await complete(lines);
    const published = await server.client.diagnosticsFor(uri);
    expect(published.diagnostics.map((d) => d.code)).toContain('yaml-syntax');
    expect(labels(items)).toEqual(expect.arrayContaining(['duty', 'duty-tolerance']));
    expect(labels(items)).not.toContain('harmonics');
  });

  it('gives the same items on LF, CR LF and lone CR documents', async () => {
    const cases = [output('square', 'du'), output('sine', 'fre'), ['clock: ./lab.clock.yaml', 'outputs:', '  tone:', '    shape: |', ''], ['clock: ./lab.clock.yaml', 'outputs:', '  tone:', '    shape: sine', '    frequency: 10 k|', '']];
    for (const lines of cases) {
      const lf = await complete(lines, 'lf');
      expect(lf.items.length, lines.join('/')).toBeGreaterThan(0);
      for (const b of Object.keys(BREAKS) as Break[]) {
        const got = await complete(lines, b);
        expect(got.items, `${b}: ${lines.join('/')}`).toStrictEqual(lf.items);
        // The edit lands where it does on LF: same line, same text once the breaks are undone.
        for (const item of got.items) expect(withBreaks(take(got.doc, item), 'lf')).toBe(take(lf.doc, lf.items.find((i) => i.label === item.label)!));
      }
    }
  });

  it('offers the shapes after `shape:`, with the space YAML needs right after the colon', async () => {
    const spaced = await complete(['clock: ./lab.clock.yaml', 'outputs:', '  tone:', '    shape: |', '']);
    expect(labels(spaced.items)).toStrictEqual(['sine', 'square', 'triangle', 'sawtooth']);
    expect(take(spaced.doc, spaced.items[1]).split('\n')[3]).toBe('    shape: square');
    // Triggered by the colon (a trigger character): `shape:sine` would be one plain scalar, not a key and value (YAML 1.2.2 §7.3.3).
    const colon = await complete(['clock: ./lab.clock.yaml', 'outputs:', '  tone:', '    shape:|', ''], 'lf', { triggerKind: 2, triggerCharacter: ':' });
    expect(take(colon.doc, colon.items[0]).split('\n')[3]).toBe('    shape: sine');
    const partial = await complete(['clock: ./lab.clock.yaml', 'outputs:', '  tone:', '    shape: tri|', '']);
    expect(take(partial.doc, partial.items.find((i) => i.label === 'triangle')!).split('\n')[3]).toBe('    shape: triangle');
  });

  it('replaces the whole key when typed inside one, keeping its colon and value', async () => {
    const { items, doc } = await complete(['clock: ./lab.clock.yaml', 'outputs:', '  tone:', '    shape: sine', '    tol|erance: 50 ppm', '']);
    const item = items.find((i) => i.label === 'tolerance')!;
    expect(item.textEdit!.insert).toStrictEqual({ start: { line: 4, character: 4 }, end: { line: 4, character: 7 } });
    expect(take(doc, item).split('\n')[4]).toBe('    tolerance: 50 ppm');
  });

  it('opens no key list for a space typed in the indentation, and keys when asked there', async () => {
    const typedSpace = await complete(output('sine', ''), 'lf', { triggerKind: 2, triggerCharacter: ' ' });
    expect(typedSpace.items).toStrictEqual([]);
    const invoked = await complete(output('sine', ''), 'lf', { triggerKind: 1 });
    expect(labels(invoked.items)).toContain('frequency');
  });
});
