// Outputs planned together.
//
// Phase-locked groups share the divider D and the table length N and keep the exact ratio of
// their targets: with g the largest frequency every target is a whole multiple of (the rational
// gcd), member i holds M_i = m_i·M cycles where f_i = m_i·g, so the group is one plan of the
// fundamental g — S floor max_i(m_i·S_i), tolerance min_i(tol_i / m_i), the budget shared by the
// tables — ranked as the planner ranks any output. Every member then has the same relative error.
//
// Stated phase offsets become whole-sample rotations: a member with M_i cycles in N samples
// rotated by k samples runs k·M_i/N cycles ahead (mod 1), so the reachable offsets are the
// multiples of gcd(M_i, N)/N of a cycle; the nearest is taken and the rest reported as the phase
// error, in degrees and in seconds (cycles / f_i).
//
// Groups that share only the sample clock share D; each member keeps its own table, chosen by the
// planner for that D. The divider is searched over the span where every member can still have a
// plan (f_s between S_i·f_i and N max·f_i for some member), ranked: more members within tolerance, more exact,
// smaller worst error relative to tolerance, fewer bytes, the smaller D.

import { type Rational, ZERO, cmp, div, gcd, mul, rat, sub, toNumber } from '../../../shared-schema/src/rational';
import { withinWorstCase } from './clock-error';
import { planOutputUncached } from './choose';
import { describePlan } from './figures';
import { compareShare, actualPart } from './joint-score';
import type { Hardware, OutputPlanning, OutputRequest, Plan } from './types';

export interface PhaseResult {
  /** Asked, in degrees ahead of the first member. */
  offsetDeg: number;
  /** Samples the member's table is rotated by (or its DMA channel starts in). */
  rotation: number;
  realisedDeg: number;
  /** realised − asked, in (−180, 180]. */
  errorDeg: number;
  errorS: number;
}

export interface GroupPlanning {
  /** One planning per member, in the group's order. */
  plans: OutputPlanning[];
  /** Phase-locked groups: each member's offset as realised. */
  phases: PhaseResult[] | null;
  /** The shared divider's search stopped at its work limit (the best found is used). */
  searchLimited: boolean;
}

/** gcd of positive rationals a/b and c/d: gcd(a·d, c·b) / (b·d). */
function gcdRational(x: Rational, y: Rational): Rational {
  return rat(gcd(x.num * y.den, y.num * x.den), x.den * y.den);
}

/** Member planning from a plan of the fundamental: M_i = m_i·M, f_i achieved = m_i·f_g achieved. */
function memberPlanning(hw: Hardware, req: OutputRequest, fundamental: Plan | null, m: bigint, base: OutputPlanning): OutputPlanning {
  if (!fundamental) return { verdict: 'no-plan', plan: null, nearestJitterFree: null, bestFractional: null, withinTolerance: false };
  const achievedHz = mul(fundamental.achievedHz, rat(m));
  const plan: Plan = { ...fundamental, cycles: mul(fundamental.cycles, rat(m)), achievedHz, errorHz: sub(achievedHz, req.targetHz) };
  const figures = describePlan(hw, req, req.waveform, plan, 'open');
  const within = withinWorstCase(plan, req.toleranceHz, hw.systemClockTolerance);
  const verdict = !within ? 'out-of-tolerance' : !figures.jitterFree ? 'fractional' : plan.errorHz.num === 0n ? 'exact' : 'within-tolerance';
  return { verdict, plan: figures, nearestJitterFree: base.nearestJitterFree, bestFractional: base.bestFractional, withinTolerance: within };
}

/** The fundamental request of a phase-locked group, and each member's multiple m_i. */
export function fundamentalOf(reqs: readonly OutputRequest[]): { request: OutputRequest; multiples: bigint[] } {
  let g = reqs[0]!.targetHz;
  for (const r of reqs.slice(1)) g = gcdRational(g, r.targetHz);
  const multiples = reqs.map((r) => div(r.targetHz, g).num);
  let sFloor = ZERO;
  let tolerance: Rational | null = null;
  reqs.forEach((r, i) => {
    const s = mul(r.minSamplesPerCycle, rat(multiples[i]!));
    if (cmp(s, sFloor) > 0) sFloor = s;
    const t = div(r.toleranceHz, rat(multiples[i]!));
    if (tolerance === null || cmp(t, tolerance) < 0) tolerance = t;
  });
  const first = reqs[0]!;
  return {
    request: {
      targetHz: g,
      minSamplesPerCycle: sFloor,
      wholeSamplesPerCycle: reqs.some((r) => r.wholeSamplesPerCycle === true),
      waveform: first.waveform,
      toleranceHz: tolerance!,
      jitter: reqs.every((r) => r.jitter === 'allow') ? 'allow' : 'forbid',
    },
    multiples,
  };
}

