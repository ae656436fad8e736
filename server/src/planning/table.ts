// The sample table of one output: the exact function the exporter, the seam check and the
// pictures all use, so what the editor shows is what the firmware streams.

import { type Rational, fromNumber } from '../../../shared-schema/src/rational';
import { customUnit } from './custom-wave';
import { highSamples, wholeCycleLength } from './duty';
import type { Hardware, Shape, TableSpan, Waveform } from './types';

/** The unit waveform in [−1, 1] at a phase in cycles, 0 ≤ phase < 1. */
export function unitWave(shape: Shape, duty: number, phase: number): number {
  switch (shape) {
    case 'sine':
      return Math.sin(2 * Math.PI * phase);
    case 'square':
      return phase < duty ? 1 : -1;
    case 'triangle':
      // −1 at phase 0, +1 at 0.5, back to −1 at 1.
      return phase < 0.5 ? -1 + 4 * phase : 3 - 4 * phase;
    case 'sawtooth':
      return -1 + 2 * phase;
  }
}

/** One LSB in volts: full scale / 2^bits. */
export function lsbVolts(dac: Hardware['dac']): number {
  return dac.fullScaleV / 2 ** dac.bits;
}

/** The code nearest to v before clamping (may lie outside the DAC's range). */
export function rawCode(v: number, dac: Hardware['dac']): number {
  return Math.round(v / lsbVolts(dac));
}

/** DAC code for a voltage: round(v / LSB) clamped to [0, 2^bits − 1]. */
export function voltageToCode(v: number, dac: Hardware['dac']): number {
  return Math.min(Math.max(rawCode(v, dac), 0), 2 ** dac.bits - 1);
}

/**
 * Ideal voltage of a waveform at a phase in cycles. samplesPerCycle (S = N/M) matters only to a
 * custom waveform band-limited below each plan's f_s/2.
 */
export function waveVolts(waveform: Waveform, phase: number, samplesPerCycle = Infinity): number {
  const unit = waveform.custom ? customUnit(waveform.custom, phase, samplesPerCycle) : unitWave(waveform.shape, waveform.duty, phase);
  return waveform.offsetV + (waveform.amplitudeVpp / 2) * unit;
}

/**
 * Phase in cycles of sample i: frac(M·i/N) for an open span, frac(M·i/(N − 1)) for a closed one.
 * i may be N (the sample that would follow the table on a continuous phase). Exact in integers.
 */
export function samplePhase(i: number, tableLength: number, cycles: Rational, span: TableSpan): number {
  const intervals = span === 'open' ? tableLength : tableLength - 1;
  if (intervals <= 0) return 0;
  // M·i/intervals = num·i / (den·intervals); keep the remainder exact.
  const num = Number(cycles.num);
  const mod = Number(cycles.den) * intervals;
  if (Math.abs(num * i) < 2 ** 53 && mod < 2 ** 53) {
    const rem = (num * i) % mod;
    return (rem < 0 ? rem + mod : rem) / mod;
  }
  const modulus = cycles.den * BigInt(intervals);
  let r = (cycles.num * BigInt(i)) % modulus;
  if (r < 0n) r += modulus;
  return Number(r) / Number(modulus);
}

/** S = N/M as a number. */
export function samplesPerCycle(tableLength: number, cycles: Rational): number {
  return (tableLength * Number(cycles.den)) / Number(cycles.num);
}

/**
 * The waveform a table of this layout plays: a square with a whole number S of samples per cycle
 * is high for exactly H of them (duty.ts), so its duty becomes H/S — set a hair above H − 1 samples'
 * phase and below H's, so that the phases (k/S, computed in doubles) split exactly at H.
 */
export function tableWaveform(waveform: Waveform, tableLength: number, cycles: Rational, span: TableSpan): Waveform {
  if (waveform.shape !== 'square' || waveform.custom) return waveform;
  const s = wholeCycleLength(tableLength, cycles, span);
  if (s === null) return waveform;
  const h = highSamples(waveform.dutyExact ?? fromNumber(waveform.duty), s);
  return { ...waveform, duty: (h - 0.5) / s };
}

/** DAC code of sample i (i = N gives the sample a continuous phase would play next). */
export function sampleCode(
  waveform: Waveform,
  dac: Hardware['dac'],
  i: number,
  tableLength: number,
  cycles: Rational,
  span: TableSpan,
): number {
  const played = tableWaveform(waveform, tableLength, cycles, span);
  return voltageToCode(waveVolts(played, samplePhase(i, tableLength, cycles, span), samplesPerCycle(tableLength, cycles)), dac);
}

/** The table of DAC codes, clamped to the DAC's range (see clippedSamples). */
export function buildTable(
  waveform: Waveform,
  dac: Hardware['dac'],
  tableLength: number,
  cycles: Rational,
  span: TableSpan,
): Int32Array {
  const n = Math.max(0, Math.floor(tableLength));
  const table = new Int32Array(n);
  const played = tableWaveform(waveform, n, cycles, span);
  const s = samplesPerCycle(n, cycles);
  for (let i = 0; i < n; i++) table[i] = voltageToCode(waveVolts(played, samplePhase(i, n, cycles, span), s), dac);
  return table;
}

/** How many samples of the table the DAC range clips (their code was clamped). */
export function clippedSamples(
  waveform: Waveform,
  dac: Hardware['dac'],
  tableLength: number,
  cycles: Rational,
  span: TableSpan,
): number {
  const top = 2 ** dac.bits - 1;
  let clipped = 0;
  for (let i = 0; i < tableLength; i++) {
    const code = rawCode(waveVolts(waveform, samplePhase(i, tableLength, cycles, span), samplesPerCycle(tableLength, cycles)), dac);
    if (code < 0 || code > top) clipped++;
  }
  return clipped;
}
