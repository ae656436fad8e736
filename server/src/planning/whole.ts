// Plans whose table holds a whole number of samples per cycle (N a multiple of M), as square,
// triangle and sawtooth tables need: with a fractional S their edges and corners land on
// different samples from cycle to cycle.
//
// With S = N/M a whole number, f_out = f_sys / (D·S) depends on D and S only; the table is S
// samples long, or the shortest multiple of S the table-length limits admit. An exact target
// (f_sys·2^k / f_target = K a whole number) is settled by number theory: its plans are the
// divisors S of K with K/S an allowed divider. Otherwise one walk over S with the best divider
// for each (floor or ceiling of the ideal), in doubles, and an exact re-ranking of the candidates
// the doubles cannot tell apart; the walk takes at most WHOLE_BUDGET steps.
//
// Which plan: `nearestWholeCycle` keeps the nearest-plan order (ranking.ts without preferences);
// `rankedWholeCycle` the output's ranking, class by class (duty realised, S ≤ S max).

import { type Rational, abs, ceil, cmp, div, isInteger, mul, rat, sub, toNumber } from '../../../shared-schema/src/rational';
import { DIVISOR_REACH, divisorsInRange } from './divisors';
import { realisesDutyAt } from './duty';
import { type Preference, bestRanked, withinTolerance } from './ranking';
import { WorkBudget } from './scan';
import { StageNeighbours } from './stage-walk';
import { type StageProducts, stageProducts } from './stages';
import type { Hardware, Plan, PlanRequest } from './types';

/**
 * Steps one walk may take (a few tens of milliseconds). Only absurd domains — tables of 2^26
 * samples at a sub-hertz target, say — reach it; the plan is then the best found and says so.
 * Counted in steps, not seconds, so the result does not depend on the machine.
 */
export const WHOLE_BUDGET = 1 << 20;

interface Candidate {
  /** Divider in 1/2^q steps: D = j / scale. */
  j: number;
  s: number;
  n: number;
}

interface Context {
  hw: Hardware;
  req: PlanRequest;
  fractional: boolean;
  scale: number;
  clock: Rational;
  C: number;
  T: number;
  jLo: number;
  jHi: number;
  nMin: number;
  nMax: number;
  sLo: number;
  powerOfTwo: boolean;
  strategy: WholeStrategy;
  /** The dividers a two-stage divider makes (jLo, jHi are members), or null for a range. */
  stages: StageProducts | null;
}

/** 'auto' is the planner; 'walk' the walk over S alone, for tests that check one method against the other. */
export type WholeStrategy = 'auto' | 'walk';

function context(hw: Hardware, req: PlanRequest, fractional: boolean, strategy: WholeStrategy = 'auto'): Context | null {
  const q = fractional ? hw.divider.fractionBits : 0;
  const scale = 2 ** q;
  const clock = mul(hw.systemClockHz, rat(scale));
  if (req.targetHz.num <= 0n || hw.dac.maxSampleRateHz.num <= 0n) return null;
  // J ≥ scale·f_sys / f_s max keeps the sample rate within the DAC's limit.
  const jRate = Number(ceil(div(clock, hw.dac.maxSampleRateHz)));
  let jLo = Math.max(hw.divider.integerMin * scale, jRate, 1);
  let jHi = hw.divider.integerMax * scale + (scale - 1);
  // A stage divider (F = 0 only): its smallest and largest members bound J.
  const stages = stageProducts(hw.divider.stages);
  if (stages !== null && jLo <= jHi) {
    jLo = stages.next(jLo, jHi);
    if (jLo === 0) return null;
    jHi = stages.prev(jLo, jHi);
  }
  const nMax = Math.min(hw.memory.tableLengthMax, Math.floor(hw.memory.budgetBytes / hw.dac.sampleBytes));
  const nMin = Math.max(1, hw.memory.tableLengthMin);
  const sLo = Math.max(1, Number(ceil(req.minSamplesPerCycle)));
  if (jLo > jHi || sLo > nMax) return null;
  return {
    hw, req, fractional, scale, clock, C: toNumber(clock), T: toNumber(req.targetHz),
    jLo, jHi, nMin, nMax, sLo, powerOfTwo: hw.memory.powerOfTwo, strategy, stages,
  };
}

