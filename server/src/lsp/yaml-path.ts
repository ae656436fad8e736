// Where the cursor is in the YAML. Hover and definition ask the analysis's own tree
// (spec/syntax.ts, flow maps such as `plan: { divider: 125 }` included); completion reads
// indentation (below), because the line being typed rarely parses.

import { parseDocument, type Document } from 'yaml';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { forYaml, withoutBreak, linesWithBreaks } from '../spec/line-breaks';
import { MAX_FILE_CHARS } from '../spec/source';
import { nodeInDocument } from '../spec/syntax';

export type { NodeAtCursor, PathPart, SyntaxTree, TopLevelKey } from '../spec/syntax';

/** The key or scalar under `offset` in a whole-file tree (quick fixes that edit the tree's shape). */
export const nodeAt = nodeInDocument;

/**
 * The whole document parsed, for the few quick fixes that add to a mapping of any shape: asked
 * only when such a fix is, and kept for the newest snapshot of a couple of documents. Every
 * other feature reads the analysis's own trees (spec/syntax.ts).
 */
export class SyntaxTrees {
  private readonly trees = new Map<string, { doc: TextDocument; tree: Document }>();

  of(doc: TextDocument): Document {
    const hit = this.trees.get(doc.uri);
    if (hit?.doc === doc) return hit.tree;
    const text = doc.getText();
    const tree = parseDocument(forYaml(text.length > MAX_FILE_CHARS ? '' : text), { uniqueKeys: false, keepSourceTokens: false, prettyErrors: false });
    this.trees.delete(doc.uri);
    this.trees.set(doc.uri, { doc, tree });
    if (this.trees.size > 2) this.trees.delete(this.trees.keys().next().value!);
    return tree;
  }

  forget(uri: string): void {
    this.trees.delete(uri);
  }
}

/** The text's lines without their breaks, CR LF, lone CR and LF alike (as the editor numbers them). */
function linesOf(text: string): string[] {
  const lines = linesWithBreaks(text).map(withoutBreak);
  // A text ending in a break has one more (empty) line, where a cursor can be.
  if (text.length === 0 || /[\r\n]$/.test(text)) lines.push('');
  return lines;
}

const indentOf = (line: string): number => line.length - line.trimStart().length;

/**
 * The key path of the mapping the cursor's line belongs to, read from indentation: each line
 * above with less indentation and of the form `key:` (nothing after it but a comment) is a parent.
 */
export function parentPathAt(text: string, line: number, character: number): string[] {
  const lines = linesOf(text);
  const current = lines[line] ?? '';
  let indent = current.trim() === '' ? character : indentOf(current);
  const path: string[] = [];
  for (let i = Math.min(line, lines.length) - 1; i >= 0 && indent > 0; i--) {
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

/**
 * Keys already present in the mapping the cursor's line belongs to (so completion skips them),
 * each with its value as written on its line ('' for a nested mapping), comment and quotes left out.
 */
export function siblingKeys(text: string, line: number, character: number): Map<string, string> {
  const lines = linesOf(text);
  const current = lines[line] ?? '';
  const indent = current.trim() === '' ? character : indentOf(current);
  const keys = new Map<string, string>();
  const scan = (from: number, step: number): void => {
    for (let i = Math.min(from, lines.length - 1); i >= 0 && i < lines.length; i += step) {
      const l = lines[i];
      if (l.trim() === '' || l.trimStart().startsWith('#')) continue;
      const own = indentOf(l);
      if (own < indent) return;
      if (own > indent) continue;
      const m = /^\s*([^\s:#][^:#]*?)\s*:(?:\s+([^#]*))?/.exec(l);
      if (m && !keys.has(m[1])) keys.set(m[1], (m[2] ?? '').trim().replace(/^(['"])(.*)\1$/, '$2'));
    }
  };
  scan(line - 1, -1);
  scan(line + 1, 1);
  return keys;
}
