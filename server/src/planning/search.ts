// The true optimum plan of one output: minimal |f_out − f_target| exactly, ties broken as
// rank.ts documents. Three exact methods, cheapest first:
//   1. exact plans by number theory (exact.ts), which settle every target the hardware can hit;
//   2. the walk: over the smaller of the two dimensions (dividers J or table lengths N) within
//      the span where a plan can still matter, the Farey kernel names the best partner of each
//      value (scan.ts) — cheap when that span is short (high targets);
//   3. the best-first search over cycles and products (cycles.ts) when both spans are long (low
//      targets); it hands back to the walk if its pairs run over a share of the walk's cost.
// Doubles carry the searches; near-ties are settled exactly.

import { type Rational, rat, sub } from '../../../shared-schema/src/rational';
import { fareyNeighbours } from './farey';
import { type Domain, jitterFreeDomain, fractionalDomain, achievedHz } from './domain';
import { type Candidate, Leader } from './rank';
import { type Cap, ScanJ, ScanN, WorkBudget } from './scan';
import { offerExactPlans } from './exact';
import { searchByCycles } from './cycles';
import { MemberWalk } from './stages';
import type { Hardware, Plan, PlanRequest } from './types';

/**
 * The best plan with an integer divider (F = 0): no divider jitter. Null when none exists.
 * `ceiling` bounds S = N/M from above (the planner's S max); none when null.
 */
export function nearestJitterFree(hw: Hardware, req: PlanRequest, ceiling: Rational | null = null): Plan | null {
  return nearestJitterFreeBy(hw, req, 'auto', ceiling);
}

/**
 * How `solve` looks for an optimum. 'auto' is the planner; 'walk' is the walk alone (no exact
 * pre-pass, no cycles search) and 'cycles' runs the cycles search without limits (the walk only
 * where it declines: products or table lengths beyond its reach): two independent methods, for
 * tests that check one against the other and for the benchmark.
 */
export type Strategy = 'auto' | 'walk' | 'cycles';

/** nearestJitterFree with a chosen strategy. */
export function nearestJitterFreeBy(hw: Hardware, req: PlanRequest, strategy: Strategy, ceiling: Rational | null = null): Plan | null {
  const d = jitterFreeDomain(hw, req, ceiling);
  if (d === null) return null;
  const c = solve(d, null, strategy);
  return c.best === null ? null : toPlan(hw, d, c.best, c.complete);
}

/**
 * The best plan over every divider I + F/2^k (F = 0 included). Null when no plan exists.
 * An exact jitter-free plan is already the best fractional plan (error 0, p(1−p) = 0, and the
 * remaining keys agree), so the wider search runs only when the integer divider misses.
 */
export function bestFractional(hw: Hardware, req: PlanRequest, ceiling: Rational | null = null): Plan | null {
  return bestFractionalBy(hw, req, 'auto', ceiling);
}

/** bestFractional with a chosen strategy. */
export function bestFractionalBy(hw: Hardware, req: PlanRequest, strategy: Strategy, ceiling: Rational | null = null): Plan | null {
  const whole = jitterFreeDomain(hw, req, ceiling);
  const wholeOutcome = whole === null ? null : solve(whole, null, strategy);
  const wholeBest = wholeOutcome === null ? null : wholeOutcome.best;
  if (hw.divider.fractionBits === 0 || (wholeBest !== null && sub(achieved(whole!, wholeBest), req.targetHz).num === 0n)) {
    return wholeBest === null ? null : toPlan(hw, whole!, wholeBest, wholeOutcome!.complete);
  }
  const d = fractionalDomain(hw, req, ceiling);
  if (d === null) return null;
  const seed = wholeBest === null ? null : { ...wholeBest, j: wholeBest.j * d.scale };
  const c = solve(d, seed, strategy);
  return c.best === null ? null : toPlan(hw, d, c.best, c.complete);
}

function achieved(d: Domain, c: Candidate): Rational {
  return achievedHz(d, c.j, c.n, c.m);
}

function toPlan(hw: Hardware, d: Domain, c: Candidate, complete: boolean): Plan {
  const achievedHz = achieved(d, c);
  // Nothing is nearer than an exact plan: it is the nearest whether or not the search finished.
  const proven = complete || sub(achievedHz, d.target).num === 0n;
  return {
    ...(proven ? {} : { searchLimited: true }),
    dividerInteger: Math.floor(c.j / d.scale),
    dividerFraction: c.j % d.scale,
    fractionBits: hw.divider.fractionBits,
    tableLength: c.n,
    cycles: rat(BigInt(c.m)),
    achievedHz,
    errorHz: sub(achievedHz, d.target),
  };
}

/** Relative margin on the float bounds of the walked span, so exact ties at its edge stay in. */
const EDGE = 1e-9;

/**
 * Walks longer than this try the cycles search first. Rough costs on the full domain (bench/plan.ts):
 * a walk step (one Farey call) ~0.3 µs, the cycles set-up ~0.02–0.05 µs per M, a ranked value
 * ~1–10 µs (a factorisation). The limits keep a cycles search that goes badly within a share of
 * the walk it replaces; its memory grows with M, hence the fixed cap.
 */
const CYCLES_FROM = 64;
const CYCLES_MAX = 1 << 18;

/**
 * Walk steps one search may take (about half a second). Only absurd domains reach it — say a 32-bit divider
 * with 16 fraction bits and 2^26-sample tables at a millihertz target; the search then stops and
 * says its plan is the best found, not proven nearest, rather than running for minutes. Counted
 * in steps, not seconds, so the result does not depend on the machine.
 */
