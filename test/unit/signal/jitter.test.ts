// Fractional plans: the stream at the real sample instants against outside references — the
// jitter-limited SNR of ADI MT-008, −20·log10(2π·f·t_j), and the staircase itself built on the
// system-clock grid and transformed by mathjs fft (an oracle with no model in it).

import { describe, expect, it } from 'vitest';
import { accumulatorJitter } from '../../../server/src/planning/jitter';
import { oraclePowers } from './oracle';
import { analyse, fullScale, inputOf, type Case } from './support';

const mt008 = (c: Case) => {
  const i = inputOf(c);
  return accumulatorJitter(c.I!, c.F!, 2 ** c.k!, 1 / c.fSysHz!, i.achievedHz, i.sampleRateHz).jitterSnrDb!;
};

describe('jitter-limited SNR (ADI MT-008: SNR = −20·log10(2π·f·t_j))', () => {
  // The issue's case: 1.5 MHz from 100 MHz, a 16-bit fraction (F odd: a 65536-period pattern,
  // TIE_rms = T_sys·sqrt((L² − 1)/12)/L ≈ 2.887 ns), a 14-bit DAC: 31.3 dB (derived).
  const issue: Case = { waveform: fullScale('sine', 14), bits: 14, N: 32, M: 1, I: 2, F: 5461, k: 16, fSysHz: 100e6 };

  it('1.5 MHz, 16-bit fraction, 14-bit DAC: 31.3 dB by MT-008, and the stream model agrees within 0.1 dB', () => {
    expect(mt008(issue)).toBeCloseTo(31.31, 2);
    const f = analyse(issue).figures;
    expect(f.method).toBe('exact');
    expect(Math.abs(f.snrDb! - mt008(issue))).toBeLessThan(0.1);
    // The 14-bit DAC alone would give ~86 dB: the jitter is the whole of the noise.
    expect(f.jitterNoisePower / f.noisePower).toBeGreaterThan(0.99);
  });

  it('the same plan by the analytic path (transform refused) agrees with the exact one within 0.1 dB', () => {
    const exact = analyse(issue).figures;
    const analytic = analyse(issue, { maxTransformPoints: 1024 }).figures;
    expect(analytic.method).toBe('analytic');
    expect(Math.abs(analytic.snrDb! - exact.snrDb!)).toBeLessThan(0.1);
    expect(Math.abs(analytic.sfdrDb! - exact.sfdrDb!)).toBeLessThan(0.1);
    expect(analytic.worstSpurHz).toBeCloseTo(exact.worstSpurHz!, 0);
  });

  it.each([
    ['8-bit fraction, N = 1000, M = 13, 20-bit DAC', { waveform: fullScale('sine', 20), bits: 20, N: 1000, M: 13, I: 5, F: 85, k: 8, fSysHz: 100e6 }],
    ['4-bit fraction, N = 999, M = 10, 20-bit DAC', { waveform: fullScale('sine', 20), bits: 20, N: 999, M: 10, I: 3, F: 5, k: 4, fSysHz: 80e6 }],
  ] as [string, Case][])('%s: MT-008 within 0.3 dB, exact and analytic within 0.1 dB', (_n, c) => {
    const exact = analyse(c).figures;
    const analytic = analyse(c, { maxTransformPoints: 2048 }).figures;
    expect(exact.method).toBe('exact');
    expect(analytic.method).toBe('analytic');
    // The sampled form has 2·sin(πν) for MT-008's 2πν: the two differ by the hold droop at f_out.
    expect(Math.abs(exact.snrDb! - mt008(c))).toBeLessThan(0.3);
    expect(Math.abs(analytic.snrDb! - exact.snrDb!)).toBeLessThan(0.1);
    expect(Math.abs(analytic.sfdrDb! - exact.sfdrDb!)).toBeLessThan(0.1);
  });

  it('the strongest divider spur sits 20·log10(f_out/f_sys) below the carrier (derived: |Ê| ≈ 1/(2π) for s = 1)', () => {
    const f = analyse({ waveform: fullScale('sine', 20), bits: 20, N: 1000, M: 13, I: 5, F: 85, k: 8, fSysHz: 100e6 }).figures;
    expect(Math.abs(f.sfdrDb! + 20 * Math.log10(f.achievedHz / 100e6))).toBeLessThan(0.3);
  });

  it('a pattern that repeats with the table (L divides N) only reshapes the cycle: no spur off the harmonics', () => {
    const f = analyse({ waveform: fullScale('square', 12), bits: 12, N: 16, M: 1, I: 5, F: 3, k: 4, fSysHz: 100e6 }).figures;
    expect(f.snrDb).toBeNull();
    expect(f.sfdrDb).toBeNull();
  });
});

