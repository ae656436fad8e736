// The built server over stdio: capabilities, diagnostics, inlay hints, hover, outline, definition,
// completion. Expected plans come from plain enumeration of the small fixture board (the oracle
// of record for plan search, see docs/REFERENCES.md) or are derived by hand in the comments.

import * as fs from 'node:fs';
import { spawnSync } from 'node:child_process';
import * as path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { ensureBuilt, LspClient, ROOT, uriOf, type LspDiagnostic } from '../support/lsp-client';
import { lineOf, scratchCopy } from './workspace';

let client: LspClient;
let ws: ReturnType<typeof scratchCopy>;
let labText: string;
let labUri: string;

beforeAll(async () => {
  ensureBuilt();
  ws = scratchCopy();
  client = await LspClient.start({ folders: [ws.dir] });
  labText = fs.readFileSync(ws.lab, 'utf8');
  labUri = uriOf(ws.lab);
  client.open(labUri, labText);
});

afterAll(async () => {
  await client?.stop();
  ws?.remove();
});

interface InlayHint {
  position: { line: number; character: number };
  label: string;
  tooltip?: string;
}
interface Hover {
  contents: { kind: string; value: string };
}

describe('language server over stdio', () => {
  it('answers initialize with the features it serves', async () => {
    const other = await LspClient.start();
    try {
      const result = await other.request<{ capabilities: Record<string, unknown> }>('initialize', { processId: null, rootUri: null, capabilities: {} });
      // LSP 3.17 §initialize: a second initialize is still answered with the capabilities object.
      expect(result.capabilities).toMatchObject({
        hoverProvider: true,
        documentSymbolProvider: true,
        definitionProvider: true,
        executeCommandProvider: { commands: ['waveplan.recheckWorkspace', 'waveplan.planReport', 'waveplan.exportC', 'waveplan.htmlReport'] },
      });
      expect(result.capabilities.inlayHintProvider).toBeTruthy();
      expect(result.capabilities.codeActionProvider).toMatchObject({ codeActionKinds: ['quickfix'] });
    } finally {
      await other.stop();
    }
  });

  it('publishes the checker’s codes and ranges for the fixture, tagged with source waveplan', async () => {
    const published = await client.diagnosticsFor(labUri, (p) => p.version === 1);
    const codes = published.diagnostics.map((d) => d.code).sort();
    expect(codes).toContain('out-of-tolerance');
    expect(codes).toContain('seam-glitch');
    for (const d of published.diagnostics) expect(d.source).toBe('waveplan');
    // derived: 37 kHz is not reachable within 20 ppm on this board (enumeration: nearest jitter-free
    // plans are −79.2 ppm and +692 ppm), so the error sits inside the beacon entry.
    const oot = published.diagnostics.find((d) => d.code === 'out-of-tolerance')!;
    expect(oot.range.start.line).toBeGreaterThanOrEqual(lineOf(labText, 'beacon:'));
    expect(oot.range.start.line).toBeLessThan(lineOf(labText, 'legacy-chirp:'));
    // The cycles value 2.5 is not whole, so the wrap glitches (docs/DESIGN.md, "Seam").
    const seam = published.diagnostics.find((d) => d.code === 'seam-glitch')!;
    expect(seam.range.start.line).toBeGreaterThanOrEqual(lineOf(labText, 'legacy-chirp:'));
  });

  it('gives the same codes, lines and columns as the headless checker', async () => {
    const published = await client.diagnosticsFor(labUri, (p) => p.version === 1);
    const run = spawnSync(process.execPath, [path.join(ROOT, 'bin', 'waveplan.js'), 'check', ws.lab, '--format', 'json'], { encoding: 'utf8' });
    const report = JSON.parse(run.stdout) as { files: { path: string; diagnostics: { code: string; line: number; column: number; message: string }[] }[] };
    const file = report.files.find((f) => path.resolve(f.path) === ws.lab || f.path.endsWith('lab.wave.yaml'))!;
    const fromChecker = file.diagnostics.map((d) => `${d.code}@${d.line}:${d.column} ${d.message}`).sort();
    // The checker prints 1-based positions, LSP carries 0-based ones (LSP 3.17 §Position).
    const fromServer = published.diagnostics.map((d: LspDiagnostic) => `${d.code}@${d.range.start.line + 1}:${d.range.start.character + 1} ${d.message}`).sort();
    expect(fromServer).toEqual(fromChecker);
  });

  it('writes each output’s plan inline after its name', async () => {
    const hints = await client.request<InlayHint[]>('textDocument/inlayHint', {
      textDocument: { uri: labUri },
      range: { start: { line: 0, character: 0 }, end: { line: 100, character: 0 } },
    });
    const probe = hints.find((h) => h.position.line === lineOf(labText, 'probe-drive:'))!;
    // derived: 120 MHz / 6 = 20 MHz (the DAC's maximum); 20 MHz × 1 / 200 = 100 kHz exactly,
    // and 200 samples per cycle is the most any exact plan on this board has (enumeration).
    expect(probe.label).toBe('100 kHz · 0 ppm · ÷6 · seam ok');
    expect(probe.position.character).toBe('  probe-drive:'.length); // just after the key's colon
    const beacon = hints.find((h) => h.position.line === lineOf(labText, 'beacon:'))!;
    // derived by enumeration: the nearest jitter-free plan is 120 MHz / 13 × 2 / 499 = 240 000 000/6487 Hz
    // ≈ 36.9971 kHz, −79.2 ppm from 37 kHz.
    // Out of its 20 ppm tolerance: the label itself starts with the error mark, not only the squiggle's colour.
    expect(beacon.label).toBe('✗ ≈36.9971 kHz · -79.2 ppm · ÷13 · seam ok');
    // The tooltip repeats the whole annotation, which the editor may truncate.
    expect(beacon.tooltip).toContain('≈36.9971 kHz · -79.2 ppm · ÷13 · seam ok');
    // Every label's mark is its output's worst published finding (LSP DiagnosticSeverity: 1 error, 2 warning).
    const published = await client.diagnosticsFor(labUri, (p) => p.version === 1);
    for (const name of ['probe-drive', 'beacon', 'legacy-chirp']) {
      const hint = hints.find((h) => h.position.line === lineOf(labText, `${name}:`))!;
      const severities = published.diagnostics.filter((d) => (d.data as { output?: string } | undefined)?.output === name).map((d) => d.severity);
      const want = severities.includes(1) ? '✗ ' : severities.includes(2) ? '⚠ ' : '';
      expect(hint.label.startsWith('✗') || hint.label.startsWith('⚠') ? hint.label.slice(0, 2) : '', `${name}: "${hint.label}"`).toBe(want);
    }
  });

  it('writes errors in the unit of ppm, ppb, ppt that puts a digit before the point (1 ppm = 1000 ppb = 10^6 ppt, SI)', async () => {
    const { formatPpm } = await import('../../server/src/cli/units');
    expect(formatPpm(-0.0009665763)).toBe('-967 ppt');
    expect(formatPpm(-0.0019665763)).toBe('-1.97 ppb');
    expect(formatPpm(0.000155)).toBe('+155 ppt');
    expect(formatPpm(0.0821)).toBe('+82.1 ppb');
    expect(formatPpm(-79.2)).toBe('-79.2 ppm');
    expect(formatPpm(0)).toBe('0 ppm');
  });

  it('shows the plan card with decodable SVG pictures on an output name', async () => {
    const line = lineOf(labText, 'probe-drive:');
    const hover = await client.request<Hover>('textDocument/hover', { textDocument: { uri: labUri }, position: { line, character: 4 } });
    const md = hover.contents.value;
    expect(hover.contents.kind).toBe('markdown');
    expect(md.length).toBeLessThan(100_000);
    expect(md).toContain('probe-drive');
    expect(md).toContain('N = 200');
    const images = [...md.matchAll(/!\[([^\]]*)\]\(data:image\/svg\+xml;base64,([A-Za-z0-9+/=]+)\)/g)];
    expect(images.length).toBeGreaterThanOrEqual(2);
    for (const [, alt, data] of images) {
      expect(alt.length).toBeGreaterThan(10); // the text fallback
      // RFC 2397 data URI with RFC 4648 base64, decoded by Node's Buffer as the oracle.
      const svg = Buffer.from(data, 'base64').toString('utf8');
      expect(svg).toMatch(/^(<\?xml[^>]*>\s*)?<svg[\s>]/);
      expect(svg.trimEnd().endsWith('</svg>')).toBe(true);
    }
  });

  it('opens the card with a one-line summary and the waveform picture, before any table', async () => {
    const line = lineOf(labText, 'probe-drive:');
    const md = (await client.request<Hover>('textDocument/hover', { textDocument: { uri: labUri }, position: { line, character: 4 } })).contents.value;
    const blocks = md.split('\n\n');
    // The summary is the annotation's own text (every part, as its tooltip carries it).
    const hints = await client.request<InlayHint[]>('textDocument/inlayHint', { textDocument: { uri: labUri }, range: { start: { line, character: 0 }, end: { line, character: 999 } } });
    const tooltip = hints[0].tooltip as string;
    const summary = tooltip.slice(tooltip.indexOf(' — ') + 3).replace(/^[✗⚠] /, '');
    expect(blocks[0]).not.toContain('\n');
    expect(blocks[0]).toBe(`**probe-drive** — ${tooltip.slice('probe-drive: '.length, tooltip.indexOf(' — '))}: ${summary}`);
    expect(blocks[1]).toMatch(/^!\[probe-drive: the sample staircase[^\]]*\]\(data:image\/svg\+xml;base64,/);
    expect(blocks[2].startsWith('|')).toBe(true);
  });

  it('says a quantity in other units and documents a key from the schema', async () => {
    const clockText = fs.readFileSync(ws.labClock, 'utf8');
    const clockUri = uriOf(ws.labClock);
    client.open(clockUri, clockText);
    const line = lineOf(clockText, 'system-clock:');
    const onValue = await client.request<Hover>('textDocument/hover', { textDocument: { uri: clockUri }, position: { line, character: 16 } });
    // derived: 120 MHz = 120 000 000 Hz; period = 1 / 120 MHz = 8.33 ns.
    expect(onValue.contents.value).toContain('120\u2009000\u2009000 Hz');
    expect(onValue.contents.value).toContain('8.33 ns period');
    const onKey = await client.request<Hover>('textDocument/hover', { textDocument: { uri: clockUri }, position: { line, character: 3 } });
    expect(onKey.contents.value).toContain('**system-clock**');
    expect(onKey.contents.value.length).toBeGreaterThan('**system-clock** — '.length + 10);
    client.close(clockUri);
  });

  it('outlines the outputs with selection ranges inside their ranges', async () => {
    type Sym = { name: string; range: LspDiagnostic['range']; selectionRange: LspDiagnostic['range'] };
    const symbols = await client.request<Sym[]>('textDocument/documentSymbol', { textDocument: { uri: labUri } });
    expect(symbols.map((s) => s.name)).toEqual(['probe-drive', 'beacon', 'legacy-chirp']);
    const key = (p: { line: number; character: number }) => p.line * 1e6 + p.character;
    for (const s of symbols) {
      // VS Code drops the outline when a selectionRange leaves its range (DEVELOPERS.md, "Toolchain notes").
      expect(key(s.selectionRange.start)).toBeGreaterThanOrEqual(key(s.range.start));
      expect(key(s.selectionRange.end)).toBeLessThanOrEqual(key(s.range.end));
    }
  });

  it('goes from `clock:` to the clock file', async () => {
    const line = lineOf(labText, 'clock:');
    const locations = await client.request<{ uri: string }[]>('textDocument/definition', { textDocument: { uri: labUri }, position: { line, character: 10 } });
    expect(locations.map((l) => l.uri)).toEqual([uriOf(ws.labClock)]);
  });

  it('completes keys, shapes and units from the schema', async () => {
    const uri = uriOf(path.join(ws.dir, 'typing.wave.yaml'));
    const text = 'clock: ./lab.clock.yaml\noutputs:\n  tone:\n    shape: s\n    frequency: 10 k\n    \n';
    client.open(uri, text);
    type Item = { label: string };
    const shapes = await client.request<Item[]>('textDocument/completion', { textDocument: { uri }, position: { line: 3, character: 12 } });
    expect(shapes.map((i) => i.label)).toEqual(expect.arrayContaining(['sine', 'square', 'triangle', 'sawtooth']));
    const units = await client.request<Item[]>('textDocument/completion', { textDocument: { uri }, position: { line: 4, character: 18 } });
    expect(units.map((i) => i.label)).toEqual(expect.arrayContaining(['Hz', 'kHz', 'MHz']));
    const keys = await client.request<Item[]>('textDocument/completion', { textDocument: { uri }, position: { line: 5, character: 4 } });
    const labels = keys.map((i) => i.label);
    expect(labels).toEqual(expect.arrayContaining(['tolerance', 'jitter', 'plan']));
    expect(labels).not.toContain('shape'); // already written in this entry
    client.close(uri);
  });

  it('opens the demo and reports its deliberate findings', async () => {
    expect(ws.demo, 'examples/*.wave.yaml is missing').toBeDefined();
    const uri = uriOf(ws.demo!);
    client.open(uri, fs.readFileSync(ws.demo!, 'utf8'));
    const published = await client.diagnosticsFor(uri);
    const errors = published.diagnostics.filter((d) => d.severity === 1);
    expect(errors.length).toBeGreaterThanOrEqual(1);
    for (const d of published.diagnostics) expect(typeof d.code).toBe('string');
    client.close(uri);
  });
});
