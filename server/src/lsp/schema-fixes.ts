// Quick fixes for what people mistype: a misspelt key renamed to the known key it is close to, a
// unit corrected to the one it was close to, a missing required key added with a placeholder the
// engineer must replace (a finding of its own until then, never a default that passes silently),
// and one "every such finding" fix where a file has several. The inputs come from the analysis's
// own diagnostic (its `fix` data, or the schema for a unit), never from the message text.

import type { CodeAction, Diagnostic, TextEdit } from 'vscode-languageserver/node';
import { TextDocument } from 'vscode-languageserver-textdocument';
import type { Document } from 'yaml';
import { closest } from '../../../shared-schema/src/did-you-mean';
import { lookupKey, type FileKind } from '../../../shared-schema/src/keys';
import { unitsOf } from '../../../shared-schema/src/quantity';
import type { Analysis, Range, SpecDiagnostic } from '../spec/types';
import { addToMapping } from './entry-edits';
import { previewFix, quickFix, type Recheck } from './fix-preview';
import { nodeAt } from './yaml-path';

export const SCHEMA_FIX_CODES = new Set(['unknown-key', 'bad-unit', 'missing-key']);

const sameRange = (a: Range, b: Range): boolean =>
  a.start.line === b.start.line && a.start.character === b.start.character && a.end.line === b.end.line && a.end.character === b.end.character;

/** The analysis's own finding behind an LSP diagnostic of the same version: same code, same range. */
export function findingOf(analysis: Analysis, d: Diagnostic): SpecDiagnostic | undefined {
  return analysis.diagnostics.find((x) => x.code === d.code && sameRange(x.range, d.range));
}

interface Fix {
  title: string;
  edits: TextEdit[];
}

/** The number and the unit of a quantity's text, with where the unit starts. */
const QUANTITY_TEXT = /^(['"]?\s*[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?\s*)([^\s'"]+)\s*['"]?$/;

/**
 * Units a mistyped one was meant to be: the close ones of the key's own units (the same function
 * the message's "did you mean" uses), else those that extend or shorten it (`V` → `Vpp` for a
 * peak-to-peak key, `Vpp` → `V` for an offset).
 */
export function unitSuggestions(kind: FileKind, path: readonly (string | number)[], unit: string): string[] {
  const q = lookupKey(kind, path)?.quantity;
  if (!q) return [];
  const own = unitsOf(q.kind);
  const near = closest(unit, own);
  if (near.length > 0) return near;
  return own.filter((u) => u !== unit && (u.startsWith(unit) || unit.startsWith(u)) && u.length > 0);
}

function unitFixes(doc: TextDocument, tree: Document, kind: FileKind, f: SpecDiagnostic): Fix[] {
  const text = doc.getText(f.range);
  const m = QUANTITY_TEXT.exec(text);
  const at = nodeAt(tree, doc.getText(), doc.offsetAt(f.range.start));
  if (!m || !at || at.role !== 'value') return [];
  const start = doc.positionAt(doc.offsetAt(f.range.start) + m[1].length);
  const range = { start, end: doc.positionAt(doc.offsetAt(start) + m[2].length) };
  return unitSuggestions(kind, at.path, m[2]).map((unit) => ({ title: `Change the unit \`${m[2]}\` to \`${unit}\``, edits: [{ range, newText: unit }] }));
}

function keyFixes(doc: TextDocument, f: SpecDiagnostic): Fix[] {
  const key = doc.getText(f.range);
  return (f.fix?.suggestions ?? []).map((known) => ({ title: `Rename \`${key}\` to \`${known}\``, edits: [{ range: f.range, newText: known }] }));
}

function missingFixes(doc: TextDocument, tree: Document, f: SpecDiagnostic): Fix[] {
  const { key, placeholder, parent } = f.fix ?? {};
  if (!key || !placeholder || !parent) return [];
  const edit = addToMapping(doc, tree, parent, key, placeholder);
  return edit ? [{ title: `Add \`${key}: ${placeholder}\` (a placeholder to replace: it stays an error until you do)`, edits: [edit] }] : [];
}

function fixesFor(doc: TextDocument, tree: Document, kind: FileKind, f: SpecDiagnostic): Fix[] {
  if (f.code === 'unknown-key') return keyFixes(doc, f);
  if (f.code === 'bad-unit') return unitFixes(doc, tree, kind, f);
  if (f.code === 'missing-key') return missingFixes(doc, tree, f);
  return [];
}

const FIX_ALL_WORDS: Record<string, string> = {
  'unknown-key': 'Rename every misspelt key to the one known key it is close to',
  'bad-unit': 'Change every mistyped unit to the one unit it is close to',
  'missing-key': 'Add every missing key with a placeholder to replace',
};

/** Counts of a code in two analyses: the fix clears `n` when the count falls by at least `n`. */
const countOf = (a: Analysis, code: string): number => a.diagnostics.filter((x) => x.code === code).length;

export function schemaFixes(doc: TextDocument, tree: Document, analysis: Analysis, d: Diagnostic, recheck: Recheck): CodeAction[] {
  const finding = findingOf(analysis, d);
  if (!finding || !SCHEMA_FIX_CODES.has(finding.code)) return [];
  const kind: FileKind = analysis.kind;
  const fixes = fixesFor(doc, tree, kind, finding);
  const out: CodeAction[] = [];
  for (const fix of fixes) {
    const preview = previewFix(doc, analysis, fix.edits, d, finding.output ?? '', recheck);
    // A fix that would not clear its finding is not offered. A single rename or unit is preferred;
    // a placeholder never is (it leaves a finding to resolve by hand).
    if (preview?.cleared) out.push(quickFix(fix.title, doc, fix.edits, d, fixes.length === 1 && finding.code !== 'missing-key'));
  }
  // Every finding of this kind with exactly one fix, fixed at once, when there are several.
  const single = analysis.diagnostics
    .filter((x) => x.code === finding.code)
    .map((x) => fixesFor(doc, tree, kind, x))
    .filter((f) => f.length === 1);
  if (single.length >= 2) {
    const edits = single.map((f) => f[0].edits[0]);
    const after = recheck(TextDocument.applyEdits(doc, edits));
    if (after && countOf(after, finding.code) <= countOf(analysis, finding.code) - single.length) {
      out.push(quickFix(`${FIX_ALL_WORDS[finding.code]} (${single.length} in this file)`, doc, edits, d));
    }
  }
  return out;
}