describe('the staircase on the system-clock grid (mathjs fft oracle)', () => {
  // Each system clock j holds the code of the sample whose edge n·I + floor(n·F/2^k) last passed.
  // Its DFT over one whole repetition (P samples, P·D clocks) times the clock's own hold
  // sin(πf·T_sys)/(πf·T_sys) is the analog staircase's line spectrum, with no model in it.
  // The model is first order in f·T_sys across the band, whose top f_s/2 is 1/(2D) of the clock:
  // measured 0.41 dB apart at D = 3.3, 0.10 dB at D = 30 (the staircase slightly noisier).
  it.each([
    ['N = 50, M = 3, ÷3 + 5/16', { waveform: fullScale('sine', 24), bits: 24, N: 50, M: 3, I: 3, F: 5, k: 4, fSysHz: 50e6 }, 0.5],
    ['N = 40, M = 7, ÷4 + 3/8', { waveform: fullScale('sine', 24), bits: 24, N: 40, M: 7, I: 4, F: 3, k: 3, fSysHz: 50e6 }, 0.5],
    ['N = 50, M = 3, ÷30 + 5/16', { waveform: fullScale('sine', 24), bits: 24, N: 50, M: 3, I: 30, F: 5, k: 4, fSysHz: 50e6 }, 0.15],
  ] as [string, Case, number][])('%s: SNR within %s dB of the model', (_n, c, tolerance) => {
    const model = analyse(c);
    const P = model.spectrum.period;
    const modulus = 2 ** c.k!;
    const clocks = (P * (c.I! * modulus + c.F!)) / modulus;
    expect(Number.isInteger(clocks)).toBe(true);
    const codes = inputOf(c).codes;
    const grid = new Float64Array(clocks);
    for (let n = 0; n < P; n++) {
      const start = n * c.I! + Math.floor((n * c.F!) / modulus);
      const end = (n + 1) * c.I! + Math.floor(((n + 1) * c.F!) / modulus);
      for (let j = start; j < end; j++) grid[j] = codes[n % c.N]!;
    }
    const p = oraclePowers(grid);
    const D = c.I! + c.F! / modulus;
    const lastInBand = Math.floor(clocks / (2 * D)); // f_s/2 in lines of f_sys/clocks
    const fundamentalLine = ((c.M as number) * P) / c.N; // f_out in lines: M·P/N
    const held = (m: number) => {
      const x = Math.PI * (m / clocks);
      return p[m]! * (Math.sin(x) / x) ** 2;
    };
    let noise = 0;
    for (let m = 1; m <= lastInBand; m++) if (m % fundamentalLine !== 0) noise += held(m);
    const snr = 10 * Math.log10(held(fundamentalLine) / noise);
    expect(Math.abs(snr - model.figures.snrDb!)).toBeLessThan(tolerance);
  });
});

describe('the stream is periodic over lcm(N′, L) samples', () => {
  it('N = 7053, M = 748, ÷22 + 85/256 (the demo chopper reference) repeats after 7053 · 256 samples: analytic', () => {
    const a = analyse({ waveform: fullScale('sine', 12), bits: 12, N: 7053, M: 748, I: 22, F: 85, k: 8, fSysHz: 150e6 });
    expect(a.spectrum.period).toBe(7053 * 256);
    expect(a.figures.method).toBe('analytic');
  });
});
