// SNR, SINAD, ENOB, SFDR and THD from a line spectrum (lines.ts), over the first Nyquist zone
// (0, f_s/2], DC left out.
//
// The fundamental is the line at f_out; its harmonics are the lines at h·f_out below f_s/2.
// What the output is meant to carry decides how they count:
// - sine: the fundamental is the signal; harmonics are distortion (THD; left out of SNR, counted
//   in SINAD and SFDR, as in IEEE Std 1241's definitions).
// - square, triangle, sawtooth: the harmonics belong to the shape, so they are signal; SNR and
//   SINAD are the shape's harmonics against everything else, SFDR the fundamental against the
//   largest line that is not one of them, and THD the shape's own harmonic content (compare
//   with the ideal shape's, shape-fidelity.ts).
// ENOB = (SINAD − 1.76)/6.02 (the ideal quantiser's 6.02·b + 1.76 dB, ADI MT-229, solved for b)
// at the output's own amplitude. A figure whose noise side is empty — every line is signal, as
// in a jitter-free table of one cycle — is unbounded and given as null.

import type { Shape } from '../planning/types';
import type { LineSpectrum, SpectrumMethod } from './lines';

/** Lines below this share of the fundamental's power are rounding, not signal (−260 dBc). */
const ZERO_SHARE = 1e-26;
/** Harmonics an analytic spectrum evaluates one by one (10 when each costs a pass over the table). */
const ANALYTIC_HARMONICS = 4096;
const BIN_BY_BIN_HARMONICS = 10;

export interface ToneFigures {
  method: SpectrumMethod;
  snrDb: number | null;
  sinadDb: number | null;
  enob: number | null;
  sfdrDb: number | null;
  /** Frequency of the largest line SFDR measures against; null when there is none. */
  worstSpurHz: number | null;
  thdPercent: number;
  /** Line powers in code² (one-sided), for the cause of a broken floor. */
  fundamentalPower: number;
  harmonicPower: number;
  /** Everything in the band that is neither signal nor counted harmonic distortion. */
  noisePower: number;
  /** Of noisePower, what the divider jitter adds. */
  jitterNoisePower: number;
}

const db = (ratio: number): number => 10 * Math.log10(ratio);

/** The fundamental's line: f_out·P/f_s, rounded for a table of fractional cycles. */
export function fundamentalLine(spectrum: LineSpectrum, cyclesPerSample: number): number {
  return Math.max(1, Math.round(cyclesPerSample * spectrum.period));
}

export function toneFigures(spectrum: LineSpectrum, cyclesPerSample: number, shape: Shape, sampleRateHz: number): ToneFigures {
  const P = spectrum.period;
  const half = P / 2;
  const m1 = fundamentalLine(spectrum, cyclesPerSample);
  const fundamental = spectrum.power(m1);
  const floor = fundamental * ZERO_SHARE;
  const shapeHarmonicsAreSignal = shape !== 'sine';
  const isHarmonic = (m: number): boolean => m % m1 === 0 && m !== m1 && m <= half;

  // An analytic spectrum evaluates each harmonic on its own: a low output in a long table has
  // millions, whose sum past the first few thousand is far below the figures' resolution.
  const lastHarmonic = spectrum.method === 'exact' ? Infinity : spectrum.binByBin ? BIN_BY_BIN_HARMONICS : ANALYTIC_HARMONICS;
  let harmonics = 0;
  for (let m = 2 * m1, h = 2; m <= half && h <= lastHarmonic; m += m1, h++) harmonics += spectrum.power(m);
  const signal = shapeHarmonicsAreSignal ? fundamental + harmonics : fundamental;
  const distortion = shapeHarmonicsAreSignal ? 0 : harmonics;
  // What is left of the band once signal and distortion are taken out: summed line by line when
  // every line is at hand, else the band's total less the lines (rounding of a few parts in 10^13
  // of the total is no noise). With the fundamental on line 1 every line is a harmonic.
  let noise = 0;
  if (m1 === 1) noise = 0;
  else if (spectrum.powers) {
    const pw = spectrum.powers;
    for (let m = 1; m <= half; m++) if (m % m1 !== 0) noise += pw[m];
    if (noise <= floor) noise = 0;
  } else {
    const rest = spectrum.bandPower - signal - distortion;
    noise = rest > Math.max(floor, 1e-13 * spectrum.bandPower) ? rest : 0;
  }

  let worst = 0;
  let worstLine = -1;
  const consider = (m: number, p: number) => {
    if (m === m1 || m === 0) return;
    if (shapeHarmonicsAreSignal && isHarmonic(m)) return;
    if (p > worst) {
      worst = p;
      worstLine = m;
    }
  };
  if (spectrum.powers) {
    const pw = spectrum.powers;
    for (let m = 1; m < pw.length; m++) if (pw[m] > worst) consider(m, pw[m]);
  } else {
    for (const m of spectrum.candidates()) consider(m, spectrum.power(m));
  }
  const hasSpur = worst > floor;
  const sinadNoise = noise + (distortion > floor ? distortion : 0);
  const sinadDb = fundamental > 0 && sinadNoise > 0 ? db(signal / sinadNoise) : null;
  return {
    method: spectrum.method,
    snrDb: fundamental > 0 && noise > 0 ? db(signal / noise) : null,
    sinadDb,
    enob: sinadDb === null ? null : (sinadDb - 1.76) / 6.02,
    sfdrDb: hasSpur && fundamental > 0 ? db(fundamental / worst) : null,
    worstSpurHz: hasSpur ? (worstLine * sampleRateHz) / P : null,
    thdPercent: fundamental > 0 ? 100 * Math.sqrt((harmonics > floor ? harmonics : 0) / fundamental) : 0,
    fundamentalPower: fundamental,
    harmonicPower: harmonics,
    noisePower: noise,
    jitterNoisePower: Math.min(spectrum.jitterPower, noise),
  };
}
