// One system clock for the whole board: every clock the tree reaches, every wave spec's outputs
// planned on it as the checker plans them (board-plan.ts: own plans, groups, the budget fit), the
// clocks ranked by joint-score.ts. The best few are proven the best:
//   1. each clock gets an optimistic score from facts that need no plan search — whether it is
//      rated, its VCO margin and distance (exact), and per output whether an exact plan can exist
//      at all (exact-reach.ts), the clock's own error as a floor on the worst error, and the
//      fewest bytes a table can take;
//   2. clocks are planned in the order of those bounds, unit by unit (an output, or a group
//      planned together), the units that cannot be exact first; a clock is dropped as soon as its
//      bound, with the units planned so far in place of their bounds, falls behind the last of
//      the best few found. While a spec's tables may still exceed the budget, the fit may shrink
//      a planned output, so its part keeps the better of plan and bound (shrinkBound);
//   3. the search ends when the next clock's bound is behind it too.
// Each bound is at least as good as the true score (every key is a sum or maximum of per-output
// parts, each part bounded on its own), so nothing dropped could have made the list.

import { type Rational, ZERO, cmp } from '../../../shared-schema/src/rational';
import { type BoardSteps, type SpecBoard, UNCACHED_STEPS, fitSpec, stepsOf, fittedPlannings, planGroupInto, planSpecAt, shrinkable, sharingOutputs, tiedOutputs } from './board-plan';
import { type ReachableClock, reachableClocks } from './clock-source';
import { exactTester, integerDividerSpan } from './exact-reach';
import { type Part, type Score, actualPart, boundPart, compareScores, compareShare, partsFit, scoreOf, shrinkBound } from './joint-score';
import type { Hardware, OutputPlanning } from './types';

export interface ClockCandidate {
  clock: ReachableClock;
  score: Score;
  /** Every output planned on this clock as the checker plans it, spec after spec, in file order. */
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
const metaOf = (hw: Hardware, clock: ReachableClock) => ({ rated: isRated(hw, clock.systemClockHz), margin: clock.vcoMargin, clockHz: clock.systemClockHz });

/** The outputs of every spec in one list: spec s's output i is entry offsets[s] + i. */
class Board {
  readonly offsets: number[] = [];
  readonly specOf: number[] = [];
  readonly sharing: boolean[] = [];
  readonly tied: boolean[] = [];
  /** Units planned as one: an output, or a group's members (flat indices). */
  readonly units: { spec: number; members: number[]; group: number | null }[] = [];

  constructor(readonly specs: readonly SpecBoard[]) {
    specs.forEach((spec, s) => {
      const base = this.specOf.length;
      this.offsets.push(base);
      spec.requests.forEach(() => this.specOf.push(s));
      this.sharing.push(...sharingOutputs(spec));
      this.tied.push(...tiedOutputs(spec));
      spec.groups.forEach((g, k) => this.units.push({ spec: s, members: g.members.map((i) => base + i), group: k }));
      spec.requests.forEach((_, i) => {
        if (!this.tied[base + i]) this.units.push({ spec: s, members: [base + i], group: null });
      });
    });
  }

  get size(): number {
    return this.specOf.length;
  }

  request(k: number) {
    return this.specs[this.specOf[k]!]!.requests[k - this.offsets[this.specOf[k]!]!]!;
  }

  /** The part of a planned output; a table another member holds takes no bytes. */
  partAt(k: number, planning: OutputPlanning, e: Rational): Part {
    const part = actualPart(this.request(k), planning, e);
    return this.sharing[k] ? { ...part, bytes: 0 } : part;
  }

