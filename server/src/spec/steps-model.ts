// An output's `steps:` → the frequencies (and tolerances) the planner shares one table among.
// Each step's quantities are read exactly from their source text, like every quantity key; a
// step without its own tolerance takes the output's.

import type { Document } from 'yaml';
import { MAX_FREQUENCY_HZ } from '../../../shared-schema/src/clock-schema';
import { type BaseUnit, MIN_FREQUENCY_HZ, type QuantityResult, parseQuantity, toleranceHz } from '../../../shared-schema/src/quantity';
import { cmp, fromNumber, sign } from '../../../shared-schema/src/rational';
import type { StepTarget } from '../planning/steps';
import { diagnostic, type LineIndex } from './source';
import { locate, rangeFor, scalarText, valueRange } from './nodes';
import type { Range, SpecDiagnostic } from './types';

type Parsed = Extract<QuantityResult, { ok: true }>;

/**
 * The steps of output `name`, in file order, with the range of each step's frequency (keyed
 * `steps.<i>` for the diagnostics about it). Null, with diagnostics, when one cannot be read.
 */
export function readSteps(
  name: string,
  count: number,
  outputTolerance: { value: Parsed['value']; base: BaseUnit },
  doc: Document.Parsed,
  lines: LineIndex,
): { steps: StepTarget[] | null; ranges: Record<string, Range>; diagnostics: SpecDiagnostic[] } {
  const diagnostics: SpecDiagnostic[] = [];
  const ranges: Record<string, Range> = {};
  const steps: StepTarget[] = [];
  const read = (i: number, key: string, kind: 'frequency' | 'tolerance'): Parsed | undefined => {
    const path = ['outputs', name, 'steps', i, key];
    const node = locate(doc, path);
    if (!node) return undefined;
    const range = valueRange(doc, lines, path) ?? rangeFor(doc, lines, path);
    if (key === 'frequency') ranges[`steps.${i}`] = range;
    const text = scalarText(doc, node.value);
    const parsed = text === undefined ? undefined : parseQuantity(kind, text);
    if (parsed === undefined || !parsed.ok) {
      diagnostics.push(diagnostic(parsed?.code ?? 'wrong-type', range, parsed?.message ?? `\`${key}\` needs a number with its unit, such as \`440 Hz\`.`, name));
      return undefined;
    }
    const outside = kind === 'frequency' && (cmp(parsed.value, fromNumber(MIN_FREQUENCY_HZ)) < 0 || cmp(parsed.value, fromNumber(MAX_FREQUENCY_HZ)) > 0);
    if (outside || sign(parsed.value) < 0) {
      diagnostics.push(diagnostic('out-of-range', range, `Step ${i + 1}'s ${key} \`${text}\` must be ${kind === 'frequency' ? 'at least 1 µHz and at most 100 GHz' : '0 or more'}.`, name));
      return undefined;
    }
    return parsed;
  };
  for (let i = 0; i < count; i++) {
    const frequency = read(i, 'frequency', 'frequency');
    const tolerance = read(i, 'tolerance', 'tolerance') ?? outputTolerance;
    if (frequency === undefined) continue;
    steps.push({ targetHz: frequency.value, toleranceHz: toleranceHz(tolerance, frequency.value) });
  }
  return { steps: steps.length === count && diagnostics.length === 0 ? steps : null, ranges, diagnostics };
}