/** Shortest allowed table holding whole cycles of S samples, or 0 when none fits. */
function shortestTable(ctx: Context, s: number): number {
  if (ctx.powerOfTwo) {
    if ((s & (s - 1)) !== 0) return 0;
    let n = s;
    while (n < ctx.nMin) n *= 2;
    return n <= ctx.nMax ? n : 0;
  }
  const n = Math.max(s, Math.ceil(ctx.nMin / s) * s);
  return n <= ctx.nMax ? n : 0;
}

/** The S after s the walk visits (only powers of two hold power-of-two tables). */
const nextS = (ctx: Context, s: number): number => (ctx.powerOfTwo ? 2 ** (Math.floor(Math.log2(s)) + 1) : s + 1);

function toPlan(ctx: Context, c: Candidate): Plan {
  const achievedHz = div(ctx.clock, rat(BigInt(c.j) * BigInt(c.s)));
  return {
    dividerInteger: Math.floor(c.j / ctx.scale),
    dividerFraction: c.j % ctx.scale,
    fractionBits: ctx.hw.divider.fractionBits,
    tableLength: c.n,
    cycles: rat(c.n / c.s),
    achievedHz,
    errorHz: sub(achievedHz, ctx.req.targetHz),
  };
}

const limited = (p: Plan): Plan => ({ ...p, searchLimited: true });

/** Which S a search may use: the window and a filter. */
interface Admitted {
  from: number;
  to: number;
  admit: (s: number) => boolean;
}

/** Walks shorter than this are taken as they are; longer ones try the products first. */
const SHORT_WALK = 2048;
/** Products K = J·S the outward search may try before it hands over to the walk. */
const OUTWARD_STEPS = 4096;

/** Every plan at the least error among the admitted S (empty when none), and whether that is proven. */
function nearestPlans(ctx: Context, a: Admitted): { plans: Plan[]; complete: boolean } {
  const to = Math.min(a.to, ctx.nMax);
  const from = Math.max(a.from, ctx.sLo);
  if (from > to) return { plans: [], complete: true };
  const exact = exactPlans(ctx, from, to, a.admit);
  if (exact !== null && exact.length > 0) return { plans: exact, complete: true };
  const { C, T } = ctx;
  // Beyond S ≥ C/(jLo·T) even the fastest divider lands below the target and the error grows
  // with S, so the first admitted S past that point ends the walk. Below C/(jHi·T) the slowest
  // divider is still above the target and the error shrinks as S grows, so the walk starts at
  // the last admitted S before it.
  const sHigh = C / (ctx.jLo * T);
  const sLow = C / (ctx.jHi * T);
  if (ctx.strategy === 'auto' && Math.min(to, sHigh) - Math.max(from, sLow) > SHORT_WALK) {
    const outward = outwardPlans(ctx, from, to, a.admit);
    if (outward !== null) return { plans: outward, complete: true };
  }
  return walkPlans(ctx, from, to, a.admit, sLow, sHigh);
}

