// The order in which one output's plans are chosen (the README quotes it):
//   1. within the frequency tolerance first;
//   among plans within it:  2. (whole-S squares) the asked duty realised within duty-tolerance first,
//                           3. S ≤ S max first;
//   4. smaller |f_out − f_target| (exact);
//   5. fractional plans: smaller long-share term p(1−p), p = F/2^k (jitter is their other error);
//   6. (ties outside the tolerance) the duty realised, then S ≤ S max, first;
//   7. larger min(S, S max): more samples per cycle, but none counted beyond S max;
//   8. fewer table bytes (shorter N);
//   9. larger S, then: jitter-free lower f_out, fractional smaller divider D.
// Outside the tolerance the nearest plan wins (4 before 2 and 3). Without S max and duty
// preference the order is the nearest-plan order of rank.ts, the one `nearestJitterFree` and
// `bestFractional` keep. This file compares finished plans exactly; the searches use rank.ts.

import { type Rational, abs, add, cmp, div, rat, sub } from '../../../shared-schema/src/rational';
import { withinWorstCase } from './clock-error';
import { realisesDuty } from './duty';
import type { Plan } from './types';

/** What an output prefers beyond the nearest plan. */
export interface Preference {
  toleranceHz: Rational;
  /**
   * e, the system clock's relative tolerance: a plan is within the tolerance when its worst case
   * |error| + e·f_out is (clock-error.ts); null = an exact clock.
   */
  clockTolerance?: Rational | null;
  /** S max; null = no ceiling. */
  maxSamplesPerCycle: Rational | null;
  /** The asked duty and duty-tolerance (square waves with whole S only). */
  duty: DutyPreference | null;
}

export interface DutyPreference {
  asked: Rational;
  tolerance: Rational;
}

/** S = N/M exactly. */
export const samplesPerCycle = (p: Plan): Rational => div(rat(BigInt(p.tableLength)), p.cycles);

export const withinTolerance = (p: Plan, pref: Pick<Preference, 'toleranceHz' | 'clockTolerance'>): boolean =>
  withinWorstCase(p, pref.toleranceHz, pref.clockTolerance ?? undefined);

/** p(1 − p)·4^k for p = F/2^k, as a whole number (0 when jitter-free). */
const longShareTerm = (p: Plan): bigint => BigInt(p.dividerFraction) * ((1n << BigInt(p.fractionBits)) - BigInt(p.dividerFraction));

const dividerScaled = (p: Plan): bigint => (BigInt(p.dividerInteger) << BigInt(p.fractionBits)) + BigInt(p.dividerFraction);

/** True ranks first. */
const first = (a: boolean, b: boolean): number => (a === b ? 0 : a ? -1 : 1);

export interface Ranked {
  plan: Plan;
  s: Rational;
  within: boolean;
  dutyOk: boolean;
  underCeiling: boolean;
}

export function ranked(plan: Plan, pref: Preference): Ranked {
  const s = samplesPerCycle(plan);
  return {
    plan,
    s,
    within: withinTolerance(plan, pref),
    dutyOk: pref.duty === null || realisesDuty(pref.duty, s),
    underCeiling: pref.maxSamplesPerCycle === null || cmp(s, pref.maxSamplesPerCycle) <= 0,
  };
}

/** Negative when a ranks before b, positive when b does, 0 for the same plan. */
export function compareRanked(a: Ranked, b: Ranked, pref: Preference, fractional: boolean): number {
  let c = first(a.within, b.within);
  if (c !== 0) return c;
  if (a.within) {
    c = first(a.dutyOk, b.dutyOk) || first(a.underCeiling, b.underCeiling);
    if (c !== 0) return c;
  }
  c = cmp(abs(a.plan.errorHz), abs(b.plan.errorHz));
  if (c !== 0) return c;
  if (fractional) {
    const pa = longShareTerm(a.plan);
    const pb = longShareTerm(b.plan);
    if (pa !== pb) return pa < pb ? -1 : 1;
  }
  c = first(a.dutyOk, b.dutyOk) || first(a.underCeiling, b.underCeiling);
  if (c !== 0) return c;
  const cap = pref.maxSamplesPerCycle;
  c = cap === null ? cmp(a.s, b.s) : cmp(a.underCeiling ? a.s : cap, b.underCeiling ? b.s : cap);
  if (c !== 0) return -c;
  if (a.plan.tableLength !== b.plan.tableLength) return a.plan.tableLength < b.plan.tableLength ? -1 : 1;
  c = cmp(b.s, a.s);
  if (c !== 0) return c;
  if (fractional) {
    const da = dividerScaled(a.plan);
    const db = dividerScaled(b.plan);
    return da === db ? 0 : da < db ? -1 : 1;
  }
  return cmp(a.plan.achievedHz, b.plan.achievedHz);
}

/** The first of the plans in the order above; null for none. */
export function bestRanked(plans: readonly (Plan | null)[], pref: Preference, fractional: boolean): Plan | null {
  let best: Ranked | null = null;
  for (const p of plans) {
    if (p === null) continue;
    const r = ranked(p, pref);
    if (best === null || compareRanked(r, best, pref, fractional) < 0) best = r;
  }
  return best === null ? null : best.plan;
}

/** |error| / tolerance (0 for an exact plan; Infinity for a zero tolerance and an inexact plan). */
export function errorShare(p: Plan, toleranceHz: Rational): Rational | null {
  if (toleranceHz.num === 0n) return p.errorHz.num === 0n ? rat(0) : null;
  return div(abs(p.errorHz), toleranceHz);
}

/** f_target ± e, the two frequencies a plan at error e can have (one when e = 0). */
export function frequenciesAt(targetHz: Rational, e: Rational): Rational[] {
  if (e.num === 0n) return [targetHz];
  const below = sub(targetHz, e);
  return below.num > 0n ? [below, add(targetHz, e)] : [add(targetHz, e)];
}
