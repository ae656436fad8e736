// YAML text → a parsed document with offsets → LSP ranges, guarded against inputs that would
// exhaust the parser (huge files, deep nesting, alias bombs). Duplicate keys are found here and
// dropped (the first is kept), so every later step sees one value per key. Lines break at CR LF,
// lone CR and LF alike (line-breaks.ts), so the checker's positions are the editor's.

import { type Document, type Node, type Pair, isAlias, isCollection, isPair, isScalar, isSeq, parseDocument } from 'yaml';
import { type Code, codeInfo } from './codes';
import { formatFileSize } from '../../../shared-schema/src/quantity-format';
import { forYaml, lineStarts } from './line-breaks';
import type { Position, Range, SpecDiagnostic } from './types';

/** A spec is a few kilobytes; the YAML parser needs about a second per megabyte on a slow machine. */
/**
 * UTF-16 code units of one spec at most. A spec of the most outputs a file plans (500) is about
 * 50 KB; reading 256 Ki of text (parse, schema, quantities) takes about half a second on a loaded
 * 2-core machine, which keeps every editor request behind it under a second (the fuzz harness's
 * files just under the limit measure it). At 1 Mi the same work took 2 s.
 */
export const MAX_FILE_CHARS = 256 * 1024;
/** The limit as messages say it. */
export const MAX_FILE_TEXT = `${MAX_FILE_CHARS / 1024} KiB`;
/** A spec nests four levels; 32 leaves room and stays far from the parser's stack limit. */
export const MAX_DEPTH = 32;
export const MAX_ALIAS_COUNT = 100;

/** Offsets (UTF-16 code units, as JS strings index) → 0-based line/character, lines as LSP counts them. */
export class LineIndex {
  private readonly starts: number[];
  constructor(readonly text: string) {
    this.starts = lineStarts(text);
  }
  get lineCount(): number {
    return this.starts.length;
  }
  /** Offset of a position; a character past its line's end stops at the line's end. */
  offset(p: Position): number {
    if (p.line >= this.starts.length) return this.text.length;
    const start = this.starts[Math.max(0, p.line)];
    const next = p.line + 1 < this.starts.length ? this.starts[p.line + 1] : this.text.length;
    return Math.min(start + Math.max(0, p.character), next);
  }
  /** Position of an offset; one between the CR and the LF of a CR LF pair is the line's end. */
  position(offset: number): Position {
    let o = Math.max(0, Math.min(offset, this.text.length));
    if (o > 0 && this.text.charCodeAt(o - 1) === 13 && this.text.charCodeAt(o) === 10) o--;
    let lo = 0;
    let hi = this.starts.length - 1;
    while (lo < hi) {
      const mid = (lo + hi + 1) >> 1;
      if (this.starts[mid] <= o) lo = mid;
      else hi = mid - 1;
    }
    return { line: lo, character: o - this.starts[lo] };
  }
  range(start: number, end: number): Range {
    return { start: this.position(start), end: this.position(Math.max(start, end)) };
  }
  /** The first line with text on it, trimmed: where file-wide diagnostics go. */
  firstLine(): Range {
    const m = /\S[^\r\n]*/.exec(this.text.slice(0, 10_000));
    if (!m) return this.range(0, 0);
    return this.range(m.index, m.index + m[0].trimEnd().length);
  }
}

export function diagnostic(code: Code, range: Range, message: string, output?: string): SpecDiagnostic {
  const d: SpecDiagnostic = { range, severity: codeInfo(code).severity, code, message };
  if (output !== undefined) d.output = output;
  return d;
}

export interface Source {
  /** The text as the YAML parser read it (lone CRs as LF: same offsets, same lines). */
  text: string;
  lines: LineIndex;
  /** Null when the text could not be parsed; diagnostics say why. */
  doc: Document.Parsed | null;
  /** What the parser made of the text, errors and all (null when it gave up): for cursors, not for checks. */
  tree: Document.Parsed | null;
  /** The document as plain data (aliases expanded), for schema validation. */
  data: unknown;
  diagnostics: SpecDiagnostic[];
}

