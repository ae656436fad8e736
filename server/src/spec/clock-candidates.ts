// The ranked system clocks of a wave spec's board: the joint search over the clock tree of its
// clock file, run only when a face asks (the checker's JSON, the hover on `system-clock`, the
// retune quick fix, the report), never on an edit, and memoised per clock and set of outputs.
// Each candidate's outputs are planned as the checker plans them (groups, the budget fit), so its
// figures are the checker's once the clock file is set to it.

import { type Rational, cmp } from '../../../shared-schema/src/rational';
import { planningKey } from '../planning/cache';
import { errorBudget } from '../planning/clock-error';
import { type ClockCandidate, type JointResult, jointSearch } from '../planning/joint-search';
import type { Hardware, OutputRequest } from '../planning/types';
import type { SpecBoard } from '../planning/board-plan';
import { specBoardOf } from './board-budget';
import type { Analysis } from './types';

/** How many ranked clocks the faces show. */
export const CANDIDATES_SHOWN = 5;

const memo = new WeakMap<Hardware, Map<string, JointResult | null>>();

/** The clock tree offers more than the clock in use. */
export const hasAlternatives = (hw: Hardware | null): hw is Hardware => !!hw?.clockTree && hw.clockTree.source !== 'fixed';

/** The memo key of a spec's outputs and groups on this hardware. */
const specKey = (hw: Hardware, spec: SpecBoard): string =>
  `${spec.requests.map((r) => planningKey(hw, r)).join('\u0000')}\u0002${JSON.stringify(spec.groups)}`;

/** The best clocks for these specs' outputs on this hardware (null: no alternatives, or a tree too large to enumerate). */
export function rankClocks(hw: Hardware | null, specs: readonly SpecBoard[], limit = CANDIDATES_SHOWN): JointResult | null {
  if (!hasAlternatives(hw)) return null;
  let byRequests = memo.get(hw);
  if (!byRequests) {
    byRequests = new Map();
    memo.set(hw, byRequests);
  }
  const key = `${limit}\u0001${specs.map((spec) => specKey(hw, spec)).join('\u0003')}`;
  let result = byRequests.get(key);
  if (result === undefined) {
    result = jointSearch(hw, specs, limit);
    // A few sets of outputs per clock file: an edited spec leaves older keys behind.
    if (byRequests.size >= 8) byRequests.delete(byRequests.keys().next().value!);
    byRequests.set(key, result);
  }
  return result;
}

/** The ranked clocks of a wave spec's outputs. */
export const clockCandidatesOf = (analysis: Analysis, limit = CANDIDATES_SHOWN): JointResult | null =>
  analysis.kind === 'wave' ? rankClocks(analysis.hardware, [specBoardOf(analysis)], limit) : null;

/** Outputs exact and within tolerance, as a candidate's plans (or the analysis) count them. */
export interface Counts {
  exact: number;
  within: number;
  total: number;
}

export const countsOfAnalysis = (analysis: Analysis): Counts => ({
  exact: analysis.outputs.filter((o) => o.planning.plan?.errorHz.num === 0n).length,
  within: analysis.outputs.filter((o) => o.planning.withinTolerance).length,
  total: analysis.outputs.length,
});

export const countsOf = (c: ClockCandidate): Counts => ({ exact: c.score.exact, within: c.score.within, total: c.plans.length });

/** The largest worst-case error of the candidate's outputs in ppm of their targets (null when one has no plan). */
export function worstErrorPpm(c: ClockCandidate, requests: readonly OutputRequest[], hw: Hardware): number | null {
  let worst = 0;
  for (let i = 0; i < c.plans.length; i++) {
    const plan = c.plans[i]!.plan;
    if (!plan) return null;
    worst = Math.max(worst, errorBudget(plan, requests[i]!.targetHz, hw.systemClockTolerance ?? { num: 0n, den: 1n }).worstPpm);
  }
  return worst;
}

/** The clock is above the rated maximum (it gets the overclock caution). */
export const aboveRated = (hw: Hardware, hz: Rational): boolean => !!hw.clockTree?.ratedHz && cmp(hz, hw.clockTree.ratedHz) > 0;
