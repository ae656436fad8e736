// The oracle for frequency steps on one table: every allowed table (N, M), and for each step every
// divider the hardware has, in exact rationals. Each step takes the nearest whole divider (ties:
// the lower frequency) — or, when that misses its tolerance and fractions are allowed, the
// nearest I + F/2^k (ties: smaller p(1−p), then the smaller divider); the tables are ranked in the
// order server/src/planning/steps.ts documents. It shares nothing with the planner but the
// rational arithmetic and the list of dividers, and is slow on purpose.

import { type Rational, ZERO, abs, add, cmp, div, floor, mul, rat, sub } from '../../shared-schema/src/rational';
import type { Hardware } from '../../server/src/planning/types';
import type { StepsQuery } from '../../server/src/planning/steps';
import { allowedLengths, dividerIntegers } from './exhaustive';

export interface OracleStep {
  dividerInteger: number;
  dividerFraction: number;
  achievedHz: Rational;
}

export interface OracleTable {
  tableLength: number;
  cycles: number;
  steps: OracleStep[];
  within: boolean;
}

interface Choice extends OracleStep {
  error: Rational;
  within: boolean;
  fractional: boolean;
}

export function exhaustiveSteps(hw: Hardware, q: StepsQuery): OracleTable | null {
  const k = hw.divider.fractionBits;
  const e = q.clockTolerance ?? ZERO;
  // Dividers within the sample-rate limit: f_sys / D ≤ max rate.
  const fast = (d: Rational): boolean => cmp(div(hw.systemClockHz, d), hw.dac.maxSampleRateHz) <= 0;
  const whole = dividerIntegers(hw).map((i) => rat(i)).filter(fast);
  const fractions: Rational[] = [];
  if (q.fractional && k > 0) {
    for (let i = hw.divider.integerMin; i <= hw.divider.integerMax; i++) {
      for (let f = 0; f < 2 ** k; f++) {
        const d = add(rat(i), rat(f, 2 ** k));
        if (fast(d)) fractions.push(d);
      }
    }
  }
  // Exact fractions without reduction (bigint numerator and denominator), for speed: the
  // oracle compares millions of them. |f − f_i| of divider d on the table (m, n).
  interface Frac { num: bigint; den: bigint }
  const less = (a: Frac, b: Frac): number => {
    const l = a.num * b.den;
    const r = b.num * a.den;
    return l < r ? -1 : l > r ? 1 : 0;
  };
  const C = hw.systemClockHz;
  const E = e;
  const choose = (m: number, n: number, i: number): Choice | null => {
    const target = q.steps[i]!.targetHz;
    const tol = q.steps[i]!.toleranceHz;
    const judge = (d: Rational, fractional: boolean): Choice & { err: Frac; f: Frac } => {
      // f = C·m/(d·n)
      const f: Frac = { num: C.num * BigInt(m) * d.den, den: C.den * d.num * BigInt(n) };
      const diff = f.num * target.den - target.num * f.den;
      const err: Frac = { num: diff < 0n ? -diff : diff, den: f.den * target.den };
      // err + e·f ≤ tol
      const worst: Frac = { num: err.num * E.den * f.den + E.num * f.num * err.den, den: err.den * E.den * f.den };
      const within = less(worst, { num: tol.num, den: tol.den }) <= 0;
      const dividerInteger = Number(d.num / d.den);
      const dividerFraction = fractional ? Number(((d.num - BigInt(dividerInteger) * d.den) * BigInt(2 ** k)) / d.den) : 0;
      return { dividerInteger, dividerFraction, achievedHz: ZERO, error: ZERO, within, fractional, err, f };
    };
    const finish = (c: (Choice & { err: Frac; f: Frac }) | null): Choice | null => {
      if (c === null) return null;
      const achievedHz = div(mul(C, rat(m)), mul(add(rat(c.dividerInteger), rat(c.dividerFraction, 2 ** k)), rat(n)));
      return { ...c, achievedHz, error: abs(sub(achievedHz, target)) };
    };
    let best: (Choice & { err: Frac; f: Frac }) | null = null;
    for (const d of whole) {
      const c = judge(d, false);
      // Nearest; equal errors: the lower frequency.
      const order = best === null ? -1 : less(c.err, best.err) || less(c.f, best.f);
      if (order < 0) best = c;
    }
    if (best === null || best.within || fractions.length === 0) return finish(best);
    const longShare = (c: Choice): number => c.dividerFraction * (2 ** k - c.dividerFraction);
    let frac: (Choice & { err: Frac; f: Frac }) | null = null;
    for (const d of fractions) {
      const c = judge(d, true);
      const order = frac === null ? -1 : less(c.err, frac.err) || longShare(c) - longShare(frac) || c.dividerInteger - frac.dividerInteger || c.dividerFraction - frac.dividerFraction;
      if (order < 0) frac = c;
    }
    return finish(frac);
  };
  interface Row { table: OracleTable; frac: number; under: boolean; share: Rational | null; s: Rational; n: number }
  const cap = q.maxSamplesPerCycle;
  const first = (x: boolean, y: boolean): number => (x === y ? 0 : x ? -1 : 1);
  const cmpShare = (a: Rational | null, b: Rational | null): number => (a === null ? (b === null ? 0 : 1) : b === null ? -1 : cmp(a, b));
  const order = (a: Row, b: Row): number => {
    let c = first(a.table.within, b.table.within);
    if (c !== 0) return c;
    if (a.table.within) {
      if (a.frac !== b.frac) return a.frac - b.frac;
      c = first(a.under, b.under);
      if (c !== 0) return c;
    }
    c = cmpShare(a.share, b.share);
    if (c !== 0) return c;
    if (!a.table.within) {
      c = first(a.under, b.under);
      if (c !== 0) return c;
    }
    const capped = (r: Row): Rational => (cap === null || r.under ? r.s : cap);
    c = cmp(capped(b), capped(a));
    if (c !== 0) return c;
    if (a.n !== b.n) return a.n - b.n;
    return cmp(b.s, a.s);
  };
  let best: Row | null = null;
  for (const n of allowedLengths(hw)) {
    const mMax = Number(floor(div(rat(n), q.minSamplesPerCycle)));
    for (let m = 1; m <= mMax; m++) {
      if (q.wholeSamplesPerCycle && n % m !== 0) continue;
      const choices: Choice[] = [];
      for (let i = 0; i < q.steps.length; i++) {
        const c = choose(m, n, i);
        if (c === null) break;
        choices.push(c);
      }
      if (choices.length < q.steps.length) continue;
      let share: Rational | null = ZERO;
      for (let i = 0; i < choices.length && share !== null; i++) {
        const tol = q.steps[i]!.toleranceHz;
        if (tol.num === 0n) share = choices[i]!.error.num === 0n ? share : null;
        else {
          const s = div(choices[i]!.error, tol);
          if (cmp(s, share) > 0) share = s;
        }
      }
      const s = rat(n, m);
      const row: Row = {
        table: { tableLength: n, cycles: m, steps: choices.map(({ dividerInteger, dividerFraction, achievedHz }) => ({ dividerInteger, dividerFraction, achievedHz })), within: choices.every((c) => c.within) },
        frac: choices.filter((c) => c.fractional && c.dividerFraction !== 0).length,
        under: cap === null || cmp(s, cap) <= 0,
        share,
        s,
        n,
      };
      if (best === null || order(row, best) < 0) best = row;
    }
  }
  return best === null ? null : best.table;
}

