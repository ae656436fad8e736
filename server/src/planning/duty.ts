// The duty a square table really has. With a whole number S of samples per cycle the high time is
// a whole number H of samples, so the duty is H/S: H is the whole number nearest the asked
// duty·S (halves round up), kept within 1 … S − 1 so that the wave has both levels. The table
// (table.ts) uses exactly this H, so the duty reported is the duty the DAC plays.
// With S not whole the edges fall on different samples from cycle to cycle: the table's duty is
// then its share of high samples, and the edges wander by up to one sample period.

import { type Rational, abs, ceil, cmp, floor, gcd, isInteger, mul, rat, sub } from '../../../shared-schema/src/rational';
import type { DutyPreference } from './ranking';
import type { TableSpan } from './types';

/** H, the high samples of one cycle of S (whole) samples at the asked duty. */
export function highSamples(asked: Rational, s: number): number {
  if (s < 2) return s;
  const h = Number(floor(rat(asked.num * BigInt(2 * s) + asked.den, 2n * asked.den)));
  return Math.min(Math.max(h, 1), s - 1);
}

/** H/S for whole S; null when S is not whole. */
export function wholeCycleDuty(asked: Rational, s: Rational): Rational | null {
  if (!isInteger(s) || s.num < 1n || s.num > 2n ** 31n) return null;
  const n = Number(s.num);
  return rat(highSamples(asked, n), n);
}

/** The S (whole) realises the asked duty within its tolerance. */
export function realisesDuty(pref: DutyPreference, s: Rational): boolean {
  if (!isInteger(s)) return false;
  return realisesDutyAt(pref, Number(s.num));
}

/** realisesDuty for a whole S, in doubles unless the margin is too close to call. */
export function realisesDutyAt(pref: DutyPreference, s: number): boolean {
  if (!(s >= 1 && s <= 2 ** 31)) return false;
  const asked = Number(pref.asked.num) / Number(pref.asked.den);
  const tolerance = Number(pref.tolerance.num) / Number(pref.tolerance.den);
  const h = highSamplesF(asked, s);
  const off = Math.abs(h / s - asked) - tolerance;
  if (Math.abs(off) > 1e-12) return off < 0;
  const got = rat(highSamples(pref.asked, s), s);
  return cmp(abs(sub(got, pref.asked)), pref.tolerance) <= 0;
}

/** highSamples in doubles; only its rounding at an exact half can differ, and that is re-checked exactly. */
function highSamplesF(asked: number, s: number): number {
  if (s < 2) return s;
  return Math.min(Math.max(Math.floor(asked * s + 0.5), 1), s - 1);
}

/**
 * Rising-edge wander from cycle to cycle, in sample periods, of a table of N samples holding M
 * cycles: cycle c starts at sample c·N/M and its edge waits for the next sample, a delay of
 * ((−c·N) mod M)/M periods; over the cycles those take every multiple of g/M below 1, g = gcd(N, M),
 * so the spread is (M − g)/M (0 when S = N/M is whole).
 */
export function edgeWanderSamples(tableLength: number, cycles: Rational, span: TableSpan = 'open'): number {
  // A closed span or a fractional count of cycles breaks the layout every table: up to a sample.
  if (span !== 'open' || !isInteger(cycles) || cycles.num < 1n) return 1;
  const m = cycles.num;
  const g = gcd(BigInt(tableLength), m);
  return Number(m - g) / Number(m);
}

/** The whole-S table's cycle length, when the table is laid out in whole cycles of whole S samples (open span). */
export function wholeCycleLength(tableLength: number, cycles: Rational, span: TableSpan): number | null {
  if (span !== 'open' || !isInteger(cycles) || cycles.num < 1n) return null;
  const m = Number(cycles.num);
  return tableLength % m === 0 ? tableLength / m : null;
}

/**
 * The duty the square table has: H/S with whole S (open span); else its share of high samples,
 * counted over the table (phases frac(M·i/N) below the asked duty, as table.ts lays them out).
 */
export function tableDuty(asked: Rational, tableLength: number, cycles: Rational, span: TableSpan): Rational {
  const s = wholeCycleLength(tableLength, cycles, span);
  if (s !== null) return rat(highSamples(asked, s), s);
  const n = Math.max(1, Math.floor(tableLength));
  const intervals = span === 'open' ? n : n - 1;
  if (intervals <= 0) return rat(1);
  if (isInteger(cycles) && span === 'open') {
    // Phases k·g/N (g = gcd(M, N)), each g times: g·ceil(duty·N/g) of them lie below the duty.
    const g = Number(gcd(cycles.num, BigInt(n)));
    const below = ceil(mul(asked, rat(n / g)));
    return rat(BigInt(g) * below, BigInt(n));
  }
  // A fractional count of cycles (a pinned plan): count the table's own phases.
  let high = 0;
  const modulus = cycles.den * BigInt(intervals);
  for (let i = 0; i < n; i++) {
    const r = (cycles.num * BigInt(i)) % modulus;
    // frac < duty  ⇔  r·duty.den < duty.num·modulus
    if (r * asked.den < asked.num * modulus) high++;
  }
  return rat(high, n);
}
