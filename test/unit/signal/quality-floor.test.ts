// The quality floor's default and the cheap estimate the diagnostics use, against the exact
// spectrum (which the other signal tests check against outside references).

import { describe, expect, it } from 'vitest';
import { accumulatorJitter } from '../../../server/src/planning/jitter';
import { defaultFloorDb, estimateQuality, type QualityInput } from '../../../server/src/signal/quality-floor';
import { analyse, fullScale, inputOf, type Case } from './support';

function estimateOf(c: Case): ReturnType<typeof estimateQuality> {
  const i = inputOf(c);
  const fSys = c.fSysHz ?? 100e6;
  const j = accumulatorJitter(c.I ?? 10, c.F ?? 0, 2 ** (c.k ?? 0), 1 / fSys, i.achievedHz, i.sampleRateHz);
  const lsb = 3.3 / 2 ** c.bits;
  const M = typeof c.M === 'number' ? c.M : Number(c.M.num) / Number(c.M.den);
  const S = c.N / M;
  const q: QualityInput = {
    shape: c.waveform.shape,
    duty: c.waveform.duty,
    amplitudeLsb: c.waveform.amplitudeVpp / 2 / lsb,
    samplesPerCycle: S,
    wholeSamplesPerCycle: Number.isInteger(S),
    bandLimited: false,
    tieRmsS: j.tieRmsS,
    sampleRateHz: i.sampleRateHz,
    fOutHz: i.achievedHz,
    systemClockHz: fSys,
    jitterFree: (c.F ?? 0) === 0,
  };
  return estimateQuality(q);
}

describe('the default floor: one bit below the ideal quantiser (6.02·(b − 1) + 1.76 dB, after MT-229)', () => {
  it('14 bits: 80.02 dB; 12 bits: 67.98 dB', () => {
    expect(defaultFloorDb(14)).toBeCloseTo(80.02, 2);
    expect(defaultFloorDb(12)).toBeCloseTo(67.98, 2);
  });
});

describe('the estimate against the exact spectrum', () => {
  it('1.5 MHz, 16-bit fraction, 14-bit DAC: about 31.3 dB, jitter the cause, under the 80.02 dB floor', () => {
    const c: Case = { waveform: fullScale('sine', 14), bits: 14, N: 32, M: 1, I: 2, F: 5461, k: 16, fSysHz: 100e6 };
    const e = estimateOf(c);
    const exact = analyse(c).figures;
    expect(Math.abs(e.snrDb - exact.snrDb!)).toBeLessThan(0.2);
    expect(e.snrCause).toBe('jitter');
    expect(e.snrDb).toBeLessThan(defaultFloorDb(14));
    // The first divider spur: f_out/f_sys = 0.015 → 36.5 dB (derived), as the exact spectrum finds.
    expect(Math.abs(e.sfdrDb - exact.sfdrDb!)).toBeLessThan(0.2);
    expect(e.sfdrCause).toBe('jitter');
  });

  it('a jitter-free 12-bit sine at full scale: 74.0 dB, quantisation, above the 67.98 dB floor', () => {
    const c: Case = { waveform: fullScale('sine', 12), bits: 12, N: 4096, M: 127 };
    const e = estimateOf(c);
    expect(Math.abs(e.snrDb - analyse(c).figures.snrDb!)).toBeLessThan(0.3);
    expect(e.snrCause).toBe('quantisation');
    expect(e.snrDb).toBeGreaterThan(defaultFloorDb(12));
  });

  it('a 12-bit sine at 1/16 of full scale loses 24 dB to quantisation (under the floor)', () => {
    const w = fullScale('sine', 12);
    const c: Case = { waveform: { ...w, amplitudeVpp: w.amplitudeVpp / 16 }, bits: 12, N: 4096, M: 127 };
    const e = estimateOf(c);
    expect(Math.abs(e.snrDb - analyse(c).figures.snrDb!)).toBeLessThan(0.5);
    expect(e.snrCause).toBe('quantisation');
  });

  it.each([
    ['square', 33, 2],
    ['square', 101, 3],
    ['sawtooth', 101, 3],
    ['triangle', 67, 2],
  ] as const)('a %s of fractional S (N = %i, M = %i): the table the cause, within 1.5 dB of the exact SNR', (shape, N, M) => {
    const c: Case = { waveform: fullScale(shape, 14), bits: 14, N, M };
    const e = estimateOf(c);
    const exact = analyse(c).figures;
    expect(e.snrCause).toBe('table');
    expect(Math.abs(e.snrDb - exact.snrDb!)).toBeLessThan(1.5);
  });
});
