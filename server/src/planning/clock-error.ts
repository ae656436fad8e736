// The system clock's own error in every output's budget. A clock off by a relative e scales
// every frequency made from it by (1 + e): a plan of relative error p (achieved = target·(1 + p))
// then runs at target·(1 + p)(1 ± e), so the worst-case relative error is
//   max |(1 + p)(1 ± e) − 1| = |p| + e·(1 + p)        (exact, for 0 ≤ e < 1 and p > −1; derived)
// — to first order the ppm add. In hertz: |f_achieved − f_target| + e·f_achieved.

import { type Rational, ZERO, abs, add, cmp, div, mul, toNumber } from '../../../shared-schema/src/rational';

export interface ErrorBudget {
  /** The plan's own error, signed, in ppm of the target. */
  planPpm: number;
  /** The clock's share of the worst case, e·f_achieved, in ppm of the target (≥ 0). */
  clockPpm: number;
  /** |p| + e·(1 + p) in ppm: the worst case the tolerance is checked against. */
  worstPpm: number;
  /** The worst case in hertz, exact. */
  worstHz: Rational;
  /** The clock's share is the larger part. */
  clockDominates: boolean;
}

/** |f_achieved − f_target| + e·f_achieved, exact. */
export function worstErrorHz(plan: { achievedHz: Rational; errorHz: Rational }, e: Rational): Rational {
  return e.num === 0n ? abs(plan.errorHz) : add(abs(plan.errorHz), mul(e, plan.achievedHz));
}

/** The worst case is within the tolerance (in hertz). */
export function withinWorstCase(plan: { achievedHz: Rational; errorHz: Rational }, toleranceHz: Rational, e: Rational | undefined): boolean {
  return cmp(worstErrorHz(plan, e ?? ZERO), toleranceHz) <= 0;
}

export function errorBudget(plan: { achievedHz: Rational; errorHz: Rational }, targetHz: Rational, e: Rational): ErrorBudget {
  const clockHz = mul(e, plan.achievedHz);
  const worstHz = add(abs(plan.errorHz), clockHz);
  const clockPpm = toNumber(div(clockHz, targetHz)) * 1e6;
  const planPpm = toNumber(div(plan.errorHz, targetHz)) * 1e6;
  return { planPpm, clockPpm, worstPpm: toNumber(div(worstHz, targetHz)) * 1e6, worstHz, clockDominates: cmp(clockHz, abs(plan.errorHz)) > 0 };
}

/** The clock's error alone, e·f_target, exceeds the tolerance: no plan can meet it. */
export function clockAloneExceeds(targetHz: Rational, toleranceHz: Rational, e: Rational | undefined): boolean {
  return e !== undefined && e.num !== 0n && cmp(mul(e, targetHz), toleranceHz) > 0;
}
