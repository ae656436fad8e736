// Everything reported about one plan: sample rate, error in ppm, jitter, seam and memory.

import { div, toNumber } from '../../../shared-schema/src/rational';
import { dividerJitter, dividerOf } from './jitter';
import { tableBytes } from './memory';
import { seamCheck } from './seam';
import type { Hardware, Plan, PlanFigures, PlanRequest, TableSpan, Waveform } from './types';

/** The figures of a plan (its divider must be > 0). */
export function describePlan(
  hw: Hardware,
  req: PlanRequest,
  waveform: Waveform,
  plan: Plan,
  span: TableSpan,
): PlanFigures {
  return {
    ...plan,
    systemClockHz: hw.systemClockHz,
    sampleRateHz: div(hw.systemClockHz, dividerOf(plan)),
    errorPpm: toNumber(div(plan.errorHz, req.targetHz)) * 1e6,
    jitterFree: plan.dividerFraction === 0,
    jitter: dividerJitter(hw.systemClockHz, plan),
    seam: seamCheck(waveform, hw.dac, plan.tableLength, plan.cycles, span),
    tableBytes: tableBytes(hw, plan.tableLength),
  };
}
