// The engine's verdict on one output: which plan to use and how it stands against the tolerance.

import { type Rational, sign } from '../../../shared-schema/src/rational';
import { PlanningCache, planningKey } from './cache';
import { withinWorstCase } from './clock-error';
import { describePlan } from './figures';
import { pinnedPlan } from './pinned';
import { bestFractional, nearestJitterFree } from './search';
import { nearestWholeCycle } from './whole';
import type { Hardware, OutputPlanning, OutputRequest, Plan, PlanFigures } from './types';

/** The memo shared by every caller of planOutput (language server, checker, exporters). */
export const planningCache = new PlanningCache(1000);

const within = (plan: Plan | PlanFigures | null, toleranceHz: Rational, clockTolerance?: Rational): boolean =>
  plan !== null && withinWorstCase(plan, toleranceHz, clockTolerance);

/** Plans one output (memoised; the result must be treated as read-only). */
export function planOutput(hw: Hardware, req: OutputRequest): OutputPlanning {
  return planningCache.getOrCompute(planningKey(hw, req), () => planOutputUncached(hw, req));
}

export function planOutputUncached(hw: Hardware, req: OutputRequest): OutputPlanning {
  const describe = (plan: Plan | null, span: 'open' | 'closed' = 'open'): PlanFigures | null =>
    plan === null ? null : describePlan(hw, req, req.waveform, plan, span);
  const whole = req.wholeSamplesPerCycle === true;
  const nearest = describe(whole ? nearestWholeCycle(hw, req, false) : nearestJitterFree(hw, req));
  // Always searched when the divider has fraction bits: the editor offers it as a quick fix.
  const fractional =
    hw.divider.fractionBits > 0 ? describe(whole ? nearestWholeCycle(hw, req, true) : bestFractional(hw, req)) : null;
  const base = { nearestJitterFree: nearest, bestFractional: fractional };

  if (req.pinned) {
    const plan = describe(pinnedPlan(hw, req.pinned, req.targetHz), req.pinned.span);
    return { ...base, verdict: 'pinned', plan, withinTolerance: within(plan, req.toleranceHz, hw.systemClockTolerance) };
  }
  if (nearest !== null && within(nearest, req.toleranceHz, hw.systemClockTolerance)) {
    const verdict = sign(nearest.errorHz) === 0 ? 'exact' : 'within-tolerance';
    return { ...base, verdict, plan: nearest, withinTolerance: true };
  }
  const fractionAllowed = req.jitter === 'allow' && hw.divider.fractionBits > 0;
  if (fractionAllowed && fractional !== null && within(fractional, req.toleranceHz, hw.systemClockTolerance)) {
    return { ...base, verdict: 'fractional', plan: fractional, withinTolerance: true };
  }
  const best = fractionAllowed && fractional !== null ? fractional : nearest;
  if (best === null) return { ...base, verdict: 'no-plan', plan: null, withinTolerance: false };
  return { ...base, verdict: 'out-of-tolerance', plan: best, withinTolerance: false };
}
