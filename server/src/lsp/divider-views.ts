// How a divider built of counter stages shows in the hover card: each stage's value (their product
// is D, which formatDivider shows as "÷3×25000") and what its register holds, read off the plan.
// Absent for the integer-plus-fraction form.

import type { PlanFigures } from '../planning/types';

/** Hover rows: "prescaler 3 (register 2) × period 25000 (register 24999)". */
export function stageRows(plan: PlanFigures): string[][] {
  if (plan.dividerStages === undefined) return [];
  return [['divider stages', plan.dividerStages.map((st) => `${st.name} ${st.value} (register ${st.register})`).join(' × ')]];
}
