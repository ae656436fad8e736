// The system clock's share of an output's error, as the annotation and the hover show it: the
// plan's part and the clock's part of the worst case the tolerance is checked against.

import { toNumber } from '../../../shared-schema/src/rational';
import { errorBudget } from '../planning/clock-error';
import type { Hardware } from '../planning/types';
import type { OutputAnalysis } from '../spec/types';
import { formatPpm } from '../cli/units';

const clockPart = (hw: Hardware | null) => {
  const e = hw?.systemClockTolerance;
  return e && e.num !== 0n ? e : null;
};
const unsigned = (ppm: number): string => formatPpm(ppm).replace(/^\+/, '');

/** " · worst 90.69 ppm with the clock's ±50 ppm" for the annotation; '' without a clock tolerance. */
export function clockShareHint(output: OutputAnalysis, hw: Hardware | null): string {
  const e = clockPart(hw);
  const plan = output.planning.plan;
  if (!e || !plan) return '';
  const b = errorBudget(plan, output.targetHz, e);
  return ` · worst ${unsigned(b.worstPpm)} with the clock's ±${unsigned(toNumber(e) * 1e6)}`;
}

/** The hover's line: both parts of the worst case and which one dominates. */
export function clockBudgetLine(output: OutputAnalysis, hw: Hardware | null): string | undefined {
  const e = clockPart(hw);
  const plan = output.planning.plan;
  if (!e || !plan) return undefined;
  const b = errorBudget(plan, output.targetHz, e);
  const dominant = b.clockDominates ? "the clock's share dominates" : "the plan's share dominates";
  return `Worst case with the system clock's ±${unsigned(toNumber(e) * 1e6)} (system-clock-tolerance): ${unsigned(b.worstPpm)} = plan ${formatPpm(b.planPpm)} + clock ${unsigned(b.clockPpm)}, ${output.planning.withinTolerance ? 'within' : 'outside'} the tolerance; ${dominant}.`;
}
