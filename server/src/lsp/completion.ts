// Completion from the schema at the cursor's key path: keys not yet written in the mapping,
// the allowed words of a choice (shapes, jitter policy, table span), units after a number.

import { CompletionItemKind, type CompletionItem, type Position } from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { childKeys, lookupKey, type FileKind } from '../../../shared-schema/src/keys';
import { uriToPath } from './documents';
import { parentPathAt, siblingKeys } from './yaml-path';

export function fileKindOf(uri: string): FileKind {
  return uriToPath(uri).endsWith('.clock.yaml') ? 'clock' : 'wave';
}

function keyItems(kind: FileKind, doc: TextDocument, position: Position, typed: string): CompletionItem[] {
  const text = doc.getText();
  const parent = parentPathAt(text, position.line, position.character);
  // Output names are the engineer's own; under `outputs:` there is nothing to offer.
  if (kind === 'wave' && parent.length === 1 && parent[0] === 'outputs') return [];
  const present = siblingKeys(text, position.line, position.character);
  const start = { line: position.line, character: position.character - typed.length };
  return childKeys(kind, parent)
    .filter((key) => !present.has(key))
    .map((key, index) => {
      const info = lookupKey(kind, [...parent, key]);
      const nested = info?.type === 'object' || info?.type === 'map';
      return {
        label: key,
        kind: CompletionItemKind.Property,
        detail: info?.default !== undefined ? `default: ${info.default}` : info?.required ? 'required' : undefined,
        documentation: info?.description ? { kind: 'markdown', value: info.description } : undefined,
        sortText: String(index).padStart(3, '0'),
        textEdit: { range: { start, end: position }, newText: nested ? `${key}:` : `${key}: ` },
      } satisfies CompletionItem;
    });
}

function valueItems(kind: FileKind, doc: TextDocument, position: Position, key: string, typed: string): CompletionItem[] {
  const parent = parentPathAt(doc.getText(), position.line, position.character);
  const info = lookupKey(kind, [...parent, key]);
  if (!info) return [];
  if (info.values) {
    const start = { line: position.line, character: position.character - typed.length };
    return info.values.map((value) => ({
      label: value,
      kind: CompletionItemKind.EnumMember,
      detail: info.default === value ? 'default' : undefined,
      textEdit: { range: { start, end: position }, newText: value },
    }));
  }
  // Units once a number has been typed: "100 k" → kHz, "100" → " kHz".
  const number = /([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)(\s*)([A-Za-zµ%]*)$/.exec(typed);
  if (!info.quantity || !number) return [];
  const [, , gap, unitTyped] = number;
  const start = { line: position.line, character: position.character - unitTyped.length };
  return info.quantity.units.map((unit, index) => ({
    label: unit,
    kind: CompletionItemKind.Unit,
    detail: info.quantity!.what,
    sortText: String(index).padStart(3, '0'),
    filterText: unitTyped === '' ? unit : undefined,
    textEdit: { range: { start, end: position }, newText: gap === '' ? ` ${unit}` : unit },
  }));
}

export function completions(doc: TextDocument, position: Position): CompletionItem[] {
  const line = doc.getText({ start: { line: position.line, character: 0 }, end: position });
  if (line.includes('#')) return [];
  const kind = fileKindOf(doc.uri);
  const keyTyped = /^\s*(?:-\s+)?([A-Za-z_-]*)$/.exec(line);
  if (keyTyped) return keyItems(kind, doc, position, keyTyped[1]);
  const valueTyped = /^\s*(?:-\s+)?([A-Za-z_][\w-]*)\s*:\s*(.*)$/.exec(line);
  if (valueTyped) return valueItems(kind, doc, position, valueTyped[1], valueTyped[2]);
  return [];
}
