// The oracle of record for the planner: a plain exhaustive search over every divider I + F/2^k
// (with counter stages: every product of stage values) and every allowed table length N, in
// exact rationals. For each (D, N) the best M is the floor
// or the ceiling of the exact f_target·D·N/f_sys, clamped to the allowed cycles, because the
// error grows linearly away from that value on both sides. It shares nothing with the planner
// but the rational arithmetic, and it is slow on purpose: clarity over speed.

import {
  type Rational, rat, add, sub, mul, div, abs, cmp, floor, ceil,
} from '../../shared-schema/src/rational';
import type { Hardware, Plan, PlanRequest } from '../../server/src/planning/types';

export interface OraclePlan {
  dividerInteger: number;
  dividerFraction: number;
  tableLength: number;
  cycles: number;
  achievedHz: Rational;
  errorHz: Rational;
}

interface Entry extends OraclePlan {
  divider: Rational;
  absError: Rational;
  samplesPerCycle: Rational;
  /** p(1 − p) with p = F/2^k. */
  longShareTerm: Rational;
}

const max = (a: bigint, b: bigint): bigint => (a > b ? a : b);

/** Every table length the hardware admits (range, budget, powers of two). */
export function allowedLengths(hw: Hardware): number[] {
  const out: number[] = [];
  for (let n = Math.max(1, hw.memory.tableLengthMin); n <= hw.memory.tableLengthMax; n++) {
    if (n * hw.dac.sampleBytes > hw.memory.budgetBytes) break;
    if (hw.memory.powerOfTwo && (n & (n - 1)) !== 0) continue;
    out.push(n);
  }
  return out;
}

/**
 * The integer parts the divider can take: its range, or with counter stages every product of one
 * value from each stage, found by trying every combination (sorted, each once).
 */
export function dividerIntegers(hw: Hardware): number[] {
  const stages = hw.divider.stages;
  if (stages === undefined) {
    const out: number[] = [];
    for (let i = hw.divider.integerMin; i <= hw.divider.integerMax; i++) out.push(i);
    return out;
  }
  let products = [1];
  for (const stage of stages) {
    const next: number[] = [];
    for (const p of products) for (let v = stage.min; v <= stage.max; v++) next.push(p * v);
    products = next;
  }
  return [...new Set(products)].sort((a, b) => a - b);
}

/** Negative when a ranks before b (see server/src/planning/rank.ts for the documented order). */
function better(a: Entry, b: Entry, fractional: boolean): number {
  let c = cmp(a.absError, b.absError);
  if (c !== 0) return c;
  if (fractional) {
    c = cmp(a.longShareTerm, b.longShareTerm);
    if (c !== 0) return c;
  }
  c = cmp(b.samplesPerCycle, a.samplesPerCycle);
  if (c !== 0) return c;
  if (a.tableLength !== b.tableLength) return a.tableLength - b.tableLength;
  return fractional ? cmp(a.divider, b.divider) : cmp(a.achievedHz, b.achievedHz);
}

/**
 * Best plan by brute force. fractional = false tries F = 0 only (the jitter-free optimum);
 * true tries every F in [0, 2^k − 1]. whole = true admits only tables whose length is a
 * multiple of their cycles (whole samples per cycle) and then tries every such M.
 */