/** One string per table and its dividers: equal strings are equal choices. */
export function stepsKey(t: { tableLength: number; cycles: number | Rational; steps: ReadonlyArray<{ dividerInteger: number; dividerFraction: number; achievedHz: Rational }> } | null): string {
  if (t === null) return 'none';
  const m = typeof t.cycles === 'number' ? t.cycles : Number(t.cycles.num);
  return `N=${t.tableLength} M=${m} ` + t.steps.map((s) => `${s.dividerInteger}+${s.dividerFraction} f=${s.achievedHz.num}/${s.achievedHz.den}`).join(' | ');
}

/** A seeded small domain for the oracle: clock, divider (range, fraction bits or stages), tables, 1–4 steps. */
export function randomStepsCase(rnd: () => number): { hw: Hardware; q: StepsQuery } {
  const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
  const systemClockHz = rat(int(1_000, 200_000), pick([1, 1, 3]));
  const stages = rnd() < 0.3;
  const x2 = int(2, 9), y1 = pick([1, 2, 3]), y2 = y1 + int(2, 25);
  const integerMin = stages ? y1 : pick([1, 1, 2, 4]);
  const integerMax = stages ? x2 * y2 : integerMin + int(0, 60);
  const fractionBits = stages ? 0 : pick([0, 0, 1, 2]);
  const tableLengthMin = int(1, 24);
  const tableLengthMax = tableLengthMin + int(0, 60);
  const hw: Hardware = {
    systemClockHz,
    divider: { integerMin, integerMax, fractionBits, ...(stages ? { stages: [{ name: 'pre', min: 1, max: x2, registerOffset: -1 }, { name: 'period', min: y1, max: y2, registerOffset: -1 }] } : {}) },
    dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rnd() < 0.6 ? systemClockHz : div(systemClockHz, rat(int(2, 6))) },
    memory: { budgetBytes: 2 * (tableLengthMax + int(-10, 10)), tableLengthMin, tableLengthMax, powerOfTwo: rnd() < 0.2 },
  };
  const count = int(1, 4);
  const base = div(systemClockHz, rat(int(20, 3000)));
  const steps = [...Array(count)].map(() => {
    const targetHz: Rational = mul(base, rat(int(900, 2000), 1000));
    const tol = pick([rat(0), rat(1, 1000), rat(1, 200), rat(1, 50), rat(1, 10)]);
    return { targetHz, toleranceHz: mul(targetHz, tol) };
  });
  const q: StepsQuery = {
    steps,
    minSamplesPerCycle: pick([rat(1), rat(2), rat(5, 2), rat(4)]),
    maxSamplesPerCycle: rnd() < 0.4 ? rat(int(3, 30)) : null,
    wholeSamplesPerCycle: rnd() < 0.3,
    fractional: fractionBits > 0 && rnd() < 0.6,
    clockTolerance: rnd() < 0.2 ? rat(1, 10_000) : null,
  };
  return { hw, q };
}