/** Deepest [ / { nesting outside quotes and comments, and where it first passes the limit. */
export function flowDepthBreach(text: string): number | undefined {
  // Most specs hold a few flow collections or none: fewer openers than the limit cannot breach
  // it, and counting them with indexOf is far cheaper than reading every character.
  let openers = 0;
  for (const opener of ['[', '{'])
    for (let i = text.indexOf(opener); i !== -1 && openers <= MAX_DEPTH; i = text.indexOf(opener, i + 1)) openers++;
  if (openers <= MAX_DEPTH) return undefined;
  let depth = 0;
  let quote = '';
  let comment = false;
  for (let i = 0; i < text.length; i++) {
    const c = text[i];
    if (comment) {
      if (c === '\n' || c === '\r') comment = false;
    } else if (quote) {
      if (c === quote) quote = '';
      else if (c === '\\' && quote === '"') i++;
    } else if (c === '"' || c === "'") {
      quote = c;
    } else if (c === '#' && (i === 0 || /\s/.test(text[i - 1]))) {
      comment = true;
    } else if (c === '[' || c === '{') {
      if (++depth > MAX_DEPTH) return i;
    } else if (c === ']' || c === '}') {
      depth = Math.max(0, depth - 1);
    }
  }
  return undefined;
}

/** Walks the tree without recursion; reports excessive depth and duplicate or complex keys. */
function inspect(doc: Document.Parsed, lines: LineIndex, isOutputs: (path: string[]) => boolean): SpecDiagnostic[] {
  const out: SpecDiagnostic[] = [];
  const stack: { node: unknown; depth: number; path: string[] }[] = [{ node: doc.contents, depth: 0, path: [] }];
  while (stack.length > 0) {
    const { node, depth, path } = stack.pop()!;
    if (!isCollection(node)) continue;
    if (depth > MAX_DEPTH) {
      const r = (node as Node).range;
      out.push(diagnostic('too-complex', lines.range(r?.[0] ?? 0, r?.[0] ?? 0), `The YAML nests more than ${MAX_DEPTH} levels deep here: write the keys out plainly.`));
      return out;
    }
    if (isSeq(node)) {
      node.items.forEach((item, i) => stack.push({ node: item, depth: depth + 1, path: [...path, String(i)] }));
      continue;
    }
    const seen = new Set<string>();
    const kept: Pair[] = [];
    for (const item of (node as { items: unknown[] }).items) {
      if (!isPair(item)) continue;
      const key = item.key;
      const keyRange = isScalar(key) || isCollection(key) || isAlias(key) ? (key as Node).range : undefined;
      const range = lines.range(keyRange?.[0] ?? 0, keyRange?.[1] ?? 0);
      if (!isScalar(key) || key.value === null || typeof key.value === 'object') {
        out.push(diagnostic('wrong-type', range, 'Keys must be plain names: write the key as a word, such as `frequency`.'));
        continue;
      }
      const name = String(key.value);
      if (seen.has(name)) {
        out.push(
          isOutputs(path)
            ? diagnostic('duplicate-output', range, `Output \`${name}\` is named twice: rename this one (only the first is planned).`, name)
            : diagnostic('duplicate-key', range, `\`${name}\` appears twice here: remove this one (only the first is read).`),
        );
        continue;
      }
      seen.add(name);
      kept.push(item);
      stack.push({ node: item.value, depth: depth + 1, path: [...path, name] });
    }
    (node as { items: unknown[] }).items = kept;
  }
  return out;
}

/** Which mapping of a wave spec holds output names (the one predicate the memo below knows). */
export const WAVE_OUTPUTS = (path: string[]): boolean => path.length === 1 && path[0] === 'outputs';

// The last wave text read: a split reading that declines has just parsed the file whole to learn
// whether it is valid YAML, and the whole reading then starts from that parse. Only texts of a
// plausible spec's size are kept, so a large file's tree is not held after its analysis is gone.
const KEPT_TEXT_CHARS = 256 * 1024;
let lastWave: { original: string; source: Source } | undefined;

/**
 * The file-too-large message, from the file's size in bytes as UTF-8 (the editor's text as it
 * would be saved, the checker's file as it is on disk), so both faces say the same.
 */
export function tooLargeMessage(bytes: number): string {
  return `The file is ${formatFileSize(bytes)}, more than a spec can be (waveplan reads at most ${MAX_FILE_TEXT} of text): check that this is the spec you meant.`;
}

/** Parses a spec's text; never throws. `isOutputs` tells which mapping holds output names. */
export function readSource(raw: string, isOutputs: (path: string[]) => boolean = () => false): Source {
  if (isOutputs === WAVE_OUTPUTS && lastWave?.original === raw) return lastWave.source;
  const source = parse(raw, isOutputs);
  if (isOutputs === WAVE_OUTPUTS) lastWave = raw.length <= KEPT_TEXT_CHARS ? { original: raw, source } : undefined;
  return source;
}

