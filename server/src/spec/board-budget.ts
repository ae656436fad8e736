// The board's memory budget, after every output is planned on its own: when the own plans
// together take more than `memory.budget`, the outputs that can shrink take the smaller plans the
// engine's board fit chooses (planning/board.ts). Each shrunk output's planning diagnostics are
// those of its new plan, plus an information diagnostic naming what it gave up; when no choice
// within tolerance fits, one `over-budget` error names the outputs that take the most and the
// least total that would fit. Runs on the analysis of a whole file, read whole or output by
// output, after the per-output memo (a menu per output is memoised by its planning values).

import { formatBytes } from '../../../shared-schema/src/quantity-format';
import { type Rational, div, isInteger, rat, sub, toDecimal } from '../../../shared-schema/src/rational';
import { DEFAULT_TOLERANCE } from '../../../shared-schema/src/defaults';
import { type BoardFit, type BoardOutput, fitBoard } from '../planning/board';
import { planningKey } from '../planning/cache';
import { preferenceOf } from '../planning/choose';
import { realisesDuty } from '../planning/duty';
import { describePlan } from '../planning/figures';
import { ShrinkMenu } from '../planning/shrink';
import type { Hardware, OutputPlanning, Plan, PlanFigures } from '../planning/types';
import { Memo } from './memo';
import { planText, planningDiagnostics } from './planning-diagnostics';
import { diagnostic } from './source';
import type { Analysis, OutputAnalysis, Range, SpecDiagnostic } from './types';

// Menus hold their frontier (one entry per table length where S rises): a small memo bounds the memory.
const menus = new Memo<string, ShrinkMenu | null>(64);

/**
 * The output can take a smaller plan: planned within tolerance by the engine, not pinned, one
 * frequency (a stepped output's table serves every step: it keeps its own).
 */
const shrinkable = (o: OutputAnalysis): boolean =>
  o.request.pinned === undefined && o.request.steps === undefined && o.planning.plan !== null && o.planning.withinTolerance && o.planning.verdict !== 'pinned';

/** The menu of an output (memoised: an edit elsewhere leaves its planning values, and so its key, unchanged). */
export function menuOf(o: OutputAnalysis, hw: Hardware, own: Plan | null = o.planning.shrunkFrom ?? o.planning.plan): ShrinkMenu | null {
  if (!shrinkable(o) || own === null) return null;
  const plan = own;
  return menus.get(`${planningKey(hw, o.request)}|${plan.dividerInteger},${plan.dividerFraction},${plan.tableLength},${plan.cycles.num}`, () => {
    const pref = preferenceOf(o.request, hw);
    const s = div(rat(BigInt(plan.tableLength)), plan.cycles);
    const dutyKept = pref.duty !== null && realisesDuty(pref.duty, s) ? pref.duty : null;
    return new ShrinkMenu(hw, o.targetHz, o.request.minSamplesPerCycle, pref, plan, o.request.wholeSamplesPerCycle === true, dutyKept);
  });
}

/** The board fit of an analysis's outputs (their own plans when within budget). */
export function boardFit(outputs: readonly OutputAnalysis[], hw: Hardware): BoardFit {
  const board: BoardOutput[] = outputs.map((o) => ({
    bytes: o.planning.plan?.tableBytes ?? 0,
    menu: menuOf(o, hw),
    pref: preferenceOf(o.request, hw),
  }));
  const own = board.reduce((t, b) => t + b.bytes, 0);
  // The menus are built only when the budget is exceeded.
  if (own <= hw.memory.budgetBytes) return fitBoard(board.map((b) => ({ ...b, menu: null })), hw.memory.budgetBytes);
  return fitBoard(board, hw.memory.budgetBytes);
}

const sText = (p: Plan): string => {
  const s: Rational = div(rat(BigInt(p.tableLength)), p.cycles);
  return isInteger(s) ? s.num.toString() : toDecimal(s, 3);
};

/** The planning of an output that takes `plan` instead of its own. */
export function shrunkPlanning(old: OutputPlanning, plan: PlanFigures): OutputPlanning {
  const verdict = !plan.jitterFree ? 'fractional' : plan.errorHz.num === 0n ? 'exact' : 'within-tolerance';
  const planning = { verdict, plan, nearestJitterFree: old.nearestJitterFree, withinTolerance: true, shrunkFrom: old.plan! } as OutputPlanning;
  Object.defineProperty(planning, 'bestFractional', { get: () => old.bestFractional, enumerable: true });
  return planning;
}

const sameDiagnostic = (a: SpecDiagnostic, b: SpecDiagnostic): boolean =>
  a.code === b.code && a.message === b.message && a.output === b.output &&
  a.range.start.line === b.range.start.line && a.range.start.character === b.range.start.character &&
  a.range.end.line === b.range.end.line && a.range.end.character === b.range.end.character;

/** The budget step: shrinks what must shrink, or reports that nothing within tolerance fits. */
export function fitToBudget(analysis: Analysis, hw: Hardware, outputsKey: Range, usedBytes: number): void {
  const budgetBytes = hw.memory.budgetBytes;
  analysis.memory = { usedBytes, budgetBytes };
  if (usedBytes <= budgetBytes) return;
  const fit = boardFit(analysis.outputs, hw);
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
  analysis.outputs = analysis.outputs.map((o, i) => {
    const chosen = fit.plans[i];
    if (!chosen) return o;
    const plan = describePlan(hw, o.request, o.request.waveform, chosen, 'open');
    const planning = shrunkPlanning(o.planning, plan);
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
