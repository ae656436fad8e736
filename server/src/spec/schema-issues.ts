// zod's issues → diagnostics with ranges, codes and a sentence that says what to do. Quantity keys
// are skipped here: quantities.ts reads them from their source text with sharper messages.

import type { Document } from 'yaml';
import type { z } from 'zod';
import { closest, didYouMean } from '../../../shared-schema/src/did-you-mean';
import { parseQuantity, quantityExample } from '../../../shared-schema/src/quantity';
import { type FileKind, type KeyInfo, childKeys, lookupKey, schemaOf } from '../../../shared-schema/src/keys';
import { outputSchema } from '../../../shared-schema/src/wave-schema';
import { diagnostic, type LineIndex } from './source';
import { type Path, keyRange, locate, rangeFor, scalarText, valueRange } from './nodes';
import type { SpecDiagnostic } from './types';

/** The output an issue at `path` is about, in a wave spec. */
export const outputOf = (kind: FileKind, path: Path): string | undefined =>
  kind === 'wave' && path[0] === 'outputs' && path.length >= 2 ? String(path[1]) : undefined;

/**
 * A value to show in messages and to seed placeholders, by the key's schema path (`*` for an
 * output name). Invented figures of no particular part.
 */
const EXAMPLES: Record<string, string> = {
  clock: './bench.clock.yaml',
  'outputs.*.frequency': '1 kHz',
  'system-clock': '96 MHz',
  'divider.integer.min': '1',
  'divider.integer.max': '4096',
  'dac.bits': '12',
  'dac.sample-bytes': '2',
  'dac.full-scale': '3.3 V',
  'dac.max-sample-rate': '10 MHz',
  'memory.budget': '64 KiB',
  'memory.table-length.min': '16',
  'memory.table-length.max': '16384',
  'outputs.*.plan.divider': '100',
  'outputs.*.plan.table-length': '1000',
  'outputs.*.plan.cycles': '1',
};

const schemaPath = (kind: FileKind, path: Path): string =>
  (kind === 'wave' && path[0] === 'outputs' && path.length >= 2 ? ['outputs', '*', ...path.slice(2)] : path).map(String).join('.');

const requiredChildren = (kind: FileKind, path: Path, info: KeyInfo): string[] => info.children.filter((c) => lookupKey(kind, [...path, c])?.required);

/** An example value for the key at `path`; objects are given as flow mappings of their required keys. */
function example(kind: FileKind, path: Path): string | undefined {
  const info = lookupKey(kind, path);
  const own = EXAMPLES[schemaPath(kind, path)];
  if (own || !info) return own;
  if (info.type === 'choice') return info.values?.[0];
  if (info.type === 'quantity' && info.quantity) return quantityExample(info.quantity.kind);
  if (info.type !== 'object') return undefined;
  const parts = requiredChildren(kind, path, info).map((c) => [c, example(kind, [...path, c])] as const);
  return parts.length > 0 && parts.every(([, v]) => v !== undefined) ? `{ ${parts.map(([c, v]) => `${c}: ${v}`).join(', ')} }` : undefined;
}

/** Placeholders are written `<…>`; a value of that form is one the engineer has yet to choose. */
export const isPlaceholder = (value: unknown): boolean => typeof value === 'string' && /^<[^>]*>$/.test(value.trim());

/**
 * The value a quick fix adds for a missing key: a placeholder that is itself a finding until it is
 * replaced (never a default that would pass silently). Objects get their required keys, each a
 * placeholder; the text has no `,` `:` `#` or brackets inside a placeholder, so it reads the same
 * in a block or a flow mapping.
 */
export function placeholderFor(kind: FileKind, path: Path): string {
  const info = lookupKey(kind, path);
  if (!info) return '<value>';
  if (info.type === 'choice' || info.type === 'true/false') return `<${(info.values ?? []).join('|')}>`;
  if (info.type === 'object') {
    const inner = requiredChildren(kind, path, info);
    return `{ ${inner.map((c) => `${c}: ${placeholderFor(kind, [...path, c])}`).join(', ')} }`;
  }
  if (info.type === 'map') return `{ <output-name>: ${placeholderFor(kind, [...path, '*'])} }`;
  const shown = example(kind, path) ?? (info.type === 'whole number' ? String(info.min ?? 1) : 'text');
  return `<e.g. ${shown}>`;
}

function describeValue(value: unknown): string {
  if (value === null || value === undefined) return 'empty';
  if (Array.isArray(value)) return 'a list';
  if (typeof value === 'object') return 'a mapping';
  if (typeof value === 'string') return 'text';
  if (typeof value === 'boolean') return 'true/false';
  if (typeof value === 'number') return Number.isInteger(value) ? 'a whole number' : 'a number with a fraction';
  return typeof value;
}