  /** Each spec's tables fit the budget. */
  fits(parts: readonly Part[], budgetBytes: number, done: readonly (boolean | null)[]): boolean {
    const byParts = partsFit(parts, this.specOf, this.specs.length, budgetBytes);
    return byParts.every((f, s) => done[s] ?? f);
  }
}

/** The best `limit` clocks for the board, proven (see above). Null when the tree is too large to enumerate. */
export function jointSearch(hw: Hardware, specs: readonly SpecBoard[], limit = 5, steps: BoardSteps = UNCACHED_STEPS): JointResult | null {
  const prepared = prepare(hw);
  if (prepared === null) return null;
  const e = hw.systemClockTolerance ?? ZERO;
  const budget = hw.memory.budgetBytes;
  const board = new Board(specs);
  const result: JointResult = { candidates: [], reachable: prepared.clocks.length, ruledOut: prepared.ruledOut, clocksPlanned: 0, plansMade: 0, complete: prepared.complete };

  // Per output, the two bounds it can have (exact possible or not); a shared table takes no bytes.
  const reqs = Array.from({ length: board.size }, (_, k) => board.request(k));
  const boundsIf = reqs.map((req, k) => [false, true].map((x) => ({ ...boundPart(hw, req, x), ...(board.sharing[k] ? { bytes: 0 } : {}) })));
  const testers = reqs.map((req) => exactTester(hw, req));
  // The most bytes an output's own plan can take: a pinned table, else the longest the budget allows.
  const longest = Math.min(hw.memory.tableLengthMax, Math.floor(budget / Math.max(1, hw.dac.sampleBytes))) * hw.dac.sampleBytes;
  const upper = reqs.map((req, k) => (board.sharing[k] ? 0 : req.pinned ? req.pinned.tableLength * hw.dac.sampleBytes : longest));
  const noneDone = specs.map((spec) => (spec.requests.length === 0 ? true : null));
  const queue = prepared.clocks.map((clock) => {
    const span = integerDividerSpan(hw, clock.systemClockHz);
    // The cheap form first: thousands of clocks are ranked by it, the few planned are refined.
    const exactAt = testers.map((test) => test(clock.systemClockHz, span, false));
    const parts = exactAt.map((x, k) => boundsIf[k]![x ? 1 : 0]!);
    const meta = metaOf(hw, clock);
    return { clock, span, exactAt, meta, bound: scoreOf(parts, board.fits(parts, budget, noneDone), meta, hw.systemClockHz) };
  });
  queue.sort((a, b) => compareScores(a.bound, b.bound));

  const best: ClockCandidate[] = [];
  const threshold = (): Score | null => (best.length >= limit ? best[best.length - 1]!.score : null);
  for (const item of queue) {
    const bar = threshold();
    if (bar && compareScores(item.bound, bar) > 0) break;
    // The thorough test can only lower the bound (it says "impossible" more often).
    const exactAt = item.exactAt.map((x, k) => x && testers[k]!(item.clock.systemClockHz, item.span, true));
    const bounds: Part[] = exactAt.map((x, k) => boundsIf[k]![x ? 1 : 0]!);
    const parts = [...bounds];
    const done: (boolean | null)[] = specs.map((spec) => (spec.requests.length === 0 ? true : null));
    const behind = (): boolean => !!bar && compareScores(scoreOf(parts, board.fits(parts, budget, done), item.meta, hw.systemClockHz), bar) > 0;
    if (behind()) continue;
    const planned = planClock(hw, board, item.clock, exactAt, bounds, parts, done, upper, e, steps, result, behind);
    if (planned === null) continue;
    best.push({ clock: item.clock, score: scoreOf(parts, done.every((d) => d === true), item.meta, hw.systemClockHz), plans: planned });
    best.sort((a, b) => compareScores(a.score, b.score));
    if (best.length > limit) best.pop();
  }
  result.candidates = best;
  return result;
}

/**
 * Plans one clock unit by unit, keeping `parts` (bounds, then figures) and `done` (each finished
 * spec's fit) up to date; null as soon as `behind` says the clock cannot make the list.
 */
function planClock(
  hw: Hardware,
  board: Board,
  clock: ReachableClock,
  exactAt: readonly boolean[],
  bounds: readonly Part[],
  parts: Part[],
  done: (boolean | null)[],
  upper: readonly number[],
  e: Rational,
  steps: BoardSteps,
  result: JointResult,
  behind: () => boolean,
): OutputPlanning[] | null {
  const hwAt: Hardware = { ...hw, systemClockHz: clock.systemClockHz };
  const budget = hw.memory.budgetBytes;
  const plans: OutputPlanning[] = new Array(board.size);
  const planned = new Array<boolean>(board.size).fill(false);
  // Per spec: units left to plan, and the most bytes its own plans can still take together.
  const left = board.specs.map(() => 0);
  for (const u of board.units) left[u.spec]!++;
  const most = board.specs.map(() => 0);
  upper.forEach((b, k) => {
    most[board.specOf[k]!]! += b;
  });
  const partOf = (k: number): Part => {
    const actual = board.partAt(k, plans[k]!, e);
    const mayShrink = most[board.specOf[k]!]! > budget && !board.tied[k] && shrinkable(board.request(k), plans[k]!);
    return mayShrink ? shrinkBound(actual, bounds[k]!) : actual;
  };
  // Plan first the units most likely to sink the clock: those that cannot be exact, the tightest
  // tolerance relative to the clock's own error first (they set the worst error).
  const cannot = (u: (typeof board.units)[number]) => u.members.some((k) => !exactAt[k]);
  const worstOf = (u: (typeof board.units)[number]) => u.members.reduce((w, k) => (compareShare(bounds[k]!.worst, w) > 0 ? bounds[k]!.worst : w), bounds[u.members[0]!]!.worst);
  const order = board.units.map((u, i) => ({ u, i })).sort((a, b) => Number(cannot(b.u)) - Number(cannot(a.u)) || compareShare(worstOf(b.u), worstOf(a.u)) || a.i - b.i);
  result.clocksPlanned++;
  for (const { u } of order) {
    const s = u.spec;
    const spec = board.specs[s]!;
    const base = board.offsets[s]!;
    for (const k of u.members) {
      plans[k] = steps.planAt(hwAt, board.request(k), stepsOf(spec));
      result.plansMade++;
    }
    if (u.group !== null) {
      const local = plans.slice(base, base + spec.requests.length);
      planGroupInto(hwAt, spec, spec.groups[u.group]!, local, steps);
      u.members.forEach((k) => {
        plans[k] = local[k - base]!;
      });
    }
    const wasOver = most[s]! > budget;
    for (const k of u.members) {
      most[s]! += (board.sharing[k] ? 0 : plans[k]!.plan?.tableBytes ?? 0) - upper[k]!;
      planned[k] = true;
    }
    if (--left[s]! === 0) finishSpec(hwAt, board, s, plans, parts, done, e, steps);
    else if (wasOver && most[s]! <= budget) {
      // No fit can happen now: every planned output of the spec counts as planned.
      for (let k = base; k < base + spec.requests.length; k++) if (planned[k]) parts[k] = partOf(k);
    } else for (const k of u.members) parts[k] = partOf(k);
    if (behind()) return null;
  }
  return plans;
}

/** A spec's units are all planned: the budget fit as the checker runs it, and the final parts. */
function finishSpec(hw: Hardware, board: Board, s: number, plans: OutputPlanning[], parts: Part[], done: (boolean | null)[], e: Rational, steps: BoardSteps): void {
  const spec = board.specs[s]!;
  const base = board.offsets[s]!;
  const own = plans.slice(base, base + spec.requests.length);
  const fit = fitSpec(hw, spec, own, steps.menuAt);
  fittedPlannings(hw, spec, own, fit).forEach((p, i) => {
    plans[base + i] = p;
  });
  done[s] = fit.fits;
  for (let k = base; k < base + spec.requests.length; k++) parts[k] = board.partAt(k, plans[k]!, e);
}

/** Every clock planned in full, then sorted: the oracle the search is proven against, and the benchmark's baseline. */
export function jointSearchExhaustive(hw: Hardware, specs: readonly SpecBoard[], limit = 5, steps: BoardSteps = UNCACHED_STEPS): JointResult | null {
  const prepared = prepare(hw);
  if (prepared === null) return null;
  const e = hw.systemClockTolerance ?? ZERO;
  const board = new Board(specs);
  const all = prepared.clocks.map((clock) => {
    const hwAt: Hardware = { ...hw, systemClockHz: clock.systemClockHz };
    const planned = specs.map((spec) => planSpecAt(hwAt, spec, steps));
    const plans = planned.flatMap((p) => p.plannings);
    const parts = plans.map((p, k) => board.partAt(k, p, e));
    return { clock, plans, score: scoreOf(parts, planned.every((p) => p.fit.fits), metaOf(hw, clock), hw.systemClockHz) };
  });
  all.sort((a, b) => compareScores(a.score, b.score));
  return {
    candidates: all.slice(0, limit),
    reachable: prepared.clocks.length,
    ruledOut: prepared.ruledOut,
    clocksPlanned: all.length,
    plansMade: all.length * board.size,
    complete: prepared.complete,
  };
}
