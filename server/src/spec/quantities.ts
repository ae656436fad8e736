// Reads every quantity key of a spec from its source text, exactly, and checks its bounds.
// The results are what the models build Hardware and OutputRequests from.

import type { Document } from 'yaml';
import { type FileKind, listKeys } from '../../../shared-schema/src/keys';
import { type BaseUnit, parseQuantity, quantityExample } from '../../../shared-schema/src/quantity';
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

/** Concrete paths of every quantity key that exists in the document (`*` expanded to output names). */
function presentPaths(kind: FileKind, doc: Document.Parsed, data: unknown): { path: Path; meta: QuantityMeta }[] {
  const names =
    kind === 'wave' && data && typeof data === 'object' && (data as Record<string, unknown>).outputs && typeof (data as Record<string, unknown>).outputs === 'object'
      ? Object.keys((data as Record<string, object>).outputs)
      : [];
  const out: { path: Path; meta: QuantityMeta }[] = [];
  for (const info of listKeys(kind)) {
    if (info.type !== 'quantity' || !info.quantity) continue;
    const parts = info.path.split('.');
    const concrete = parts[1] === '*' ? names.map((n) => [parts[0], n, ...parts.slice(2)]) : [parts];
    for (const path of concrete) if (locate(doc, path)) out.push({ path, meta: info.quantity.bounds });
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
    const label = `\`${path[path.length - 1]}\``;
    const range = valueRange(doc, lines, path) ?? rangeFor(doc, lines, path);
    const output = outputOf(kind, path);
    const text = scalarText(doc, locate(doc, path)?.value);
    if (text === undefined) {
      diagnostics.push(diagnostic('wrong-type', range, `${label} needs a number with its unit, such as \`${quantityExample(meta.kind)}\`, not an empty value, list or mapping.`, output));
      continue;
    }
    const parsed = parseQuantity(meta.kind, text);
    if (!parsed.ok) {
      diagnostics.push(diagnostic(parsed.code, range, parsed.message, output));
      continue;
    }
    // A relative tolerance has no bound in hertz; only its sign is checked.
    const bounds = meta.kind === 'tolerance' ? { ...meta, max: undefined } : meta;
    if (!inBounds(parsed.value, bounds)) {
      diagnostics.push(diagnostic('out-of-range', range, `${label} must be ${boundsText(bounds, parsed.base)}: change \`${text.trim()}\`.`, output));
      continue;
    }
    quantities.set(path, { value: parsed.value, base: parsed.base, unit: parsed.unit, text: text.trim() });
  }
  return { quantities, diagnostics };
}