/** The walk over S (see nearestPlans), at most WHOLE_BUDGET steps. */
function walkPlans(ctx: Context, from: number, to: number, admit: (s: number) => boolean, sLow: number, sHigh: number): { plans: Plan[]; complete: boolean } {
  const a = { admit };
  const budget = new WorkBudget(WHOLE_BUDGET);
  const { C, T } = ctx;
  let start = from;
  for (let s = Math.min(to, Math.floor(sLow)); s >= from && budget.take(); s--) {
    if (a.admit(s) && shortestTable(ctx, s) > 0) {
      start = s;
      break;
    }
  }

  const found: { c: Candidate; err: number }[] = [];
  let bestErr = Infinity;
  const offer = (c: Candidate): void => {
    const err = Math.abs(C / (c.j * c.s) - T);
    // Keep everything the doubles cannot separate from the best; settle it exactly below.
    if (err > bestErr * (1 + 1e-9) + 1e-300) return;
    if (err < bestErr) bestErr = err;
    found.push({ c, err });
  };
  if (ctx.powerOfTwo) start = 2 ** Math.ceil(Math.log2(start));
  // A stage divider: the nearest dividers the stages make stand in for floor and ceiling.
  const near = ctx.stages === null ? null : new StageNeighbours(ctx.stages, ctx.jLo, ctx.jHi, ctx.clock, ctx.req.targetHz);
  for (let s = start; s <= to; s = nextS(ctx, s)) {
    if (!budget.take()) break;
    if (!a.admit(s)) continue;
    const n = shortestTable(ctx, s);
    if (n === 0) continue;
    const ideal = C / (T * s);
    if (near !== null) near.visit(s, ideal, (j) => offer({ j, s, n }));
    else {
      const jf = Math.min(ctx.jHi, Math.max(ctx.jLo, Math.floor(ideal)));
      const jc = Math.min(ctx.jHi, Math.max(ctx.jLo, Math.ceil(ideal)));
      offer({ j: jf, s, n });
      if (jc !== jf) offer({ j: jc, s, n });
    }
    if (s >= sHigh) break;
  }
  const plans = found.filter((f) => f.err <= bestErr * (1 + 1e-9) + 1e-300).map((f) => toPlan(ctx, f.c));
  if (plans.length === 0) return { plans, complete: !budget.spent };
  let least = abs(plans[0]!.errorHz);
  for (const p of plans) if (cmp(abs(p.errorHz), least) < 0) least = abs(p.errorHz);
  const at = plans.filter((p) => cmp(abs(p.errorHz), least) === 0);
  // Nothing is nearer than an exact plan, finished or not.
  const proven = !budget.spent || least.num === 0n;
  return { plans: proven ? at : at.map(limited), complete: proven };
}

/**
 * The plans of least error by products K = J·S in rising error outward from K* = C/f_target
 * (f_out = C/K, so the error grows with the distance of K from K* on each side): the first K with
 * an admitted divisor S (K/S an allowed divider) holds the nearest plans, with the other side's K
 * when its error is exactly equal. Null when OUTWARD_STEPS products have no plan (the walk
 * decides). The caller has made sure the numbers stay exact in doubles (exactPlans ran).
 */
function outwardPlans(ctx: Context, from: number, to: number, admit: (s: number) => boolean): Plan[] | null {
  const star = div(ctx.clock, ctx.req.targetHz);
  const sHi = Math.min(to, ctx.nMax);
  const kMin = ctx.jLo * from;
  const kMax = ctx.jHi * sHi;
  if (!(kMax < 2 ** 52) || Math.min(sHi, Math.sqrt(kMax)) > DIVISOR_REACH) return null;
  // Products outside [kMin, kMax] have no plan: start each side at the nearest one that may.
  const floorStar = star.num / star.den;
  let down = floorStar > BigInt(kMax) ? kMax : Number(floorStar);
  let up = floorStar + 1n < BigInt(kMin) ? kMin : Number(floorStar) + 1;
  const C = ctx.C, T = ctx.T;
  // error of K below K*: C/K − T; above: T − C/K. Compared exactly when the doubles cannot tell.
  const errorOf = (k: number): Rational => abs(sub(div(ctx.clock, rat(k)), ctx.req.targetHz));
  const downFirst = (): boolean => {
    if (down < kMin || down < 1) return false;
    if (up > kMax) return true;
    const ed = C / down - T;
    const eu = T - C / up;
    if (Math.abs(ed - eu) > 1e-9 * (ed + eu)) return ed < eu;
    return cmp(errorOf(down), errorOf(up)) <= 0;
  };
  for (let step = 0; step < OUTWARD_STEPS; step++) {
    if ((down < kMin || down < 1) && up > kMax) return [];
    const fromDown = downFirst();
    const k = fromDown ? down : up;
    if (fromDown) down--;
    else up++;
    const found = plansOfProduct(ctx, k, from, sHi, admit);
    if (found.length === 0) continue;
    // The other side's next product may tie exactly.
    const other = fromDown ? up : down;
    if (other >= Math.max(kMin, 1) && other <= kMax && cmp(errorOf(other), errorOf(k)) === 0) {
      found.push(...plansOfProduct(ctx, other, from, sHi, admit));
    }
    return found;
  }
  return null;
}

const divisors: number[] = [];

