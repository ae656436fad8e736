// A wave spec's outputs → OutputRequests for the planner, with the checks that need the clock
// file's hardware: clipping against the DAC's range, the Nyquist floor, and a pinned plan the
// hardware cannot run.

import { type Document, isMap, isScalar } from 'yaml';
import type { OutputEntry } from '../../../shared-schema/src/wave-schema';
import {
  DEFAULT_DUTY,
  DEFAULT_DUTY_TOLERANCE,
  DEFAULT_JITTER,
  DEFAULT_WHOLE_SAMPLES_PER_CYCLE,
  DEFAULT_MIN_SAMPLES_PER_CYCLE,
  DEFAULT_TABLE_SPAN,
  DEFAULT_TOLERANCE,
  NYQUIST_SAMPLES_PER_CYCLE,
} from '../../../shared-schema/src/defaults';
import { shapeLimitedKeys } from '../../../shared-schema/src/keys';
import { parseQuantity, toleranceHz } from '../../../shared-schema/src/quantity';
import { formatHz, formatVolts } from '../../../shared-schema/src/quantity-format';
import { type Rational, add, cmp, div, floor, fromNumber, isInteger, mul, rat, sub, toDecimal, toNumber } from '../../../shared-schema/src/rational';
import { defaultMaxSamplesPerCycle } from '../planning/ceiling';
import { pinnedProblems } from '../planning/pinned';
import { splitDivider, stageProducts } from '../planning/stages';
import type { Hardware, OutputRequest, PinnedPlan } from '../planning/types';
import { diagnostic, type LineIndex } from './source';
import { placeholderFor } from './schema-issues';
import { customTable } from './custom-model';
import type { SampleSource } from './sample-file';
import { readSteps } from './steps-model';
import { entryRange, keyRange, locate, valueRange } from './nodes';
import type { Quantities } from './quantities';
import type { OutputAnalysis, Range, SpecDiagnostic } from './types';

/** An output ready to plan: everything of its analysis but the planning. */
export type OutputDraft = Omit<OutputAnalysis, 'planning'>;

/** Output names in file order, with their entries as plain data. */
export function outputNames(doc: Document.Parsed): string[] {
  const outputs = locate(doc, ['outputs'])?.value;
  if (!isMap(outputs)) return [];
  return outputs.items.flatMap((p) => (isScalar(p.key) ? [String(p.key.value)] : []));
}

function rangesOf(doc: Document.Parsed, lines: LineIndex, name: string): Record<string, Range> {
  const ranges: Record<string, Range> = {};
  const entry = locate(doc, ['outputs', name])?.value;
  if (!isMap(entry)) return ranges;
  for (const pair of entry.items) {
    if (!isScalar(pair.key)) continue;
    const key = String(pair.key.value);
    const r = valueRange(doc, lines, ['outputs', name, key]);
    if (r) ranges[key] = r;
    if (key === 'plan' && isMap(pair.value)) {
      for (const sub of pair.value.items) {
        if (!isScalar(sub.key)) continue;
        const sr = valueRange(doc, lines, ['outputs', name, 'plan', String(sub.key.value)]);
        if (sr) ranges[`plan.${String(sub.key.value)}`] = sr;
      }
    }
  }
  return ranges;
}

/** "square waves", "square, triangle and sawtooth waves". */
const shapeWords = (shapes: readonly string[]): string =>
  `${shapes.length > 1 ? `${shapes.slice(0, -1).join(', ')} and ${shapes[shapes.length - 1]}` : shapes[0]} waves`;

/** A documented default, parsed by the same code as a value the engineer wrote. */
function parseDefault(kind: 'tolerance' | 'duty', text: string) {
  const parsed = parseQuantity(kind, text);
  if (!parsed.ok) throw new Error(`default ${text} does not parse: ${parsed.message}`);
  return parsed;
}

/**
 * Builds one output's request. Returns the draft (null when the entry cannot be planned) and the
 * diagnostics found on the way.
 */