export function exhaustivePlan(
  hw: Hardware,
  req: PlanRequest,
  fractional: boolean,
  whole = false,
  ceiling: Rational | null = null,
): OraclePlan | null {
  const k = hw.divider.fractionBits;
  const fractions = fractional ? 2 ** k : 1;
  const lengths = allowedLengths(hw);
  let best: Entry | null = null;
  for (const I of dividerIntegers(hw)) {
    for (let F = 0; F < fractions; F++) {
      const p = rat(F, 2 ** k);
      const divider = add(rat(I), p);
      if (divider.num <= 0n) continue;
      if (cmp(div(hw.systemClockHz, divider), hw.dac.maxSampleRateHz) > 0) continue;
      const longShareTerm = mul(p, sub(rat(1), p));
      for (const N of lengths) {
        // N / S ceiling ≤ M ≤ N / S floor, M ≥ 1.
        const mMax = floor(div(rat(N), req.minSamplesPerCycle));
        const mMin = ceiling === null ? 1n : max(1n, ceil(div(rat(N), ceiling)));
        if (mMax < mMin) continue;
        const mIdeal = div(mul(mul(req.targetHz, divider), rat(N)), hw.systemClockHz);
        const tries = new Set<bigint>();
        if (whole) {
          for (let m = mMin; m <= mMax; m++) if (BigInt(N) % m === 0n) tries.add(m);
        } else {
          for (const m of [floor(mIdeal), ceil(mIdeal)]) tries.add(m < mMin ? mMin : m > mMax ? mMax : m);
        }
        for (const M of tries) {
          const achievedHz = div(mul(hw.systemClockHz, rat(M)), mul(divider, rat(N)));
          const errorHz = sub(achievedHz, req.targetHz);
          const entry: Entry = {
            dividerInteger: I,
            dividerFraction: F,
            tableLength: N,
            cycles: Number(M),
            achievedHz,
            errorHz,
            divider,
            absError: abs(errorHz),
            samplesPerCycle: rat(N, M),
            longShareTerm,
          };
          if (best === null || better(entry, best, fractional) < 0) best = entry;
        }
      }
    }
  }
  if (best === null) return null;
  const { dividerInteger, dividerFraction, tableLength, cycles, achievedHz, errorHz } = best;
  return { dividerInteger, dividerFraction, tableLength, cycles, achievedHz, errorHz };
}

/**
 * Divider, table, cycles and achieved frequency in one string: for one target, equal strings are
 * equal plans with equal exact errors. Compares the planner's plans with the oracle's.
 */
export function planKey(p: Plan | OraclePlan | null): string {
  if (p === null) return 'none';
  const cycles = typeof p.cycles === 'number' ? rat(p.cycles) : p.cycles;
  return `I=${p.dividerInteger} F=${p.dividerFraction} N=${p.tableLength} M=${cycles.num}/${cycles.den} f=${p.achievedHz.num}/${p.achievedHz.den}`;
}

/** What the ranking of an output's plans needs (see server/src/planning/ranking.ts for the order). */
export interface OracleRanking {
  toleranceHz: Rational;
  /** S max; null = none. */
  maxSamplesPerCycle: Rational | null;
  /** Whole-S squares: asked duty and duty-tolerance. */
  duty: { asked: Rational; tolerance: Rational } | null;
  jitter: 'forbid' | 'allow';
  whole: boolean;
}

interface RankedEntry {
  plan: OraclePlan;
  key: (bigint | Rational | number)[];
}

/** H/S with H the whole number nearest duty·S (halves up), within 1 … S − 1. */
function oracleDuty(asked: Rational, s: bigint): Rational {
  if (s < 2n) return rat(s, s);
  let h = floor(add(mul(asked, rat(s)), rat(1, 2)));
  if (h < 1n) h = 1n;
  if (h > s - 1n) h = s - 1n;
  return rat(h, s);
}

function compareKeys(a: RankedEntry['key'], b: RankedEntry['key']): number {
  for (let i = 0; i < a.length; i++) {
    const x = a[i]!, y = b[i]!;
    const c = typeof x === 'object' ? cmp(x, y as Rational) : (x as number | bigint) < (y as number | bigint) ? -1 : (x as number | bigint) > (y as number | bigint) ? 1 : 0;
    if (c !== 0) return c;
  }
  return 0;
}

/**
 * The plan an output's ranking chooses, by brute force over every plan the policy allows,
 * sorted literally by the documented keys: within tolerance; (within it) duty realised, S ≤ S max;
 * |error|; (fractional) p(1−p); duty realised, S ≤ S max; larger min(S, S max); shorter N; larger S;
 * then lower f_out (jitter-free) or smaller D (fractional). Jitter-free plans first when one is
 * within tolerance; with jitter allowed, else the best of all dividers.
 */
