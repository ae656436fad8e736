// Finding the YAML nodes behind a key path, their ranges, and the exact source text of a scalar
// (YAML reads `125000000` and `1.5` as binary numbers; quantities are parsed from the text).

import { type Document, type Node, type Pair, type Scalar, isAlias, isMap, isScalar, isSeq } from 'yaml';
import type { LineIndex } from './source';
import type { Range } from './types';

export type Path = readonly (string | number)[];

export interface Located {
  /** The pair holding the value; undefined for the document root. */
  pair?: Pair;
  key?: Node;
  value: unknown;
}

function deref(doc: Document.Parsed, node: unknown): unknown {
  let cur = node;
  for (let i = 0; i < 8 && isAlias(cur); i++) cur = cur.resolve(doc);
  return cur;
}

// Key → pair per mapping, built once: a file with thousands of outputs must not make every
// lookup a scan (source.ts has already dropped duplicate keys, so the first pair is the pair).
const pairIndex = new WeakMap<object, Map<string, Pair>>();

function pairIn(map: { items: Pair[] }, key: string): Pair | undefined {
  let index = pairIndex.get(map);
  if (!index) {
    index = new Map();
    for (const p of map.items) {
      if (!isScalar(p.key)) continue;
      const k = String(p.key.value);
      if (!index.has(k)) index.set(k, p);
    }
    pairIndex.set(map, index);
  }
  return index.get(key);
}

/** The pair at `path`, following aliases; undefined when any step is missing. */
export function locate(doc: Document.Parsed, path: Path): Located | undefined {
  let cur: Located = { value: doc.contents };
  for (const part of path) {
    const node = deref(doc, cur.value);
    if (isMap(node)) {
      const pair = pairIn(node as { items: Pair[] }, String(part));
      if (!pair) return undefined;
      cur = { pair, key: pair.key as Node, value: pair.value };
    } else if (isSeq(node) && typeof part === 'number') {
      if (part < 0 || part >= node.items.length) return undefined;
      cur = { value: node.items[part] };
    } else {
      return undefined;
    }
  }
  return cur;
}

const rangeOfNode = (node: unknown): [number, number] | undefined => {
  const r = (node as Node | undefined)?.range;
  return r ? [r[0], r[1]] : undefined;
};

/** A block collection's range runs to the next line; stop it at its last character instead. */
function trimmed(lines: LineIndex, r: [number, number]): [number, number] {
  let end = Math.min(r[1], lines.text.length);
  while (end > r[0] && /\s/.test(lines.text[end - 1])) end--;
  return [r[0], end];
}

/** Range of the key at `path` (the key text itself). */
export function keyRange(doc: Document.Parsed, lines: LineIndex, path: Path): Range | undefined {
  const r = rangeOfNode(locate(doc, path)?.key);
  return r && lines.range(r[0], r[1]);
}

/** Range of the value at `path`; an empty value falls back to its key. */
export function valueRange(doc: Document.Parsed, lines: LineIndex, path: Path): Range | undefined {
  const found = locate(doc, path);
  if (!found) return undefined;
  const raw = rangeOfNode(found.value);
  const r = raw && trimmed(lines, raw);
  if (r && r[1] > r[0]) return lines.range(r[0], r[1]);
  const k = rangeOfNode(found.key);
  return k && lines.range(k[0], k[1]);
}

/** Range from the key's start to the value's end. */
export function entryRange(doc: Document.Parsed, lines: LineIndex, path: Path): Range | undefined {
  const found = locate(doc, path);
  const k = rangeOfNode(found?.key);
  if (!found || !k) return undefined;
  const raw = rangeOfNode(found.value);
  const v = raw && trimmed(lines, raw);
  return lines.range(k[0], v && v[1] > k[1] ? v[1] : k[1]);
}

/** The best range for a diagnostic about `path`: its value, else the nearest existing ancestor's key. */
export function rangeFor(doc: Document.Parsed, lines: LineIndex, path: Path, prefer: 'key' | 'value' = 'value'): Range {
  for (let n = path.length; n > 0; n--) {
    const p = path.slice(0, n);
    const r = prefer === 'key' || n < path.length ? keyRange(doc, lines, p) : valueRange(doc, lines, p);
    if (r) return r;
  }
  return lines.firstLine();
}

/**
 * The text a scalar was written as: a string's own value, a number's source text (so `1.50`
 * stays 1.50 and `125000000` is never a double). Undefined for anything but a number or text.
 */
export function scalarText(doc: Document.Parsed, node: unknown): string | undefined {
  const n = deref(doc, node);
  if (!isScalar(n)) return undefined;
  const s = n as Scalar;
  if (typeof s.value === 'string') return s.value;
  if (typeof s.value !== 'number' && typeof s.value !== 'bigint') return undefined;
  const token = s.srcToken as { type?: string; source?: string } | undefined;
  if (token && token.type === 'scalar' && typeof token.source === 'string') return token.source;
  return String(s.value);
}
