// Reads every quantity key of a spec from its source text, exactly, and checks its bounds.
// The results are what the models build Hardware and OutputRequests from.

import type { Document } from 'yaml';
import { type FileKind, listKeys } from '../../../shared-schema/src/keys';
import { type BaseUnit, magnitudeProblem, parseQuantity, quantityExample } from '../../../shared-schema/src/quantity';
import { type Rational, cmp, fromNumber } from '../../../shared-schema/src/rational';
import type { QuantityMeta } from '../../../shared-schema/src/schema-kit';
import { formatBytes, formatHz } from '../../../shared-schema/src/quantity-format';
import { diagnostic, type LineIndex } from './source';
import { type Path, locate, scalarText, valueRange, rangeFor } from './nodes';
import { outputOf } from './schema-issues';
import type { SpecDiagnostic } from './types';

export interface QuantityValue {
  value: Rational;
  base: BaseUnit;
  /** The unit as written ('' for a plain number). */
  unit: string;
  /** The text as written, e.g. "3.997802734375 MHz". */
  text: string;
}

const keyOf = (path: Path): string => path.map(String).join('\u0000');

export class Quantities {
  private readonly values = new Map<string, QuantityValue>();
  set(path: Path, q: QuantityValue): void {
    this.values.set(keyOf(path), q);
  }
  get(path: Path): QuantityValue | undefined {
    return this.values.get(keyOf(path));
  }
}

/** A quantity key of a file kind, in the order the schema lists its keys. */
export interface QuantityKey {
  /** Dotted path split at dots; `*` stands for an output name. */
  parts: readonly string[];
  meta: QuantityMeta;
}

// The key list is fixed by the schema: built once per kind, not on every analysis.
const keyLists = new Map<FileKind, QuantityKey[]>();

export function quantityKeys(kind: FileKind): QuantityKey[] {
  let keys = keyLists.get(kind);
  if (!keys) {
    keys = [];
    for (const info of listKeys(kind)) if (info.type === 'quantity' && info.quantity) keys.push({ parts: info.path.split('.'), meta: info.quantity.bounds });
    keyLists.set(kind, keys);
  }
  return keys;
}

const concrete = (key: QuantityKey, name: string): Path => [key.parts[0], name, ...key.parts.slice(2)];

/** Concrete paths of every quantity key that exists in the document (`*` expanded to output names). */
function presentPaths(kind: FileKind, doc: Document.Parsed, data: unknown): { path: Path; meta: QuantityMeta }[] {
  // A `*` stands for the names of a top-level map: the outputs of a wave spec, the peripheral
  // clocks of a clock file.
  const namesOf = (top: string): string[] => {
    const map = data && typeof data === 'object' ? (data as Record<string, unknown>)[top] : undefined;
    return map && typeof map === 'object' && !Array.isArray(map) ? Object.keys(map) : [];
  };
  const out: { path: Path; meta: QuantityMeta }[] = [];
  for (const key of quantityKeys(kind)) {
    const paths = key.parts[1] === '*' ? namesOf(key.parts[0]).map((n) => concrete(key, n)) : [key.parts];
    for (const path of paths) if (locate(doc, path)) out.push({ path, meta: key.meta });
  }
  return out;
}

function boundText(n: number, base: BaseUnit): string {
  if (base === 'Hz') return formatHz(fromNumber(n));
  if (base === 'B') return formatBytes(n);
  return base === 'ratio' || base === '' ? `${n}` : `${n} ${base}`;
}

function boundsText(meta: QuantityMeta, base: BaseUnit): string {
  const parts: string[] = [];
  if (meta.min !== undefined) parts.push(`${meta.minExclusive ? 'more than' : 'at least'} ${boundText(meta.min, base)}`);
  if (meta.max !== undefined) parts.push(`${meta.maxExclusive ? 'less than' : 'at most'} ${boundText(meta.max, base)}`);
  return parts.join(' and ');
}

function inBounds(value: Rational, meta: QuantityMeta): boolean {
  if (meta.min !== undefined) {
    const c = cmp(value, fromNumber(meta.min));
    if (c < 0 || (c === 0 && meta.minExclusive)) return false;
  }
  if (meta.max !== undefined) {
    const c = cmp(value, fromNumber(meta.max));
    if (c > 0 || (c === 0 && meta.maxExclusive)) return false;
  }
  return true;
}

export function readQuantities(
  kind: FileKind,
  doc: Document.Parsed,
  lines: LineIndex,
  data: unknown,
): { quantities: Quantities; diagnostics: SpecDiagnostic[] } {
  const quantities = new Quantities();
  const diagnostics: SpecDiagnostic[] = [];
  for (const { path, meta } of presentPaths(kind, doc, data)) {
    const d = readQuantity(kind, doc, lines, path, meta, quantities);
    if (d) diagnostics.push(d);
  }
  return { quantities, diagnostics };
}

/**
 * One output's quantities of a wave spec. The diagnostics come per quantity key (the index into
 * `quantityKeys('wave')`), so a caller that reads outputs one by one can still list them in the
 * order `readQuantities` does: key by key, outputs in file order within each key.
 */
export function readOutputQuantities(doc: Document.Parsed, lines: LineIndex, name: string, quantities: Quantities): SpecDiagnostic[][] {
  return quantityKeys('wave').map((key) => {
    if (key.parts[1] !== '*') return [];
    const path = concrete(key, name);
    if (!locate(doc, path)) return [];
    const d = readQuantity('wave', doc, lines, path, key.meta, quantities);
    return d ? [d] : [];
  });
}

/** Reads the quantity at `path` into `quantities`; a diagnostic when it cannot. */
function readQuantity(kind: FileKind, doc: Document.Parsed, lines: LineIndex, path: Path, meta: QuantityMeta, quantities: Quantities): SpecDiagnostic | undefined {
  const label = `\`${path[path.length - 1]}\``;
  const range = valueRange(doc, lines, path) ?? rangeFor(doc, lines, path);
  const output = outputOf(kind, path);
  const text = scalarText(doc, locate(doc, path)?.value);
  if (text === undefined) {
    return diagnostic('wrong-type', range, `${label} needs a number with its unit, such as \`${quantityExample(meta.kind)}\`, not an empty value, list or mapping.`, output);
  }
  const parsed = parseQuantity(meta.kind, text);
  if (!parsed.ok) return diagnostic(parsed.code, range, parsed.message, output);
  // A relative tolerance has no bound in hertz; only its sign is checked.
  const bounds = meta.kind === 'tolerance' ? { ...meta, max: undefined } : meta;
  if (!inBounds(parsed.value, bounds)) {
    return diagnostic('out-of-range', range, `${label} must be ${boundsText(bounds, parsed.base)}: change \`${text.trim()}\`.`, output);
  }
  // Whatever the key's own bounds: a magnitude every derived figure can be computed with.
  const size = magnitudeProblem(meta.kind, parsed.value, parsed.base);
  if (size) return diagnostic('out-of-range', range, `${label} must be ${size}: change \`${text.trim()}\`.`, output);
  quantities.set(path, { value: parsed.value, base: parsed.base, unit: parsed.unit, text: text.trim() });
  return undefined;
}
