// The figures of what an output really emits, in one call: the stream model (emitted.ts), its
// line spectrum (lines.ts), the tone figures (tone-figures.ts) and the hold's droop and first
// image (hold.ts).

import type { Shape } from '../planning/types';
import { type EmittedPlan, type StreamModel, streamModel } from './emitted';
import { holdFigures, type HoldFigures } from './hold';
import { type LineSpectrum, lineSpectrum, type SpectrumOptions } from './lines';
import { type ToneFigures, toneFigures } from './tone-figures';

export interface SignalFigures extends ToneFigures, HoldFigures {
  sampleRateHz: number;
  achievedHz: number;
}

export interface SignalInput extends EmittedPlan {
  shape: Shape;
  /** f_s = f_sys/D. */
  sampleRateHz: number;
  /** f_out. */
  achievedHz: number;
}

export interface SignalAnalysis {
  figures: SignalFigures;
  spectrum: LineSpectrum;
  /** The fundamental's line in the spectrum. */
  cyclesPerSample: number;
  /** The stream reduced to its own period (one cycle when S is whole). */
  model: StreamModel;
}

export function analyseSignal(input: SignalInput, options: SpectrumOptions = {}): SignalAnalysis {
  const model = streamModel(input);
  const spectrum = lineSpectrum(model, options);
  const tone = toneFigures(spectrum, model.cyclesPerSample, input.shape, input.sampleRateHz);
  return {
    figures: { ...tone, ...holdFigures(input.achievedHz, input.sampleRateHz), sampleRateHz: input.sampleRateHz, achievedHz: input.achievedHz },
    spectrum,
    cyclesPerSample: model.cyclesPerSample,
    model,
  };
}

export function signalFigures(input: SignalInput, options: SpectrumOptions = {}): SignalFigures {
  return analyseSignal(input, options).figures;
}
