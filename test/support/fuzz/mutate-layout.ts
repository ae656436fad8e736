// Mutations of layout: tabs for indentation and after colons, a byte order mark, CR LF, lone CR
// and mixed line breaks, trailing space, a missing or doubled final break.

import { withBreaks } from '../line-breaks';
import { int, pick, type Random } from './random';
import { lineStarts, splice } from './tokens';

export function tabs(text: string, r: Random): string {
  let out = text;
  for (let n = 1 + int(r, 3); n > 0; n--) {
    const starts = lineStarts(out);
    const at = pick(r, starts);
    const line = /^[^\r\n]*/.exec(out.slice(at))![0];
    const indent = /^ */.exec(line)![0].length;
    const colon = line.indexOf(': ');
    if (indent > 0 && int(r, 2) === 0) out = splice(out, at, indent, '\t'.repeat(Math.max(1, Math.floor(indent / 2))));
    else if (colon >= 0) out = splice(out, at + colon + 1, 1, '\t');
    else out = splice(out, at, 0, '\t');
  }
  return out;
}

export function byteOrderMark(text: string, r: Random): string {
  if (int(r, 3) > 0) return `\ufeff${text}`;
  return splice(text, pick(r, lineStarts(text)), 0, '\ufeff');
}

export function lineBreaks(text: string, r: Random): string {
  const kind = pick(r, ['crlf', 'cr', 'mixed', 'lf'] as const);
  const out = withBreaks(text, kind);
  const tail = int(r, 4);
  if (tail === 0) return out.replace(/(\r\n|\r|\n)+$/, '');
  if (tail === 1) return out + pick(r, ['\n', '\r\n', '\r', '\n\n', '\r\r']);
  return out;
}

export function trailingSpace(text: string, r: Random): string {
  let out = text;
  for (let n = 1 + int(r, 4); n > 0; n--) {
    // The end of a line: just before its break, or the end of the text.
    const ends = [...out.matchAll(/\r\n|\r|\n/g)].map((m) => m.index!).concat(out.length);
    out = splice(out, pick(r, ends), 0, pick(r, [' ', '  ', '\t', ' \t ']));
  }
  return out;
}
