// Where a cursor is in a spec, answered from the trees the analysis read, never by parsing the
// whole text again: the whole file's tree when it was read whole, else the frame's and the one
// output's piece under the cursor (each parsed on its own, small and memoised). Hover, definition,
// code lens and the outline ask here. The trees are kept beside the analysis, not in it, so an
// Analysis stays plain data.

import { type Document, type Node, isMap, isPair, isScalar, isSeq, parseDocument } from 'yaml';
import { forYaml } from './line-breaks';
import { Memo } from './memo';
import { MAX_FILE_CHARS } from './source';
import type { Analysis } from './types';

export type PathPart = string | number;

export interface NodeAtCursor {
  path: PathPart[];
  role: 'key' | 'value';
  /** File offsets of the key or value under the cursor. */
  start: number;
  end: number;
  /** Source text of that key or scalar value. */
  source: string;
}

export interface TopLevelKey {
  key: string;
  /** File offsets of the key and of the end of its value. */
  start: number;
  end: number;
  valueEnd: number;
}

export interface SyntaxTree {
  nodeAt(offset: number): NodeAtCursor | undefined;
  /** The top-level keys in file order. */
  topLevel(): TopLevelKey[];
  /**
   * A wave spec's output entries in file order, those that do not parse included where the tree
   * still holds them (the outline lists every one); `key` is the name as written.
   */
  outputEntries(): TopLevelKey[];
}

function inside(node: Node | null | undefined, offset: number): node is Node {
  return !!node?.range && node.range[0] <= offset && offset <= node.range[1];
}

/** The key or scalar under `offset` in one parsed document (offsets of that document's text). */
export function nodeInDocument(tree: Document, text: string, offset: number): NodeAtCursor | undefined {
  let node = tree.contents as Node | null;
  const path: PathPart[] = [];
  for (let depth = 0; node && depth < 64; depth++) {
    if (isMap(node)) {
      let next: Node | null = null;
      for (const pair of node.items) {
        if (!isPair(pair)) continue;
        const key = pair.key as Node | null;
        if (!isScalar(key)) continue;
        const name = String(key.value);
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

/** The keys of a mapping node in order, with where each key and its value end. */
function keysOf(map: Node | null | undefined): TopLevelKey[] {
  if (!isMap(map)) return [];
  const out: TopLevelKey[] = [];
  for (const pair of map.items) {
    if (!isPair(pair) || !isScalar(pair.key) || !pair.key.range) continue;
    const [start, end] = pair.key.range;
    out.push({ key: String(pair.key.value), start, end, valueEnd: Math.max(end, (pair.value as Node | null)?.range?.[1] ?? end) });
  }
  return out;
}

export const topLevelOf = (tree: Document | null): TopLevelKey[] => keysOf(tree?.contents as Node | null | undefined);

/** The entries under a document's `outputs:` key. */
export function outputEntriesOf(tree: Document | null): TopLevelKey[] {
  const root = tree?.contents as Node | null | undefined;
  if (!isMap(root)) return [];
  const outputs = root.items.find((p) => isPair(p) && isScalar(p.key) && p.key.value === 'outputs');
  return keysOf(outputs?.value as Node | null | undefined);
}

/** A tree over one document whose offsets are the file's. */
export function documentTree(tree: Document | null, text: string): SyntaxTree {
  return {
    nodeAt: (offset) => (tree ? nodeInDocument(tree, text, offset) : undefined),
    topLevel: () => topLevelOf(tree),
    outputEntries: () => outputEntriesOf(tree),
  };
}

/** A text parsed for cursors only (errors allowed). */
const parseForCursor = (text: string): Document => parseDocument(forYaml(text), { uniqueKeys: false, keepSourceTokens: false, prettyErrors: false });

const smallTexts = new Memo<string, Document>(64);

/** A small text (a frame, one output's piece) parsed for cursors, memoised by its text. */
export function cursorTree(text: string): Document {
  return smallTexts.get(text, parseForCursor);
}

const trees = new WeakMap<Analysis, SyntaxTree>();

export function setSyntax(analysis: Analysis, tree: SyntaxTree): void {
  trees.set(analysis, tree);
}

/** The tree the analysis read; a file read without one (a clock file) is parsed once, on first ask. */
export function syntaxOf(analysis: Analysis): SyntaxTree {
  let tree = trees.get(analysis);
  if (!tree) {
    // A text over the read limit was never parsed (file-too-large) and is not parsed here either:
    // every cursor request after every edit of a 10 MB buffer paid a parse of it, seconds each.
    tree = documentTree(analysis.text.length > MAX_FILE_CHARS ? null : parseForCursor(analysis.text), analysis.text);
    trees.set(analysis, tree);
  }
  return tree;
}
