// What follows the DAC: an amplifier (gain, slew rate, gain-bandwidth, output swing), then an
// AC-coupling capacitor into the load's resistance. Each check is a textbook formula:
// - slew rate a sine needs: SR ≥ 2π·f·V_peak; full-power bandwidth SR/(2π·V_peak)
//   (NPTEL 117107094, lecture 7); a table's largest step needs step·f_s to follow it sample by sample
// - closed-loop bandwidth of a single-pole amplifier ≈ GBW/gain, and its loss at f:
//   1/sqrt(1 + (f/f_c)²) (common practice)
// - RC high-pass corner f_c = 1/(2πRC) and its loss at f: f/sqrt(f² + f_c²) (first-order high-pass)
// - square-wave tilt over a level held for t: exact 1 − exp(−t/RC) (derived: the coupled level
//   decays with time constant RC), and the textbook π·f_c/f for a 50 % square (Khandpur, 2006, §9)
// - the reconstruction filter must bring the first image (f_s − f_out, hold.ts) down to the
//   quality floor: attenuation = floor + image level (dBc), when positive.

import { toNumber } from '../../../shared-schema/src/rational';
import type { AnalogChain, LoadKind, OutputRequest, PlanFigures, Shape } from '../planning/types';

export type { AnalogChain, LoadKind };

export interface ChainSignal {
  shape: Shape;
  duty: number;
  fOutHz: number;
  sampleRateHz: number;
  /** At the DAC, V. */
  amplitudeVpp: number;
  offsetV: number;
  /** The table's largest step between neighbouring samples (the wrap included), V at the DAC. */
  largestStepV: number;
}

export interface ChainFigures {
  /** At the amplifier's output. */
  peakHighV: number;
  peakLowV: number;
  clips: boolean;
  /** V/s the output needs: 2π·f·V_peak for a sine, the largest step × f_s for the other shapes. */
  slewNeededVPerS: number;
  slewLimited: boolean | null;
  /** SR/(2π·V_peak), when a slew rate is given. */
  fullPowerBandwidthHz: number | null;
  /** GBW/gain. */
  closedLoopBandwidthHz: number | null;
  /** Loss of the fundamental in the amplifier's single pole, dB (≤ 0). */
  amplifierLossDb: number | null;
  /** Harmonics of f_out the amplifier passes with less than 3 dB loss (f_c / f_out, floored). */
  harmonicsPassed: number | null;
  highPassCornerHz: number | null;
  /** Loss of the fundamental in the coupling high-pass, dB (≤ 0). */
  couplingLossDb: number | null;
  /** Square waves: tilt of the longer level, exact and by π·f_c/f, as a share (0.0488 = 4.88 %). */
  tiltExact: number | null;
  tiltApprox: number | null;
  cautions: string[];
}

const db = (x: number) => 20 * Math.log10(x);

/** 1/(2πRC). */
export const highPassCornerHz = (rOhm: number, cF: number): number => 1 / (2 * Math.PI * rOhm * cF);

/** Tilt of a level held for seconds through a coupling of time constant RC: 1 − exp(−t/RC). */
export const tiltExact = (seconds: number, rOhm: number, cF: number): number => 1 - Math.exp(-seconds / (rOhm * cF));

/** The textbook approximation for a 50 % square wave: π·f_c/f. */
export const tiltApprox = (fHz: number, cornerHz: number): number => (Math.PI * cornerHz) / fHz;

/** Slew rate a sine of peak amplitude vPeak at fHz needs: 2π·f·V_peak. */
export const sineSlewRate = (fHz: number, vPeak: number): number => 2 * Math.PI * fHz * vPeak;

/** The smallest coupling capacitance that keeps a square's tilt at or below `tilt` (inverse of tiltExact). */
export function capacitanceForTilt(levelSeconds: number, rOhm: number, tilt: number): number {
  return levelSeconds / (rOhm * -Math.log(1 - tilt));
}

/** Attenuation the reconstruction filter needs at the first image, dB (0 when none). */
export function imageAttenuationNeededDb(floorDb: number, firstImageDbc: number): number {
  return Math.max(0, floorDb + firstImageDbc);
}