/** The plans with J·S = K among the admitted S in [from, to]. */
function plansOfProduct(ctx: Context, k: number, from: number, to: number, admit: (s: number) => boolean): Plan[] {
  const lo = Math.max(from, Math.ceil(k / ctx.jHi));
  const hi = Math.min(to, Math.floor(k / ctx.jLo));
  const plans: Plan[] = [];
  if (lo > hi) return plans;
  divisorsInRange(k, lo, hi, divisors);
  for (const s of divisors) {
    const j = k / s;
    if (j < ctx.jLo || j > ctx.jHi || !admit(s) || (ctx.stages !== null && !ctx.stages.has(j))) continue;
    const n = shortestTable(ctx, s);
    if (n > 0) plans.push(toPlan(ctx, { j, s, n }));
  }
  return plans;
}

/**
 * Every exact plan among the admitted S: K = C/f_target must be whole, and S a divisor of K with
 * K/S an allowed divider. Null when the number theory is out of reach (then the walk decides).
 */
function exactPlans(ctx: Context, from: number, to: number, admit: (s: number) => boolean): Plan[] | null {
  const k = div(ctx.clock, ctx.req.targetHz);
  if (!isInteger(k)) return [];
  if (k.num >= 2n ** 52n) return null;
  const K = Number(k.num);
  const lo = Math.max(from, Math.ceil(K / ctx.jHi));
  const hi = Math.min(to, Math.floor(K / ctx.jLo));
  if (lo > hi) return [];
  // Trial division reaches min(hi, √K); beyond the prime table's reach only short windows are listed.
  if (Math.min(hi, Math.sqrt(K)) > DIVISOR_REACH && hi - lo > DIVISOR_REACH && K / lo - K / hi > DIVISOR_REACH) return null;
  return plansOfProduct(ctx, K, lo, hi, admit);
}

const ALL: Admitted = { from: 1, to: Infinity, admit: () => true };
const NEUTRAL = (req: PlanRequest): Preference => ({ toleranceHz: req.targetHz, maxSamplesPerCycle: null, duty: null });

/**
 * Best plan with whole samples per cycle in the nearest-plan order. fractional = false keeps
 * F = 0 (jitter-free); true admits every F of the clock's fraction bits. Null when none exists.
 */
export function nearestWholeCycle(hw: Hardware, req: PlanRequest, fractional: boolean, strategy: WholeStrategy = 'auto'): Plan | null {
  return wholeCyclePlans(hw, req, fractional, null, strategy).nearest;
}

/**
 * The nearest whole-S plan and the plan the output's ranking chooses among them (ranking.ts):
 * the nearest plan of the first class that has one within tolerance — duty realised and
 * S ≤ S max, duty realised, S ≤ S max, the rest — else the nearest plan of all, its ties ranked.
 * Without a preference (null) the ranked plan is the nearest.
 */
export function wholeCyclePlans(
  hw: Hardware,
  req: PlanRequest,
  fractional: boolean,
  pref: Preference | null,
  strategy: WholeStrategy = 'auto',
): { nearest: Plan | null; ranked: Plan | null } {
  const ctx = context(hw, req, fractional, strategy);
  if (ctx === null) return { nearest: null, ranked: null };
  const all = nearestPlans(ctx, ALL).plans;
  const nearest = bestRanked(all, NEUTRAL(req), fractional);
  // Nothing is nearer than the nearest: when it misses the tolerance, every class does.
  if (pref === null || nearest === null) return { nearest, ranked: nearest };
  if (!withinTolerance(nearest, pref)) return { nearest, ranked: bestRanked(all, pref, fractional) };
  const cap = pref.maxSamplesPerCycle;
  const top = cap === null ? Infinity : Number(cap.num / cap.den);
  const duty = pref.duty;
  const dutyOk = duty === null ? () => true : (s: number) => realisesDutyAt(duty, s);
  // From this S on every S realises the duty, so the classes that miss it end below.
  const missesBelow = duty === null ? 0 : dutyAlwaysFrom(duty);
  const classes: Admitted[] = [
    { from: 1, to: top, admit: dutyOk },
    ...(cap === null ? [] : [{ from: top + 1, to: Infinity, admit: dutyOk }]),
    ...(duty === null ? [] : [{ from: 1, to: Math.min(top, missesBelow - 1), admit: (s: number) => !dutyOk(s) }]),
    ...(duty === null || cap === null ? [] : [{ from: top + 1, to: missesBelow - 1, admit: (s: number) => !dutyOk(s) }]),
  ];
  for (const c of classes) {
    const best = bestRanked(nearestPlans(ctx, c).plans, pref, fractional);
    if (best !== null && withinTolerance(best, pref)) return { nearest, ranked: best };
  }
  return { nearest, ranked: bestRanked(all, pref, fractional) };
}

