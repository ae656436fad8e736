// One language-server session on a fuzzed spec: opened, then edited with ranged changes (now and
// then a whole-text change), with hover, inlay hints, code actions, symbols, completion and code
// lenses asked in between, some cancelled at once. At the end: the final version's diagnostics
// equal the checker's on the saved file, and every quick fix offered is applied and checked.

import * as fs from 'node:fs';
import * as path from 'node:path';
import { TextDocument } from 'vscode-languageserver-textdocument';
import { DiskHost } from '../../../server/src/cli/disk';
import { analyze } from '../../../server/src/spec/analyze';
import { CancellationTokenSource, uriOf, type LspClient, type LspDiagnostic } from '../lsp-client';
import { diagnosticProblems, linesOf } from '../ranges';
import { compareFindings, findingOf, runChecker, saveBuffer, type Finding } from './checker-side';
import type { FuzzConfig } from './config';
import { rangedEdit } from './edits';
import { checkFix } from './fix-check';
import { mutate, mutateMildly } from './mutations';
import { between, caseRandom, chance, int, pick, type Random } from './random';
import { answerProblems } from './responses';
import type { Tally } from './tally';
import type { FuzzCase } from './cases';

const METHODS = ['textDocument/hover', 'textDocument/inlayHint', 'textDocument/codeAction', 'textDocument/documentSymbol', 'textDocument/completion', 'textDocument/codeLens'] as const;
const SEVERITY: Record<number, string> = { 1: 'error', 2: 'warning', 3: 'information' };
/** Diagnostics of one session whose quick fixes are asked for and applied. */
const MAX_FIXED_DIAGNOSTICS = 60;
/** An answer later than this is a hang: the session stops there and the server is started afresh. */
const ANSWER_MS = 30_000;

class Stalled extends Error {}

/** The answer, or a Stalled rejection once ANSWER_MS have passed without one. */
function answered<T>(pending: Promise<T>, what: string): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  const late = new Promise<never>((_, reject) => (timer = setTimeout(() => reject(new Stalled(`${what}: no answer in ${ANSWER_MS / 1000} s`)), ANSWER_MS)));
  return Promise.race([pending, late]).finally(() => clearTimeout(timer));
}

/** RequestCancelled (LSP 3.17, "Cancellation Support"). */
const REQUEST_CANCELLED = -32800;

interface Action {
  title: string;
  edit?: { changes?: Record<string, { range: LspDiagnostic['range']; newText: string }[]> };
}

/** A position in the text, mostly on a line and within it, sometimes past the end of either. */
function somewhere(r: Random, text: string): { line: number; character: number } {
  const lines = linesOf(text);
  if (chance(r, 0.05)) return { line: lines.length + int(r, 3), character: int(r, 5) };
  const line = int(r, lines.length);
  return { line, character: chance(r, 0.05) ? lines[line].length + 1 + int(r, 3) : int(r, lines[line].length + 1) };
}

function paramsFor(method: (typeof METHODS)[number], r: Random, uri: string, text: string, diagnostics: LspDiagnostic[]): unknown {
  const textDocument = { uri };
  const lines = linesOf(text).length;
  switch (method) {
    case 'textDocument/hover':
    case 'textDocument/completion':
      return { textDocument, position: somewhere(r, text) };
    case 'textDocument/inlayHint':
      return { textDocument, range: chance(r, 0.5) ? { start: { line: 0, character: 0 }, end: { line: lines, character: 0 } } : { start: somewhere(r, text), end: { line: lines + 1, character: 0 } } };
    case 'textDocument/codeAction': {
      // Diagnostics of an older version, as an editor sends them while the new ones are on their way.
      // Every draw is made whatever arrived, so a replay takes the same path (the diagnostics do not).
      const useOne = chance(r, 0.8);
      const which = r();
      const elsewhere = { start: somewhere(r, text), end: somewhere(r, text) };
      const d = useOne && diagnostics.length ? diagnostics[Math.floor(which * diagnostics.length)] : undefined;
      const range = d?.range ?? elsewhere;
      return { textDocument, range, context: { diagnostics: d ? [d] : [] } };
    }
    default:
      return { textDocument };
  }
}