const CAUTIONS: Record<Exclude<LoadKind, 'line'>, string> = {
  transducer:
    'This chain drives a transducer: check its voltage, current and power ratings and its duty limits in the datasheet, and follow qualified practice before running it.',
  'power-stage':
    'This chain drives a power stage: check the stage\'s ratings, protection and heat in the datasheet, and follow qualified practice before running it.',
  mains:
    'This chain connects to mains-powered equipment: keep to the equipment\'s datasheet, local electrical codes and qualified practice (isolation, earthing) before running it.',
};

export function chainFigures(chain: AnalogChain, s: ChainSignal): ChainFigures {
  const g = chain.gain;
  const peakHighV = g * (s.offsetV + s.amplitudeVpp / 2);
  const peakLowV = g * (s.offsetV - s.amplitudeVpp / 2);
  const lo = Math.min(peakHighV, peakLowV);
  const hi = Math.max(peakHighV, peakLowV);
  const clips =
    (chain.swingMinV !== undefined && lo < chain.swingMinV) || (chain.swingMaxV !== undefined && hi > chain.swingMaxV);
  const vPeak = (Math.abs(g) * s.amplitudeVpp) / 2;
  const slewNeededVPerS = s.shape === 'sine' ? sineSlewRate(s.fOutHz, vPeak) : Math.abs(g) * s.largestStepV * s.sampleRateHz;
  const sr = chain.slewRateVPerS;
  const gbw = chain.gainBandwidthHz;
  const closedLoop = gbw !== undefined ? gbw / Math.max(1, Math.abs(g)) : null;
  const r = chain.couplingResistanceOhm;
  const c = chain.couplingCapacitanceF;
  const corner = r !== undefined && c !== undefined ? highPassCornerHz(r, c) : null;
  let tiltE: number | null = null;
  let tiltA: number | null = null;
  if (s.shape === 'square' && r !== undefined && c !== undefined && corner !== null) {
    const longer = Math.max(s.duty, 1 - s.duty) / s.fOutHz;
    tiltE = tiltExact(longer, r, c);
    // The textbook form is for a 50 % square: π·f_c/f; for another duty the longer level's
    // share stands in for ½ (2·d·π·f_c/f).
    tiltA = tiltApprox(s.fOutHz, corner) * 2 * Math.max(s.duty, 1 - s.duty);
  }
  const cautions = chain.load && chain.load !== 'line' ? [CAUTIONS[chain.load]] : [];
  return {
    peakHighV: hi,
    peakLowV: lo,
    clips,
    slewNeededVPerS,
    slewLimited: sr === undefined ? null : slewNeededVPerS > sr,
    fullPowerBandwidthHz: sr !== undefined && vPeak > 0 ? sr / (2 * Math.PI * vPeak) : null,
    closedLoopBandwidthHz: closedLoop,
    amplifierLossDb: closedLoop === null ? null : db(1 / Math.sqrt(1 + (s.fOutHz / closedLoop) ** 2)),
    harmonicsPassed: closedLoop === null ? null : Math.floor(closedLoop / s.fOutHz),
    highPassCornerHz: corner,
    couplingLossDb: corner === null ? null : db(s.fOutHz / Math.sqrt(s.fOutHz ** 2 + corner ** 2)),
    tiltExact: tiltE,
    tiltApprox: tiltA,
    cautions,
  };
}

/**
 * The chain's view of a planned output. The largest step between neighbouring samples is the
 * plain shape's: a sine's 2·A·sin(π/S) peak-to-peak share, a triangle's 2·Vpp/S, the full swing for
 * a square's edge and a sawtooth's reset.
 */
export function chainSignal(req: OutputRequest, plan: PlanFigures, lsbV: number): ChainSignal {
  const w = req.waveform;
  const s = plan.tableLength / toNumber(plan.cycles);
  const step = w.shape === 'sine' ? w.amplitudeVpp * Math.sin(Math.PI / s) : w.shape === 'triangle' ? (2 * w.amplitudeVpp) / s : w.amplitudeVpp;
  return {
    shape: w.shape,
    duty: w.duty,
    fOutHz: toNumber(plan.achievedHz),
    sampleRateHz: toNumber(plan.sampleRateHz),
    amplitudeVpp: w.amplitudeVpp,
    offsetV: w.offsetV,
    largestStepV: Math.max(step, lsbV),
  };
}