/** The nearest whole-sample rotation to `offsetDeg` for M cycles in N samples, and what it leaves. */
export function phaseRotation(offsetDeg: number, cycles: number, tableLength: number, frequencyHz: number): PhaseResult {
  const g = gcdNumberSafe(cycles, tableLength);
  const steps = tableLength / g;
  const want = ((((offsetDeg / 360) % 1) + 1) % 1) * steps;
  const j = Math.round(want) % steps;
  // k·(M/g) ≡ j (mod N/g): k = j · (M/g)^-1 mod N/g.
  const k = steps === 1 ? 0 : (j * modInverse((cycles / g) % steps, steps)) % steps;
  const realised = ((k * cycles) % tableLength) / tableLength;
  let errorCycles = realised - offsetDeg / 360;
  errorCycles -= Math.round(errorCycles);
  if (errorCycles <= -0.5) errorCycles += 1;
  const realisedDeg = realised * 360;
  return { offsetDeg, rotation: k, realisedDeg, errorDeg: errorCycles * 360, errorS: errorCycles / frequencyHz };
}

function gcdNumberSafe(a: number, b: number): number {
  while (b !== 0) [a, b] = [b, a % b];
  return Math.abs(a);
}

/** x^-1 mod m for gcd(x, m) = 1 (extended Euclid). */
function modInverse(x: number, m: number): number {
  let [r0, r1] = [m, x];
  let [t0, t1] = [0, 1];
  while (r1 !== 0) {
    const q = Math.floor(r0 / r1);
    [r0, r1] = [r1, r0 - q * r1];
    [t0, t1] = [t1, t0 - q * t1];
  }
  return ((t0 % m) + m) % m;
}

/**
 * A phase-locked group: one plan of the fundamental, the members' cycles its multiples, each
 * offset realised as a rotation. `tables` is how many tables the budget holds (1 when the members
 * share one table through start offsets).
 */
export function planPhaseGroup(hw: Hardware, reqs: readonly OutputRequest[], base: readonly OutputPlanning[], offsetsDeg: readonly number[], tables: number): GroupPlanning {
  const { request, multiples } = fundamentalOf(reqs);
  const shared: Hardware = { ...hw, memory: { ...hw.memory, budgetBytes: Math.floor(hw.memory.budgetBytes / Math.max(1, tables)) } };
  const planning = planOutputUncached(shared, request);
  const fundamental = planning.plan;
  const plans = reqs.map((r, i) => memberPlanning(hw, r, fundamental, multiples[i]!, base[i]!));
  const phases = fundamental
    ? reqs.map((r, i) => phaseRotation(offsetsDeg[i] ?? 0, Number(plans[i]!.plan!.cycles.num), fundamental.tableLength, toNumber(plans[i]!.plan!.achievedHz)))
    : null;
  return { plans, phases, searchLimited: fundamental?.searchLimited === true };
}

/** Dividers one shared-clock search tries before it stops and keeps the best found. */
export const SHARED_DIVIDER_LIMIT = 2048;

interface GroupRank {
  within: number;
  exact: number;
  worst: ReturnType<typeof actualPart>['worst'];
  bytes: number;
  d: number;
}

function compareRank(a: GroupRank, b: GroupRank): number {
  if (a.within !== b.within) return b.within - a.within;
  if (a.exact !== b.exact) return b.exact - a.exact;
  const w = compareShare(a.worst, b.worst);
  if (w !== 0) return w;
  if (a.bytes !== b.bytes) return a.bytes - b.bytes;
  return a.d - b.d;
}

