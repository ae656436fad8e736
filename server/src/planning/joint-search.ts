// One system clock for the whole board: every clock the tree reaches, every output planned on it
// as the planner plans it, the clocks ranked by joint-score.ts. The best few are proven the best:
//   1. each clock gets an optimistic score from facts that need no plan search — whether it is
//      rated, its VCO margin and distance (exact), and per output whether an exact plan can exist
//      at all (exact-reach.ts), the clock's own error as a floor on the worst error, and the
//      fewest bytes a table can take;
//   2. clocks are planned in the order of those bounds, output by output, the outputs that
//      cannot be exact first; a clock is dropped as soon as its bound, with the outputs planned
//      so far in place of their bounds, falls behind the last of the best few found;
//   3. the search ends when the next clock's bound is behind it too.
// Each bound is at least as good as the true score (every key is a sum or maximum of per-output
// parts, each part bounded on its own), so nothing dropped could have made the list.

import { type Rational, ZERO, cmp } from '../../../shared-schema/src/rational';
import { planOutputUncached } from './choose';
import { type ReachableClock, reachableClocks } from './clock-source';
import { exactTester, integerDividerSpan } from './exact-reach';
import { type Part, type Score, actualPart, boundPart, compareScores, compareShare, scoreOf } from './joint-score';
import type { Hardware, OutputPlanning, OutputRequest } from './types';

export interface ClockCandidate {
  clock: ReachableClock;
  score: Score;
  /** Every output planned on this clock, in the order of the requests. */
  plans: OutputPlanning[];
}

export interface JointResult {
  /** Best first; at most the limit asked for. */
  candidates: ClockCandidate[];
  /** Distinct clocks the tree reaches (that feed every peripheral). */
  reachable: number;
  /** Clocks ruled out because a peripheral cannot get its clock from them. */
  ruledOut: number;
  /** Clocks whose outputs were (partly) planned; output plans made. */
  clocksPlanned: number;
  plansMade: number;
  /** False when the tree reaches more clocks than one search ranks (the nearest were ranked). */
  complete: boolean;
}

/** Clocks one search ranks: beyond it the ones nearest the clock in use are kept. */
export const MAX_JOINT_CLOCKS = 1 << 15;

/** Plans one output at one clock; the planner's own choice (memoised callers pass planOutput). */
export type PlanAt = (hw: Hardware, req: OutputRequest) => OutputPlanning;

interface Prepared {
  clocks: ReachableClock[];
  ruledOut: number;
  complete: boolean;
}

function prepare(hw: Hardware): Prepared | null {
  const tree = hw.clockTree;
  if (!tree) return { clocks: [{ systemClockHz: hw.systemClockHz, setting: null, vcoMargin: 0, peripheralsOk: true }], ruledOut: 0, complete: true };
  const all = reachableClocks(tree, hw.systemClockHz);
  if (all === null) return null;
  const usable = all.filter((c) => c.peripheralsOk);
  let clocks = usable;
  let complete = true;
  if (clocks.length > MAX_JOINT_CLOCKS) {
    const dist = (c: ReachableClock) => Math.abs(Number(c.systemClockHz.num) / Number(c.systemClockHz.den) - Number(hw.systemClockHz.num) / Number(hw.systemClockHz.den));
    clocks = [...clocks].sort((a, b) => dist(a) - dist(b)).slice(0, MAX_JOINT_CLOCKS);
    complete = false;
  }
  return { clocks, ruledOut: all.length - usable.length, complete };
}

const isRated = (hw: Hardware, hz: Rational): boolean => !hw.clockTree?.ratedHz || cmp(hz, hw.clockTree.ratedHz) <= 0;