export interface SessionResult {
  problems: string[];
  /** A request went unanswered: the server is to be replaced before the next session. */
  stalled: boolean;
  edits: number;
  fixes: number;
}

/**
 * An editing session (`edits`): the case's text, `config.edits` edits, mostly back to the seed at
 * the end. A fixing session (`fixes`): the seed with one mild change, no edits, every quick fix.
 */
export type SessionKind = 'edits' | 'fixes';

export async function runSession(client: LspClient, config: FuzzConfig, c: FuzzCase, root: string, tally: Tally, kind: SessionKind = 'edits'): Promise<SessionResult> {
  const r = caseRandom(config.seed, c.n, kind === 'edits' ? 1 : 2);
  const problems: string[] = [];
  const file = path.join(c.seed.folder, `fuzz-${kind}-${c.n}.${c.seed.kind}.yaml`);
  const uri = uriOf(file);
  const logsBefore = client.logs.length;
  const start = kind === 'edits' ? c.text : mutateMildly(c.seed.text, r).text;
  const edits = kind === 'edits' ? config.edits : 0;
  let doc = TextDocument.create(uri, 'yaml', 1, start);
  client.open(uri, start, 1);
  const pending: Promise<void>[] = [];
  const stalled = { value: false };
  let lastDiagnostics: LspDiagnostic[] = [];

  const ask = (method: (typeof METHODS)[number]) => {
    const text = doc.getText();
    const version = doc.version;
    const params = paramsFor(method, r, uri, text, lastDiagnostics);
    const cancel = chance(r, 0.15) ? new CancellationTokenSource() : undefined;
    const started = performance.now();
    const answer = answered(client.request<unknown>(method, params, cancel), `v${version}: ${method}`);
    if (cancel) {
      if (chance(r, 0.5)) cancel.cancel();
      else setImmediate(() => cancel.cancel());
    }
    pending.push(
      answer.then(
        (value) => {
          tally.request(`${method} (case ${c.n}, ${text.length} chars)`, performance.now() - started);
          problems.push(...answerProblems(method, value, text, uri).map((p) => `v${version}: ${p}`));
        },
        (error: { code?: number; message?: string }) => {
          if (error instanceof Stalled) {
            stalled.value = true;
            return void problems.push(error.message);
          }
          if (cancel && error?.code === REQUEST_CANCELLED) return tally.count('cancelled');
          problems.push(`v${version}: ${method} answered an error: ${error?.code} ${error?.message}`);
        },
      ),
    );
  };

  for (let e = 0; e < edits; e++) {
    const next = mutate(doc.getText(), r, 1).text;
    const version = doc.version + 1;
    if (chance(r, 0.1)) {
      client.change(uri, version, next);
      doc = TextDocument.update(doc, [{ text: next }], version);
    } else {
      const edit = rangedEdit(doc, next);
      client.edit(uri, version, edit.range, edit.text);
      doc = TextDocument.update(doc, [{ range: edit.range, text: edit.text }], version);
      if (doc.getText() !== next) problems.push(`the harness's own ranged edit went wrong at v${version}`);
    }
    for (let k = between(r, 0, 3); k > 0; k--) ask(pick(r, METHODS));
    const published = client.published.filter((p) => p.uri === uri).at(-1);
    if (published) lastDiagnostics = published.diagnostics;
    if (chance(r, 0.3)) await Promise.all(pending.splice(0));
  }
  // Most sessions end back on their seed with one mild change, so the final check and the quick
  // fixes meet plans and not only broken YAML.
  if (kind === 'edits' && chance(r, 0.7)) {
    const version = doc.version + 1;
    const edit = rangedEdit(doc, mutateMildly(c.seed.text, r).text);
    client.edit(uri, version, edit.range, edit.text);
    doc = TextDocument.update(doc, [{ range: edit.range, text: edit.text }], version);
    for (let k = between(r, 1, 3); k > 0; k--) ask(pick(r, METHODS));
  }
  await Promise.all(pending.splice(0));
  const text = doc.getText();
  const final = await client.diagnosticsFor(uri, (p) => p.version === doc.version).catch((e: Error) => {
    problems.push(`no diagnostics for the final version ${doc.version}: ${e.message.slice(0, 300)}`);
    return undefined;
  });
  let fixes = 0;
  if (final && !stalled.value) {
    problems.push(...diagnosticProblems(final.diagnostics, text).map((p) => `final diagnostics: ${p}`));
    // The checker on the same text saved to disk.
    saveBuffer(file, text);
    const checked = runChecker([file], root);
    problems.push(...checked.problems);
    const editor = final.diagnostics.map((d) => findingOf({ severity: SEVERITY[d.severity ?? 1] as 'error', code: String(d.code), message: d.message, range: d.range }));
    // A buffer that starts with U+FEFF is saved with a mark before it (saveBuffer), so the file is
    // 3 bytes longer than the buffer in UTF-8: file-too-large, which states that size, is then
    // compared by code and range alone.
    const sized = (f: Finding): Finding => (text.startsWith('\ufeff') && f.code === 'file-too-large' ? { ...f, message: '(the size)' } : f);
    if (checked.files[0]) problems.push(...compareFindings('the editor', editor.map(sized), 'the checker', checked.files[0].findings.map(sized)));
    fixes = await applyFixes(client, doc, final.diagnostics, file, root, tally, problems, stalled);
  }
  client.close(uri);
  // FUZZ_DUMP=<folder> keeps the final text of a failing session for a closer look.
  if (problems.length && process.env.FUZZ_DUMP) {
    fs.mkdirSync(process.env.FUZZ_DUMP, { recursive: true });
    fs.writeFileSync(path.join(process.env.FUZZ_DUMP, path.basename(file)), text);
  }
  const failed = client.logs.slice(logsBefore).filter((m) => /failed/.test(m));
  problems.push(...failed.map((m) => `server log: ${m.slice(0, 400)}`));
  if (!client.alive) problems.push(`the server exited: ${client.serverStderr.slice(-500)}`);
  return { problems, edits, fixes, stalled: stalled.value };
}

