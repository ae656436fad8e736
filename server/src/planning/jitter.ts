// Divider jitter of a first-order accumulator fractional divider, in closed form.
//
// Each sample period is I or I + 1 system clocks; an accumulator adds F each period and a carry
// out of the modulus makes the period long, so the long share is p = F/modulus. Edge n then
// falls at n·I + floor(n·F/modulus) clocks, i.e. frac(n·F/modulus) clocks early against the
// grid of the mean period I + p. Over one pattern (L = modulus/gcd(F, modulus) periods) those
// fractions take each value 0, 1/L, …, (L−1)/L once, which gives the TIE figures below.

import { type Rational, rat, add, div, gcdNumber, toNumber } from '../../../shared-schema/src/rational';
import type { Jitter, Plan } from './types';

const SPURS = 4;


/**
 * Jitter of a divider I + F/modulus on a system clock of period tSysS, for an output at fOutHz
 * sampled at fSHz. F = 0 is jitter-free (all figures 0, SNR null).
 */
export function accumulatorJitter(
  I: number,
  F: number,
  modulus: number,
  tSysS: number,
  fOutHz: number,
  fSHz: number,
): Jitter {
  void I; // the period pattern's spread does not depend on the integer part
  if (F === 0 || modulus <= 1) {
    return {
      longShare: 0,
      samplePeriodJitterPkPkS: 0,
      samplePeriodJitterRmsS: 0,
      tiePkPkS: 0,
      tieRmsS: 0,
      patternLength: 1,
      jitterSnrDb: null,
      spurOffsetsHz: [],
    };
  }
  const p = F / modulus;
  const g = gcdNumber(F, modulus);
  const L = modulus / g;
  // Uniform over {0, 1/L, …, (L−1)/L} clocks: range (L−1)/L, variance (L²−1)/(12·L²).
  const tiePkPkS = ((L - 1) / L) * tSysS;
  const tieRmsS = (Math.sqrt(L * L - 1) / (L * Math.sqrt(12))) * tSysS;
  const spurStep = fSHz / L;
  const spurOffsetsHz: number[] = [];
  for (let k = 1; k <= Math.min(SPURS, L - 1); k++) spurOffsetsHz.push(k * spurStep);
  return {
    longShare: p,
    samplePeriodJitterPkPkS: tSysS,
    samplePeriodJitterRmsS: tSysS * Math.sqrt(p * (1 - p)),
    tiePkPkS,
    tieRmsS,
    patternLength: L,
    jitterSnrDb: jitterSnrDb(fOutHz, tieRmsS),
    spurOffsetsHz,
  };
}

/** Jitter-limited SNR of a sine at fHz sampled with RMS timing error tjS: −20·log10(2π·f·tj). */
export function jitterSnrDb(fHz: number, tjS: number): number {
  return -20 * Math.log10(2 * Math.PI * fHz * tjS);
}

/** Sample-clock divider D = I + F/2^k of a plan, exactly. */
export function dividerOf(plan: Pick<Plan, 'dividerInteger' | 'dividerFraction' | 'fractionBits'>): Rational {
  return add(rat(BigInt(plan.dividerInteger)), rat(BigInt(plan.dividerFraction), 2n ** BigInt(plan.fractionBits)));
}

/** Jitter of a plan's divider on a system clock f_sys. */
export function dividerJitter(systemClockHz: Rational, plan: Plan): Jitter {
  const tSysS = 1 / toNumber(systemClockHz);
  const d = dividerOf(plan);
  const fSHz = d.num === 0n ? 0 : toNumber(div(systemClockHz, d));
  return accumulatorJitter(
    plan.dividerInteger,
    plan.dividerFraction,
    2 ** plan.fractionBits,
    tSysS,
    toNumber(plan.achievedHz),
    fSHz,
  );
}

// The pattern itself, period by period, for pictures of it. Over one pattern the accumulator visits
// every multiple of g = gcd(F, modulus) below the modulus once, and edge n lies
// (acc_0 − acc_n)/modulus clocks from the grid n·D (derived: each period adds
// I + F/modulus − Δacc/modulus). So TIE_n = (mean(acc) − acc_n)/modulus · T_sys with
// mean(acc) = g(L − 1)/2; no walk over a long pattern is needed to align the grid.

export interface PeriodPattern {
  /** true = a long period (I + 1 clocks). */
  long: boolean[];
  /** TIE of edges 0…shown in system clocks (edge n ends period n − 1). */
  tieClocks: number[];
  patternLength: number;
}

/** The accumulator's first `shown` periods; modulus is 2^k for a binary fraction. */
export function periodPattern(fraction: number, modulus: number, shown: number): PeriodPattern {
  const g = gcdNumber(fraction, modulus);
  const patternLength = modulus / g;
  const meanAcc = (g * (patternLength - 1)) / 2;
  const count = Math.min(shown, patternLength);
  const long: boolean[] = [];
  const tieClocks: number[] = [meanAcc / modulus];
  let acc = 0;
  for (let n = 0; n < count; n++) {
    acc += fraction;
    const overflow = acc >= modulus;
    if (overflow) acc -= modulus;
    long.push(overflow);
    tieClocks.push((meanAcc - acc) / modulus);
  }
  return { long, tieClocks, patternLength };
}

