// The search domain of one output, reduced to one integer problem for both divider kinds.
// With J = I·2^k + F the fractional divider is an integer divider J on a clock f_sys·2^k, so
// f_out = C·M/(J·N) with C = f_sys·2^k (k = 0 for the jitter-free problem). Everything the hot
// loop needs is precomputed here, both exact (bigint) and as doubles.

import { type Rational, rat, mul, div, ceil, cmp, toNumber, sign } from '../../../shared-schema/src/rational';
import { type StageProducts, stageProducts } from './stages';
import type { Hardware, PlanRequest } from './types';

export type Mode = 'jitter-free' | 'fractional';

export interface Domain {
  mode: Mode;
  /** k of the hardware; F = J mod 2^k in fractional mode. */
  fractionBits: number;
  /** 2^k in fractional mode, 1 in jitter-free mode (the J step of one whole divider count). */
  scale: number;
  /** C = f_sys·2^k (fractional) or f_sys (jitter-free). */
  clock: Rational;
  target: Rational;
  clockF: number;
  targetF: number;
  /** Inclusive range of J after the sample-rate limit (both members of `dividers` when it is set). */
  jMin: number;
  jMax: number;
  /** The dividers a two-stage divider can make, when not every J in the range is one (stages.ts). */
  dividers: StageProducts | null;
  /** Allowed table lengths: the range [nMin, nMax], or only its powers of two. */
  nMin: number;
  nMax: number;
  powerOfTwo: boolean;
  /** Powers of two in [nMin, nMax] when powerOfTwo, ascending. */
  lengths: number[];
  /** S floor = sNum/sDen > 0: a plan keeps N·sDen ≥ M·sNum. */
  sNum: bigint;
  sDen: bigint;
  sFloorF: number;
  /** sNum and sDen as doubles when both are below 2^40 (else NaN: use the bigints). */
  sNumF: number;
  sDenF: number;
  /**
   * S ceiling = cNum/cDen (a plan keeps N·cDen ≤ M·cNum), or cNum = 0n for none. The searches
   * honour it as they honour the floor; the ranking (choose.ts) uses it to plan within S max.
   */
  cNum: bigint;
  cDen: bigint;
  /** The ceiling as a double (Infinity when none), never above N max. */
  sCeilF: number;
  /** Exact error pieces: |errorHz| = |kM·M − kJN·J·N| / (den·J·N). */
  kM: bigint;
  kJN: bigint;
}

/** Largest M a table of n samples may hold: floor(n / S floor). */
export function maxCycles(d: Domain, n: number): number {
  // Doubles divide exactly enough while the dividend stays far below 2^53.
  const top = n * d.sDenF;
  if (top < 2 ** 40) return Math.floor(top / d.sNumF);
  return Number((BigInt(n) * d.sDen) / d.sNum);
}

/** Fewest cycles a table of n samples may hold under the S ceiling: ceil(n / S ceiling), at least 1. */
export function minCycles(d: Domain, n: number): number {
  if (d.cNum === 0n) return 1;
  const top = n * Number(d.cDen);
  const c = Number(d.cNum);
  if (top < 2 ** 52 && c < 2 ** 52) return Math.max(1, Math.ceil(top / c));
  const q = BigInt(n) * d.cDen;
  return Math.max(1, Number((q + d.cNum - 1n) / d.cNum));
}

/** a/b keeps S = b/a ≤ the S ceiling (always true without one). */
export function keepsCeiling(d: Domain, a: number, b: number): boolean {
  if (d.cNum === 0n) return true;
  return BigInt(b) * d.cDen <= BigInt(a) * d.cNum;
}

/**
 * The jitter-free (F = 0) domain, or null when no plan can exist. `ceiling` is an upper bound on
 * S = N/M (none when null); a ceiling below the floor leaves no plan.
 */
export function jitterFreeDomain(hw: Hardware, req: PlanRequest, ceiling: Rational | null = null): Domain | null {
  return makeDomain(hw, req, 'jitter-free', ceiling);
}