/** The dividers where some member can have a plan: S_i·f_i ≤ f_s ≤ N max·f_i for one i at least (the tolerance's slack included). */
export function sharedDividerSpan(hw: Hardware, reqs: readonly OutputRequest[]): { lo: number; hi: number } {
  const fSys = toNumber(hw.systemClockHz);
  const nMax = Math.min(hw.memory.tableLengthMax, Math.floor(hw.memory.budgetBytes / hw.dac.sampleBytes));
  // Outside every member's own span no member has a plan; inside the union some may.
  let lo = Infinity;
  let hi = 0;
  for (const r of reqs) {
    const f = toNumber(r.targetHz);
    // Within tolerance f_out lies in f·(1 ± t): f_s = f_out·N/M ≤ f·(1 + t)·N max, f_s ≥ S floor·f·(1 − t).
    const t = toNumber(div(r.toleranceHz, r.targetHz)) + 1e-9;
    lo = Math.min(lo, Math.floor(fSys / (f * (1 + t) * nMax)));
    hi = Math.max(hi, t >= 1 ? Infinity : Math.ceil(fSys / (f * (1 - t) * toNumber(r.minSamplesPerCycle))));
  }
  return { lo: Math.max(lo, hw.divider.integerMin, Math.ceil(fSys / toNumber(hw.dac.maxSampleRateHz) - 1e-9)), hi: Math.min(hi, hw.divider.integerMax) };
}

/** A shared-clock group: one integer divider for all, each member's table chosen for it. */
export function planSharedClock(hw: Hardware, reqs: readonly OutputRequest[], base: readonly OutputPlanning[]): GroupPlanning {
  // Outside the span no member is within tolerance, so a divider inside it that puts one member
  // within beats them all; only when none does are the other dividers tried.
  const span = sharedDividerSpan(hw, reqs);
  const full = { lo: Math.max(hw.divider.integerMin, Math.ceil(toNumber(div(hw.systemClockHz, hw.dac.maxSampleRateHz)) - 1e-9)), hi: hw.divider.integerMax };
  const inside = searchDividers(hw, reqs, span);
  const found = inside.best && inside.best.rank.within > 0 ? inside : searchDividers(hw, reqs, full);
  return finish(hw, reqs, base, found.best, found.limited);
}

function searchDividers(hw: Hardware, reqs: readonly OutputRequest[], span: { lo: number; hi: number }) {
  const e = hw.systemClockTolerance ?? ZERO;
  let best: { rank: GroupRank; plans: OutputPlanning[] } | null = null;
  const last = Math.min(span.hi, span.lo + SHARED_DIVIDER_LIMIT - 1);
  for (let d = span.lo; d <= last; d++) {
    const fixed: Hardware = { ...hw, divider: { integerMin: d, integerMax: d, fractionBits: 0 } };
    const plans = reqs.map((r) => planOutputUncached(fixed, r.pinned ? r : { ...r, jitter: 'forbid' }));
    const parts = plans.map((p, i) => actualPart(reqs[i]!, p, e));
    let worst = parts[0]!.worst;
    for (const p of parts) if (compareShare(p.worst, worst) > 0) worst = p.worst;
    const rank: GroupRank = {
      within: parts.reduce((s, p) => s + p.within, 0),
      exact: parts.reduce((s, p) => s + p.exact, 0),
      worst,
      bytes: parts.reduce((s, p) => s + p.bytes, 0),
      d,
    };
    if (best === null || compareRank(rank, best.rank) < 0) best = { rank, plans };
  }
  return { best, limited: span.hi > last };
}

function finish(hw: Hardware, reqs: readonly OutputRequest[], base: readonly OutputPlanning[], best: { plans: OutputPlanning[] } | null, limited: boolean): GroupPlanning {
  // The divider was fixed for the search; the plans keep the hardware's own fraction bits (F = 0).
  const bits = hw.divider.fractionBits;
  const plans = best
    ? best.plans.map((p, i) => ({ ...p, plan: p.plan && { ...p.plan, fractionBits: bits }, nearestJitterFree: base[i]!.nearestJitterFree, bestFractional: base[i]!.bestFractional }))
    : reqs.map(() => ({ verdict: 'no-plan' as const, plan: null, nearestJitterFree: null, bestFractional: null, withinTolerance: false }));
  return { plans, phases: null, searchLimited: limited };
}
