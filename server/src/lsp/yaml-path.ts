// Where the cursor is in the YAML: the key path and whether it sits on a key or a value.
// Hover and definition use the parsed tree (flow maps such as `plan: { divider: 125 }` included);
// completion uses indentation, because the line being typed rarely parses.

import { isMap, isPair, isScalar, isSeq, parseDocument, type Document, type Node } from 'yaml';
import type { TextDocument } from 'vscode-languageserver-textdocument';

export type PathPart = string | number;

const KEPT_TREES = 8;

export interface NodeAtCursor {
  path: PathPart[];
  role: 'key' | 'value';
  /** Offsets of the key or value under the cursor. */
  start: number;
  end: number;
  /** Source text of that key or scalar value. */
  source: string;
}

/** Parsing for a cursor is cheap but not free: keep one tree per (URI, version). */
export class SyntaxTrees {
  private readonly trees = new Map<string, { version: number; doc: Document }>();

  of(doc: TextDocument): Document {
    const hit = this.trees.get(doc.uri);
    if (hit && hit.version === doc.version) return hit.doc;
    const parsed = parseDocument(doc.getText(), { uniqueKeys: false, keepSourceTokens: false, prettyErrors: false });
    this.trees.delete(doc.uri);
    this.trees.set(doc.uri, { version: doc.version, doc: parsed });
    // Only the documents being worked in need a tree; Map order is the recency order.
    if (this.trees.size > KEPT_TREES) this.trees.delete(this.trees.keys().next().value!);
    return parsed;
  }

  forget(uri: string): void {
    this.trees.delete(uri);
  }
}

function inside(node: Node | null | undefined, offset: number): node is Node {
  return !!node?.range && node.range[0] <= offset && offset <= node.range[1];
}

function keyText(key: unknown): string | undefined {
  if (isScalar(key)) return String(key.value);
  return undefined;
}

export function nodeAt(tree: Document, text: string, offset: number): NodeAtCursor | undefined {
  let node = tree.contents as Node | null;
  const path: PathPart[] = [];
  for (let depth = 0; node && depth < 64; depth++) {
    if (isMap(node)) {
      let next: Node | null = null;
      for (const pair of node.items) {
        if (!isPair(pair)) continue;
        const key = pair.key as Node | null;
        const name = keyText(key);
        if (name === undefined) continue;
        if (inside(key, offset)) {
          const [start, end] = key.range!;
          return { path: [...path, name], role: 'key', start, end, source: text.slice(start, end) };
        }
        const value = pair.value as Node | null;
        if (inside(value, offset)) {
          path.push(name);
          next = value;
          break;
        }
      }
      node = next;
    } else if (isSeq(node)) {
      const index = node.items.findIndex((item) => inside(item as Node, offset));
      if (index < 0) return undefined;
      path.push(index);
      node = node.items[index] as Node;
    } else if (isScalar(node) && node.range) {
      const [start, end] = node.range;
      return { path, role: 'value', start, end, source: text.slice(start, end) };
    } else {
      return undefined;
    }
  }
  return undefined;
}

const indentOf = (line: string): number => line.length - line.trimStart().length;

/**
 * The key path of the mapping the cursor's line belongs to, read from indentation: each line
 * above with less indentation and of the form `key:` (nothing after it but a comment) is a parent.
 */
export function parentPathAt(text: string, line: number, character: number): string[] {
  const lines = text.split(/\r?\n/);
  const current = lines[line] ?? '';
  let indent = current.trim() === '' ? character : indentOf(current);
  const path: string[] = [];
  for (let i = line - 1; i >= 0 && indent > 0; i--) {
    const candidate = lines[i];
    if (candidate.trim() === '' || candidate.trimStart().startsWith('#')) continue;
    const own = indentOf(candidate);
    if (own >= indent) continue;
    const m = /^\s*(?:-\s+)?([^\s:#][^:#]*?)\s*:\s*(?:#.*)?$/.exec(candidate);
    if (!m) return path;
    path.unshift(m[1].replace(/^['"]|['"]$/g, ''));
    indent = own;
  }
  return path;
}

/** Keys already present in the mapping the cursor's line belongs to (so completion skips them). */
export function siblingKeys(text: string, line: number, character: number): Set<string> {
  const lines = text.split(/\r?\n/);
  const current = lines[line] ?? '';
  const indent = current.trim() === '' ? character : indentOf(current);
  const keys = new Set<string>();
  const scan = (from: number, step: number): void => {
    for (let i = from; i >= 0 && i < lines.length; i += step) {
      const l = lines[i];
      if (l.trim() === '' || l.trimStart().startsWith('#')) continue;
      const own = indentOf(l);
      if (own < indent) return;
      if (own > indent) continue;
      const m = /^\s*([^\s:#][^:#]*?)\s*:/.exec(l);
      if (m) keys.add(m[1]);
    }
  };
  scan(line - 1, -1);
  scan(line + 1, 1);
  return keys;
}
