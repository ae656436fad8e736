// Splits a wave spec's text into its frame (the top-level keys, the `outputs:` line and the
// comments before the first output) and one piece per output, so that an edit inside one output
// re-reads only that output. Only a plainly laid-out file is split: every output key a plain name
// on a line of its own at one indentation, no tabs or carriage returns. Anything else returns
// null and the file is read whole, which gives the same analysis, only slower.

import { MAX_FILE_CHARS } from './source';

/** What follows an output's piece in the file; the piece is read with the same kind of line after it. */
export type Follower = 'sibling' | 'top-level' | 'end';

export interface OutputPiece {
  name: string;
  /** Line (0-based) of the output's key. */
  line: number;
  /** The piece's text: its key line through the line before the next output, newlines included. */
  text: string;
  follower: Follower;
}

export interface Segments {
  /** The lines outside every output piece, joined in order. */
  frameText: string;
  /** Line in the file of each frame line. */
  frameLines: number[];
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
  if (text.length > MAX_FILE_CHARS || text.includes('\t') || text.includes('\r')) return null;
  const lines = text.split('\n');
  const start = lines.findIndex((l) => OUTPUTS_LINE.test(l));
  if (start < 0) return null;

  let end = start + 1;
  while (end < lines.length) {
    const l = lines[end];
    if (l.length > 0 && l.charCodeAt(0) !== 32 && l.charCodeAt(0) !== 35) break;
    end++;
  }

  // Output keys sit at the indentation of the first line with content in the block.
  const keyLines: number[] = [];
  const names = new Set<string>();
  let column = -1;
  for (let i = start + 1; i < end; i++) {
    const l = lines[i];
    const indent = indentOf(l);
    if (isQuiet(l, indent)) continue;
    if (column < 0) column = indent;
    if (indent < column || column === 0) return null;
    if (indent > column) {
      if (keyLines.length === 0) return null;
      continue;
    }
    const name = outputKey(l, indent);
    if (name === undefined || name === '__proto__' || names.has(name)) return null;
    names.add(name);
    keyLines.push(i);
  }
  if (keyLines.length === 0 || keyLines.length > maxOutputs) return null;

  const pieces: OutputPiece[] = keyLines.map((line, k) => {
    const next = k + 1 < keyLines.length ? keyLines[k + 1] : end;
    const follower: Follower = k + 1 < keyLines.length ? 'sibling' : end < lines.length ? 'top-level' : 'end';
    const text = next < lines.length ? lines.slice(line, next).join('\n') + '\n' : lines.slice(line, next).join('\n');
    return { name: outputKey(lines[line], column)!, line, text, follower };
  });

  const frameLines: number[] = [];
  for (let i = 0; i < keyLines[0]; i++) frameLines.push(i);
  for (let i = end; i < lines.length; i++) frameLines.push(i);
  return { frameText: frameLines.map((i) => lines[i]).join('\n'), frameLines, pieces };
}