export function buildOutput(
  name: string,
  entry: OutputEntry,
  q: Quantities,
  hw: Hardware,
  doc: Document.Parsed,
  lines: LineIndex,
  samples?: SampleSource,
): { draft: OutputDraft | null; diagnostics: SpecDiagnostic[] } {
  const diagnostics: SpecDiagnostic[] = [];
  const nameRange = keyRange(doc, lines, ['outputs', name])!;
  const valueRanges = rangesOf(doc, lines, name);
  const at = (key: string): Range => valueRanges[key] ?? nameRange;
  const get = (...key: string[]) => q.get(['outputs', name, ...key]);
  const push = (code: Parameters<typeof diagnostic>[0], range: Range, message: string) => diagnostics.push(diagnostic(code, range, message, name));

  const tolerance = get('tolerance') ?? parseDefault('tolerance', DEFAULT_TOLERANCE);
  // One frequency, or steps on one table (steps-model.ts).
  const stepped = entry.steps === undefined ? null : readSteps(name, entry.steps.length, tolerance, doc, lines);
  if (stepped !== null) {
    diagnostics.push(...stepped.diagnostics);
    Object.assign(valueRanges, stepped.ranges);
    if (entry.frequency !== undefined) push('unused-key', keyRange(doc, lines, ['outputs', name, 'frequency']) ?? at('frequency'), 'frequency is not read when steps lists the frequencies: remove it, or the steps.');
    if (entry.plan !== undefined) push('unused-key', keyRange(doc, lines, ['outputs', name, 'plan']) ?? at('plan'), 'A pinned plan is not read on an output with steps: waveplan chooses the table the steps share; remove plan, or the steps.');
  } else if (entry.frequency === undefined) {
    const d = diagnostic('missing-key', nameRange, `\`${name}\` has neither \`frequency\` nor \`steps\`: add \`frequency: 1 kHz\`, or the steps it moves through.`, name);
    d.fix = { key: 'frequency', placeholder: placeholderFor('wave', ['outputs', name, 'frequency']), parent: ['outputs', name] };
    diagnostics.push(d);
  }
  if (stepped !== null && stepped.steps === null) return { draft: null, diagnostics };
  const frequency = stepped === null ? get('frequency') : undefined;
  if (stepped === null && !frequency) return { draft: null, diagnostics };
  const steps = stepped?.steps ?? undefined;
  const targetHz = steps !== undefined ? steps[0]!.targetHz : frequency!.value;
  const shape = entry.shape;

  const floorText = get('min-samples-per-cycle');
  const minSamplesPerCycle = floorText?.value ?? rat(DEFAULT_MIN_SAMPLES_PER_CYCLE[shape]);
  if (shape === 'sine' && cmp(minSamplesPerCycle, rat(NYQUIST_SAMPLES_PER_CYCLE)) <= 0) {
    push('nyquist', at('min-samples-per-cycle'), `A sine needs more than 2 samples per cycle (Nyquist): raise min-samples-per-cycle above 2 (8 is the default).`);
  }

  // Keys the schema gives to other shapes (appliesTo); the keys that define a sine's own waveform
  // are named in custom-model.ts, with what to write instead.
  for (const [key, shapes] of shapeLimitedKeys()) {
    if (key === 'harmonics' || key === 'sample-file' || shapes.includes(shape) || entry[key as keyof OutputEntry] === undefined) continue;
    push('unused-key', keyRange(doc, lines, ['outputs', name, key]) ?? at(key), `${key} applies to ${shapeWords(shapes)} only: remove it from this ${shape}.`);
  }
  const dutyExact = (get('duty') ?? parseDefault('duty', DEFAULT_DUTY)).value;
  const duty = toNumber(dutyExact);
  const dutyTolerance = (get('duty-tolerance') ?? parseDefault('duty', DEFAULT_DUTY_TOLERANCE)).value;

  // Clipping is decided exactly: 3.3 V full scale holds 1.65 V ± 1.65 V.
  const fullScale = fromNumber(hw.dac.fullScaleV);
  // The highest code, 2^bits − 1, sits one LSB below full scale.
  const codes = 1n << BigInt(hw.dac.bits);
  const amplitude = get('amplitude')?.value ?? div(mul(fullScale, rat(codes - 1n)), rat(codes));
  const offset = get('offset')?.value ?? div(amplitude, rat(2n));
  const half = div(amplitude, rat(2n));
  const low = sub(offset, half);
  const high = add(offset, half);
  if (cmp(low, rat(0n)) < 0 || cmp(high, fullScale) > 0) {
    const where = valueRanges.amplitude ?? valueRanges.offset ?? nameRange;
    push(
      'clipping',
      where,
      `The output swings from ${formatVolts(toNumber(low))} to ${formatVolts(toNumber(high))}, outside the DAC's 0 V to ${formatVolts(hw.dac.fullScaleV)}: lower the amplitude or move the offset.`,
    );
  }

  // S max: as written (never below the floor, which rules), else derived from the swing in LSB.
  const swingLsb = fullScale.num > 0n ? toNumber(div(mul(amplitude, rat(codes)), fullScale)) : 0;
  const ceilingText = get('max-samples-per-cycle');
  // A sample file's cycle plays sample for sample at S = K, its number of values (never below the floor).
  const fileValues = shape === 'sine' && samples?.read.ok ? rat(BigInt(samples.read.count)) : undefined;
  const fileCeiling = fileValues && (cmp(fileValues, minSamplesPerCycle) < 0 ? minSamplesPerCycle : fileValues);
  let maxSamplesPerCycle = ceilingText?.value ?? fileCeiling ?? defaultMaxSamplesPerCycle(shape, swingLsb, dutyTolerance, minSamplesPerCycle);
  if (maxSamplesPerCycle !== null && cmp(maxSamplesPerCycle, minSamplesPerCycle) < 0) {
    push('samples-per-cycle', at('max-samples-per-cycle'), `max-samples-per-cycle ${toDecimal(maxSamplesPerCycle, 6)} is below min-samples-per-cycle ${toDecimal(minSamplesPerCycle, 6)}, so the floor rules: raise it or lower the floor.`);
    maxSamplesPerCycle = minSamplesPerCycle;
  }

  const targetsHz = steps !== undefined ? steps.map((st) => st.targetHz) : [targetHz];
  const custom = customTable({ name, entry, shape, duty, targetsHz, doc, lines, at, push, samples });
  if (custom === null) return { draft: null, diagnostics };
  const request: OutputRequest = {
    targetHz,
    minSamplesPerCycle,
    ...(maxSamplesPerCycle !== null ? { maxSamplesPerCycle } : {}),
    ...(shape === 'square' ? { duty: { asked: dutyExact, tolerance: dutyTolerance } } : {}),
    waveform: { shape, duty, dutyExact, amplitudeVpp: toNumber(amplitude), offsetV: toNumber(offset), exact: { amplitudeVpp: amplitude, offsetV: offset }, ...custom },
    toleranceHz: steps !== undefined ? steps[0]!.toleranceHz : toleranceHz(tolerance, targetHz),
    ...(steps !== undefined ? { steps } : {}),
    jitter: entry.jitter ?? (DEFAULT_JITTER as 'forbid'),
    wholeSamplesPerCycle: entry['whole-samples-per-cycle'] ?? DEFAULT_WHOLE_SAMPLES_PER_CYCLE[shape],
  };
  if (entry.plan && steps === undefined) {
    const pinned = pinPlan(entry.plan, request.jitter, hw, (key) => get('plan', key)?.value, (key) => valueRanges[`plan.${key}`] ?? at('plan'), push);
    if (!pinned) return { draft: null, diagnostics };
    request.pinned = pinned;
  }
  const entryR = entryRange(doc, lines, ['outputs', name]) ?? nameRange;
  const toleranceText = get('tolerance')?.text ?? DEFAULT_TOLERANCE;
  return { draft: { name, nameRange, entryRange: entryR, valueRanges, targetHz, toleranceText, request }, diagnostics };
}