function wanted(info: KeyInfo | undefined): string {
  switch (info?.type) {
    case 'object':
    case 'map':
      return 'a mapping of keys';
    case 'whole number':
      return `a whole number from ${info.min} to ${info.max}`;
    case 'number':
      return `a number from ${info.min} to ${info.max}`;
    case 'true/false':
      return '`true` or `false`';
    case 'choice': {
      const words = (info.values ?? []).map((v) => `\`${v}\``).join(', ');
      return info.quantity ? `${words} or ${info.quantity.what} such as \`${quantityExample(info.quantity.kind)}\`` : words;
    }
    case 'quantity':
      return info.quantity?.what ?? 'a quantity';
    default:
      return 'text';
  }
}

const keyLabel = (path: Path): string => (path.length === 0 ? 'The file' : `\`${path.map(String).join('.')}\``);

const pathKey = (path: Path): string => path.map(String).join('\u0000');

/** Absent required keys by the path of the mapping that lacks them (a misspelling often names one). */
function missingByParent(doc: Document.Parsed, issues: readonly z.core.$ZodIssue[]): Map<string, Set<string>> {
  const missing = new Map<string, Set<string>>();
  for (const issue of issues) {
    const path = cleanPath(issue.path);
    if (issue.code === 'unrecognized_keys' || issue.code === 'invalid_key' || path.length === 0 || locate(doc, path)) continue;
    const parent = pathKey(path.slice(0, -1));
    if (!missing.has(parent)) missing.set(parent, new Set());
    missing.get(parent)!.add(String(path[path.length - 1]));
  }
  return missing;
}

const cleanPath = (path: readonly PropertyKey[]): Path => path.filter((p): p is string | number => typeof p !== 'symbol');

