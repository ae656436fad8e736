// Completion from the schema at the cursor's key path: keys not yet written in the mapping (under an
// output with a known shape, only those that apply to it), the allowed words of a choice (shapes,
// jitter policy, table span), units after a number. The path is read from indentation, so a line
// that is half typed (a YAML error) completes as well as a finished one. Every item's edit covers
// the partial word already typed, so the list opens and filters while a key is being typed.

import {
  CompletionItemKind,
  CompletionTriggerKind,
  type CompletionContext,
  type CompletionItem,
  type Position,
  type Range,
} from 'vscode-languageserver/node';
import type { TextDocument } from 'vscode-languageserver-textdocument';
import { childKeys, lookupKey, type FileKind } from '../../../shared-schema/src/keys';
import { SHAPES } from '../../../shared-schema/src/shape';
import { uriToPath } from './documents';
import { parentPathAt, siblingKeys } from './yaml-path';

export function fileKindOf(uri: string): FileKind {
  return uriToPath(uri).endsWith('.clock.yaml') ? 'clock' : 'wave';
}

/** The output's shape as written beside the cursor, when it is one the schema knows. */
function shapeOf(kind: FileKind, parent: string[], present: Map<string, string>): string | undefined {
  if (kind !== 'wave' || parent.length !== 2 || parent[0] !== 'outputs') return undefined;
  const shape = present.get('shape');
  return shape !== undefined && (SHAPES as readonly string[]).includes(shape) ? shape : undefined;
}

/** The rest of the key after the cursor (`quency` in `fre|quency: 1 kHz`) and whether a colon follows it. */
function keyAfter(doc: TextDocument, position: Position): { length: number; colon: boolean } {
  const rest = doc.getText({ start: position, end: { line: position.line + 1, character: 0 } }).replace(/[\r\n]+$/, '');
  const m = /^([A-Za-z0-9_-]*)(\s*:)?/.exec(rest)!;
  return { length: m[1].length, colon: m[2] !== undefined };
}

/** What the client said it takes (LSP 3.17 `completionItem.insertReplaceSupport`). */
export interface CompletionClient {
  insertReplace: boolean;
}

function keyItems(kind: FileKind, doc: TextDocument, position: Position, typed: string, client: CompletionClient): CompletionItem[] {
  const text = doc.getText();
  const parent = parentPathAt(text, position.line, position.character);
  // Output names are the engineer's own; under `outputs:` there is nothing to offer.
  if (kind === 'wave' && parent.length === 1 && parent[0] === 'outputs') return [];
  const present = siblingKeys(text, position.line, position.character);
  const start = { line: position.line, character: position.character - typed.length };
  const after = keyAfter(doc, position);
  // Typed in the middle of a key: the item replaces the whole key, and keeps the colon written after it.
  const insert: Range = { start, end: position };
  const replace: Range = { start, end: { line: position.line, character: position.character + after.length } };
  return childKeys(kind, parent, shapeOf(kind, parent, present))
    .filter((key) => !present.has(key))
    .map((key, index) => {
      const info = lookupKey(kind, [...parent, key]);
      const nested = info?.type === 'object' || info?.type === 'map' || info?.type === 'list';
      const newText = after.colon ? key : nested ? `${key}:` : `${key}: `;
      return {
        label: key,
        kind: CompletionItemKind.Property,
        detail: info?.default !== undefined ? `default: ${info.default}` : info?.required ? 'required' : undefined,
        documentation: info?.description ? { kind: 'markdown', value: info.description } : undefined,
        sortText: String(index).padStart(3, '0'),
        textEdit: after.length === 0 ? { range: insert, newText } : client.insertReplace ? { newText, insert, replace } : { range: replace, newText },
      } satisfies CompletionItem;
    });
}

function valueItems(kind: FileKind, doc: TextDocument, position: Position, key: string, typed: string, gap: string): CompletionItem[] {
  const parent = parentPathAt(doc.getText(), position.line, position.character);
  const info = lookupKey(kind, [...parent, key]);
  if (!info) return [];
  if (info.values) {
    const start = { line: position.line, character: position.character - typed.length };
    // Right after the colon (its trigger character): the value comes with the space YAML needs.
    const space = gap === '' ? ' ' : '';
    return info.values.map((value) => ({
      label: value,
      kind: CompletionItemKind.EnumMember,
      detail: info.default === value ? 'default' : undefined,
      filterText: space === '' ? undefined : value,
      textEdit: { range: { start, end: position }, newText: space + value },
    }));
  }
  // Units once a number has been typed: "100 k" → kHz, "100" → " kHz".
  const number = /([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)(\s*)([A-Za-zµ%]*)$/.exec(typed);
  if (!info.quantity || !number) return [];
  const [, , unitGap, unitTyped] = number;
  const start = { line: position.line, character: position.character - unitTyped.length };
  return info.quantity.units.map((unit, index) => ({
    label: unit,
    kind: CompletionItemKind.Unit,
    detail: info.quantity!.what,
    sortText: String(index).padStart(3, '0'),
    filterText: unitTyped === '' ? unit : undefined,
    textEdit: { range: { start, end: position }, newText: unitGap === '' ? ` ${unit}` : unit },
  }));
}

export function completions(doc: TextDocument, position: Position, context?: CompletionContext, client: CompletionClient = { insertReplace: false }): CompletionItem[] {
  const line = doc.getText({ start: { line: position.line, character: 0 }, end: position });
  if (line.includes('#')) return [];
  const kind = fileKindOf(doc.uri);
  const keyTyped = /^\s*(?:-\s+)?([A-Za-z_-]*)$/.exec(line);
  if (keyTyped) {
    // A space typed in the indentation is not a request for keys: the list would open on every
    // indented line, and Enter would then take a key instead of ending the line.
    if (context?.triggerKind === CompletionTriggerKind.TriggerCharacter && keyTyped[1] === '') return [];
    return keyItems(kind, doc, position, keyTyped[1], client);
  }
  const valueTyped = /^\s*(?:-\s+)?([A-Za-z_][\w-]*)\s*:(\s*)(.*)$/.exec(line);
  if (valueTyped) return valueItems(kind, doc, position, valueTyped[1], valueTyped[3], valueTyped[2]);
  return [];
}
