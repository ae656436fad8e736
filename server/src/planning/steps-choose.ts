// The verdict on an output with frequency steps: the table the steps share and each step's plan
// on it (steps.ts), in the shape every face reads (OutputPlanning). `plan` is the first step's,
// `steps` all of them; the verdict is the single-output one applied to all the steps together:
// exact (every step exact, whole dividers), within-tolerance, fractional (some step needs a
// fractional divider, which jitter: allow permits), out-of-tolerance, no-plan.

import { sign } from '../../../shared-schema/src/rational';
import { withinWorstCase } from './clock-error';
import { describePlan } from './figures';
import { planSteps, type StepsQuery } from './steps';
import type { Hardware, OutputPlanning, OutputRequest, PlanFigures, Verdict } from './types';

export function planSteppedOutput(hw: Hardware, req: OutputRequest): OutputPlanning {
  const steps = req.steps ?? [];
  const hasFraction = hw.divider.fractionBits > 0;
  const search = (fractional: boolean): PlanFigures[] | null => {
    const query: StepsQuery = {
      steps,
      minSamplesPerCycle: req.minSamplesPerCycle,
      maxSamplesPerCycle: req.maxSamplesPerCycle ?? null,
      wholeSamplesPerCycle: req.wholeSamplesPerCycle === true,
      fractional,
      clockTolerance: hw.systemClockTolerance ?? null,
    };
    const found = planSteps(hw, query);
    if (found === null) return null;
    return found.steps.map((p, i) => describePlan(hw, { ...req, targetHz: steps[i]!.targetHz }, req.waveform, p, 'open'));
  };
  const every = (plans: PlanFigures[]): boolean =>
    plans.every((p, i) => withinWorstCase(p, steps[i]!.toleranceHz, hw.systemClockTolerance));

  // With jitter allowed the search itself puts tables of whole dividers first (fewer fractional
  // steps rank first), so one search gives the plan; the jitter-free one only when they differ.
  const allowed = req.jitter === 'allow' && hasFraction;
  const chosen = search(allowed);
  const jitterFreeOnly = chosen !== null && chosen.every((p) => p.jitterFree) ? chosen : search(false);
  let fractional: PlanFigures | null | undefined = allowed ? (chosen?.[0] ?? null) : undefined;
  const bestFractional = (): PlanFigures | null => {
    if (fractional === undefined) fractional = hasFraction ? (search(true)?.[0] ?? null) : null;
    return fractional;
  };
  const result = (verdict: Verdict, plans: PlanFigures[] | null, within: boolean): OutputPlanning => {
    const planning = {
      verdict,
      plan: plans?.[0] ?? null,
      nearestJitterFree: jitterFreeOnly?.[0] ?? null,
      withinTolerance: within,
      ...(plans !== null ? { steps: plans } : {}),
    } as OutputPlanning;
    Object.defineProperty(planning, 'bestFractional', { get: bestFractional, enumerable: true });
    return planning;
  };
  if (chosen === null) return result('no-plan', null, false);
  if (!every(chosen)) return result('out-of-tolerance', chosen, false);
  if (chosen.some((p) => !p.jitterFree)) return result('fractional', chosen, true);
  return result(chosen.every((p) => sign(p.errorHz) === 0) ? 'exact' : 'within-tolerance', chosen, true);
}
