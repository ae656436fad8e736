// Lookups from a YAML key path to what the schema says about it: description, value type,
// allowed values, units and default. Hover, completion, "did you mean" and the generated
// reference all read the zod schemas through here, so they cannot drift apart.

import { z } from 'zod';
import { clockSchema } from './clock-schema';
import { waveSchema } from './wave-schema';
import { type QuantityKind, type BaseUnit, describeKind, plainUnitOf, unitsOf } from './quantity';
import { type QuantityMeta, defaultTextRegistry, quantityRegistry, shapesRegistry } from './schema-kit';

export type FileKind = 'wave' | 'clock';

export type ValueType = 'object' | 'map' | 'list' | 'text' | 'whole number' | 'number' | 'true/false' | 'choice' | 'quantity';

export interface KeyInfo {
  /** Dotted path; `*` stands for any output name, e.g. `outputs.*.frequency`. */
  path: string;
  key: string;
  description: string;
  type: ValueType;
  required: boolean;
  /** The default as written in a file (`50 ppm`), or in words when it depends on other keys. */
  default?: string;
  /** True when `default` is words ("the DAC's full scale"), not a value to write. */
  defaultInWords?: boolean;
  /** Allowed values of a choice, or `true`/`false`. */
  values?: string[];
  quantity?: { kind: QuantityKind; what: string; units: string[]; plain: BaseUnit | null; bounds: QuantityMeta };
  /** Whole-number bounds. */
  min?: number;
  max?: number;
  /** Known keys of an object (empty for leaves and maps). */
  children: string[];
  /** A list's items: what each one is. */
  items?: KeyInfo;
  /** The waveform shapes the key applies to, when not every shape (see `appliesTo`). */
  shapes?: readonly string[];
}

export const schemaOf = (kind: FileKind): z.ZodType => (kind === 'clock' ? clockSchema : waveSchema);

type Def = { type: string; innerType?: z.ZodType; shape?: Record<string, z.ZodType>; valueType?: z.ZodType; element?: z.ZodType; entries?: Record<string, string>; options?: z.ZodType[] };
const defOf = (s: z.ZodType): Def => (s as unknown as { _zod: { def: Def } })._zod.def;

function unwrap(s: z.ZodType): z.ZodType {
  let cur = s;
  while (defOf(cur).type === 'optional' && defOf(cur).innerType) cur = defOf(cur).innerType!;
  return cur;
}

/** The schema of the key at `path` (as declared, optional wrapper included), or undefined. */
function schemaAt(kind: FileKind, path: readonly (string | number)[]): z.ZodType | undefined {
  let cur: z.ZodType = schemaOf(kind);
  for (const part of path) {
    const inner = unwrap(cur);
    const def = defOf(inner);
    if (def.type === 'object' && def.shape) {
      if (typeof part !== 'string' || !Object.hasOwn(def.shape, part)) return undefined;
      cur = def.shape[part];
    } else if (def.type === 'record' && def.valueType) {
      cur = def.valueType;
    } else if (def.type === 'array' && def.element && typeof part === 'number') {
      cur = def.element;
    } else {
      return undefined;
    }
  }
  return cur;
}