/** Asks for the quick fixes of every diagnostic and applies each to the text (test/support/fuzz/fix-check.ts). */
async function applyFixes(client: LspClient, doc: TextDocument, diagnostics: LspDiagnostic[], file: string, root: string, tally: Tally, problems: string[], stalled: { value: boolean }): Promise<number> {
  const text = doc.getText();
  const before = analyze(file, text, new DiskHost([root]));
  let applied = 0;
  // A file of thousands of copied outputs repeats its findings: the first ones stand for the rest.
  if (diagnostics.length > MAX_FIXED_DIAGNOSTICS) tally.count('diagnostics not asked for fixes', diagnostics.length - MAX_FIXED_DIAGNOSTICS);
  for (const d of diagnostics.slice(0, MAX_FIXED_DIAGNOSTICS)) {
    const started = performance.now();
    let actions: Action[];
    try {
      const asked = client.request<Action[]>('textDocument/codeAction', { textDocument: { uri: doc.uri }, range: d.range, context: { diagnostics: [d], only: ['quickfix'] } });
      actions = await answered(asked, `quick fixes for ${d.code} of ${(d.data as { output?: string } | undefined)?.output ?? 'the file'}`);
    } catch (e) {
      if (e instanceof Stalled) {
        stalled.value = true;
        problems.push(e.message);
        break;
      }
      problems.push(`quick fixes for ${d.code}: answered an error: ${(e as Error).message}`);
      continue;
    }
    tally.request(`textDocument/codeAction quick fixes (${text.length} chars)`, performance.now() - started);
    problems.push(...answerProblems('textDocument/codeAction', actions, text, doc.uri).map((p) => `final: ${p}`));
    for (const action of actions) {
      const edits = action.edit?.changes?.[doc.uri];
      if (!edits?.length) continue;
      applied++;
      const output = (d.data as { output?: string } | undefined)?.output;
      problems.push(...checkFix(doc, { title: action.title, edits }, { code: String(d.code), output }, before, file, root));
    }
  }
  tally.count('quick fixes applied', applied);
  return applied;
}
