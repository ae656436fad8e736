// Mutations by tokens and lines: delete a few tokens, duplicate a token, duplicate a run of lines
// (so keys and outputs appear twice), or swap two lines.

import { between, int, pick, type Random } from './random';
import { lineStarts, solidTokens, splice } from './tokens';

export function deleteTokens(text: string, r: Random): string {
  let out = text;
  for (let n = between(r, 1, 3); n > 0; n--) {
    const all = solidTokens(out, r);
    if (all.length === 0) break;
    const t = pick(r, all);
    out = splice(out, t.at, t.text.length, '');
  }
  return out;
}

export function duplicateToken(text: string, r: Random): string {
  const all = solidTokens(text, r);
  if (all.length === 0) return text + text;
  const t = pick(r, all);
  return splice(text, t.at, 0, t.text.repeat(between(r, 1, 3)));
}

export function duplicateLines(text: string, r: Random): string {
  const starts = [...lineStarts(text), text.length];
  const from = int(r, starts.length - 1);
  const to = Math.min(starts.length - 1, from + between(r, 1, 6));
  const block = text.slice(starts[from], starts[to]);
  // A block without its own line break is joined to what follows it.
  return splice(text, starts[to], 0, block);
}

export function swapLines(text: string, r: Random): string {
  const lines = text.split(/(?<=\r\n|\r(?!\n)|\n)/);
  if (lines.length < 2) return text;
  const a = int(r, lines.length);
  const b = int(r, lines.length);
  [lines[a], lines[b]] = [lines[b], lines[a]];
  return lines.join('');
}