/**
 * The S from which every whole S realises the duty: rounding H = duty·S lands within 1/(2S), so
 * within the tolerance δ once S ≥ 1/(2δ), and the clamp to 1 … S − 1 stops mattering once
 * duty·S and (1 − duty)·S are at least 1/2 (derived). Infinity for δ = 0.
 */
function dutyAlwaysFrom(duty: { asked: Rational; tolerance: Rational }): number {
  const d = Number(duty.asked.num) / Number(duty.asked.den);
  const t = Number(duty.tolerance.num) / Number(duty.tolerance.den);
  if (!(t > 0)) return Infinity;
  return Math.ceil(Math.max(1 / (2 * t), 1 / (2 * Math.min(d, 1 - d)))) + 1;
}

/** What a warning about a square's duty names: the nearest duty within tolerance and the nearest exact-duty plan. */
export interface DutyAlternatives {
  /** The plan within the frequency tolerance whose duty is nearest the asked one (ties: the smaller error). */
  nearestDuty: Plan | null;
  /** The nearest plan (any error) whose S holds the asked duty exactly. */
  exactDuty: Plan | null;
}

/**
 * Plans for the duty warning. The S that can meet the frequency tolerance lie between
 * C/(J max·(f + tol)) and C/(J min·(f − tol)); those are walked (at most WHOLE_BUDGET of them). An
 * exact duty p/q needs S a multiple of q.
 */
export function dutyAlternatives(hw: Hardware, req: PlanRequest, fractional: boolean, pref: Preference): DutyAlternatives {
  const ctx = context(hw, req, fractional);
  const duty = pref.duty;
  if (ctx === null || duty === null) return { nearestDuty: null, exactDuty: null };
  const q = Number(duty.asked.den);
  const exact = q <= ctx.nMax ? nearestPlans(ctx, { from: 1, to: Infinity, admit: (s) => s % q === 0 }).plans : [];
  const tol = toNumber(pref.toleranceHz);
  const { C, T } = ctx;
  const from = Math.max(ctx.sLo, Math.floor(C / (ctx.jHi * (T + tol))));
  const to = Math.min(ctx.nMax, T > tol ? Math.ceil(C / (ctx.jLo * (T - tol))) : ctx.nMax);
  const asked = toNumber(duty.asked);
  let best: { plan: Plan; off: number } | null = null;
  const budget = new WorkBudget(WHOLE_BUDGET);
  for (let s = from; s <= to && budget.take(); s = nextS(ctx, s)) {
    const n = shortestTable(ctx, s);
    if (n === 0) continue;
    const off = Math.abs(highSamplesOf(asked, s) / s - asked);
    if (best !== null && off > best.off + 1e-12) continue;
    const ideal = C / (T * s);
    for (const raw of [Math.floor(ideal), Math.floor(ideal) + 1]) {
      const j = Math.min(ctx.jHi, Math.max(ctx.jLo, raw));
      const plan = toPlan(ctx, { j, s, n });
      if (!withinTolerance(plan, pref)) continue;
      if (best === null || off < best.off - 1e-12 || cmp(abs(plan.errorHz), abs(best.plan.errorHz)) < 0) best = { plan, off };
    }
  }
  return { nearestDuty: best?.plan ?? null, exactDuty: bestRanked(exact, NEUTRAL(req), fractional) };
}

/** H for a duty in doubles (messages only; the exact rule is duty.ts's). */
const highSamplesOf = (duty: number, s: number): number => (s < 2 ? s : Math.min(Math.max(Math.floor(duty * s + 0.5), 1), s - 1));
