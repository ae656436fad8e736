// Editing keeps its footing: a new six-line output typed one character at a time (between two
// outputs, at the end of the file), a line typed into the frame, and the new output deleted again
// with backspace. After every keystroke the server's diagnostics and annotations of every output
// the typing did not touch must equal those of the clean file (moved by the lines typed above
// them); while the text is not valid YAML (the `yaml` package, a general-purpose parser, is the
// oracle) a yaml-syntax error must be published, on a line being typed. The invented board and
// outputs are this test's own.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { parseDocument } from 'yaml';
import { afterAll, describe, expect, it } from 'vitest';
import { uriOf, type LspDiagnostic } from '../support/lsp-client';
import { serverOnScratch } from './workspace';

const CLOCK = `# replay.clock.yaml — an invented test box; a roomy memory budget keeps the outputs apart.
system-clock: 96 MHz
divider:
  integer: { min: 1, max: 4000 }
  fraction-bits: 4
dac:
  bits: 12
  sample-bytes: 2
  full-scale: 3.3 V
  max-sample-rate: 12 MHz
memory:
  budget: 4 MiB
  table-length: { min: 32, max: 4096 }
`;

const SPEC = `# replay.wave.yaml — outputs of every kind, so every kind of finding is there to keep.
clock: ./replay.clock.yaml
outputs:
  exact-tone:
    shape: sine
    frequency: 12 kHz
  near-tone:
    shape: sine
    frequency: 7.777 kHz
    tolerance: 100 ppm
  tight-tone:
    shape: sine
    frequency: 33.3331 kHz
    tolerance: 0.001 ppm
  loose-jitter:
    shape: sine
    frequency: 41.1234 kHz
    tolerance: 1 ppb
    jitter: allow
  gate:
    shape: square
    duty: 25 %
    frequency: 1 kHz
  ramp:
    shape: triangle
    frequency: 2.5 kHz
    colour: blue
  glitchy:
    shape: sine
    frequency: 30 kHz
    plan: { divider: 100, table-length: 64, cycles: 2.5 }
  last-one:
    shape: sawtooth
    frequency: 500 Hz
`;

const NEW_OUTPUT = ['  typed-probe:', '    shape: sine', '    frequency: 12.5 kHz', '    tolerance: 50 ppm', '    amplitude: 1 Vpp', '    jitter: forbid'];
const NAMES = [...SPEC.matchAll(/^ {2}([a-z-]+):$/gm)].map((m) => m[1]);

type Range = LspDiagnostic['range'];
interface Hint {
  position: { line: number; character: number };
  label: string;
  tooltip?: string;
}

const server = serverOnScratch({}, (dir) => fs.writeFileSync(path.join(dir, 'replay.clock.yaml'), CLOCK));

const lineOfOutput = (text: string, name: string): number => text.split('\n').indexOf(`  ${name}:`);

/** What the editor shows of one output: its diagnostics and its annotation, positions relative to its key line. */
function view(text: string, diagnostics: LspDiagnostic[], hints: Hint[], name: string) {
  const at = lineOfOutput(text, name);
  const rel = (r: Range) => ({ start: { ...r.start, line: r.start.line - at }, end: { ...r.end, line: r.end.line - at } });
  return {
    diagnostics: diagnostics
      .filter((d) => (d.data as { output?: string } | undefined)?.output === name)
      .map((d) => ({ code: d.code, severity: d.severity, message: d.message, range: rel(d.range) })),
    hints: hints.filter((h) => h.position.line === at).map((h) => ({ label: h.label, tooltip: h.tooltip, character: h.position.character })),
  };
}

interface Session {
  uri: string;
  doc: TextDocument;
  clean: Map<string, ReturnType<typeof view>>;
}

async function state(uri: string, version: number, since: number): Promise<{ diagnostics: LspDiagnostic[]; hints: Hint[] }> {
  const published = await server.client.diagnosticsFor(uri, (p) => p.version === version, since);
  const hints = await server.client.request<Hint[]>('textDocument/inlayHint', { textDocument: { uri }, range: { start: { line: 0, character: 0 }, end: { line: 999, character: 0 } } });
  return { diagnostics: published.diagnostics, hints };
}

async function open(name: string): Promise<Session> {
  const file = path.join(server.ws.dir, name);
  fs.writeFileSync(file, SPEC);
  const uri = uriOf(file);
  server.client.open(uri, SPEC, 1);
  const first = await state(uri, 1, 0);
  const clean = new Map(NAMES.map((n) => [n, view(SPEC, first.diagnostics, first.hints, n)]));
  // The clean file has findings of several kinds, and an annotation on every output.
  const codes = new Set(first.diagnostics.map((d) => d.code));
  for (const code of ['out-of-tolerance', 'fractional-plan', 'seam-glitch', 'unknown-key']) expect(codes, code).toContain(code);
  // Every output but the one with an unknown key (an error, so not planned) carries an annotation.
  expect(NAMES.filter((n) => clean.get(n)!.hints.length === 1)).toStrictEqual(NAMES.filter((n) => n !== 'ramp'));
  return { uri, doc: TextDocument.create(uri, 'yaml', 1, SPEC), clean };
}

