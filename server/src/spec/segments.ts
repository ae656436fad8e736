// Splits a wave spec's text into its frame (the top-level keys, the `outputs:` line and the
// comments before the first output) and one piece per output, so that an edit inside one output
// re-reads only that output. Only a plainly laid-out file is split: output keys on lines of their
// own at one indentation, no tabs; lines may end in LF, CR LF or a lone CR (line-breaks.ts).
// A line at the outputs' indentation that is not a plain `name:` (half typed, say) starts a piece
// of its own marked `keyed: false`, read only for its syntax errors while the file does not parse.
// Anything else returns null and the file is read whole, which gives the same analysis, only slower.

import { lineStarts } from './line-breaks';
import { MAX_FILE_CHARS } from './source';

/** What follows an output's piece in the file; the piece is read with the same kind of line after it. */
export type Follower = 'sibling' | 'top-level' | 'end';

export interface OutputPiece {
  /** The output's name; for a piece that is not `keyed`, the text of its first line. */
  name: string;
  /** False when the first line is not a plain `name:` key (see above). */
  keyed: boolean;
  /** Line (0-based) of the output's key. */
  line: number;
  /** Indentation of the file's output keys. */
  column: number;
  /** Offset in the file where the piece starts. */
  start: number;
  /** The piece's text: its key line through the line before the next output, line breaks included. */
  text: string;
  follower: Follower;
}

/**
 * The frame is the file's head (up to the first output) and its tail (after the outputs block),
 * joined: a frame offset below `headEnd` is the same in the file, one at or above it lies
 * `tailStart - headEnd` further on; frame lines at or past `headLines` lie `pieceLines` further down.
 */
export interface Segments {
  frameText: string;
  headEnd: number;
  headLines: number;
  tailStart: number;
  pieceLines: number;
  /** Line (0-based) of `outputs:`. */
  outputsLine: number;
  pieces: OutputPiece[];
}

const OUTPUTS_LINE = /^outputs:(?:[ ]+(?:#.*)?)?$/;
const NAME = /^[A-Za-z_][A-Za-z0-9_-]{0,63}$/;

const SPACE = 32;
const HASH = 35;
const CR = 13;
const LF = 10;

/** An output key alone on its line (a value or a comment may follow after a space). */
function outputKey(line: string, indent: number): string | undefined {
  const colon = line.indexOf(':', indent);
  if (colon < 0 || (colon + 1 < line.length && line.charCodeAt(colon + 1) !== SPACE)) return undefined;
  const name = line.slice(indent, colon);
  return NAME.test(name) ? name : undefined;
}

// The text is walked by offsets, not split into line strings: an edit re-splits the whole file,
// and this must stay cheap next to re-reading the one output that changed.
export function splitWave(text: string, maxOutputs: number): Segments | null {
  if (text.length > MAX_FILE_CHARS || text.includes('\t')) return null;
  const starts = lineStarts(text);
  const count = starts[starts.length - 1] === text.length && starts.length > 1 ? starts.length - 1 : starts.length;
  /** Where line i's text ends, before its break. */
  const contentEnd = (i: number): number => {
    let end = i + 1 < starts.length ? starts[i + 1] : text.length;
    if (end > starts[i] && text.charCodeAt(end - 1) === LF) end--;
    if (end > starts[i] && text.charCodeAt(end - 1) === CR) end--;
    return end;
  };
  const lineText = (i: number): string => text.slice(starts[i], contentEnd(i));

  let start = -1;
  for (let i = 0; i < count && start < 0; i++) if (text.startsWith('outputs:', starts[i]) && OUTPUTS_LINE.test(lineText(i))) start = i;
  if (start < 0) return null;

  let end = start + 1;
  while (end < count) {
    const c = starts[end] < contentEnd(end) ? text.charCodeAt(starts[end]) : SPACE;
    if (c !== SPACE && c !== HASH) break;
    end++;
  }

  // Output keys sit at the indentation of the first line with content in the block; a line
  // with less indentation than that (but some) starts a piece that is not keyed.
  const keyLines: { line: number; name: string | undefined }[] = [];
  const names = new Set<string>();
  let column = -1;
  for (let i = start + 1; i < end; i++) {
    const from = starts[i];
    const to = contentEnd(i);
    let at = from;
    while (at < to && text.charCodeAt(at) === SPACE) at++;
    if (at === to || text.charCodeAt(at) === HASH) continue;
    const indent = at - from;
    if (column < 0) column = indent;
    if (column === 0) return null;
    if (indent > column) {
      if (keyLines.length === 0) return null;
      continue;
    }
    const name = indent === column ? outputKey(text.slice(from, to), indent) : undefined;
    if (name === '__proto__' || (name !== undefined && names.has(name))) return null;
    if (name !== undefined) names.add(name);
    keyLines.push({ line: i, name });
  }
  if (keyLines.length === 0 || keyLines.length > maxOutputs) return null;

  const offset = (i: number): number => (i < starts.length ? starts[i] : text.length);
  const pieces: OutputPiece[] = keyLines.map(({ line, name }, k) => {
    const next = k + 1 < keyLines.length ? keyLines[k + 1].line : end;
    const follower: Follower = k + 1 < keyLines.length ? 'sibling' : end < count ? 'top-level' : 'end';
    return {
      name: name ?? lineText(line).trim(),
      keyed: name !== undefined,
      line,
      column,
      start: offset(line),
      text: text.slice(offset(line), offset(next)),
      follower,
    };
  });

  const first = keyLines[0].line;
  const headEnd = offset(first);
  const tailStart = offset(end);
  return { frameText: text.slice(0, headEnd) + text.slice(tailStart), headEnd, headLines: first, tailStart, pieceLines: end - first, outputsLine: start, pieces };
}
