// The analog chain after the DAC against textbook examples.

import { describe, expect, it } from 'vitest';
import {
  capacitanceForTilt,
  chainFigures,
  highPassCornerHz,
  imageAttenuationNeededDb,
  sineSlewRate,
  tiltApprox,
  tiltExact,
} from '../../../server/src/signal/analog-chain';

describe('slew rate (NPTEL 117107094, lecture 7: SR ≥ 2π·f·V_peak)', () => {
  it('full-power bandwidth of 2 V/µs at 12 V peak: 26.53 kHz (read)', () => {
    const f = chainFigures({ gain: 1, slewRateVPerS: 2e6 }, { shape: 'sine', duty: 0.5, fOutHz: 1e3, sampleRateHz: 1e6, amplitudeVpp: 24, offsetV: 0, largestStepV: 0 });
    expect(f.fullPowerBandwidthHz! / 1e3).toBeCloseTo(26.53, 2);
  });
  it('1 MHz at 1.65 V peak needs 10.37 V/µs (computed); a 5 V/µs amplifier slew-limits it', () => {
    expect(sineSlewRate(1e6, 1.65) / 1e6).toBeCloseTo(10.37, 2);
    const f = chainFigures({ gain: 1, slewRateVPerS: 5e6 }, { shape: 'sine', duty: 0.5, fOutHz: 1e6, sampleRateHz: 20e6, amplitudeVpp: 3.3, offsetV: 1.65, largestStepV: 0 });
    expect(f.slewLimited).toBe(true);
  });
  it('a square needs its largest step per sample period: 3.3 V · 10 MHz · gain 2 = 66 V/µs (derived)', () => {
    const f = chainFigures({ gain: 2 }, { shape: 'square', duty: 0.5, fOutHz: 1e5, sampleRateHz: 1e7, amplitudeVpp: 3.3, offsetV: 1.65, largestStepV: 3.3 });
    expect(f.slewNeededVPerS / 1e6).toBeCloseTo(66, 6);
  });
});

describe('AC coupling (first-order RC high-pass)', () => {
  it('10 kΩ with 1 µF: f_c = 1/(2πRC) = 15.915 Hz (computed)', () => {
    expect(highPassCornerHz(10e3, 1e-6)).toBeCloseTo(15.915, 3);
  });
  it('tilt of a 10 Hz square through 10 kΩ and 100 µF: 4.88 % exact (1 − exp(−T/2RC)), 5.0 % by π·f_c/f (derived)', () => {
    const f = chainFigures(
      { gain: 1, couplingResistanceOhm: 10e3, couplingCapacitanceF: 100e-6 },
      { shape: 'square', duty: 0.5, fOutHz: 10, sampleRateHz: 1e4, amplitudeVpp: 3.3, offsetV: 1.65, largestStepV: 3.3 },
    );
    expect(100 * f.tiltExact!).toBeCloseTo(4.877, 3);
    expect(100 * f.tiltApprox!).toBeCloseTo(5.0, 3);
  });
  it('f_c = 1.5915 Hz, 100 Hz square: 4.877 % exact vs 5.0 % approximate (Khandpur 2006, §9; REFERENCES)', () => {
    const rc = 1 / (2 * Math.PI * 1.5915);
    expect(100 * tiltExact(1 / 200, rc, 1)).toBeCloseTo(4.877, 2);
    expect(100 * tiltApprox(100, 1.5915)).toBeCloseTo(5.0, 2);
  });
  it('the capacitance for a 1 % tilt inverts the exact formula', () => {
    const c = capacitanceForTilt(0.05, 10e3, 0.01);
    expect(tiltExact(0.05, 10e3, c)).toBeCloseTo(0.01, 12);
  });
  it('loss of the fundamental at f = f_c: −3.01 dB (first-order high-pass)', () => {
    const f = chainFigures({ gain: 1, couplingResistanceOhm: 1e3, couplingCapacitanceF: 1 / (2 * Math.PI * 1e3 * 100) }, { shape: 'sine', duty: 0.5, fOutHz: 100, sampleRateHz: 1e5, amplitudeVpp: 1, offsetV: 0.5, largestStepV: 0.01 });
    expect(f.couplingLossDb!).toBeCloseTo(-3.0103, 3);
  });
});

describe('amplifier bandwidth, swing and cautions', () => {
  it('GBW 10 MHz at gain 10: 1 MHz closed loop, −3.01 dB at 1 MHz (single pole, common practice)', () => {
    const f = chainFigures({ gain: 10, gainBandwidthHz: 10e6 }, { shape: 'sine', duty: 0.5, fOutHz: 1e6, sampleRateHz: 2e7, amplitudeVpp: 1, offsetV: 0.5, largestStepV: 0.1 });
    expect(f.closedLoopBandwidthHz).toBe(1e6);
    expect(f.amplifierLossDb!).toBeCloseTo(-3.0103, 3);
  });
  it('gain 4 on 0.3 … 3.0 V swings 1.2 … 12 V: clips a ±10 V amplifier', () => {
    const f = chainFigures({ gain: 4, swingMinV: -10, swingMaxV: 10 }, { shape: 'sine', duty: 0.5, fOutHz: 1e3, sampleRateHz: 1e6, amplitudeVpp: 2.7, offsetV: 1.65, largestStepV: 0.01 });
    expect(f.peakHighV).toBeCloseTo(12, 9);
    expect(f.clips).toBe(true);
  });
  it('a transducer load carries the caution that defers to the datasheet and qualified practice', () => {
    const f = chainFigures({ gain: 1, load: 'transducer' }, { shape: 'sine', duty: 0.5, fOutHz: 1e3, sampleRateHz: 1e6, amplitudeVpp: 1, offsetV: 0.5, largestStepV: 0.01 });
    expect(f.cautions[0]).toMatch(/datasheet.*qualified practice/);
  });
  it('the filter must bring an image at −16.9 dBc below an 80 dB floor: 63.1 dB (derived)', () => {
    expect(imageAttenuationNeededDb(80, -16.9)).toBeCloseTo(63.1, 9);
    expect(imageAttenuationNeededDb(10, -16.9)).toBe(0);
  });
});