/** The fractional domain (every F), or null when no plan can exist. */
export function fractionalDomain(hw: Hardware, req: PlanRequest, ceiling: Rational | null = null): Domain | null {
  return makeDomain(hw, req, 'fractional', ceiling);
}

function makeDomain(hw: Hardware, req: PlanRequest, mode: Mode, ceiling: Rational | null): Domain | null {
  const k = mode === 'fractional' ? hw.divider.fractionBits : 0;
  const scale = 2 ** k;
  const clock = mul(hw.systemClockHz, rat(BigInt(scale)));
  const target = req.targetHz;
  if (sign(clock) <= 0 || sign(target) <= 0 || sign(req.minSamplesPerCycle) <= 0) return null;
  if (sign(hw.dac.maxSampleRateHz) <= 0) return null;

  // f_s = C/J ≤ max rate  ⇔  J ≥ C / max rate.
  const jRate = ceil(div(clock, hw.dac.maxSampleRateHz));
  let jMin = Math.max(hw.divider.integerMin * scale, Number(jRate), 1);
  let jMax = hw.divider.integerMax * scale + scale - 1;
  if (!(jMin <= jMax)) return null;
  const dividers = stageProducts(hw.divider.stages);
  if (dividers !== null) {
    jMin = dividers.next(jMin, jMax);
    jMax = dividers.prev(jMin, jMax);
    if (jMin === 0 || jMax === 0) return null;
  }

  const sFloor = req.minSamplesPerCycle;
  const byBudget = hw.dac.sampleBytes > 0 ? Math.floor(hw.memory.budgetBytes / hw.dac.sampleBytes) : 0;
  // M ≥ 1 needs N ≥ S floor.
  let nMin = Math.max(hw.memory.tableLengthMin, Number(ceil(sFloor)), 1);
  let nMax = Math.min(hw.memory.tableLengthMax, byBudget);
  const lengths: number[] = [];
  if (hw.memory.powerOfTwo) {
    for (let n = 1; n <= nMax; n *= 2) if (n >= nMin) lengths.push(n);
    if (lengths.length === 0) return null;
    nMin = lengths[0]!;
    nMax = lengths[lengths.length - 1]!;
  }
  if (!(nMin <= nMax)) return null;
  if (ceiling !== null && (sign(ceiling) <= 0 || cmp(ceiling, sFloor) < 0)) return null;
  // S = N/M ≤ N max always: a ceiling at or above it rules nothing out.
  if (ceiling !== null && cmp(ceiling, rat(BigInt(nMax))) >= 0) ceiling = null;

  return {
    mode,
    fractionBits: hw.divider.fractionBits,
    scale,
    clock,
    target,
    clockF: toNumber(clock),
    targetF: toNumber(target),
    jMin,
    jMax,
    dividers,
    nMin,
    nMax,
    powerOfTwo: hw.memory.powerOfTwo,
    lengths,
    sNum: sFloor.num,
    sDen: sFloor.den,
    sFloorF: toNumber(sFloor),
    sNumF: sFloor.num < 2n ** 40n && sFloor.den < 2n ** 40n ? Number(sFloor.num) : NaN,
    sDenF: sFloor.num < 2n ** 40n && sFloor.den < 2n ** 40n ? Number(sFloor.den) : NaN,
    cNum: ceiling === null ? 0n : ceiling.num,
    cDen: ceiling === null ? 1n : ceiling.den,
    sCeilF: ceiling === null ? Infinity : Math.min(toNumber(ceiling), nMax),
    kM: clock.num * target.den,
    kJN: target.num * clock.den,
  };
}

/** Exact f_out = C·M/(J·N). */
export function achievedHz(d: Domain, j: number, n: number, m: number): Rational {
  return div(mul(d.clock, rat(BigInt(m))), rat(BigInt(j) * BigInt(n)));
}

