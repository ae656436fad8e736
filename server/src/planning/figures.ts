// Everything reported about one plan: sample rate, error in ppm, jitter, seam, memory, and for
// shapes with edges the duty the table really has and how far its edges wander.

import { div, fromNumber, toNumber } from '../../../shared-schema/src/rational';
import { edgeWanderSamples, tableDuty } from './duty';
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
  const sampleRateHz = div(hw.systemClockHz, dividerOf(plan));
  const square = waveform.shape === 'square' && !waveform.custom;
  const asked = waveform.dutyExact ?? fromNumber(waveform.duty);
  return {
    ...plan,
    ...(stages !== null && plan.dividerFraction === 0 ? { dividerStages: stages } : {}),
    systemClockHz: hw.systemClockHz,
    sampleRateHz,
    errorPpm: toNumber(div(plan.errorHz, req.targetHz)) * 1e6,
    jitterFree: plan.dividerFraction === 0,
    jitter: dividerJitter(hw.systemClockHz, plan),
    seam: seamCheck(waveform, hw.dac, plan.tableLength, plan.cycles, span),
    tableBytes: tableBytes(hw, plan.tableLength),
    // Only the shapes they belong to carry them (absent, not null, elsewhere).
    ...(square ? { dutyAsked: asked, dutyAchieved: tableDuty(asked, plan.tableLength, plan.cycles, span) } : {}),
    ...(waveform.shape === 'sine' ? {} : { edgeWanderS: edgeWanderSamples(plan.tableLength, plan.cycles, span) / toNumber(sampleRateHz) }),
  };
}
