// How good one system clock is for a whole board, as a key that orders clocks exactly, and the
// optimistic bound of that key before (or while) its outputs are planned.
//
// Order of clocks (best first; the README quotes it):
//   1. at or below the rated maximum (an overclocked candidate is listed, with the caution, after
//      every rated one);
//   2. more outputs within tolerance (the clock's own tolerance counted in);
//   3. the tables fit the memory budget (after the board's budget fit, as the checker fits them);
//   4. more outputs exact;  5. more outputs jitter-free (and within tolerance);
//   6. smaller worst error relative to tolerance, over the outputs (exact rationals);
//   7. fewer table bytes (after the fit; a table shared through start offsets once);  8. more VCO margin;  9. nearer the system clock in use;
//   10. the lower clock.
// A clock that cannot feed every peripheral is ruled out before any of this.

import { type Rational, ZERO, abs, cmp, div, mul, sub } from '../../../shared-schema/src/rational';
import { clockAloneExceeds, worstErrorHz } from './clock-error';
import type { Hardware, OutputPlanning, OutputRequest } from './types';

/** worst-case error / tolerance: exact, or infinite (a zero tolerance missed, or no plan). */
export interface Share {
  infinite: boolean;
  value: Rational;
}

export const INFINITE_SHARE: Share = { infinite: true, value: ZERO };

export function compareShare(a: Share, b: Share): number {
  if (a.infinite || b.infinite) return a.infinite === b.infinite ? 0 : a.infinite ? 1 : -1;
  return cmp(a.value, b.value);
}

const shareOf = (worstHz: Rational, toleranceHz: Rational): Share =>
  toleranceHz.num === 0n ? (worstHz.num === 0n ? { infinite: false, value: ZERO } : INFINITE_SHARE) : { infinite: false, value: div(worstHz, toleranceHz) };

/** One output's part of a clock's score. */
export interface Part {
  within: number;
  exact: number;
  jitterFree: number;
  worst: Share;
  bytes: number;
}

export interface Score {
  rated: boolean;
  within: number;
  fits: boolean;
  exact: number;
  jitterFree: number;
  worst: Share;
  bytes: number;
  margin: number;
  distance: Rational;
  clockHz: Rational;
}

/** The actual part of a planned output. */
export function actualPart(req: OutputRequest, planning: OutputPlanning, e: Rational): Part {
  const plan = planning.plan;
  if (!plan) return { within: 0, exact: 0, jitterFree: 0, worst: INFINITE_SHARE, bytes: 0 };
  const within = planning.withinTolerance ? 1 : 0;
  return {
    within,
    exact: plan.errorHz.num === 0n ? 1 : 0,
    jitterFree: within && plan.jitterFree ? 1 : 0,
    worst: shareOf(worstErrorHz(plan, e), req.toleranceHz),
    bytes: plan.tableBytes,
  };
}

/** Fewest bytes any plan of this output can take: the shortest allowed table of S floor samples or more. */
export function fewestBytes(hw: Hardware, req: OutputRequest): number {
  if (req.pinned) return req.pinned.tableLength * hw.dac.sampleBytes;
  const floorS = Number(req.minSamplesPerCycle.num / req.minSamplesPerCycle.den) + (req.minSamplesPerCycle.num % req.minSamplesPerCycle.den === 0n ? 0 : 1);
  let n = Math.max(1, hw.memory.tableLengthMin, floorS);
  if (hw.memory.powerOfTwo) {
    let p = 1;
    while (p < n) p *= 2;
    n = p;
  }
  return n * hw.dac.sampleBytes;
}

/**
 * The best part an output can have at any clock where it may (or may not) be exact: within
 * tolerance unless the clock's tolerance alone breaks it; the worst error at least e·f_target
 * (|error| + e·f_achieved ≥ e·f_target for any plan, derived); the fewest bytes.
 */
export function boundPart(hw: Hardware, req: OutputRequest, exactPossible: boolean): Part {
  const e = hw.systemClockTolerance ?? ZERO;
  const within = clockAloneExceeds(req.targetHz, req.toleranceHz, e) ? 0 : 1;
  return {
    within,
    exact: exactPossible ? 1 : 0,
    jitterFree: within,
    worst: shareOf(mul(e, req.targetHz), req.toleranceHz),
    bytes: fewestBytes(hw, req),
  };
}

/** Per spec, the parts' bytes within the memory budget (each wave spec is fitted on its own). */
export function partsFit(parts: readonly Part[], specOf: readonly number[], specs: number, budgetBytes: number): boolean[] {
  const bytes = new Array<number>(specs).fill(0);
  parts.forEach((p, k) => {
    bytes[specOf[k]!]! += p.bytes;
  });
  return bytes.map((b) => b <= budgetBytes);
}

/** The score of a clock from its outputs' parts; `fits`: every spec's tables fit the budget. */
export function scoreOf(parts: readonly Part[], fits: boolean, clock: { rated: boolean; margin: number; clockHz: Rational }, current: Rational): Score {
  let within = 0;
  let exact = 0;
  let jitterFree = 0;
  let bytes = 0;
  let worst: Share = { infinite: false, value: ZERO };
  for (const p of parts) {
    within += p.within;
    exact += p.exact;
    jitterFree += p.jitterFree;
    bytes += p.bytes;
    if (compareShare(p.worst, worst) > 0) worst = p.worst;
  }
  return {
    rated: clock.rated,
    within,
    fits,
    exact,
    jitterFree,
    worst,
    bytes,
    margin: clock.margin,
    distance: abs(sub(clock.clockHz, current)),
    clockHz: clock.clockHz,
  };
}

/** Negative when a is the better clock, positive when b is; 0 only for the same clock. */
export function compareScores(a: Score, b: Score): number {
  if (a.rated !== b.rated) return a.rated ? -1 : 1;
  if (a.within !== b.within) return b.within - a.within;
  if (a.fits !== b.fits) return a.fits ? -1 : 1;
  if (a.exact !== b.exact) return b.exact - a.exact;
  if (a.jitterFree !== b.jitterFree) return b.jitterFree - a.jitterFree;
  const w = compareShare(a.worst, b.worst);
  if (w !== 0) return w;
  if (a.bytes !== b.bytes) return a.bytes - b.bytes;
  if (a.margin !== b.margin) return b.margin - a.margin;
  const d = cmp(a.distance, b.distance);
  if (d !== 0) return d;
  return cmp(a.clockHz, b.clockHz);
}

/**
 * The part of a planned output that the budget fit may still shrink: the fit keeps it within
 * tolerance (so `within` is as planned) and may trade its other figures either way, so each is
 * the better of the plan's and the bound's.
 */
export function shrinkBound(actual: Part, bound: Part): Part {
  return {
    within: actual.within,
    exact: Math.max(actual.exact, bound.exact),
    jitterFree: Math.max(actual.jitterFree, bound.jitterFree),
    worst: compareShare(actual.worst, bound.worst) <= 0 ? actual.worst : bound.worst,
    bytes: Math.min(actual.bytes, bound.bytes),
  };
}
