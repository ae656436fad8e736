// How a divider built of counter stages shows in the editor: the stage values (their product is
// D) and what each register holds, read off the plan. Absent for the integer-plus-fraction form.

import type { PlanFigures } from '../planning/types';
import { formatDivider } from '../cli/units';

/** Hover rows: "prescaler 12 (register 11) × period 1000 (register 999)". */
export function stageRows(plan: PlanFigures): string[][] {
  if (plan.dividerStages === undefined) return [];
  return [['divider stages', plan.dividerStages.map((st) => `${st.name} ${st.value} (register ${st.register})`).join(' × ')]];
}

/** The divider for an annotation: "÷12×1000" with stages, else the usual "÷12000" or "÷22+85/256". */
export function dividerHint(plan: PlanFigures): string {
  if (plan.dividerStages === undefined || plan.dividerStages.length < 2) return formatDivider(plan);
  return `÷${plan.dividerStages.map((st) => st.value).join('×')}`;
}
