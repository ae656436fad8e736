// Line breaks as the editor and YAML count them: CR LF, a lone CR, or LF. LSP positions count all
// three (LSP 3.17, "Position"), and so does YAML 1.2 (YAML 1.2.2 §5.4, b-break); the `yaml`
// package only breaks lines at LF, so its input has each lone CR turned into an LF first (same
// length, so every offset stays put). Edits use the file's own line break (lineBreakAt).

export type LineBreak = '\n' | '\r\n' | '\r';

const CR = 13;
const LF = 10;

/** The text with every lone CR turned into LF: what the YAML parser reads. Offsets are unchanged. */
export function forYaml(text: string): string {
  return text.includes('\r') ? text.replace(/\r(?!\n)/g, '\n') : text;
}

/** Offsets where lines start (0 first), counting CR LF, lone CR and LF each as one break. */
export function lineStarts(text: string): number[] {
  const starts = [0];
  // LF-only text (the common case): indexOf finds the breaks without reading each character.
  if (text.indexOf('\r') === -1) {
    for (let i = text.indexOf('\n'); i !== -1; i = text.indexOf('\n', i + 1)) starts.push(i + 1);
    return starts;
  }
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === LF || (c === CR && text.charCodeAt(i + 1) !== LF)) starts.push(i + 1);
  }
  return starts;
}

/** How many line breaks the text holds (a CR LF pair is one). */
export function lineBreakCount(text: string): number {
  return lineStarts(text).length - 1;
}

export function endsWithLineBreak(text: string): boolean {
  const c = text.charCodeAt(text.length - 1);
  return c === LF || c === CR;
}

/** The lines of the text, each with the break that ends it (the last may have none). */
export function linesWithBreaks(text: string): string[] {
  const starts = lineStarts(text);
  const out: string[] = [];
  for (let i = 0; i < starts.length; i++) {
    const end = i + 1 < starts.length ? starts[i + 1] : text.length;
    if (i + 1 < starts.length || end > starts[i]) out.push(text.slice(starts[i], end));
  }
  return out;
}

/** A line without its break. */
export function withoutBreak(line: string): string {
  return line.replace(/(?:\r\n|\r|\n)$/, '');
}

function breakAt(text: string, offset: number): LineBreak {
  if (text.charCodeAt(offset) === LF) return '\n';
  return text.charCodeAt(offset + 1) === LF ? '\r\n' : '\r';
}

/** The file's own line break: the first one in it; LF when it has none. */
export function lineBreakOf(text: string): LineBreak {
  const at = text.search(/[\r\n]/);
  return at < 0 ? '\n' : breakAt(text, at);
}

/**
 * The break to write after `line` (0-based): the one that ends it, else the one before it (the last
 * line of a file often has none), else the file's own. Mixed files keep each line's own ending.
 */
export function lineBreakAt(text: string, line: number): LineBreak {
  const starts = lineStarts(text);
  const own = starts[line + 1];
  if (own !== undefined) return breakAt(text, text.charCodeAt(own - 1) === LF && text.charCodeAt(own - 2) === CR ? own - 2 : own - 1);
  const before = starts[line];
  if (before !== undefined && line > 0) return breakAt(text, text.charCodeAt(before - 1) === LF && text.charCodeAt(before - 2) === CR ? before - 2 : before - 1);
  return lineBreakOf(text);
}
