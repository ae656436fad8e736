// The zero-order hold: sin(πf/f_s)/(πf/f_s) droop (ADI MT-017, W. Kester, Fig. 1: −3.92 dB at
// f_s/2) and the images at k·f_s ± f.

import { describe, expect, it } from 'vitest';
import { holdFigures, holdGainDb, sinc } from '../../../server/src/signal/hold';
import { analyse, fullScale } from './support';

describe('sinc droop at named points (ADI MT-017)', () => {
  it.each([
    [0.5, -3.9224],
    [1 / 3, -1.6502],
    [0.25, -0.9121],
    [0.1, -0.1434],
    [1 / 8, -0.2241],
  ])('f/f_s = %f → %f dB (computed from the formula; MT-017 reads −3.92 dB at f_s/2)', (x, dB) => {
    expect(holdGainDb(x * 1e6, 1e6)).toBeCloseTo(dB, 3);
  });
  it('sinc(0) = 1 and sinc(1) = 0 (the hold nulls the sample rate)', () => {
    expect(sinc(0)).toBe(1);
    expect(Math.abs(sinc(1))).toBeLessThan(1e-15);
  });
});

describe('the first image, f_s − f_out, and its level ν/(1 − ν) (derived: sin(π(1 − ν)) = sin(πν))', () => {
  it('S = 8: the image at 7·f_out, 20·log10(1/7) = −16.90 dBc', () => {
    const h = holdFigures(1e6, 8e6);
    expect(h.firstImageHz).toBe(7e6);
    expect(h.firstImageDbc).toBeCloseTo(-16.902, 3);
    // Against the hold's own gains at f and f_s − f.
    expect(h.firstImageDbc).toBeCloseTo(holdGainDb(7e6, 8e6) - holdGainDb(1e6, 8e6), 9);
  });
  it('every plan reports its droop and image: 4096 × 127 at f_s = 10 MHz', () => {
    const f = analyse({ waveform: fullScale('sine', 12), bits: 12, N: 4096, M: 127 }).figures;
    expect(f.droopDb).toBeCloseTo(holdGainDb(f.achievedHz, f.sampleRateHz), 12);
    expect(f.firstImageHz).toBeCloseTo(10e6 - f.achievedHz, 3);
  });
});
