// The board's memory budget, after every output is planned on its own: when the own plans
// together take more than `memory.budget`, the outputs that can shrink take the smaller plans the
// engine's board fit chooses (planning/board.ts). Each shrunk output's planning diagnostics are
// those of its new plan, plus an information diagnostic naming what it gave up; when no choice
// within tolerance fits, one `over-budget` error names the outputs that take the most and the
// least total that would fit. Runs on the analysis of a whole file, read whole or output by
// output, after the per-output memo (a menu per output is memoised by its planning values). The
// steps are the planner's (planning/board-plan.ts), which the joint search over clocks shares.

import { formatBytes } from '../../../shared-schema/src/quantity-format';
import { type Rational, div, isInteger, rat, sub, toDecimal } from '../../../shared-schema/src/rational';
import { DEFAULT_TOLERANCE } from '../../../shared-schema/src/defaults';
import type { BoardFit } from '../planning/board';
import { type GroupSpec, type SpecBoard, fitSpec, fittedPlannings, newMenu, shrinkable } from '../planning/board-plan';
import { planningKey } from '../planning/cache';
import type { ShrinkMenu } from '../planning/shrink';
import type { Hardware, OutputRequest, Plan } from '../planning/types';
import { Memo } from './memo';
import { planText, planningDiagnostics } from './planning-diagnostics';
import { diagnostic } from './source';
import type { Analysis, OutputAnalysis, Range, SpecDiagnostic } from './types';

// Menus hold their frontier (one entry per table length where S rises): a small memo bounds the memory.
const menus = new Memo<string, ShrinkMenu | null>(64);

/** The menu of an output (memoised: an edit elsewhere leaves its planning values, and so its key, unchanged). */
export function menuOf(o: OutputAnalysis, hw: Hardware, own: Plan | null = o.planning.shrunkFrom ?? o.planning.plan): ShrinkMenu | null {
  if (!shrinkable(o.request, o.planning) || own === null) return null;
  return menuAt(hw, o.request, own);
}

/** The memoised menu of a request's plan `own`. */
export function menuAt(hw: Hardware, req: OutputRequest, own: Plan): ShrinkMenu | null {
  return menus.get(`${planningKey(hw, req)}|${own.dividerInteger},${own.dividerFraction},${own.tableLength},${own.cycles.num}`, () => newMenu(hw, req, own));
}

/** The outputs and groups of a wave spec's analysis as the planner sees them. */
export function specBoardOf(analysis: Analysis): SpecBoard {
  const index = new Map(analysis.outputs.map((o, i) => [o.name, i] as const));
  const groups: GroupSpec[] = (analysis.groups ?? []).map((g) => ({
    lock: g.lock,
    members: g.members.map((m) => index.get(m)!),
    offsetsDeg: g.offsetsDeg,
    sharedTable: g.offsetsAs === 'start-offset',
  }));
  return { requests: analysis.outputs.map((o) => o.request), groups };
}

/** The board fit of an analysis's outputs (their own plans when within budget). */
export function boardFit(analysis: Analysis, hw: Hardware): BoardFit {
  return fitSpec(hw, specBoardOf(analysis), analysis.outputs.map((o) => o.planning), menuAt);
}

const sText = (p: Plan): string => {
  const s: Rational = div(rat(BigInt(p.tableLength)), p.cycles);
  return isInteger(s) ? s.num.toString() : toDecimal(s, 3);
};

const sameDiagnostic = (a: SpecDiagnostic, b: SpecDiagnostic): boolean =>
  a.code === b.code && a.message === b.message && a.output === b.output &&
  a.range.start.line === b.range.start.line && a.range.start.character === b.range.start.character &&
  a.range.end.line === b.range.end.line && a.range.end.character === b.range.end.character;

/** The budget step: shrinks what must shrink, or reports that nothing within tolerance fits. */
export function fitToBudget(analysis: Analysis, hw: Hardware, outputsKey: Range, usedBytes: number): void {
  const budgetBytes = hw.memory.budgetBytes;
  analysis.memory = { usedBytes, budgetBytes };
  if (usedBytes <= budgetBytes) return;
  const fit = boardFit(analysis, hw);
  if (!fit.fits) {
    const largest = analysis.outputs
      .filter((o) => o.planning.plan !== null)
      .sort((a, b) => b.planning.plan!.tableBytes - a.planning.plan!.tableBytes || (a.name < b.name ? -1 : 1))
      .slice(0, 3)
      .map((o) => `${o.name} ${formatBytes(o.planning.plan!.tableBytes)}`);
    analysis.diagnostics.push(diagnostic('over-budget', outputsKey, `All tables together take ${formatBytes(usedBytes)}, more than the ${formatBytes(budgetBytes)} memory budget, and no choice within every output's tolerance fits: the least they can take is ${formatBytes(fit.leastBytes)} (the largest: ${largest.join(', ')}); raise the budget to that, widen tolerances, or drop an output.`));
    return;
  }
  const added: SpecDiagnostic[] = [];
  const fitted = fittedPlannings(hw, specBoardOf(analysis), analysis.outputs.map((o) => o.planning), fit);
  analysis.outputs = analysis.outputs.map((o, i) => {
    const chosen = fit.plans[i];
    if (!chosen) return o;
    const planning = fitted[i]!;
    const plan = planning.plan!;
    const toleranceText = o.toleranceText ?? DEFAULT_TOLERANCE;
    const stale = planningDiagnostics(o, o.planning, hw, toleranceText);
    analysis.diagnostics = analysis.diagnostics.filter((d) => !stale.some((s) => sameDiagnostic(s, d)));
    added.push(...planningDiagnostics(o, planning, hw, toleranceText));
    const own = o.planning.plan!;
    const gaveS = sub(div(rat(BigInt(own.tableLength)), own.cycles), div(rat(BigInt(plan.tableLength)), plan.cycles));
    const gaveText = isInteger(gaveS) ? gaveS.num.toString() : toDecimal(gaveS, 3);
    added.push(diagnostic('fitted-to-budget', o.nameRange, `To fit all tables in the ${formatBytes(budgetBytes)} memory budget this output takes ${sText(plan)} samples per cycle in ${formatBytes(plan.tableBytes)} instead of ${sText(own)} in ${formatBytes(own.tableBytes)}, giving up ${gaveText} samples per cycle and ${formatBytes(own.tableBytes - plan.tableBytes)}: ${planText(plan)}${fit.complete ? '' : ' (the best fit found within the board\'s work limit)'}.`, o.name));
    return { ...o, planning };
  });
  analysis.diagnostics.push(...added);
  analysis.memory = { usedBytes: fit.totalBytes, budgetBytes };
}
