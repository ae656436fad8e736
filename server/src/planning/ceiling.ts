// S max, the samples per cycle beyond which more samples buy nothing on this DAC: the default of
// `max-samples-per-cycle`, derived per shape from the DAC's resolution and the output's swing.
// The idea is one rule — stop where neighbouring samples differ by less than one LSB, since the
// DAC then repeats codes — applied to each shape's steepest part (A is the swing in LSB):
// - sine, A·sin(2πt)/2: neighbours differ by at most A·sin(π/S) (derived), so the smallest S with
//   A·sin(π/S) ≤ 1 LSB, S = π / asin(1/A) ≈ π·A;
// - triangle, rising A in S/2 samples: steps 2A/S, so S = 2A;
// - sawtooth, rising A in S samples (the reset is one full step by design): S = A;
// - square, two levels: more samples only refine where the edges fall, so the S that sets any duty
//   to within ±duty-tolerance δ: steps of 1/S round to within 1/(2S), so S = 1/(2δ) (no ceiling
//   for δ = 0).
// Never below the S floor (min-samples-per-cycle), so there is always a plan at or below it.

import { type Rational, ceil, cmp, div, rat } from '../../../shared-schema/src/rational';
import type { Shape } from './types';

/** The steepest step between neighbouring samples of a sine of swing A (any unit) at S samples per cycle: A·sin(π/S). */
export const sineSteepestStep = (swing: number, s: number): number => swing * Math.sin(Math.PI / s);

/** S max by shape before the floor; null for none. `swingLsb` is the peak-to-peak swing in LSB. */
export function derivedMaxSamplesPerCycle(shape: Shape, swingLsb: number, dutyTolerance: Rational | null): number | null {
  switch (shape) {
    case 'sine': {
      if (!(swingLsb > 1)) return 1;
      // The smallest whole S with A·sin(π/S) ≤ 1, from the closed form, checked against rounding.
      let s = Math.ceil(Math.PI / Math.asin(1 / swingLsb));
      while (s > 2 && sineSteepestStep(swingLsb, s - 1) <= 1) s--;
      while (sineSteepestStep(swingLsb, s) > 1) s++;
      return s;
    }
    case 'triangle':
      return Math.max(1, Math.ceil(2 * swingLsb));
    case 'sawtooth':
      return Math.max(1, Math.ceil(swingLsb));
    case 'square':
      if (dutyTolerance === null || dutyTolerance.num === 0n) return null;
      return Number(ceil(div(rat(1), rat(2n * dutyTolerance.num, dutyTolerance.den))));
  }
}

/** The default S max: derived, never below the S floor; null for none. */
export function defaultMaxSamplesPerCycle(shape: Shape, swingLsb: number, dutyTolerance: Rational | null, floor: Rational): Rational | null {
  const derived = derivedMaxSamplesPerCycle(shape, swingLsb, dutyTolerance);
  if (derived === null || !Number.isFinite(derived)) return null;
  const s = rat(Math.min(derived, 2 ** 40));
  return cmp(s, floor) < 0 ? rat(ceil(floor)) : s;
}
