// The Fourier series of the ideal shapes the tables approximate, in the phase convention of
// planning/table.ts (unitWave), so a band-limited table is the same waveform with its harmonics
// above a corner left out.
//
// unitWave(φ) = Σ_h a_h·cos(2πhφ) + b_h·sin(2πhφ):
// - square, duty d (+1 for φ < d): a_h = 2·sin(2πhd)/(πh), b_h = 2·(1 − cos(2πhd))/(πh)
// - triangle (−1 at φ = 0, +1 at ½): a_h = −8/(π²h²) for odd h, 0 for even
// - sawtooth (−1 at 0 rising to +1): b_h = −2/(πh)
// (derived by integrating each piece; the sums check against unitWave in the tests).

import type { FourierTerm } from '../planning/custom-wave';
import type { Shape } from '../planning/types';

export type { FourierTerm };

/** Harmonic h of a shape's unit waveform (zero terms for the harmonics it lacks). */
export function shapeTerm(shape: Shape, duty: number, h: number): FourierTerm {
  switch (shape) {
    case 'sine':
      return { order: h, cos: 0, sin: h === 1 ? 1 : 0 };
    case 'square': {
      const x = 2 * Math.PI * h * duty;
      return { order: h, cos: (2 * Math.sin(x)) / (Math.PI * h), sin: (2 * (1 - Math.cos(x))) / (Math.PI * h) };
    }
    case 'triangle':
      return { order: h, cos: h % 2 === 1 ? -8 / (Math.PI * Math.PI * h * h) : 0, sin: 0 };
    case 'sawtooth':
      return { order: h, cos: 0, sin: -2 / (Math.PI * h) };
  }
}

/** Terms 1…maxOrder of a shape's unit waveform, the absent ones left out. */
export function shapeTerms(shape: Shape, duty: number, maxOrder: number): FourierTerm[] {
  const terms: FourierTerm[] = [];
  for (let h = 1; h <= maxOrder; h++) {
    const t = shapeTerm(shape, duty, h);
    // A square of 50 % duty has no even harmonics; sin(πh) leaves ~1e-16 of them.
    if (Math.hypot(t.cos, t.sin) > 1e-12 / h) terms.push(t);
  }
  return terms;
}

/**
 * THD of the ideal continuous shape, as a ratio: sqrt(Σ_{h≥2} P_h / P_1). Closed forms (derived
 * from Σ sin²(πhd)/h² = π²·d(1 − d)/2, Σ 1/h⁴ over odd h = π⁴/96, Σ 1/h² = π²/6):
 * square sqrt(π²·d(1 − d)/(2·sin²(πd)) − 1) (0.4834 at d = ½), triangle sqrt(π⁴/96 − 1) = 0.1212,
 * sawtooth sqrt(π²/6 − 1) = 0.8031, sine 0.
 */
export function idealThd(shape: Shape, duty: number): number {
  switch (shape) {
    case 'sine':
      return 0;
    case 'square': {
      const s = Math.sin(Math.PI * duty);
      return Math.sqrt((Math.PI * Math.PI * duty * (1 - duty)) / (2 * s * s) - 1);
    }
    case 'triangle':
      return Math.sqrt(Math.PI ** 4 / 96 - 1);
    case 'sawtooth':
      return Math.sqrt((Math.PI * Math.PI) / 6 - 1);
  }
}

/** Amplitude of harmonic h against the fundamental's, ideal shape. */
export function idealHarmonicRatio(shape: Shape, duty: number, order: number): number {
  const first = shapeTerm(shape, duty, 1);
  const t = shapeTerm(shape, duty, order);
  return Math.hypot(t.cos, t.sin) / Math.hypot(first.cos, first.sin);
}
