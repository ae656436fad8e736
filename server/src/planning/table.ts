// The sample table of one output: the exact function the exporter, the seam check and the
// pictures all use, so what the editor shows is what the firmware streams.

import { type Rational, add, div, floor, fromNumber, mul, rat, sub } from '../../../shared-schema/src/rational';
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

/** DAC code for a voltage: round(v / LSB) clamped to [0, 2^bits − 1], in floating point. */
export function voltageToCode(v: number, dac: Hardware['dac']): number {
  return clampCode(rawCode(v, dac), dac);
}

const clampCode = (code: number, dac: Hardware['dac']): number => Math.min(Math.max(code, 0), 2 ** dac.bits - 1);

/**
 * Ideal voltage of a waveform at a phase in cycles. samplesPerCycle (S = N/M) matters only to a
 * custom waveform band-limited below each plan's f_s/2.
 */
export function waveVolts(waveform: Waveform, phase: number, samplesPerCycle = Infinity): number {
  const unit = waveform.custom ? customUnit(waveform.custom, phase, samplesPerCycle) : unitWave(waveform.shape, waveform.duty, phase);
  return waveform.offsetV + (waveform.amplitudeVpp / 2) * unit;
}

/** Sample i's phase frac(M·i/N) (or frac(M·i/(N − 1)) for a closed span) as an exact rational. */
export function exactPhase(i: number, tableLength: number, cycles: Rational, span: TableSpan): Rational {
  const intervals = span === 'open' ? tableLength : tableLength - 1;
  if (intervals <= 0) return rat(0n);
  const modulus = cycles.den * BigInt(intervals);
  let r = (cycles.num * BigInt(i)) % modulus;
  if (r < 0n) r += modulus;
  return rat(r, modulus);
}

/**
 * The nearest code to a value within rounding error of a half, decided exactly. With w(φ)
 * rational (square, triangle, sawtooth; a sine at the phases where sin 2πφ is 0, ±1/2 or ±1 —
 * the only rational values it takes at rational φ, Niven's theorem) x is a rational and may be
 * exactly a half; otherwise x is irrational, never a half, and 190-bit arithmetic tells its side.
 */
function nearTieCode(waveform: Waveform, dac: Hardware['dac'], phase: Rational): number {
  const amplitude = waveform.exact?.amplitudeVpp ?? fromNumber(waveform.amplitudeVpp);
  const offset = waveform.exact?.offsetV ?? fromNumber(waveform.offsetV);
  const perVolt = div(rat(2n ** BigInt(dac.bits)), fromNumber(dac.fullScaleV));
  const w = exactUnitWave(waveform, phase) ?? rat(sineFixed(phase), FIXED_ONE);
  const x = mul(add(offset, mul(div(amplitude, rat(2n)), w)), perVolt);
  return Number(floor(add(x, rat(1n, 2n))));
}

/** w(φ) exactly, or null when it is irrational (a sine away from the phases Niven's theorem names). */
function exactUnitWave(waveform: Waveform, phase: Rational): Rational | null {
  const { num, den } = phase;
  switch (waveform.shape) {
    case 'square':
      // The same comparison unitWave makes, so the exact and the quick path agree on the level.
      return rat(Number(num) / Number(den) < waveform.duty ? 1n : -1n);
    case 'triangle':
      return 2n * num < den ? sub(mul(rat(4n), phase), rat(1n)) : sub(rat(3n), mul(rat(4n), phase));
    case 'sawtooth':
      return sub(mul(rat(2n), phase), rat(1n));
    case 'sine': {
      if ((12n * num) % den !== 0n) return null;
      const twelfths = Number((12n * num) / den);
      const values: Record<number, Rational> = { 0: rat(0n), 1: rat(1n, 2n), 3: rat(1n), 5: rat(1n, 2n), 6: rat(0n), 7: rat(-1n, 2n), 9: rat(-1n), 11: rat(-1n, 2n) };
      return values[twelfths] ?? null;
    }
  }
}

// Fixed point with 190 fraction bits for the rare sine sample next to a half (π by Machin's formula).
const FIXED_BITS = 190n;
const FIXED_ONE = 1n << FIXED_BITS;
let fixedPi: bigint | undefined;

function atanInverse(x: bigint): bigint {
  let sum = 0n;
  let power = FIXED_ONE / x;
  for (let k = 0n; power !== 0n; k++, power /= x * x) sum += (k % 2n === 0n ? 1n : -1n) * (power / (2n * k + 1n));
  return sum;
}

/** sin(2πφ) · 2^190, rounded; φ in [0, 1). */
function sineFixed(phase: Rational): bigint {
  fixedPi ??= 4n * (4n * atanInverse(5n) - atanInverse(239n));
  // θ = 2πφ taken into [−π, π), where the series converges fast enough.
  const centred = 2n * phase.num >= phase.den ? phase.num - phase.den : phase.num;
  const theta = (2n * fixedPi * centred) / phase.den;
  const theta2 = (theta * theta) >> FIXED_BITS;
  let sum = 0n;
  let term = theta;
  for (let k = 1n; term !== 0n; k++) {
    sum += term;
    term = -((term * theta2) >> FIXED_BITS) / (2n * k * (2n * k + 1n));
  }
  return sum;
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
  return clampCode(sampleRawCode(waveform, dac, i, tableLength, cycles, span), dac);
}

/** The code nearest to sample i's ideal value, before clamping (see codeAt for the rule). */
export function sampleRawCode(
  waveform: Waveform,
  dac: Hardware['dac'],
  i: number,
  tableLength: number,
  cycles: Rational,
  span: TableSpan,
): number {
  const played = tableWaveform(waveform, tableLength, cycles, span);
  return codeAt(played, dac, i, tableLength, cycles, span, samplesPerCycle(tableLength, cycles));
}

/**
 * The code nearest to x = volts / LSB for sample i of a table playing `played`. The rule: round
 * to the nearest code, and a value exactly half-way between two codes takes the upper one —
 * floor(x + 1/2), "round half up". Floating point decides wherever x is clearly away from a
 * half; near one, exact arithmetic does (nearTieCode), so 409.5 LSB is 410 whatever the doubles
 * say. A custom waveform has no exact form here; its doubles decide.
 */
function codeAt(played: Waveform, dac: Hardware['dac'], i: number, n: number, cycles: Rational, span: TableSpan, s: number): number {
  const lsb = lsbVolts(dac);
  const x = waveVolts(played, samplePhase(i, n, cycles, span), s) / lsb;
  const fromHalf = Math.abs(x - Math.floor(x) - 0.5);
  // A bound on the rounding error of x: a few units in the last place of the terms it sums.
  const slack = 2 ** -40 * ((Math.abs(played.offsetV) + Math.abs(played.amplitudeVpp) / 2) / lsb + Math.abs(x) + 1);
  if (played.custom || !(fromHalf <= slack)) return Math.round(x);
  return nearTieCode(played, dac, exactPhase(i, n, cycles, span));
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
  for (let i = 0; i < n; i++) table[i] = clampCode(codeAt(played, dac, i, n, cycles, span, s), dac);
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
  const played = tableWaveform(waveform, tableLength, cycles, span);
  const s = samplesPerCycle(tableLength, cycles);
  let clipped = 0;
  for (let i = 0; i < tableLength; i++) {
    const code = codeAt(played, dac, i, tableLength, cycles, span, s);
    if (code < 0 || code > top) clipped++;
  }
  return clipped;
}