export function schemaDiagnostics(
  kind: FileKind,
  doc: Document.Parsed,
  lines: LineIndex,
  data: unknown,
  issues: readonly z.core.$ZodIssue[],
): SpecDiagnostic[] {
  const out: SpecDiagnostic[] = [];
  const missing = missingByParent(doc, issues);
  // Missing keys that a misspelt key next to them stands for: the unknown-key finding says it once.
  const meant = new Set<string>();
  for (const issue of issues) {
    if (issue.code !== 'unrecognized_keys') continue;
    const path = cleanPath(issue.path);
    const lacking = missing.get(pathKey(path));
    for (const key of issue.keys) for (const k of closest(key, childKeys(kind, path))) if (lacking?.has(k)) meant.add(pathKey([...path, k]));
  }
  for (const issue of issues) {
    const path = cleanPath(issue.path);
    const output = outputOf(kind, path);
    const info = lookupKey(kind, path);

    if (issue.code === 'unrecognized_keys') {
      const known = childKeys(kind, path);
      const present = new Set(Object.keys((valueAt(data, path) as Record<string, unknown> | null) ?? {}));
      const lacking = missing.get(pathKey(path)) ?? new Set<string>();
      for (const key of issue.keys) {
        const r = keyRange(doc, lines, [...path, key]) ?? rangeFor(doc, lines, path, 'key');
        // A rename onto a key already written would only make a duplicate.
        const suggestions = closest(key, known).filter((k) => !present.has(k));
        const lacked = suggestions.filter((k) => lacking.has(k));
        const hint = suggestions.length === 0 ? '' : ` (did you mean ${suggestions.map((c) => `\`${c}\``).join(' or ')}${lacked.length > 0 ? `, which ${path.length === 0 ? 'the file' : keyLabel(path)} lacks` : ''}?)`;
        const where = path.length === 0 ? 'at the top of the file' : `in ${keyLabel(path)}`;
        const d = diagnostic('unknown-key', r, `Unknown key \`${key}\` ${where}${hint}: fix its spelling or remove it.`, outputOf(kind, [...path, key]));
        if (suggestions.length > 0) d.fix = { suggestions };
        out.push(d);
      }
      continue;
    }
    if (issue.code === 'invalid_key') {
      const r = keyRange(doc, lines, path) ?? rangeFor(doc, lines, path, 'key');
      const name = String(path[path.length - 1]);
      const message = path.includes('stages')
        ? `Stage name \`${name}\` is not allowed: start with a letter, then use letters and digits, joined by single _ (at most 32); it becomes part of C names.`
        : `Output name \`${name}\` is not allowed: start with a letter or _, then use letters, digits, _ or - (at most 64).`;
      out.push(diagnostic('bad-name', r, message, outputOf(kind, path)));
      // The schema checks no value under a key it rejects; check it here, so one pass says everything.
      if (kind === 'wave' && path.length === 2) {
        const inner = outputSchema.safeParse(valueAt(data, path));
        if (!inner.success) out.push(...schemaDiagnostics(kind, doc, lines, data, inner.error.issues.map((i) => ({ ...i, path: [...path, ...i.path] }))));
      }
      continue;
    }
    const found = locate(doc, path);
    if (!found) {
      if (meant.has(pathKey(path))) continue;
      // An absent key: mark its parent's key (or the top of the file) and say what to add.
      const parent = path.slice(0, -1);
      const key = String(path[path.length - 1]);
      const shown = example(kind, path);
      const inner = info?.type === 'object' ? requiredChildren(kind, path, info) : [];
      const add = shown
        ? `add \`${key}: ${shown}\``
        : inner.length > 0
          ? `add \`${key}:\` with ${inner.map((c) => `\`${c}\``).join(', ')}`
          : `add \`${key}:\``;
      const d = diagnostic('missing-key', rangeFor(doc, lines, parent, 'key'), `${keyLabel(parent)} has no \`${key}\`: ${add}.`, output);
      d.fix = { key, placeholder: placeholderFor(kind, path), parent };
      out.push(d);
      continue;
    }
    if (info?.type === 'quantity') {
      // Quantities in a list (a step's frequency) are not read key by key (quantities.ts): say
      // here what is wrong with the text, as the reader would.
      const listed = path.some((p) => typeof p === 'number');
      const text = listed ? scalarText(doc, found.value) : undefined;
      const parsed = text === undefined ? undefined : parseQuantity(info.quantity!.kind, text);
      if (parsed !== undefined && !parsed.ok) out.push(diagnostic(parsed.code, valueRange(doc, lines, path) ?? rangeFor(doc, lines, path), parsed.message, output));
      continue;
    }
    const r = valueRange(doc, lines, path) ?? rangeFor(doc, lines, path);
    const value = valueAt(data, path);
    if (isPlaceholder(value)) {
      out.push(diagnostic(issue.code === 'invalid_value' ? 'bad-choice' : 'wrong-type', r, `${keyLabel(path)} still holds the placeholder \`${String(value).trim()}\`: write ${wanted(info)} in its place.`, output));
    } else if (info?.type === 'choice' && info.quantity && typeof value === 'string' && /^\s*[+-]?\.?\d/.test(value)) {
      // A choice that also takes a quantity (`band-limit: 20 kOhm`): what is wrong with the quantity.
      const parsed = parseQuantity(info.quantity.kind, value);
      out.push(parsed.ok ? diagnostic('wrong-type', r, `${keyLabel(path)} must be ${wanted(info)}.`, output) : diagnostic(parsed.code, r, parsed.message, output));
    } else if (info?.type === 'choice' && (issue.code === 'invalid_value' || (info.quantity !== undefined && typeof value === 'string'))) {
      const hint = typeof value === 'string' ? didYouMean(value, info.values ?? []) : '';
      out.push(diagnostic('bad-choice', r, `${keyLabel(path)} must be one of ${wanted(info)}${hint}.`, output));
    } else if (issue.code === 'too_small' || issue.code === 'too_big') {
      out.push(diagnostic('out-of-range', r, `${keyLabel(path)} must be ${wanted(info)}: ${String(value)} is ${issue.code === 'too_small' ? 'too small' : 'too large'}.`, output));
    } else {
      const shown = exampleFor(info, kind, path);
      const write = info?.type === 'object' || info?.type === 'map' ? `write ${shown}` : `write e.g. ${shown}`;
      out.push(diagnostic('wrong-type', r, `${keyLabel(path)} must be ${wanted(info)}, not ${describeValue(value)}: ${write}.`, output));
    }
  }
  return out;
}

function exampleFor(info: KeyInfo | undefined, kind: FileKind, path: Path): string {
  if (!info) return 'a value from the file reference';
  if (info.type === 'map') return 'one output name per line under it, each with its own keys';
  if (info.type === 'object') {
    const needed = requiredChildren(kind, path, info);
    const shown = needed.length > 0 ? needed : info.children.slice(0, 3);
    return `its keys under it, such as ${shown.map((c) => `\`${c}\``).join(', ')}`;
  }
  if (info.type === 'choice' || info.type === 'true/false') return `\`${info.values?.[0]}\``;
  const shown = example(kind, path);
  return shown ? `\`${shown}\`` : info.type === 'text' ? '`some text`' : 'a value from the file reference';
}

function valueAt(data: unknown, path: Path): unknown {
  let cur = data;
  for (const p of path) {
    if (cur === null || typeof cur !== 'object') return undefined;
    cur = (cur as Record<string, unknown>)[String(p)];
  }
  return cur;
}

/** Validates plain data against the file kind's schema and maps every issue to a diagnostic. */
export function validate(kind: FileKind, doc: Document.Parsed, lines: LineIndex, data: unknown): SpecDiagnostic[] {
  const result = schemaOf(kind).safeParse(data);
  return result.success ? [] : schemaDiagnostics(kind, doc, lines, data, result.error.issues);
}
