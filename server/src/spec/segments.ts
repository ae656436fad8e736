// Splits a wave spec's text into its frame (the top-level keys, the `outputs:` line and the
// comments before the first output) and one piece per output, so that an edit inside one output
// re-reads only that output. Only a plainly laid-out file is split: output keys on lines of their
// own at one indentation, no tabs; lines may end in LF, CR LF or a lone CR (line-breaks.ts).
// A line at the outputs' indentation that is not a plain `name:` (half typed, say) starts a piece
// of its own marked `keyed: false`, read only for its syntax errors while the file does not parse.
// Anything else returns null and the file is read whole, which gives the same analysis, only slower.

import { linesWithBreaks, withoutBreak } from './line-breaks';
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

const indentOf = (line: string): number => {
  let i = 0;
  while (i < line.length && line.charCodeAt(i) === 32) i++;
  return i;
};

/** Blank or comment-only: no YAML content on the line. */
const isQuiet = (line: string, indent: number): boolean => indent === line.length || line.charCodeAt(indent) === 35;

/** An output key alone on its line (a value or a comment may follow after a space). */
function outputKey(line: string, indent: number): string | undefined {
  const colon = line.indexOf(':', indent);
  if (colon < 0 || (colon + 1 < line.length && line.charCodeAt(colon + 1) !== 32)) return undefined;
  const name = line.slice(indent, colon);
  return NAME.test(name) ? name : undefined;
}

export function splitWave(text: string, maxOutputs: number): Segments | null {
  if (text.length > MAX_FILE_CHARS || text.includes('\t')) return null;
  const raw = linesWithBreaks(text);
  const lines = raw.map(withoutBreak);
  const start = lines.findIndex((l) => OUTPUTS_LINE.test(l));
  if (start < 0) return null;

  let end = start + 1;
  while (end < lines.length) {
    const l = lines[end];
    if (l.length > 0 && l.charCodeAt(0) !== 32 && l.charCodeAt(0) !== 35) break;
    end++;
  }

  // Output keys sit at the indentation of the first line with content in the block; a line
  // with less indentation than that (but some) starts a piece that is not keyed.
  const keyLines: { line: number; name: string | undefined }[] = [];
  const names = new Set<string>();
  let column = -1;
  for (let i = start + 1; i < end; i++) {
    const l = lines[i];
    const indent = indentOf(l);
    if (isQuiet(l, indent)) continue;
    if (column < 0) column = indent;
    if (column === 0) return null;
    if (indent > column) {
      if (keyLines.length === 0) return null;
      continue;
    }
    const name = indent === column ? outputKey(l, indent) : undefined;
    if (name === '__proto__' || (name !== undefined && names.has(name))) return null;
    if (name !== undefined) names.add(name);
    keyLines.push({ line: i, name });
  }
  if (keyLines.length === 0 || keyLines.length > maxOutputs) return null;

  const offsets: number[] = [0];
  for (const r of raw) offsets.push(offsets[offsets.length - 1] + r.length);
  const pieces: OutputPiece[] = keyLines.map(({ line, name }, k) => {
    const next = k + 1 < keyLines.length ? keyLines[k + 1].line : end;
    const follower: Follower = k + 1 < keyLines.length ? 'sibling' : end < lines.length ? 'top-level' : 'end';
    return {
      name: name ?? lines[line].trim(),
      keyed: name !== undefined,
      line,
      column,
      start: offsets[line],
      text: text.slice(offsets[line], offsets[next]),
      follower,
    };
  });

  const first = keyLines[0].line;
  const headEnd = offsets[first];
  const tailStart = offsets[end];
  return { frameText: text.slice(0, headEnd) + text.slice(tailStart), headEnd, headLines: first, tailStart, pieceLines: end - first, outputsLine: start, pieces };
}
