// Can an output be exact at a given system clock? A cheap test that needs no plan search, so the
// joint search can rank thousands of clocks before planning any of them.
//
// With f_target / f_sys = a/b in lowest terms, an integer divider D and a table of N samples
// make f_target exactly iff b divides D·N (exact.ts has the same number theory). So an exact plan
// can exist only if some allowed N and some D within range (the sample-rate limit included) have
// b | D·N. The S floor is left out: the test says "possible", never "impossible" wrongly.

import { type Rational, ceil, div, gcdNumber } from '../../../shared-schema/src/rational';
import { divisorsInRange } from './divisors';
import type { Hardware, OutputRequest } from './types';

const scratch: number[] = [];

/** The divider range an integer divider has at this clock: [max(I min, ⌈f_sys / f_s max⌉), I max]. */
export function integerDividerSpan(hw: Hardware, systemClockHz: Rational): { lo: number; hi: number } {
  const rate = Number(ceil(div(systemClockHz, hw.dac.maxSampleRateHz)));
  return { lo: Math.max(hw.divider.integerMin, rate, 1), hi: hw.divider.integerMax };
}

/** Some multiple of g lies in [lo, hi]. */
const multipleIn = (g: number, lo: number, hi: number): boolean => g <= hi && Math.floor(hi / g) * g >= lo;

/** The table lengths of the hardware: the range, or its largest power of two. */
function lengths(hw: Hardware): { min: number; max: number; topPowerOfTwo: number } {
  const max = Math.min(hw.memory.tableLengthMax, Math.floor(hw.memory.budgetBytes / Math.max(1, hw.dac.sampleBytes)));
  let top = 0;
  for (let n = 1; n <= max; n *= 2) if (n >= hw.memory.tableLengthMin) top = n;
  return { min: Math.max(1, hw.memory.tableLengthMin), max, topPowerOfTwo: top };
}

/** ⌈S floor⌉ as a number. */
const sFloorCeil = (req: OutputRequest): number => Number((req.minSamplesPerCycle.num + req.minSamplesPerCycle.den - 1n) / req.minSamplesPerCycle.den);

const SAFE = BigInt(Number.MAX_SAFE_INTEGER);

/**
 * The test for one output, with everything that does not depend on the clock worked out once:
 * `test(clock, span)` is true unless no integer divider in `span` and allowed table can make the
 * target exactly at that clock with S at or above its floor (and whole, where the output needs it).
 */
export type ExactTest = (clockHz: Rational, span: { lo: number; hi: number }, thorough?: boolean) => boolean;

/** `thorough: false` skips the divisor walk (says "possible" where only it could say no): a cheaper, weaker test. */
export function exactTester(hw: Hardware, req: OutputRequest): ExactTest {
  // A pinned plan is checked as written; a fractional divider may hit what a whole one misses.
  if (req.pinned || (req.jitter === 'allow' && hw.divider.fractionBits > 0)) return () => true;
  const len = lengths(hw);
  const sMin = sFloorCeil(req);
  const sNum = Number(req.minSamplesPerCycle.num);
  const sDen = Number(req.minSamplesPerCycle.den);
  const t = req.targetHz;
  const small = t.num <= SAFE && t.den <= SAFE && req.minSamplesPerCycle.num < 2n ** 26n && req.minSamplesPerCycle.den < 2n ** 26n;
  return (clockHz, span, thorough = true) => {
    if (span.lo > span.hi || len.max < len.min) return false;
    // f_target / f_sys = a/b in lowest terms, on exact doubles where they hold it.
    let a: number;
    let b: number;
    const tn = Number(t.num) * Number(clockHz.den);
    const td = Number(t.den) * Number(clockHz.num);
    if (small && clockHz.num <= SAFE && clockHz.den <= SAFE && Number.isSafeInteger(tn) && Number.isSafeInteger(td)) {
      const g = gcdNumber(tn, td);
      a = tn / g;
      b = td / g;
    } else {
      const r = div(t, clockHz);
      if (r.den > SAFE || r.num > SAFE) return true;
      a = Number(r.num);
      b = Number(r.den);
    }
    if (req.wholeSamplesPerCycle) return wholeExactPossible(hw, a, b, sMin, span, len, thorough);
    // S = N/M = b/(a·J) for every exact plan, so the S floor caps the divider: J ≤ b/(a·S floor).
    const top = b * sDen;
    const bottom = a * sNum;
    const jHi = Math.min(span.hi, Number.isSafeInteger(top) && Number.isSafeInteger(bottom) ? Math.floor(top / bottom) : span.hi);
    if (jHi < span.lo) return false;
    if (hw.memory.powerOfTwo) {
      if (len.topPowerOfTwo === 0) return false;
      // b = 2^t · odd: the longest power-of-two table takes up to its own factor 2^K, D the rest.
      let odd = b;
      let twos = 1;
      while (odd % 2 === 0) {
        odd /= 2;
        twos *= 2;
      }
      const rest = twos > len.topPowerOfTwo ? twos / len.topPowerOfTwo : 1;
      return multipleIn(odd * rest, span.lo, jHi);
    }
    if (b > jHi * len.max) return false;
    // The divisor walk works on exact doubles; beyond them say "possible" and let the plan decide.
    if (b >= 2 ** 52) return true;
    // b = n·g with some table a multiple of n and some divider a multiple of g.
    if (multipleIn(b, span.lo, jHi)) return true;
    if (!thorough) return true;
    divisorsInRange(b, Math.ceil(b / jHi), len.max, scratch);
    for (const n of scratch) if (multipleIn(n, len.min, len.max) && multipleIn(b / n, span.lo, jHi)) return true;
    return false;
  };
}

/** exactTester for one clock. */
export function exactPossible(hw: Hardware, req: OutputRequest, systemClockHz: Rational): boolean {
  return exactTester(hw, req)(systemClockHz, integerDividerSpan(hw, systemClockHz));
}

/** Whole S: f_out = f_sys/(D·S), so f_sys/f_target = b/a must be a whole K = D·S with D and S in range. */
function wholeExactPossible(hw: Hardware, a: number, b: number, sMin: number, span: { lo: number; hi: number }, len: { min: number; max: number }, thorough: boolean): boolean {
  if (a !== 1) return false;
  const k = b;
  if (k >= 2 ** 52 || !thorough) return true;
  divisorsInRange(k, Math.max(sMin, Math.ceil(k / span.hi)), len.max, scratch);
  for (const s of scratch) {
    if (hw.memory.powerOfTwo && (s & (s - 1)) !== 0) continue;
    if (!multipleIn(s, len.min, len.max)) continue;
    const d = k / s;
    if (d >= span.lo && d <= span.hi) return true;
  }
  return false;
}