/** The best `limit` clocks for the board, proven (see above). Null when the tree is too large to enumerate. */
export function jointSearch(hw: Hardware, requests: readonly OutputRequest[], limit = 5, planAt: PlanAt = planOutputUncached): JointResult | null {
  const prepared = prepare(hw);
  if (prepared === null) return null;
  const e = hw.systemClockTolerance ?? ZERO;
  const result: JointResult = { candidates: [], reachable: prepared.clocks.length, ruledOut: prepared.ruledOut, clocksPlanned: 0, plansMade: 0, complete: prepared.complete };

  // Per output, the two bounds it can have (exact possible or not); per clock, which applies.
  const boundsIf = requests.map((req) => [boundPart(hw, req, false), boundPart(hw, req, true)] as const);
  const testers = requests.map((req) => exactTester(hw, req));
  const queue = prepared.clocks.map((clock) => {
    const span = integerDividerSpan(hw, clock.systemClockHz);
    // The cheap form first: thousands of clocks are ranked by it, the few planned are refined.
    const exactAt = testers.map((test) => test(clock.systemClockHz, span, false));
    const parts = exactAt.map((x, i) => boundsIf[i]![x ? 1 : 0]);
    const meta = { rated: isRated(hw, clock.systemClockHz), margin: clock.vcoMargin, clockHz: clock.systemClockHz };
    return { clock, span, exactAt, parts, meta, bound: scoreOf(parts, hw, meta, hw.systemClockHz) };
  });
  queue.sort((a, b) => compareScores(a.bound, b.bound));

  const best: ClockCandidate[] = [];
  const threshold = (): Score | null => (best.length >= limit ? best[best.length - 1]!.score : null);
  for (const item of queue) {
    const bar = threshold();
    if (bar && compareScores(item.bound, bar) > 0) break;
    // The thorough test can only lower the bound (it says "impossible" more often).
    const exactAt = item.exactAt.map((x, i) => x && testers[i]!(item.clock.systemClockHz, item.span, true));
    const parts: Part[] = exactAt.map((x, i) => boundsIf[i]![x ? 1 : 0]);
    if (bar && compareScores(scoreOf(parts, hw, item.meta, hw.systemClockHz), bar) > 0) continue;
    const hwAt: Hardware = { ...hw, systemClockHz: item.clock.systemClockHz };
    const plans: OutputPlanning[] = new Array(requests.length);
    // Plan first the outputs most likely to sink the clock: those that cannot be exact, the
    // tightest tolerance relative to the clock's own error first (they set the worst error).
    const order = requests
      .map((_, i) => i)
      .sort((a, b) => Number(exactAt[a]) - Number(exactAt[b]) || compareShare(parts[b]!.worst, parts[a]!.worst) || a - b);
    result.clocksPlanned++;
    let dropped = false;
    for (const i of order) {
      plans[i] = planAt(hwAt, requests[i]!);
      result.plansMade++;
      parts[i] = actualPart(requests[i]!, plans[i]!, e);
      if (bar && compareScores(scoreOf(parts, hw, item.meta, hw.systemClockHz), bar) > 0) {
        dropped = true;
        break;
      }
    }
    if (dropped) continue;
    const candidate: ClockCandidate = { clock: item.clock, score: scoreOf(parts, hw, item.meta, hw.systemClockHz), plans };
    best.push(candidate);
    best.sort((a, b) => compareScores(a.score, b.score));
    if (best.length > limit) best.pop();
  }
  result.candidates = best;
  return result;
}

/** Every clock planned in full, then sorted: the oracle the search is proven against, and the benchmark's baseline. */
export function jointSearchExhaustive(hw: Hardware, requests: readonly OutputRequest[], limit = 5, planAt: PlanAt = planOutputUncached): JointResult | null {
  const prepared = prepare(hw);
  if (prepared === null) return null;
  const e = hw.systemClockTolerance ?? ZERO;
  const all = prepared.clocks.map((clock) => {
    const hwAt: Hardware = { ...hw, systemClockHz: clock.systemClockHz };
    const plans = requests.map((req) => planAt(hwAt, req));
    const parts = plans.map((p, i) => actualPart(requests[i]!, p, e));
    const meta = { rated: isRated(hw, clock.systemClockHz), margin: clock.vcoMargin, clockHz: clock.systemClockHz };
    return { clock, plans, score: scoreOf(parts, hw, meta, hw.systemClockHz) };
  });
  all.sort((a, b) => compareScores(a.score, b.score));
  return {
    candidates: all.slice(0, limit),
    reachable: prepared.clocks.length,
    ruledOut: prepared.ruledOut,
    clocksPlanned: all.length,
    plansMade: all.length * requests.length,
    complete: prepared.complete,
  };
}
