// Building blocks of the two file schemas. A quantity key is a number in base units or a string
// with a unit; the registries below carry what JSON Schema cannot say (the quantity kind and the
// default written in words) to the key lookup used by hover, completion and the spec layer.

import { z } from 'zod';
import { type QuantityKind, plainUnitOf, quantityPattern } from './quantity';

export interface QuantityMeta {
  kind: QuantityKind;
  /** Bounds in base units (Hz, bytes, V, Vpp, ratio). */
  min?: number;
  minExclusive?: boolean;
  max?: number;
  maxExclusive?: boolean;
}

/** Which schema nodes are quantities, and of what kind. */
export const quantityRegistry = z.registry<QuantityMeta>();

/** Defaults that depend on other keys, in words ("the DAC's full scale"). */
export const defaultTextRegistry = z.registry<{ text: string }>();

export function quantity(meta: QuantityMeta): z.ZodType {
  const text = z.string().regex(new RegExp(quantityPattern(meta.kind)));
  let schema: z.ZodType = text;
  if (plainUnitOf(meta.kind) !== null) {
    let n = z.number();
    if (meta.min !== undefined) n = meta.minExclusive ? n.gt(meta.min) : n.gte(meta.min);
    if (meta.max !== undefined) n = meta.maxExclusive ? n.lt(meta.max) : n.lte(meta.max);
    schema = z.union([n, text]);
  }
  quantityRegistry.add(schema, meta);
  return schema;
}

/** A required key with its documentation. */
export const required = <T extends z.ZodType>(schema: T, description: string): T => schema.describe(description);

/** An optional key; `fallback` is its default, shown in the JSON Schema and the docs. */
export function optional<T extends z.ZodType>(schema: T, description: string, fallback?: string | number | boolean) {
  const opt = schema.optional();
  return fallback === undefined ? opt.meta({ description }) : opt.meta({ description, default: fallback });
}

/** An optional key whose default depends on other keys and is given in words. */
export function optionalDerived<T extends z.ZodType>(schema: T, description: string, defaultText: string) {
  const opt = schema.optional().meta({ description });
  defaultTextRegistry.add(opt, { text: defaultText });
  return opt;
}

/** A whole number within bounds (counts, bits, table lengths). */
export const whole = (min: number, max: number) => z.number().int().min(min).max(max);

/**
 * Keys that apply to some waveform shapes only (`duty` to a square): completion offers them, and
 * the check accepts them without an `unused-key` warning, under those shapes alone.
 */
export const shapesRegistry = z.registry<{ shapes: readonly string[] }>();

/** Marks each named key of an object schema as applying only to the listed shapes. */
export function appliesTo<S extends Record<string, z.ZodType>>(shape: S, keys: { [K in keyof S]?: readonly string[] }): void {
  for (const [key, shapes] of Object.entries(keys) as [keyof S & string, readonly string[]][]) shapesRegistry.add(shape[key], { shapes });
}
