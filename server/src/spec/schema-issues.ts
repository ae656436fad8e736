// zod's issues → diagnostics with ranges, codes and a sentence that says what to do. Quantity keys
// are skipped here: quantities.ts reads them from their source text with sharper messages.

import type { Document } from 'yaml';
import type { z } from 'zod';
import { didYouMean } from '../../../shared-schema/src/did-you-mean';
import { type FileKind, type KeyInfo, childKeys, lookupKey, schemaOf } from '../../../shared-schema/src/keys';
import { diagnostic, type LineIndex } from './source';
import { type Path, keyRange, locate, rangeFor, valueRange } from './nodes';
import type { SpecDiagnostic } from './types';

/** The output an issue at `path` is about, in a wave spec. */
export const outputOf = (kind: FileKind, path: Path): string | undefined =>
  kind === 'wave' && path[0] === 'outputs' && path.length >= 2 ? String(path[1]) : undefined;

const EXAMPLES: Record<string, string> = {
  clock: './bench.clock.yaml',
  shape: 'sine',
  frequency: '1 kHz',
  'system-clock': '125 MHz',
  integer: '{ min: 1, max: 65535 }',
  min: '1',
  max: '65535',
  bits: '12',
  'sample-bytes': '2',
  'full-scale': '3.3 V',
  'max-sample-rate': '10 MHz',
  budget: '64 KiB',
  'table-length': '{ min: 16, max: 16384 }',
  cycles: '1',
};

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
    case 'true/false':
      return '`true` or `false`';
    case 'choice':
      return (info.values ?? []).map((v) => `\`${v}\``).join(', ');
    case 'quantity':
      return info.quantity?.what ?? 'a quantity';
    default:
      return 'text';
  }
}

const keyLabel = (path: Path): string => (path.length === 0 ? 'The file' : `\`${path.map(String).join('.')}\``);

export function schemaDiagnostics(
  kind: FileKind,
  doc: Document.Parsed,
  lines: LineIndex,
  data: unknown,
  issues: readonly z.core.$ZodIssue[],
): SpecDiagnostic[] {
  const out: SpecDiagnostic[] = [];
  for (const issue of issues) {
    const path = issue.path.filter((p): p is string | number => typeof p !== 'symbol');
    const output = outputOf(kind, path);
    const info = lookupKey(kind, path);

    if (issue.code === 'unrecognized_keys') {
      const known = childKeys(kind, path);
      for (const key of issue.keys) {
        const r = keyRange(doc, lines, [...path, key]) ?? rangeFor(doc, lines, path, 'key');
        const hint = didYouMean(key, known);
        const where = path.length === 0 ? 'at the top of the file' : `in ${keyLabel(path)}`;
        out.push(diagnostic('unknown-key', r, `Unknown key \`${key}\` ${where}${hint}: fix its spelling or remove it.`, outputOf(kind, [...path, key])));
      }
      continue;
    }
    if (issue.code === 'invalid_key') {
      const r = keyRange(doc, lines, path) ?? rangeFor(doc, lines, path, 'key');
      out.push(diagnostic('bad-name', r, `Output name \`${String(path[path.length - 1])}\` is not allowed: start with a letter or _, then use letters, digits, _ or - (at most 64).`, outputOf(kind, path)));
      continue;
    }
    const found = locate(doc, path);
    if (!found) {
      // An absent key: mark its parent's key (or the top of the file) and say what to add.
      const parent = path.slice(0, -1);
      const key = String(path[path.length - 1]);
      const example = info?.type === 'choice' ? info.values?.[0] : EXAMPLES[key];
      const inner = info?.type === 'object' ? info.children.filter((c) => lookupKey(kind, [...path, c])?.required) : [];
      const add = example
        ? `add \`${key}: ${example}\``
        : inner.length > 0
          ? `add \`${key}:\` with ${inner.map((c) => `\`${c}\``).join(', ')}`
          : `add \`${key}:\``;
      out.push(diagnostic('missing-key', rangeFor(doc, lines, parent, 'key'), `${keyLabel(parent)} has no \`${key}\`: ${add}.`, output));
      continue;
    }
    if (info?.type === 'quantity') continue;
    const r = valueRange(doc, lines, path) ?? rangeFor(doc, lines, path);
    const value = valueAt(data, path);
    if (issue.code === 'invalid_value' && info?.type === 'choice') {
      const hint = typeof value === 'string' ? didYouMean(value, info.values ?? []) : '';
      out.push(diagnostic('bad-choice', r, `${keyLabel(path)} must be one of ${wanted(info)}${hint}.`, output));
    } else if (issue.code === 'too_small' || issue.code === 'too_big') {
      out.push(diagnostic('out-of-range', r, `${keyLabel(path)} must be ${wanted(info)}: ${String(value)} is ${issue.code === 'too_small' ? 'too small' : 'too large'}.`, output));
    } else {
      const example = exampleFor(info, kind, path);
      const write = info?.type === 'object' || info?.type === 'map' ? `write ${example}` : `write e.g. ${example}`;
      out.push(diagnostic('wrong-type', r, `${keyLabel(path)} must be ${wanted(info)}, not ${describeValue(value)}: ${write}.`, output));
    }
  }
  return out;
}

function exampleFor(info: KeyInfo | undefined, kind?: FileKind, path?: Path): string {
  if (!info) return 'a value from the file reference';
  if (info.type === 'map') return 'one output name per line under it, each with its own keys';
  if (info.type === 'object') {
    const needed = kind && path ? info.children.filter((c) => lookupKey(kind, [...path, c])?.required) : [];
    const shown = needed.length > 0 ? needed : info.children.slice(0, 3);
    return `its keys under it, such as ${shown.map((c) => `\`${c}\``).join(', ')}`;
  }
  if (info.type === 'choice' || info.type === 'true/false') return `\`${info.values?.[0]}\``;
  return EXAMPLES[info.key] ? `\`${EXAMPLES[info.key]}\`` : info.type === 'text' ? '`some text`' : 'a value from the file reference';
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
