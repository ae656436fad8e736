// The oracle of record for the planner: a plain exhaustive search over every divider I + F/2^k
// and every allowed table length N, in exact rationals. For each (D, N) the best M is the floor
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

function allowedLengths(hw: Hardware): number[] {
  const out: number[] = [];
  for (let n = Math.max(1, hw.memory.tableLengthMin); n <= hw.memory.tableLengthMax; n++) {
    if (n * hw.dac.sampleBytes > hw.memory.budgetBytes) break;
    if (hw.memory.powerOfTwo && (n & (n - 1)) !== 0) continue;
    out.push(n);
  }
  return out;
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
export function exhaustivePlan(hw: Hardware, req: PlanRequest, fractional: boolean, whole = false): OraclePlan | null {
  const k = hw.divider.fractionBits;
  const fractions = fractional ? 2 ** k : 1;
  const lengths = allowedLengths(hw);
  let best: Entry | null = null;
  for (let I = hw.divider.integerMin; I <= hw.divider.integerMax; I++) {
    for (let F = 0; F < fractions; F++) {
      const p = rat(F, 2 ** k);
      const divider = add(rat(I), p);
      if (divider.num <= 0n) continue;
      if (cmp(div(hw.systemClockHz, divider), hw.dac.maxSampleRateHz) > 0) continue;
      const longShareTerm = mul(p, sub(rat(1), p));
      for (const N of lengths) {
        // M ≤ N / S floor, M ≥ 1.
        const mMax = floor(div(rat(N), req.minSamplesPerCycle));
        if (mMax < 1n) continue;
        const mIdeal = div(mul(mul(req.targetHz, divider), rat(N)), hw.systemClockHz);
        const tries = new Set<bigint>();
        if (whole) {
          for (let m = 1n; m <= mMax; m++) if (BigInt(N) % m === 0n) tries.add(m);
        } else {
          for (const m of [floor(mIdeal), ceil(mIdeal)]) tries.add(m < 1n ? 1n : m > mMax ? mMax : m);
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
