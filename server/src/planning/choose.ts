// The engine's verdict on one output: which plan to use (the ranking of ranking.ts) and how it
// stands against the tolerance.
//
// For one divider kind the ranking's plan is found with at most three exact searches: the nearest
// plan of the whole domain G (what `nearestJitterFree` / `bestFractional` report); the nearest
// plan with S ≤ S max, A (G itself when G keeps S max); and, only when A misses the tolerance, the
// best-ranked plan among all plans at G's error (ties.ts), which is then the nearest plan the
// ranking prefers, within the tolerance or not. Whole-S shapes rank class by class (whole.ts).

import { type Rational, abs, cmp, isInteger, sign } from '../../../shared-schema/src/rational';
import { PlanningCache, planningKey } from './cache';
import { OUTPUT_STEPS } from './work';
import { withinWorstCase } from './clock-error';
import { jitterFreeDomain, fractionalDomain } from './domain';
import { describePlan } from './figures';
import { pinnedPlan } from './pinned';
import { type Preference, samplesPerCycle, withinTolerance } from './ranking';
import { bestFractional, nearestJitterFree } from './search';
import { planSteppedOutput } from './steps-choose';
import { bestAtError } from './ties';
import { realisesDuty } from './duty';
import { dutyAlternatives, wholeCyclePlans } from './whole';
import type { Hardware, OutputPlanning, OutputRequest, Plan, PlanFigures, Verdict } from './types';

/** The memo shared by every caller of planOutput (language server, checker, exporters). */
export const planningCache = new PlanningCache(1000);

const within = (plan: Plan | PlanFigures | null, toleranceHz: Rational, clockTolerance?: Rational): boolean =>
  plan !== null && withinWorstCase(plan, toleranceHz, clockTolerance);

/**
 * Plans one output (memoised; the result must be treated as read-only) within `steps` steps of
 * search work (work.ts): a file shares its budget among its outputs with stepsPerOutput.
 */
export function planOutput(hw: Hardware, req: OutputRequest, steps = OUTPUT_STEPS): OutputPlanning {
  return planningCache.getOrCompute(planningKey(hw, req), () => planOutputUncached(hw, req), steps);
}

/** What the ranking prefers for this output. The duty counts only for whole-S square tables. */
export function preferenceOf(req: OutputRequest, hw: Hardware): Preference {
  const dutyApplies = req.waveform.shape === 'square' && req.wholeSamplesPerCycle === true && req.duty !== undefined;
  return {
    toleranceHz: req.toleranceHz,
    clockTolerance: hw.systemClockTolerance ?? null,
    maxSamplesPerCycle: req.maxSamplesPerCycle ?? null,
    duty: dutyApplies ? req.duty! : null,
  };
}

/** The nearest plan of one divider kind and the plan the ranking chooses among that kind. */
interface KindPlans {
  nearest: Plan | null;
  ranked: Plan | null;
}

function planKind(hw: Hardware, req: OutputRequest, pref: Preference, fractional: boolean): KindPlans {
  if (req.wholeSamplesPerCycle === true) return wholeCyclePlans(hw, req, fractional, pref);
  const search = fractional ? bestFractional : nearestJitterFree;
  const nearest = search(hw, req);
  if (nearest === null) return { nearest, ranked: null };
  const cap = pref.maxSamplesPerCycle;
  const keepsCap = cap === null || cmp(samplesPerCycle(nearest), cap) <= 0;
  const underCap = keepsCap ? nearest : search(hw, req, cap);
  if (underCap !== null && withinTolerance(underCap, pref)) return { nearest, ranked: underCap };
  if (keepsCap) return { nearest, ranked: nearest };
  const d = fractional ? fractionalDomain(hw, req) : jitterFreeDomain(hw, req);
  const ranked = d === null ? nearest : bestAtError(d, abs(nearest.errorHz), pref, hw.divider.fractionBits, nearest);
  return { nearest, ranked: nearest.searchLimited ? { ...ranked, searchLimited: true } : ranked };
}

/** A value computed when first read and kept. */
function lazy<T>(compute: () => T): () => T {
  let done = false;
  let value: T;
  return () => {
    if (!done) {
      value = compute();
      done = true;
    }
    return value;
  };
}

export function planOutputUncached(hw: Hardware, req: OutputRequest): OutputPlanning {
  if (req.steps !== undefined) return planSteppedOutput(hw, req);
  const describe = (plan: Plan | null, span: 'open' | 'closed' = 'open'): PlanFigures | null =>
    plan === null ? null : describePlan(hw, req, req.waveform, plan, span);
  const pref = preferenceOf(req, hw);
  const e = hw.systemClockTolerance;
  const jitterFree = planKind(hw, req, pref, false);
  const nearest = describe(jitterFree.nearest);
  const hasFraction = hw.divider.fractionBits > 0;
  // The fractional kind is searched only when its result is read: for the plan (jitter allowed,
  // no jitter-free plan within tolerance) or through `bestFractional` (a quick fix, a report).
  const fractionalKind = lazy(() => (hasFraction ? planKind(hw, req, pref, true) : { nearest: null, ranked: null }));
  const fractionalNearest = lazy(() => describe(fractionalKind().nearest));
  const result = (verdict: Verdict, plan: PlanFigures | null, withinTolerance: boolean): OutputPlanning => {
    const planning = { verdict, plan, nearestJitterFree: nearest, withinTolerance } as OutputPlanning;
    Object.defineProperty(planning, 'bestFractional', { get: fractionalNearest, enumerable: true });
    // A square within tolerance whose whole S misses the duty: what the warning names.
    const duty = pref.duty;
    if (duty !== null && plan !== null && withinTolerance && !realisesDuty(duty, samplesPerCycle(plan)) && isInteger(samplesPerCycle(plan))) {
      const fractional = plan.dividerFraction !== 0;
      const alt = dutyAlternatives(hw, req, fractional, pref);
      planning.dutyMiss = { nearestDuty: describe(alt.nearestDuty), exactDuty: describe(alt.exactDuty) };
    }
    return planning;
  };

  if (req.pinned) {
    const plan = describe(pinnedPlan(hw, req.pinned, req.targetHz), req.pinned.span);
    return result('pinned', plan, within(plan, req.toleranceHz, e));
  }
  const chosen = jitterFree.ranked;
  if (chosen !== null && within(chosen, req.toleranceHz, e)) {
    const plan = chosen === jitterFree.nearest ? nearest : describe(chosen);
    return result(sign(chosen.errorHz) === 0 ? 'exact' : 'within-tolerance', plan, true);
  }
  const fractionAllowed = req.jitter === 'allow' && hasFraction;
  const fractional = fractionAllowed ? fractionalKind().ranked : null;
  if (fractional !== null && within(fractional, req.toleranceHz, e)) {
    return result('fractional', describe(fractional), true);
  }
  const best = fractional ?? chosen;
  if (best === null) return result('no-plan', null, false);
  return result('out-of-tolerance', best === jitterFree.nearest ? nearest : describe(best), false);
}
