// The system clock's tolerance in an output's verdict: the worst case the tolerance is checked
// against, in words, and the error when the clock alone exceeds what the output allows.

import { formatHz } from '../../../shared-schema/src/quantity-format';
import { toNumber } from '../../../shared-schema/src/rational';
import { clockAloneExceeds, errorBudget } from '../planning/clock-error';
import type { Hardware, PlanFigures } from '../planning/types';
import { relativeText } from './clock-tree-model';
import { diagnostic } from './source';
import type { OutputDraft } from './wave-model';
import type { SpecDiagnostic } from './types';

const ppm = (x: number): string => relativeText(x / 1e6);

/**
 * The worst case in words, in two parts around "outside ±tolerance": "; with the system clock's
 * ±50 ppm (system-clock-tolerance) its worst case is 90.69 ppm (plan -40.69 ppm + clock 50 ppm)"
 * and " — the clock's share dominates". Both empty without a clock tolerance.
 */
export function clockBudgetText(plan: PlanFigures, draft: OutputDraft, hw: Hardware): { worst: string; share: string } {
  const e = hw.systemClockTolerance;
  if (!e || e.num === 0n) return { worst: '', share: '' };
  const b = errorBudget(plan, draft.targetHz, e);
  const unsigned = (x: number) => ppm(x).replace(/^\+/, '');
  return {
    worst: `; with the system clock's ±${unsigned(toNumber(e) * 1e6)} (system-clock-tolerance) its worst case is ${unsigned(b.worstPpm)} (plan ${ppm(b.planPpm)} + clock ${unsigned(b.clockPpm)})`,
    share: b.clockDominates ? " — the clock's share dominates" : " — the plan's share dominates",
  };
}

/** The error when the clock's tolerance alone exceeds the output's: nothing a divider can fix. */
export function clockAccuracyDiagnostic(draft: OutputDraft, hw: Hardware, toleranceText: string): SpecDiagnostic | undefined {
  const e = hw.systemClockTolerance;
  if (!clockAloneExceeds(draft.targetHz, draft.request.toleranceHz, e)) return undefined;
  const range = draft.valueRanges.tolerance ?? draft.valueRanges.frequency ?? draft.nameRange;
  const eText = ppm(toNumber(e!) * 1e6).replace(/^\+/, '');
  return diagnostic(
    'clock-accuracy',
    range,
    `The system clock's own ±${eText} (system-clock-tolerance) already moves ${formatHz(draft.targetHz)} by up to ±${formatHz({ num: e!.num * draft.targetHz.num, den: e!.den * draft.targetHz.den })}, more than ±${toleranceText} allows, whatever the divider and table: use a more accurate clock source or widen the tolerance.`,
    draft.name,
  );
}
