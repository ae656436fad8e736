// What a quick fix must leave alone, read with the `yaml` package (a general-purpose parser, the
// oracle here): the text of each output's entry, and every comment of the file.

import { isMap, isScalar, parseDocument } from 'yaml';

/** Each output's entry text (from its name to the end of its value), by name; undefined when the text is not clean YAML. */
export function outputTexts(text: string): Map<string, string> | undefined {
  const doc = parseDocument(text, { uniqueKeys: false });
  if (doc.errors.length > 0 || !isMap(doc.contents)) return undefined;
  const outputs = doc.contents.items.find((p) => isScalar(p.key) && p.key.value === 'outputs')?.value;
  const out = new Map<string, string>();
  if (!isMap(outputs)) return out;
  for (const pair of outputs.items) {
    if (!isScalar(pair.key) || !pair.key.range) continue;
    const name = String(pair.key.value);
    const end = (pair.value as { range?: [number, number, number] } | null)?.range?.[1] ?? pair.key.range[1];
    // A name written twice is not one entry to compare.
    if (out.has(name)) out.set(name, '\u0000duplicate');
    else out.set(name, text.slice(pair.key.range[0], end));
  }
  return out;
}

/** Every comment: from a `#` at a line's start or after white space to the end of the line. */
export function comments(text: string): string[] {
  const found: string[] = [];
  for (const line of text.split(/\r\n|\r|\n/)) {
    const m = /(?:^|\s)(#.*)$/.exec(line);
    if (m) found.push(m[1]);
  }
  return found;
}

/** The comments of `before` that `after` no longer has (as a multiset: a comment written twice must stay twice). */
export function lostComments(before: string, after: string): string[] {
  const left = new Map<string, number>();
  for (const c of comments(after)) left.set(c, (left.get(c) ?? 0) + 1);
  const lost: string[] = [];
  for (const c of comments(before)) {
    const n = left.get(c) ?? 0;
    if (n === 0) lost.push(c);
    else left.set(c, n - 1);
  }
  return lost;
}
