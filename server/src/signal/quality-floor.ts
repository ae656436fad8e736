// The signal-quality floor of an output and a cheap estimate of what breaks it, for the
// diagnostics that run on every edit (the full spectrum is computed only where it is shown).
//
// Default floor: one bit below the ideal b-bit quantiser, 6.02·(b − 1) + 1.76 dB, for both SNR
// and SFDR (ADI MT-229's 6.02·b + 1.76 dB less 6.02 dB; a rule of our own, documented): a table
// at full scale clears it with a bit to spare, and the floor fires when something costs more.
//
// The estimate adds three noise powers against the signal's power (all in LSB², A = half the
// peak-to-peak swing in LSB, S = samples per cycle):
// - quantisation: 1/12 per sample (uniform rounding error, Bennett 1948);
// - divider jitter: mean(d²)·(TIE_rms/T_s)², the sampled form of ADI MT-008 (emitted.ts), with
//   mean(d²) of the ideal shape's steps: sine 2A²·sin²(π/S); square two steps of 2A a cycle, 8A²/S;
//   triangle (4A/S)²; sawtooth (2A/S)² + 4A²/S for the reset (derived);
// - the table: for square, triangle and sawtooth of fractional S, the harmonics above f_s/2 fold
//   between the harmonics (sum of the ideal harmonic powers above S/2).
// SFDR: the strongest divider spur sits f_out/f_sys below the carrier (the accumulator's first
// TIE harmonic, lines.ts); the largest folded harmonic for a table of fractional S.

import type { Shape } from '../planning/types';
import { idealHarmonicRatio } from './ideal-shapes';

export type QualityCause = 'jitter' | 'table' | 'quantisation';

/** 6.02·(b − 1) + 1.76 dB. */
export const defaultFloorDb = (bits: number): number => 6.02 * (bits - 1) + 1.76;

export interface QualityInput {
  shape: Shape;
  duty: number;
  /** Half the peak-to-peak swing in LSB. */
  amplitudeLsb: number;
  samplesPerCycle: number;
  /** S is a whole number (every cycle sampled at the same phases). */
  wholeSamplesPerCycle: boolean;
  /** Whether the table is a band-limited or custom one (no harmonics above f_s/2 to fold). */
  bandLimited: boolean;
  tieRmsS: number;
  sampleRateHz: number;
  fOutHz: number;
  systemClockHz: number;
  jitterFree: boolean;
}

export interface QualityEstimate {
  snrDb: number;
  sfdrDb: number;
  /** The noise term that dominates SNR, and the spur that sets SFDR. */
  snrCause: QualityCause;
  sfdrCause: QualityCause | null;
  /** SNR each cause alone would give (Infinity when it adds nothing). */
  snrByCause: Record<QualityCause, number>;
}

const db = (ratio: number): number => 10 * Math.log10(ratio);

/** Mean square of a unit shape (power of the ideal waveform of amplitude 1). */
function unitPower(shape: Shape, duty: number): number {
  switch (shape) {
    case 'sine':
      return 0.5;
    case 'square':
      return 1 - (2 * duty - 1) ** 2;
    case 'triangle':
    case 'sawtooth':
      return 1 / 3;
  }
}

function meanStepSquare(shape: Shape, A: number, S: number): number {
  switch (shape) {
    case 'sine':
      return 2 * A * A * Math.sin(Math.PI / S) ** 2;
    case 'square':
      return (8 * A * A) / S;
    case 'triangle':
      return (4 * A / S) ** 2;
    case 'sawtooth':
      return (2 * A / S) ** 2 + (4 * A * A) / S;
  }
}

/** Share of the fundamental's power in harmonics above S/2, and the largest of them. */
function folded(shape: Shape, duty: number, S: number): { share: number; largest: number } {
  // Harmonic powers fall as c/h^p (p = 2: square, sawtooth; p = 4: triangle): sum 4096 of them,
  // then the tail by ∫ c·h^−p, c the mean of r_h·h^p over the last 64 (which averages the
  // missing even harmonics and a duty's sin² in).
  const p = shape === 'triangle' ? 4 : 2;
  const first = Math.floor(S / 2) + 1;
  const last = first + 4095;
  let share = 0;
  let largest = 0;
  let c = 0;
  for (let h = first; h <= last; h++) {
    const r = idealHarmonicRatio(shape, duty, h) ** 2;
    share += r;
    largest = Math.max(largest, r);
    if (h > last - 64) c += (r * h ** p) / 64;
  }
  return { share: share + (c * last ** (1 - p)) / (p - 1), largest };
}

export function estimateQuality(q: QualityInput): QualityEstimate {
  const A = q.amplitudeLsb;
  const S = q.samplesPerCycle;
  const signal = A * A * unitPower(q.shape, q.duty);
  const quantisation = 1 / 12;
  const tieOverTs = q.tieRmsS * q.sampleRateHz;
  const jitter = q.jitterFree ? 0 : meanStepSquare(q.shape, A, S) * tieOverTs * tieOverTs;
  const foldsOffHarmonics = q.shape !== 'sine' && !q.wholeSamplesPerCycle && !q.bandLimited;
  const fold = foldsOffHarmonics ? folded(q.shape, q.duty, S) : { share: 0, largest: 0 };
  // The fold's share is of the fundamental's power, (amplitude of harmonic 1)² / 2.
  const fundamental = (A * idealHarmonicRatioFirst(q.shape, q.duty)) ** 2 / 2;
  const table = fold.share * fundamental;
  const snrByCause: Record<QualityCause, number> = {
    quantisation: db(signal / quantisation),
    jitter: jitter > 0 ? db(signal / jitter) : Infinity,
    table: table > 0 ? db(signal / table) : Infinity,
  };
  const noise = quantisation + jitter + table;
  const snrCause: QualityCause = jitter >= table && jitter >= quantisation ? 'jitter' : table >= quantisation ? 'table' : 'quantisation';
  // SFDR: the larger of the divider's first spur and the largest folded harmonic.
  const jitterSpur = q.jitterFree ? 0 : (q.fOutHz / q.systemClockHz) ** 2;
  const foldSpur = fold.largest;
  const spur = Math.max(jitterSpur, foldSpur);
  return {
    snrDb: db(signal / noise),
    sfdrDb: spur > 0 ? -db(spur) : Infinity,
    snrCause,
    sfdrCause: spur === 0 ? null : jitterSpur >= foldSpur ? 'jitter' : 'table',
    snrByCause,
  };
}

/** Amplitude of the unit shape's fundamental: sine 1, square 4·sin(πd)/π, triangle 8/π², sawtooth 2/π. */
function idealHarmonicRatioFirst(shape: Shape, duty: number): number {
  switch (shape) {
    case 'sine':
      return 1;
    case 'square':
      return (4 * Math.sin(Math.PI * duty)) / Math.PI;
    case 'triangle':
      return 8 / (Math.PI * Math.PI);
    case 'sawtooth':
      return 2 / Math.PI;
  }
}