function describe(declared: z.ZodType, path: readonly (string | number)[], pathText: string): KeyInfo {
  const inner = unwrap(declared);
  const def = defOf(inner);
  const meta = z.globalRegistry.get(declared) ?? z.globalRegistry.get(inner);
  const q = quantityRegistry.get(inner);
  const info: KeyInfo = {
    path: pathText,
    key: String(path[path.length - 1] ?? ''),
    description: declared.description ?? inner.description ?? '',
    type: 'text',
    required: defOf(declared).type !== 'optional',
    children: [],
  };
  const shapes = shapesRegistry.get(declared) ?? shapesRegistry.get(inner);
  if (shapes) info.shapes = shapes.shapes;
  const derived = defaultTextRegistry.get(declared);
  if (meta?.default !== undefined) info.default = String(meta.default);
  else if (derived) {
    info.default = derived.text;
    info.defaultInWords = true;
  }
  if (q) {
    info.type = 'quantity';
    info.quantity = { kind: q.kind, what: describeKind(q.kind), units: unitsOf(q.kind), plain: plainUnitOf(q.kind), bounds: q };
  } else if (def.type === 'object' && def.shape) {
    info.type = 'object';
    info.children = Object.keys(def.shape);
  } else if (def.type === 'record') {
    info.type = 'map';
  } else if (def.type === 'array' && def.element) {
    info.type = 'list';
    info.items = describe(def.element, [...path, 0], `${pathText}[]`);
  } else if (def.type === 'enum' && def.entries) {
    info.type = 'choice';
    info.values = Object.values(def.entries);
  } else if (def.type === 'union' && def.options?.some((o) => defOf(o).type === 'enum')) {
    // Words or a quantity (`band-limit: nyquist` or `band-limit: 20 kHz`): a choice whose
    // quantity the spec layer reads itself when the value is not one of the words.
    info.type = 'choice';
    info.values = def.options.flatMap((o) => Object.values(defOf(o).entries ?? {}));
    const other = def.options.map((o) => quantityRegistry.get(o)).find((m) => m !== undefined);
    if (other) info.quantity = { kind: other.kind, what: describeKind(other.kind), units: unitsOf(other.kind), plain: plainUnitOf(other.kind), bounds: other };
  } else if (def.type === 'boolean') {
    info.type = 'true/false';
    info.values = ['true', 'false'];
  } else if (def.type === 'number') {
    const n = inner as z.ZodNumber;
    info.type = n.isInt ? 'whole number' : 'number';
    info.min = n.minValue ?? undefined;
    info.max = n.maxValue ?? undefined;
  }
  return info;
}

const normalise = (kind: FileKind, path: readonly (string | number)[]): (string | number)[] =>
  kind === 'wave' && path[0] === 'outputs' && path.length >= 2 ? ['outputs', '*', ...path.slice(2)] : [...path];

/** `outputs.*.steps[].frequency`: a list item's index is written `[]`. */
const pathText = (parts: readonly (string | number)[]): string => parts.map((p) => (typeof p === 'number' ? '[]' : p)).join('.').replace(/\.\[\]/g, '[]');

/** What the schema says about the key at `path` (e.g. ['outputs', 'coil', 'frequency']). */
export function lookupKey(kind: FileKind, given: readonly (string | number)[]): KeyInfo | undefined {
  // `steps[]` (as the reference writes it) stands for the key and any item of its list.
  const path = given.flatMap((p) => (typeof p === 'string' && p.endsWith('[]') ? [p.slice(0, -2), 0] : [p]));
  const declared = schemaAt(kind, path);
  if (!declared) return undefined;
  return describe(declared, path, pathText(normalise(kind, path)));
}

/**
 * The keys an object at `path` accepts (completion, "did you mean"); [] when it is not an object.
 * With `shape` (an output's, as written), only the keys that apply to that shape.
 */
export function childKeys(kind: FileKind, path: readonly (string | number)[], shape?: string): string[] {
  const keys = lookupKey(kind, path)?.children ?? [];
  if (shape === undefined) return keys;
  return keys.filter((key) => {
    const shapes = lookupKey(kind, [...path, key])?.shapes;
    return !shapes || shapes.includes(shape);
  });
}

/** Every key of a file kind, depth first in schema order, for the generated reference. */
export function listKeys(kind: FileKind): KeyInfo[] {
  const out: KeyInfo[] = [];
  const visit = (path: (string | number)[]) => {
    const info = lookupKey(kind, path);
    if (!info) return;
    if (path.length > 0) out.push(info);
    if (info.type === 'object') for (const child of info.children) visit([...path, child]);
    if (info.type === 'map') visit([...path, '*']);
    // A list of mappings: the keys of its items (`outputs.*.steps[].frequency`).
    if (info.type === 'list' && info.items?.type === 'object') for (const child of info.items.children) visit([...path, 0, child]);
  };
  visit([]);
  return out;
}

let outputShapes: ReadonlyMap<string, readonly string[]> | undefined;

/** The output keys that apply to some shapes only, with those shapes (read once from the schema). */
export function shapeLimitedKeys(): ReadonlyMap<string, readonly string[]> {
  outputShapes ??= new Map(
    childKeys('wave', ['outputs', '*']).flatMap((key) => {
      const shapes = lookupKey('wave', ['outputs', '*', key])?.shapes;
      return shapes ? [[key, shapes] as const] : [];
    }),
  );
  return outputShapes;
}