function parse(raw: string, isOutputs: (path: string[]) => boolean): Source {
  const text = forYaml(raw);
  const lines = new LineIndex(text);
  const fail = (d: SpecDiagnostic): Source => ({ text, lines, doc: null, tree: null, data: undefined, diagnostics: [d] });
  if (text.length > MAX_FILE_CHARS) {
    return fail(diagnostic('file-too-large', lines.range(0, 0), tooLargeMessage(Buffer.byteLength(raw, 'utf8'))));
  }
  const breach = flowDepthBreach(text);
  if (breach !== undefined) {
    return fail(diagnostic('too-complex', lines.range(breach, breach + 1), `Brackets nest more than ${MAX_DEPTH} levels deep here: write the keys out plainly.`));
  }
  let doc: Document.Parsed;
  try {
    doc = parseDocument(text, { keepSourceTokens: true, uniqueKeys: false, prettyErrors: false });
  } catch (e) {
    return fail(diagnostic('too-complex', lines.firstLine(), `The YAML parser gave up on this file (${(e as Error).message.slice(0, 80)}): simplify the file.`));
  }
  const diagnostics: SpecDiagnostic[] = [];
  const broken = (): Source => ({ text, lines, doc: null, tree: doc, data: undefined, diagnostics });
  for (const err of doc.errors) diagnostics.push(syntaxDiagnostic(lines, err.code, err.pos, err.message));
  if (diagnostics.length > 0) return broken();
  diagnostics.push(...inspect(doc, lines, isOutputs));
  if (diagnostics.some((d) => d.code === 'too-complex')) return broken();
  let data: unknown;
  try {
    data = doc.toJS({ maxAliasCount: MAX_ALIAS_COUNT });
  } catch (e) {
    diagnostics.push(diagnostic('too-complex', lines.firstLine(), `The YAML expands too many aliases (${(e as Error).message.slice(0, 60)}): write the values out plainly.`));
    return broken();
  }
  return { text, lines, doc, tree: doc, data, diagnostics };
}

/**
 * An empty range (the parser often reports the end of the file) widened to the text of its line,
 * or of the last line with text before it, so an editor shows a visible squiggle.
 */
function visibleRange(lines: LineIndex, from: number, to: number): Range {
  const text = lines.text;
  const start = Math.min(from, text.length);
  const end = Math.min(to, text.length);
  if (end > start) return lines.range(start, end);
  let at = Math.min(start, text.length);
  while (at > 0 && /\s/.test(text[at - 1]) && (at >= text.length || text[at] === '\n' || /\s/.test(text[at]))) at--;
  const lineStart = text.lastIndexOf('\n', at - 1) + 1;
  let lineEnd = text.indexOf('\n', at);
  if (lineEnd < 0) lineEnd = text.length;
  const slice = text.slice(lineStart, lineEnd);
  const lead = slice.length - slice.trimStart().length;
  return slice.trim() === '' ? lines.range(start, start) : lines.range(lineStart + lead, lineStart + slice.trimEnd().length);
}

/** One parser error → a diagnostic; an unclosed quote is marked from its opening quote. */
function syntaxDiagnostic(lines: LineIndex, code: string, pos: [number, number], raw: string): SpecDiagnostic {
  if (code === 'RESOURCE_EXHAUSTION') {
    return diagnostic('too-complex', visibleRange(lines, pos[0], pos[1]), 'The YAML is too deeply nested for the parser: write the keys out plainly.');
  }
  if (code === 'MULTIPLE_DOCS') {
    return diagnostic('yaml-syntax', visibleRange(lines, pos[0], pos[1]), 'A spec is one YAML document: remove this `---` and the document after it, or move it to a file of its own.');
  }
  const quote = code === 'MISSING_CHAR' ? /closing (["'])/.exec(raw)?.[1] : undefined;
  if (quote) {
    const open = lines.text.lastIndexOf(quote, Math.min(pos[0], lines.text.length) - 1);
    if (open >= 0) {
      // The line's end, before its break (a CR of a CR LF is not text on the line).
      const rest = lines.text.slice(open).search(/[\r\n]/);
      const end = rest < 0 ? lines.text.length : open + rest;
      return diagnostic('yaml-syntax', lines.range(open, end), `This quoted text has no closing ${quote}: add one where the text ends.`);
    }
  }
  const first = raw.split('\n')[0].replace(/ at line \d+, column \d+:?$/, '').trim().replace(/\.$/, '');
  return diagnostic('yaml-syntax', visibleRange(lines, pos[0], pos[1]), `YAML syntax: ${first}; fix the text here.`);
}
