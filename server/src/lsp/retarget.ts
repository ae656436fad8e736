// The nearest jitter-free frequencies just below and just above a target, found with the engine
// (planOutput and its memo) rather than by a planner of our own.
//
// Why the bisection finds the neighbour: let u be a reachable frequency above the target t and
// m = (t + u)/2. Any reachable x in (t, u) is closer to m than u is, and closer than anything at
// or below t; so the plan nearest to m is either such an x (the new, smaller u) or proves there is
// none (derived). Each step moves u strictly towards t, so a few dozen steps always end it.

import { add, cmp, div, mul, rat, sub, abs, type Rational } from '../../../shared-schema/src/rational';
import { planOutput } from '../planning/choose';
import type { Hardware, OutputRequest, PlanFigures } from '../planning/types';

const MAX_STEPS = 64;

export interface Neighbours {
  below: PlanFigures | null;
  above: PlanFigures | null;
}

type Nearest = (target: Rational) => PlanFigures | null;

function nearestFor(hw: Hardware, req: OutputRequest): Nearest {
  return (targetHz) => {
    if (targetHz.num <= 0n) return null;
    const planning = planOutput(hw, { ...req, targetHz, pinned: undefined, jitter: 'forbid' });
    return planning.nearestJitterFree;
  };
}

/** No output can be faster than this: the fastest sample rate over the smallest samples per cycle. */
function ceilingHz(hw: Hardware, req: OutputRequest): Rational {
  const byDivider = div(hw.systemClockHz, rat(Math.max(1, hw.divider.integerMin)));
  const fastest = cmp(hw.dac.maxSampleRateHz, byDivider) < 0 ? hw.dac.maxSampleRateHz : byDivider;
  const floorS = req.minSamplesPerCycle.num > 0n ? req.minSamplesPerCycle : rat(1);
  return div(fastest, floorS);
}

/** `side` = 1 for the smallest reachable frequency above the target, −1 for the largest below. */
function neighbour(nearest: Nearest, target: Rational, side: 1 | -1, start: Rational, limit: Rational): PlanFigures | null {
  const beyond = (p: PlanFigures | null): p is PlanFigures => !!p && cmp(p.achievedHz, target) === side;
  const tiny = div(target, rat(2n ** 40n));
  let found: PlanFigures | null = null;
  // Probe ever further out until something lies on that side (or nothing can).
  let step = start;
  for (let i = 0; i < MAX_STEPS && !found; i++) {
    let probe = side > 0 ? add(target, step) : sub(target, step);
    const last = side > 0 ? cmp(probe, limit) > 0 : cmp(probe, tiny) <= 0;
    if (last && side < 0) probe = tiny;
    const p = nearest(probe);
    if (beyond(p)) found = p;
    else if (last) break;
    step = mul(step, rat(2));
  }
  // Then halve the gap until no reachable frequency lies between the target and `found`.
  for (let i = 0; found && i < MAX_STEPS; i++) {
    const p = nearest(div(add(target, found.achievedHz), rat(2)));
    if (!beyond(p) || cmp(p.achievedHz, found.achievedHz) * side >= 0) break;
    found = p;
  }
  return found;
}

export function jitterFreeNeighbours(hw: Hardware, req: OutputRequest, isCancelled: () => boolean = () => false): Neighbours {
  const nearest = nearestFor(hw, req);
  const target = req.targetHz;
  const first = nearest(target);
  const gap = first ? abs(sub(first.achievedHz, target)) : rat(0);
  // The first probe steps a little past the target: at least 1 ppm of it.
  const start = cmp(gap, div(target, rat(1_000_000))) > 0 ? gap : div(target, rat(1_000_000));
  const limit = ceilingHz(hw, req);
  const below = first && cmp(first.achievedHz, target) < 0 ? first : isCancelled() ? null : neighbour(nearest, target, -1, start, limit);
  const above = first && cmp(first.achievedHz, target) > 0 ? first : isCancelled() ? null : neighbour(nearest, target, 1, start, limit);
  return {
    below: below && isCancelled() ? null : below,
    above: above && isCancelled() ? null : above,
  };
}
