// The outline over stdio: every fixture and example opened with LF, CR LF and lone-CR line breaks
// lists every output entry (broken ones too) with its state, each selection range inside its range
// (VS Code drops the whole outline otherwise, DEVELOPERS.md "Toolchain notes"), the same on every
// line ending (LSP 3.17, "Position": CR LF, CR and LF each end a line); and an output whose text is
// broken mid-edit stays in the outline while the others keep their plans.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT, uriOf, type LspDiagnostic } from '../support/lsp-client';
import { BREAKS, type Break, outputNamesByLine, specFiles, withBreaks } from '../support/outline';
import { lineOf, serverOnScratch } from './workspace';

type Range = LspDiagnostic['range'];
interface Sym {
  name: string;
  detail?: string;
  range: Range;
  selectionRange: Range;
}

// The fixtures and the examples copied beside the protocol fixtures, so the variants opened next
// to them read the same clock files.
const server = serverOnScratch({}, (dir) => {
  fs.cpSync(path.join(ROOT, 'test', 'fixtures'), path.join(dir, 'fixtures'), { recursive: true });
  fs.cpSync(path.join(ROOT, 'examples'), path.join(dir, 'examples'), { recursive: true });
});

const symbolsOf = (uri: string) => server.client.request<Sym[]>('textDocument/documentSymbol', { textDocument: { uri } });
const at = (p: Range['start']) => p.line * 1e6 + p.character;

describe('the outline over stdio', () => {
  it('lists every output of every fixture and example on every line ending, selections inside ranges', async () => {
    const files = [...specFiles(path.join(server.ws.dir, 'fixtures')), ...specFiles(path.join(server.ws.dir, 'examples'))];
    expect(files.length).toBeGreaterThanOrEqual(60);
    let opened = 0;
    let outputs = 0;
    for (const file of files) {
      const lf = withBreaks(fs.readFileSync(file, 'utf8'), 'lf');
      let reference: Sym[] | undefined;
      for (const b of Object.keys(BREAKS) as Break[]) {
        const variant = file.replace(/\.(wave|clock)\.yaml$/, `-${b}.$1.yaml`);
        const uri = uriOf(variant);
        const text = withBreaks(lf, b);
        server.client.open(uri, text);
        // Once published, the analysis is whole: no output is still being planned.
        await server.client.diagnosticsFor(uri);
        const symbols = await symbolsOf(uri);
        const where = `${path.relative(server.ws.dir, variant)}`;
        for (const s of symbols) {
          expect(at(s.selectionRange.start), `${where} ${s.name}`).toBeGreaterThanOrEqual(at(s.range.start));
          expect(at(s.selectionRange.end), `${where} ${s.name}`).toBeLessThanOrEqual(at(s.range.end));
        }
        if (file.endsWith('.wave.yaml')) {
          expect(symbols.map((s) => s.name), where).toStrictEqual(outputNamesByLine(text));
          for (const s of symbols) expect(s.detail, `${where} ${s.name}`).toBeTruthy();
          outputs += symbols.length;
        }
        reference ??= symbols;
        expect(symbols, where).toStrictEqual(reference);
        server.client.close(uri);
        opened++;
      }
    }
    expect(opened).toBe(files.length * 3);
    expect(outputs).toBeGreaterThanOrEqual(3 * 60);
    expect(server.client.logs.filter((m) => m.includes('failed'))).toStrictEqual([]);
  }, 120_000);

  it('keeps an output broken mid-edit in the outline, and the other outputs’ plans', async () => {
    const text = fs.readFileSync(server.ws.lab, 'utf8');
    const uri = uriOf(path.join(server.ws.dir, 'outline-edit.wave.yaml'));
    server.client.open(uri, text);
    await server.client.diagnosticsFor(uri, (p) => p.version === 1);
    const before = await symbolsOf(uri);
    expect(before.map((s) => s.name)).toStrictEqual(['probe-drive', 'beacon', 'legacy-chirp']);
    // derived: 120 MHz / 6 / 200 samples × 1 cycle = 100 kHz exactly (the fixture's own comment).
    expect(before[0].detail).toBe('exact, jitter-free · 100 kHz · 0 ppm · ÷6 · seam ok');
    // An unclosed quote in the beacon's frequency: its own text no longer parses.
    const line = lineOf(text, '    frequency: 37 kHz');
    server.client.edit(uri, 2, { start: { line, character: 15 }, end: { line, character: 15 } }, '"');
    await server.client.diagnosticsFor(uri, (p) => p.version === 2);
    const after = await symbolsOf(uri);
    expect(after.map((s) => s.name)).toStrictEqual(['probe-drive', 'beacon', 'legacy-chirp']);
    expect(after[1].detail).toBe(`not read: YAML syntax error, line ${line + 1}`);
    expect(after[0]).toStrictEqual(before[0]);
    expect(after[2]).toStrictEqual(before[2]);
    server.client.close(uri);
  });
});
