// What the planner's verdict on an output with frequency steps says: each step that misses its
// tolerance on the shared table, and the steps that need a fractional divider (with the jitter
// it adds), each on the step's own frequency in the file.

import { formatHz } from '../../../shared-schema/src/quantity-format';
import { withinWorstCase } from '../planning/clock-error';
import type { Hardware, PlanFigures } from '../planning/types';
import { diagnostic } from './source';
import type { SpecDiagnostic } from './types';
import type { OutputDraft } from './wave-model';

export function stepsDiagnostics(
  draft: OutputDraft,
  steps: readonly PlanFigures[],
  hw: Hardware,
  planText: (p: PlanFigures) => string,
  jitterText: (p: PlanFigures) => string,
): SpecDiagnostic[] {
  const out: SpecDiagnostic[] = [];
  const targets = draft.request.steps ?? [];
  const at = (i: number) => draft.valueRanges[`steps.${i}`] ?? draft.nameRange;
  steps.forEach((p, i) => {
    const target = targets[i];
    if (target === undefined) return;
    if (!withinWorstCase(p, target.toleranceHz, hw.systemClockTolerance)) {
      out.push(
        diagnostic(
          'out-of-tolerance',
          at(i),
          `Step ${i + 1} of ${steps.length} (${formatHz(target.targetHz)}) gets ${planText(p)} on the table the steps share, outside ±${formatHz(target.toleranceHz)}: widen its tolerance, allow jitter, or change the clock.`,
          draft.name,
        ),
      );
    } else if (!p.jitterFree) {
      out.push(
        diagnostic(
          'fractional-plan',
          at(i),
          `Only a fractional divider meets step ${i + 1}'s ±${formatHz(target.toleranceHz)} on the shared table: ${planText(p)} with ${jitterText(p)} — accept it, or widen its tolerance for a whole divider.`,
          draft.name,
        ),
      );
    }
  });
  return out;
}
