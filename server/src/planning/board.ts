// One memory budget for the board. When the outputs' own plans together take more than the
// budget, every output that can shrink (its plan within tolerance, not pinned) takes a plan from
// its menu (shrink.ts) so that the total fits, chosen by, in order:
//   1. the largest smallest share S / S_own over the outputs (S_own: the S of the output's own
//      plan, which is at most its S max whenever a plan there meets the tolerance);
//   2. then the smallest worst error share, |error| / tolerance, over the outputs;
//   3. then the fewest bytes in all;
// and, per output, the ranking of ranking.ts among its plans of that table length.
// Each step is a search over the finitely many values the menus offer: the bytes an output needs
// only grow with the share asked and only fall with the error allowed, so the best value is the
// largest (smallest) one whose total still fits, found by bisection.

import { type Rational, cmp, div, mul, neg, rat, toNumber } from '../../../shared-schema/src/rational';
import { type Ladder, firstExact, largestFeasible } from './ladder';
import { type Preference, bestRanked } from './ranking';
import { Frontier, type MenuPlan, type ShrinkMenu, menuSteps } from './shrink';
import type { Plan } from './types';

export interface BoardOutput {
  /** Bytes of the output's own plan (0 without one). */
  bytes: number;
  /** The smaller plans it could take; null when it keeps its plan (pinned, outside tolerance, none). */
  menu: ShrinkMenu | null;
  pref: Preference;
}

export interface BoardFit {
  /** The outputs' own plans took more than the budget. */
  over: boolean;
  /** Some choice within every output's tolerance fits (always true when not over). */
  fits: boolean;
  /** Per output: the plan it takes instead of its own, or null to keep its own. */
  plans: (Plan | null)[];
  /** Total bytes of the chosen plans (of the own plans when nothing fits). */
  totalBytes: number;
  /** The fewest bytes any choice within tolerance takes. */
  leastBytes: number;
  /** The objective reached: smallest share of S_own, largest share of the tolerance (null when not over or nothing fits). */
  minShare: Rational | null;
  worstErrorShare: Rational | null;
  /** Every menu scan finished within its budget (else the choice is the best found). */
  complete: boolean;
}

const ONE = rat(1);

/** min(1, S / S_own) of a menu plan. */
const shareOf = (menu: ShrinkMenu, p: MenuPlan): Rational => {
  const s = div(rat(p.n), rat(p.m));
  const share = div(s, menu.sRef);
  return cmp(share, ONE) > 0 ? ONE : share;
};

export function fitBoard(outputs: readonly BoardOutput[], budgetBytes: number): BoardFit {
  const own = outputs.reduce((t, o) => t + o.bytes, 0);
  const keep = outputs.map(() => null);
  if (own <= budgetBytes) return { over: false, fits: true, plans: keep, totalBytes: own, leastBytes: own, minShare: null, worstErrorShare: null, complete: true };
  const fixed = outputs.reduce((t, o) => t + (o.menu === null ? o.bytes : 0), 0);
  const menus = outputs.map((o) => o.menu);
  const steps = menuSteps(menus.filter((m) => m !== null).length);
  const frontiers = menus.map((m) => (m === null ? new Frontier() : m.frontier(steps)));
  const bytesOf = (i: number, n: number): number => n * menus[i]!.sampleBytes;
  const least = fixed + frontiers.reduce((t, f, i) => t + (f.length > 0 ? bytesOf(i, f.n(0)) : 0), 0);
  const complete = (): boolean => menus.every((m) => m === null || m.complete);
  if (least > budgetBytes) {
    return { over: true, fits: false, plans: keep, totalBytes: own, leastBytes: least, minShare: null, worstErrorShare: null, complete: complete() };
  }

  // 1. The smallest share: each frontier rises in share (and in bytes).
  const shareLadder = (i: number): Ladder => {
    const f = frontiers[i]!;
    const ref = toNumber(menus[i]!.sRef);
    const approx = new Float64Array(f.length);
    for (let k = 0; k < f.length; k++) approx[k] = Math.min(1, f.n(k) / f.m(k) / ref);
    return { approx, exact: (k) => shareOf(menus[i]!, f.at(k)), bytes: (k) => bytesOf(i, f.n(k)) };
  };
  const live = menus.flatMap((m, i) => (m === null ? [] : [i]));
  const shareLadders = new Map(live.map((i) => [i, shareLadder(i)] as const));
  const sigma = largestFeasible([...shareLadders.values()], fixed, budgetBytes)!;
  const sigmaF = toNumber(sigma);
  const startIndex = (i: number): number => firstExact(shareLadders.get(i)!, sigma, sigmaF);

  // 2. The largest error share, with every output at S ≥ σ·S_own: each staircase falls in error
  // share as its bytes rise, so minus the share rises.
  const floors = menus.map((m) => (m === null ? null : mul(sigma, m.sRef)));
  const starts = menus.map((m, i) => (m === null ? null : frontiers[i]!.at(startIndex(i))));
  const atSigma = starts.reduce((t, p, i) => (p === null ? t : t + bytesOf(i, p.n)), fixed);
  // No output may take more than the room the others leave at their fewest bytes for σ.
  const stairs = menus.map((m, i) => {
    if (m === null) return [];
    const room = Math.floor((budgetBytes - atSigma) / m.sampleBytes) + starts[i]!.n;
    return m.staircase(floors[i]!, starts[i]!, room, steps);
  });
  const errorLadders = new Map(live.map((i) => {
    const st = stairs[i]!;
    const ladder: Ladder = {
      approx: Float64Array.from(st, (x) => -toNumber(x.share)),
      exact: (k) => neg(st[k]!.share),
      bytes: (k) => bytesOf(i, st[k]!.plan.n),
    };
    return [i, ladder] as const;
  }));
  const rho = neg(largestFeasible([...errorLadders.values()], fixed, budgetBytes)!);
  const rhoF = toNumber(rho);

  // 3. Per output the fewest bytes at (σ, ρ), its ranking deciding between plans of that length.
  let total = fixed;
  const plans = menus.map((m, i) => {
    if (m === null) return null;
    const n = stairs[i]![firstExact(errorLadders.get(i)!, neg(rho), -rhoF)]!.plan.n;
    total += bytesOf(i, n);
    const chosen = bestRanked(m.plansAt(n, floors[i]!, rho), outputs[i]!.pref, m.fractional);
    return chosen !== null && sameTable(chosen, m.own) ? null : chosen;
  });
  return { over: true, fits: true, plans, totalBytes: total, leastBytes: least, minShare: sigma, worstErrorShare: rho, complete: complete() };
}

const sameTable = (a: Plan, b: Plan): boolean =>
  a.dividerInteger === b.dividerInteger && a.dividerFraction === b.dividerFraction && a.tableLength === b.tableLength && cmp(a.cycles, b.cycles) === 0;

