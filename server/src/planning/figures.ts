// Everything reported about one plan: sample rate, error in ppm, jitter, seam and memory.

import { div, toNumber } from '../../../shared-schema/src/rational';
import { dividerJitter, dividerOf } from './jitter';
import { tableBytes } from './memory';
import { seamCheck } from './seam';
import { splitDivider } from './stages';
import type { Hardware, Plan, PlanFigures, PlanRequest, TableSpan, Waveform } from './types';

/** The figures of a plan (its divider must be > 0). */
export function describePlan(
  hw: Hardware,
  req: PlanRequest,
  waveform: Waveform,
  plan: Plan,
  span: TableSpan,
): PlanFigures {
  const stages = hw.divider.stages === undefined ? null : splitDivider(hw.divider.stages, plan.dividerInteger);
  return {
    ...plan,
    ...(stages !== null && plan.dividerFraction === 0 ? { dividerStages: stages } : {}),
    systemClockHz: hw.systemClockHz,
    sampleRateHz: div(hw.systemClockHz, dividerOf(plan)),
    errorPpm: toNumber(div(plan.errorHz, req.targetHz)) * 1e6,
    jitterFree: plan.dividerFraction === 0,
    jitter: dividerJitter(hw.systemClockHz, plan),
    seam: seamCheck(waveform, hw.dac, plan.tableLength, plan.cycles, span),
    tableBytes: tableBytes(hw, plan.tableLength),
  };
}