export const WALK_BUDGET = 1 << 19;

/** What a search found, and whether it covered the whole domain (else: stopped at WALK_BUDGET). */
export interface Outcome {
  best: Candidate | null;
  complete: boolean;
}

/** The exact best candidate of a domain, starting from an optional known plan. */
export function solve(d: Domain, seed: Candidate | null, strategy: Strategy = 'auto'): Outcome {
  const budget = new WorkBudget(WALK_BUDGET);
  const lead = new Leader(d, budget);
  const done = (complete = true): Outcome => ({ best: lead.result(), complete });
  if (seed !== null) lead.offer(seed.j, seed.n, seed.m);
  // Error 0 cannot be beaten, and the exact plans are ranked without a scan.
  if (strategy !== 'walk' && offerExactPlans(d, lead)) return done();
  const byJ = new ScanJ(d, lead, capOf(d), budget, ceilingCapOf(d));
  const byN = new ScanN(d, lead, budget);
  const C = d.clockF;
  const T = d.targetF;
  const stages = d.dividers;
  // A probe needs some divider the hardware makes near j: the nearest member above, else below.
  const clampJ = (j: number): number => {
    const c = Math.min(d.jMax, Math.max(d.jMin, j));
    return stages === null ? c : stages.next(c, d.jMax) || stages.prev(d.jMin, c);
  };

  // Two cheap probes give an error bound before the span is fixed: the dividers where the
  // longest table holds one cycle (or the S ceiling is met exactly) and where the S floor is.
  const sTop = Math.min(d.nMax, d.sCeilF);
  byJ.run(clampJ(Math.ceil(C / (sTop * T))));
  byJ.run(clampJ(Math.floor(C / (d.sFloorF * T))));

  // f_out ≥ C/(J·min(N max, S ceiling)) and f_out ≤ C/(J·S floor): outside these J can only do worse.
  const jLow = (e: number): number => Math.max(d.jMin, Math.floor((C / (sTop * (T + e))) * (1 - EDGE)));
  const jHigh = (e: number): number =>
    T - e > 0 ? Math.min(d.jMax, Math.ceil((C / (d.sFloorF * (T - e))) * (1 + EDGE))) : d.jMax;
  // f_out ≥ C/(J max·N): short tables can only do worse below this N.
  const nLow = Math.max(d.nMin, Math.floor((C / (d.jMax * (T + lead.errF))) * (1 - EDGE)));

  const j0 = jLow(lead.errF);
  let j1 = jHigh(lead.errF);
  const lengths = d.powerOfTwo ? d.lengths.filter((n) => n >= nLow) : null;
  // The walk over N asks the Farey kernel for any J up to J max: with stages only where every J
  // of the span is one (stages.ts), else the walk goes over the dividers the stages make.
  const countN = stages !== null && j1 > stages.completeTo ? Infinity : lengths !== null ? lengths.length : d.nMax - nLow + 1;
  const walk = Math.min(j1 - j0 + 1, countN);
  const limits =
    strategy === 'cycles'
      ? { maxCycles: Infinity, maxPairs: Infinity }
      : strategy === 'auto' && walk > CYCLES_FROM
        ? { maxCycles: Math.min(16 * walk, CYCLES_MAX), maxPairs: Math.min(walk, WALK_BUDGET) / 16 }
        : null;
  if (limits !== null && searchByCycles(d, lead, limits, budget)) return done();

  if (j1 - j0 + 1 <= countN) {
    // Ascending J: once the leader is exact (and jitter-free in fractional mode) at a J already
    // passed, no later J can beat it — a larger J means a smaller S for the same f_out.
    const members = stages === null ? null : new MemberWalk(stages, j0, j1);
    for (let j = members === null ? j0 : members.next(); j <= j1; j = members === null ? j + 1 : members.next()) {
      if (j === 0) break;
      if (!budget.take()) return done(false);
      const before = lead.errF;
      byJ.run(j);
      if (lead.errF !== before) {
        j1 = Math.min(j1, jHigh(lead.errF));
        if (lead.errF <= 1e-9 * T && lead.j <= j && lead.j % d.scale === 0 && lead.exact()) break;
      }
    }
  } else if (lengths !== null) {
    for (const n of lengths) if (budget.take()) byN.run(n);
  } else {
    // Longest tables first: they resolve the finest frequencies, so a stopped walk keeps them.
    for (let n = d.nMax; n >= nLow; n--) {
      if (!budget.take()) return done(false);
      byN.run(n);
    }
  }
  return done(!budget.spent);
}

/** The smallest M/N ≥ 1/S ceiling with N ≤ N max; null without a ceiling. */
function ceilingCapOf(d: Domain): Cap | null {
  if (d.cNum === 0n) return null;
  const { upper } = fareyNeighbours(rat(d.cDen, d.cNum), BigInt(d.nMax));
  if (upper === null) return null;
  return { m: Number(upper.num), n: Number(upper.den), valueF: Number(upper.num) / Number(upper.den) };
}

/** The largest positive M/N ≤ 1/S floor with N ≤ N max; null when there is none. */
function capOf(d: Domain): Cap | null {
  const { lower } = fareyNeighbours(rat(d.sDen, d.sNum), BigInt(d.nMax));
  if (lower.num < 1n) return null;
  return { m: Number(lower.num), n: Number(lower.den), valueF: Number(lower.num) / Number(lower.den) };
}