export function exhaustiveRanked(hw: Hardware, req: PlanRequest, r: OracleRanking): OraclePlan | null {
  const k = hw.divider.fractionBits;
  const cap = r.maxSamplesPerCycle;
  const best = (fractional: boolean): RankedEntry | null => {
    let top: RankedEntry | null = null;
    for (const e of allPlans(hw, req, fractional, r.whole, cap)) {
      const s = rat(BigInt(e.tableLength), BigInt(e.cycles));
      const err = abs(e.errorHz);
      const within = cmp(err, r.toleranceHz) <= 0;
      const dutyOk = r.duty === null || cmp(abs(sub(oracleDuty(r.duty.asked, BigInt(e.tableLength / e.cycles)), r.duty.asked)), r.duty.tolerance) <= 0;
      const under = cap === null || cmp(s, cap) <= 0;
      const p = rat(e.dividerFraction, 2 ** k);
      const key: RankedEntry['key'] = [
        within ? 0 : 1,
        within && !dutyOk ? 1 : 0,
        within && !under ? 1 : 0,
        err,
        fractional ? mul(p, sub(rat(1), p)) : 0,
        dutyOk ? 0 : 1,
        under ? 0 : 1,
        sub(rat(0), cap !== null && !under ? cap : s),
        e.tableLength,
        sub(rat(0), s),
        fractional ? add(rat(e.dividerInteger), p) : e.achievedHz,
      ];
      const entry = { plan: e, key };
      if (top === null || compareKeys(key, top.key) < 0) top = entry;
    }
    return top;
  };
  const jitterFree = best(false);
  if (jitterFree !== null && jitterFree.key[0] === 0) return jitterFree.plan;
  if (r.jitter === 'allow' && k > 0) {
    const fractional = best(true);
    if (fractional !== null) return fractional.plan;
  }
  return jitterFree === null ? null : jitterFree.plan;
}

/** Every candidate plan: per (D, N) the clamped floor and ceiling of the ideal M on each side of the S ceiling (all whole-S M when whole). */
function* allPlans(hw: Hardware, req: PlanRequest, fractional: boolean, whole: boolean, cap: Rational | null): Generator<OraclePlan> {
  const k = hw.divider.fractionBits;
  const fractions = fractional ? 2 ** k : 1;
  const lengths = allowedLengths(hw);
  for (let I = hw.divider.integerMin; I <= hw.divider.integerMax; I++) {
    for (let F = 0; F < fractions; F++) {
      const divider = add(rat(I), rat(F, 2 ** k));
      if (cmp(div(hw.systemClockHz, divider), hw.dac.maxSampleRateHz) > 0) continue;
      for (const N of lengths) {
        const mMax = floor(div(rat(N), req.minSamplesPerCycle));
        if (mMax < 1n) continue;
        const tries = new Set<bigint>();
        if (whole) {
          for (let m = 1n; m <= mMax; m++) if (BigInt(N) % m === 0n) tries.add(m);
        } else {
          const mIdeal = div(mul(mul(req.targetHz, divider), rat(N)), hw.systemClockHz);
          const split = cap === null ? 1n : max(1n, ceil(div(rat(N), cap)));
          const ranges: [bigint, bigint][] = split > 1n ? [[1n, min(split - 1n, mMax)], [split, mMax]] : [[1n, mMax]];
          for (const [lo, hi] of ranges) {
            if (lo > hi) continue;
            for (const m of [floor(mIdeal), ceil(mIdeal)]) tries.add(m < lo ? lo : m > hi ? hi : m);
          }
        }
        for (const M of tries) {
          const achievedHz = div(mul(hw.systemClockHz, rat(M)), mul(divider, rat(N)));
          yield { dividerInteger: I, dividerFraction: F, tableLength: N, cycles: Number(M), achievedHz, errorHz: sub(achievedHz, req.targetHz) };
        }
      }
    }
  }
}

const min = (a: bigint, b: bigint): bigint => (a < b ? a : b);