interface Tally {
  keystrokes: number;
  kept: number;
  broken: number;
}

/**
 * Applies one keystroke (an insertion or a deletion at `offset`), waits for its diagnostics and
 * annotations and checks every untouched output against the clean file. `typedLines` tells which
 * lines are being typed, where a syntax error belongs.
 */
async function keystroke(s: Session, offset: number, insert: string, remove: number, typedLines: (text: string) => [number, number], tally: Tally): Promise<void> {
  const range = { start: s.doc.positionAt(offset), end: s.doc.positionAt(offset + remove) };
  const version = s.doc.version + 1;
  const since = server.client.published.length;
  s.doc = TextDocument.update(s.doc, [{ range, text: insert }], version);
  server.client.edit(s.uri, version, range, insert);
  const text = s.doc.getText();
  const now = await state(s.uri, version, since);
  tally.keystrokes++;
  let kept = true;
  for (const name of NAMES) {
    const seen = view(text, now.diagnostics, now.hints, name);
    const want = s.clean.get(name)!;
    expect(seen, `${name} after typing ${JSON.stringify(insert)} (version ${version}):\n${text}`).toStrictEqual(want);
    kept &&= JSON.stringify(seen) === JSON.stringify(want);
  }
  if (kept) tally.kept++;
  if (parseDocument(text).errors.length > 0) {
    tally.broken++;
    const syntax = now.diagnostics.filter((d) => d.code === 'yaml-syntax');
    expect(syntax.length, `no yaml-syntax error published for\n${text}`).toBeGreaterThan(0);
    const [from, to] = typedLines(text);
    for (const d of syntax) expect(d.range.start.line >= from && d.range.start.line <= to, `syntax error at line ${d.range.start.line}, typing at ${from}–${to}:\n${text}`).toBe(true);
  }
}

/** Types `typed` at `offset` one character at a time. */
async function type(s: Session, offset: number, typed: string, typedLines: (text: string) => [number, number], tally: Tally): Promise<void> {
  for (let i = 0; i < typed.length; i++) await keystroke(s, offset + i, typed[i], 0, typedLines, tally);
}

const tallies: Record<string, Tally> = {};
const tally = (name: string): Tally => (tallies[name] = { keystrokes: 0, kept: 0, broken: 0 });

describe('typing replay', () => {
  it('a new output typed between two outputs, then deleted with backspace', async () => {
    const s = await open('between.wave.yaml');
    // The cursor at the end of `gate`'s last line; Enter, then the new output line by line.
    const at = SPEC.indexOf('    frequency: 1 kHz') + '    frequency: 1 kHz'.length;
    const typed = NEW_OUTPUT.map((l) => `\n${l}`).join('');
    const line = SPEC.slice(0, at).split('\n').length - 1;
    const lines = (): [number, number] => [line + 1, line + NEW_OUTPUT.length];
    const typing = tally('between outputs');
    await type(s, at, typed, lines, typing);
    const deleting = tally('deleting it again');
    for (let i = typed.length; i > 0; i--) await keystroke(s, at + i - 1, '', 1, lines, deleting);
    expect(s.doc.getText()).toBe(SPEC);
    expect(typing.kept).toBe(typing.keystrokes);
    expect(deleting.kept).toBe(deleting.keystrokes);
    // The replay went through broken states, or it proves nothing.
    expect(typing.broken).toBeGreaterThan(10);
  }, 120_000);

  it('a new output typed at the end of the file', async () => {
    const s = await open('end.wave.yaml');
    const line = SPEC.split('\n').length - 1;
    const t = tally('at the end');
    await type(s, SPEC.length, NEW_OUTPUT.join('\n') + '\n', () => [line, line + NEW_OUTPUT.length], t);
    expect(t.kept).toBe(t.keystrokes);
    expect(t.broken).toBeGreaterThan(10);
  }, 120_000);

  it('a line typed into the frame', async () => {
    const s = await open('frame.wave.yaml');
    // Enter at the end of the first line, then a top-level key.
    const at = SPEC.indexOf('\n');
    const t = tally('in the frame');
    await type(s, at, '\ndescription: signals for the replay box  # typed', () => [1, 1], t);
    expect(t.kept).toBe(t.keystrokes);
    expect(t.broken).toBeGreaterThan(3);
  }, 120_000);

  afterAll(() => {
    const rows = Object.entries(tallies).map(([k, v]) => `${k}: ${v.kept}/${v.keystrokes} keystrokes kept every untouched output (${v.broken} while not valid YAML)`);
    console.log(`typing replay\n${rows.join('\n')}`);
  });
});