type Push = (code: 'pinned-plan', range: Range, message: string) => void;

/** Checks a hand-written plan against the hardware; a divider the hardware cannot make is rounded to the nearest one it can. */
function pinPlan(
  plan: NonNullable<OutputEntry['plan']>,
  jitter: 'forbid' | 'allow',
  hw: Hardware,
  value: (key: string) => Rational | undefined,
  at: (key: string) => Range,
  push: Push,
): PinnedPlan | null {
  const divider = value('divider');
  const cycles = value('cycles');
  if (!divider || !cycles) return null;
  const k = hw.divider.fractionBits;
  const steps = 1n << BigInt(k);
  let scaled = mul(divider, rat(steps));
  if (!isInteger(scaled)) {
    // Round half up to the nearest step the divider can make.
    const nearest = floor(add(scaled, rat(1n, 2n)));
    const better = div(rat(nearest), rat(steps));
    const grid = k === 0 ? 'a whole number' : `a whole number plus a multiple of 1/${steps}`;
    push('pinned-plan', at('divider'), `The divider must be ${grid} (fraction-bits ${k}): write ${toDecimal(better, 24)}, the nearest the hardware can make.`);
    scaled = rat(nearest);
  }
  const dividerInteger = Number(scaled.num / steps);
  const dividerFraction = Number(scaled.num % steps);
  if (dividerFraction !== 0 && jitter === 'forbid') {
    push('pinned-plan', at('divider'), `This divider has a fraction, which adds divider jitter while jitter is forbid: use a whole divider or set jitter: allow.`);
  }
  const n = plan['table-length'];
  const pinned: PinnedPlan = { dividerInteger, dividerFraction, tableLength: n, cycles, span: plan['table-span'] ?? (DEFAULT_TABLE_SPAN as 'open') };
  const { tableLengthMin: nMin, tableLengthMax: nMax } = hw.memory;
  // The engine names what the plan breaks; the seam and the budget are reported with its figures.
  for (const problem of pinnedProblems(hw, pinned)) {
    if (problem === 'divider-integer-out-of-range') {
      push('pinned-plan', at('divider'), `The divider's integer part ${dividerInteger} is outside the clock file's ${hw.divider.integerMin} to ${hw.divider.integerMax}: pick a divider within it.`);
    } else if (problem === 'divider-not-stage-product') {
      push('pinned-plan', at('divider'), stageMisfit(hw, dividerInteger));
    } else if (problem === 'sample-rate-too-high') {
      const rate = div(hw.systemClockHz, div(scaled, rat(steps)));
      push('pinned-plan', at('divider'), `This divider gives a sample rate of ${formatHz(rate)}, above the DAC's max-sample-rate ${formatHz(hw.dac.maxSampleRateHz)}: use a larger divider.`);
    } else if (problem === 'table-length-out-of-range') {
      push('pinned-plan', at('table-length'), `table-length ${n} is outside the clock file's ${nMin} to ${nMax}: pick a length within it.`);
    } else if (problem === 'table-length-not-power-of-two') {
      push('pinned-plan', at('table-length'), `table-length ${n} is not a power of two, which the clock file requires: use ${2 ** Math.round(Math.log2(n))}.`);
    }
  }
  return pinned;
}

/** Why the stages cannot make divider d, with the nearest dividers they can make. */
function stageMisfit(hw: Hardware, d: number): string {
  const stages = hw.divider.stages ?? [];
  const names = stages.map((st) => `${st.name} (${st.min} to ${st.max})`).join(' × ');
  const set = stageProducts(stages);
  const near = set === null ? [] : [set.prev(set.min, d), set.next(d, set.max)].filter((v) => v > 0);
  const split = (v: number): string => (splitDivider(stages, v) ?? []).map((st) => st.value).join(' × ');
  const offer = near.length === 0 ? '' : `: the nearest they make ${near.length === 1 ? 'is' : 'are'} ${near.map((v) => `${v} (${split(v)})`).join(' and ')}`;
  return `The divider ${d} is no product of the stages ${names}${offer}.`;
}
