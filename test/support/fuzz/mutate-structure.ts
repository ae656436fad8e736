// Mutations of the YAML structure: values nested hundreds or thousands deep, alias bombs (an anchor
// repeated through levels of aliases), aliases to outputs and to missing anchors, and files of
// many megabytes (the outputs repeated under new names, one flow line, a long comment or string).

import { between, chance, int, pick, type Random } from './random';
import { lineStarts, splice, windowOf } from './tokens';

/** Offsets just after "key: " on lines that have one: where a value starts. */
function valueStarts(text: string, r: Random): number[] {
  const { part, base } = windowOf(text, r);
  return [...part.matchAll(/^[ \t-]*[^\s:#][^:#\r\n]*: ?/gm)].map((m) => base + m.index! + m[0].length);
}

const DEPTHS = [20, 64, 100, 257, 1000, 5000, 20000];

export function deepNesting(text: string, r: Random): string {
  const depth = pick(r, DEPTHS);
  const starts = valueStarts(text, r);
  const at = starts.length ? pick(r, starts) : text.length;
  const form = int(r, 4);
  let value: string;
  if (form === 0) value = '['.repeat(depth) + ']'.repeat(depth);
  else if (form === 1) value = '{a: '.repeat(depth) + '1' + '}'.repeat(depth);
  else if (form === 2) value = '['.repeat(depth); // never closed
  else {
    // Block nesting: a line deeper than the last for every level.
    const lines = [];
    for (let i = 1; i <= Math.min(depth, 400); i++) lines.push(`${' '.repeat(i)}k${i}:`);
    value = `\n${lines.join('\n')} 1`;
  }
  const end = text.slice(at).search(/\r\n|\r|\n|$/);
  return splice(text, at, end, value);
}

/** Levels × width of the classic bomb: width^levels strings if every alias were expanded. */
function bomb(levels: number, width: number, key: string): string {
  const lines = [`${key}0: &b0 "boom"`];
  for (let l = 1; l <= levels; l++) lines.push(`${key}${l}: &b${l} [${Array.from({ length: width }, () => `*b${l - 1}`).join(', ')}]`);
  return lines.join('\n') + '\n';
}

export function aliasBomb(text: string, r: Random): string {
  const form = int(r, 4);
  const starts = lineStarts(text);
  if (form === 0) return bomb(between(r, 4, 12), between(r, 5, 12), 'x-bomb-') + text;
  if (form === 1) {
    // Inside outputs: every bomb level is an output entry.
    const at = text.search(/^outputs:.*$/m);
    const line = at < 0 ? text.length : at + text.slice(at).search(/\r\n|\r|\n|$/);
    const indented = bomb(between(r, 4, 10), between(r, 5, 10), 'bomb-').replace(/^/gm, '  ').trimEnd();
    return splice(text, line, 0, `\n${indented}`);
  }
  if (form === 2) {
    // An anchor on one value and aliases to it at other values (or to a missing anchor).
    const values = valueStarts(text, r);
    if (values.length < 2) return text;
    let out = text;
    const anchorAt = pick(r, values);
    out = splice(out, anchorAt, 0, '&v ');
    for (let n = between(r, 1, 4); n > 0; n--) {
      const at = pick(r, valueStarts(out, r));
      const end = out.slice(at).search(/\r\n|\r|\n|$/);
      out = splice(out, at, end, chance(r, 0.8) ? '*v' : '*missing');
    }
    return out;
  }
  // Merge keys: `<<: *alias` of a bomb level into an output.
  const line = pick(r, starts);
  return bomb(between(r, 3, 8), between(r, 3, 8), 'x-merge-') + splice(text, line, 0, `    <<: *b${between(r, 1, 3)}\n`);
}

/** Text of about `chars` UTF-16 code units grown from `text` in one of four ways. */
export function bigFile(text: string, r: Random, chars: number): string {
  const form = int(r, 4);
  if (form === 0) {
    // The outputs section repeated under numbered names: a real-looking spec of thousands of outputs.
    const at = text.search(/^outputs:/m);
    if (at >= 0) {
      const body = text.slice(at).replace(/^outputs:.*(\r\n|\r|\n)?/, '');
      const parts: string[] = [text];
      let size = text.length;
      for (let i = 0; size < chars && body.length > 0; i++) {
        const copy = body.replace(/^( {2})([A-Za-z0-9_-]+):/gm, `$1$2-${i}:`);
        parts.push(copy.endsWith('\n') || copy.endsWith('\r') ? copy : `${copy}\n`);
        size += copy.length + 1;
      }
      return parts.join('');
    }
  }
  const fill = Math.max(0, chars - text.length);
  if (form === 1) {
    // One flow mapping on one line.
    const items: string[] = [];
    let size = 0;
    for (let i = 0; size < fill; i++) {
      const item = `o${i}: {shape: sine, frequency: ${1 + (i % 997)} kHz}`;
      items.push(item);
      size += item.length + 2;
    }
    return `${text.replace(/^outputs:.*$/m, 'outputs-old:')}\noutputs: {${items.join(', ')}}\n`;
  }
  if (form === 2) return `${text}\n# ${'x'.repeat(fill)}\n`;
  return text.replace(/^(\s*description:).*$/m, `$1 "${'long text '.repeat(Math.ceil(fill / 10))}"`) + (/description:/.test(text) ? '' : `\ndescription: ${'y'.repeat(fill)}\n`);
}
