// Plans and tables for the signal tests, built with the planning engine's own buildTable so the
// codes are the ones the C export writes.

import { rat, type Rational } from '../../../shared-schema/src/rational';
import { buildTable } from '../../../server/src/planning/table';
import type { Hardware, Shape, TableSpan, Waveform } from '../../../server/src/planning/types';
import { type SignalAnalysis, type SignalInput, analyseSignal } from '../../../server/src/signal/signal-figures';
import type { SpectrumOptions } from '../../../server/src/signal/lines';

export const dacOf = (bits: number, fullScaleV = 3.3): Hardware['dac'] => ({ bits, sampleBytes: 4, fullScaleV, maxSampleRateHz: rat(1e9) });

/** The default waveform: codes 0 … 2^bits − 1 around mid-scale (full scale less one LSB). */
export function fullScale(shape: Shape, bits: number, fullScaleV = 3.3, duty = 0.5): Waveform {
  const amp = (fullScaleV * (2 ** bits - 1)) / 2 ** bits;
  return { shape, duty, amplitudeVpp: amp, offsetV: amp / 2 };
}

export interface Case {
  waveform: Waveform;
  bits: number;
  N: number;
  M: Rational | number;
  I?: number;
  F?: number;
  k?: number;
  fSysHz?: number;
  span?: TableSpan;
}

export function tableOf(c: Case): Int32Array {
  const M = typeof c.M === 'number' ? rat(c.M) : c.M;
  return buildTable(c.waveform, dacOf(c.bits), c.N, M, c.span ?? 'open');
}

export function inputOf(c: Case): SignalInput {
  const M = typeof c.M === 'number' ? rat(c.M) : c.M;
  const I = c.I ?? 10;
  const F = c.F ?? 0;
  const k = c.k ?? 0;
  const fSys = c.fSysHz ?? 100e6;
  const fs = fSys / (I + F / 2 ** k);
  return {
    codes: tableOf(c),
    cycles: M,
    span: c.span ?? 'open',
    dividerInteger: I,
    dividerFraction: F,
    fractionBits: k,
    shape: c.waveform.shape,
    sampleRateHz: fs,
    achievedHz: (fs * Number(M.num)) / Number(M.den) / c.N,
  };
}

export const analyse = (c: Case, options?: SpectrumOptions): SignalAnalysis => analyseSignal(inputOf(c), options);
