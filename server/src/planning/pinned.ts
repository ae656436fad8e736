// A plan written into the spec by hand: its exact figures and what it breaks.

import { type Rational, rat, sub, mul, div, cmp, sign, isInteger } from '../../../shared-schema/src/rational';
import { dividerOf } from './jitter';
import { splitDivider } from './stages';
import type { Hardware, PinnedPlan, Plan } from './types';

/** Stable names of what a pinned plan can get wrong (the spec layer maps them to diagnostics). */
export type PinnedProblem =
  | 'divider-integer-out-of-range'
  | 'divider-not-stage-product'
  | 'divider-fraction-out-of-range'
  | 'sample-rate-too-high'
  | 'table-length-out-of-range'
  | 'table-length-not-power-of-two'
  | 'table-over-budget'
  | 'cycles-not-positive'
  | 'cycles-not-whole';

export function pinnedProblems(hw: Hardware, pinned: PinnedPlan): PinnedProblem[] {
  const problems: PinnedProblem[] = [];
  const { integerMin, integerMax, fractionBits } = hw.divider;
  const I = pinned.dividerInteger;
  const F = pinned.dividerFraction;
  const N = pinned.tableLength;
  if (!Number.isInteger(I) || I < integerMin || I > integerMax) problems.push('divider-integer-out-of-range');
  if (!Number.isInteger(F) || F < 0 || F >= 2 ** fractionBits) problems.push('divider-fraction-out-of-range');
  const stages = hw.divider.stages;
  if (stages !== undefined && I >= integerMin && I <= integerMax && splitDivider(stages, I) === null) problems.push('divider-not-stage-product');
  const d = dividerOf({ dividerInteger: I, dividerFraction: F, fractionBits });
  if (sign(d) > 0 && cmp(div(hw.systemClockHz, d), hw.dac.maxSampleRateHz) > 0) problems.push('sample-rate-too-high');
  if (!Number.isInteger(N) || N < hw.memory.tableLengthMin || N > hw.memory.tableLengthMax) {
    problems.push('table-length-out-of-range');
  }
  if (hw.memory.powerOfTwo && !(Number.isInteger(N) && N > 0 && (N & (N - 1)) === 0 && N <= 2 ** 30)) {
    problems.push('table-length-not-power-of-two');
  }
  if (N * hw.dac.sampleBytes > hw.memory.budgetBytes) problems.push('table-over-budget');
  if (sign(pinned.cycles) <= 0) problems.push('cycles-not-positive');
  else if (!isInteger(pinned.cycles)) problems.push('cycles-not-whole');
  return problems;
}

/**
 * The pinned plan's exact figures: f_out = f_sys·M/(D·N). Null when they do not exist
 * (D ≤ 0, N < 1 or not whole), since no frequency can be named then.
 */
export function pinnedPlan(hw: Hardware, pinned: PinnedPlan, targetHz: Rational): Plan | null {
  const { dividerInteger, dividerFraction, tableLength, cycles } = pinned;
  if (!Number.isInteger(dividerInteger) || !Number.isInteger(dividerFraction)) return null;
  if (!Number.isInteger(tableLength) || tableLength < 1) return null;
  const d = dividerOf({ dividerInteger, dividerFraction, fractionBits: hw.divider.fractionBits });
  if (sign(d) <= 0) return null;
  const achievedHz = div(mul(hw.systemClockHz, cycles), mul(d, rat(BigInt(tableLength))));
  return {
    dividerInteger,
    dividerFraction,
    fractionBits: hw.divider.fractionBits,
    tableLength,
    cycles,
    achievedHz,
    errorHz: sub(achievedHz, targetHz),
  };
}
