// How a divider built of counter stages and frequency steps show in the editor, read off the
// analysis: each stage's value (their product is D, which formatDivider shows as "÷3×25000") and
// what its register holds; the step table of a stepped output and its worst step in one phrase.

import type { PlanFigures } from '../planning/types';
import type { OutputAnalysis } from '../spec/types';
import { formatDivider, formatHz, formatPpm } from '../cli/units';

/** Hover rows: "prescaler 3 (register 2) × period 25000 (register 24999)". */
export function stageRows(plan: PlanFigures): string[][] {
  if (plan.dividerStages === undefined) return [];
  return [['divider stages', plan.dividerStages.map((st) => `${st.name} ${st.value} (register ${st.register})`).join(' × ')]];
}

/** The step with the largest |error| in ppm, for the annotation: "13 steps, worst -17.45 ppm". */
export function stepsHint(output: OutputAnalysis): string {
  const steps = output.planning.steps;
  if (steps === undefined || steps.length === 0) return '';
  const worst = steps.reduce((a, b) => (Math.abs(b.errorPpm) > Math.abs(a.errorPpm) ? b : a));
  return ` · ${steps.length} steps, worst ${formatPpm(worst.errorPpm)}`;
}

/** The hover's step table: each step's target, what it gets and its divider on the shared table. */
export function stepsTable(output: OutputAnalysis): string[] {
  const steps = output.planning.steps;
  const targets = output.request.steps;
  if (steps === undefined || targets === undefined) return [];
  const cell = (t: string): string => t.replace(/\|/g, '\\|');
  return [
    '',
    `${steps.length} frequency steps on this one table (N = ${steps[0]?.tableLength}, M = ${steps[0]?.cycles.num}); the firmware writes each step's divider:`,
    '',
    '| step | target | achieved | error | divider |',
    '|---|---|---|---|---|',
    ...steps.map((p, i) => `| ${i + 1} | ${cell(formatHz(targets[i]!.targetHz))} | ${cell(formatHz(p.achievedHz))} | ${cell(formatPpm(p.errorPpm))} | ${cell(formatDivider(p))} |`),
  ];
}
