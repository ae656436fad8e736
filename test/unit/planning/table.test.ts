// Sample tables and the seam at their wrap.

import { describe, expect, it } from 'vitest';
import { fft } from 'mathjs';
import { type Rational, rat } from '../../../shared-schema/src/rational';
import { edgeWanderSamples, highSamples, tableDuty } from '../../../server/src/planning/duty';
import { buildTable, clippedSamples, unitWave, voltageToCode } from '../../../server/src/planning/table';
import { seamCheck } from '../../../server/src/planning/seam';
import type { Hardware, Shape, Waveform } from '../../../server/src/planning/types';

const dac12: Hardware['dac'] = { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(1e6) };
const wave = (shape: Shape, amplitudeVpp = 3, duty = 0.5): Waveform => ({ shape, duty, amplitudeVpp, offsetV: 1.65 });

describe('unit waveforms (definitions in docs/DESIGN.md, "Unit waveforms")', () => {
  it('sine = sin(2π·phase): 0, 1, 0, −1 at quarter cycles', () => {
    expect([0, 0.25, 0.5, 0.75].map((p) => unitWave('sine', 0.5, p))).toEqual([
      0, 1, Math.sin(Math.PI), Math.sin(1.5 * Math.PI),
    ]);
  });
  it('square: +1 below the duty, −1 from it on', () => {
    expect([0, 0.29, 0.3, 0.9].map((p) => unitWave('square', 0.3, p))).toEqual([1, 1, -1, -1]);
  });
  it('triangle: −1 at 0, 0 at ¼, +1 at ½, 0 at ¾', () => {
    expect([0, 0.25, 0.5, 0.75].map((p) => unitWave('triangle', 0.5, p))).toEqual([-1, 0, 1, 0]);
  });
  it('sawtooth: −1 at 0, 0 at ½, rising to +1', () => {
    expect([0, 0.5, 0.75].map((p) => unitWave('sawtooth', 0.5, p))).toEqual([-1, 0, 0.5]);
  });
});

describe('voltage → code: round(v/LSB), LSB = full scale/2^bits, clamped (ideal DAC, common practice)', () => {
  it('3.3 V, 12 bits: LSB = 0.8056640625 mV; 1.65 V → 2048; 1 mV → 1; 3.3 V clamps to 4095; −0.1 V to 0 (derived)', () => {
    expect(voltageToCode(1.65, dac12)).toBe(2048);
    expect(voltageToCode(0.001, dac12)).toBe(1);
    expect(voltageToCode(3.3, dac12)).toBe(4095);
    expect(voltageToCode(-0.1, dac12)).toBe(0);
  });
});

describe('tables', () => {
  it('a 12-bit sine of 127 cycles in 4096 samples has SNR 6.02·12 + 1.76 = 74.01 dB within 0.3 dB (Bennett 1948; ADI MT-229; oracle: mathjs fft)', () => {
    const fullScale: Waveform = { shape: 'sine', duty: 0.5, amplitudeVpp: 3.3 * (4094 / 4096), offsetV: 3.3 * (2048 / 4096) };
    const table = buildTable(fullScale, dac12, 4096, rat(127), 'open');
    const spectrum = fft(Array.from(table)) as unknown as { re: number; im: number }[];
    const power = spectrum.map((c) => c.re * c.re + c.im * c.im);
    const signal = 2 * power[127]!;
    let noise = 0;
    for (let k = 1; k < 4096; k++) if (k !== 127 && k !== 4096 - 127) noise += power[k]!;
    const snr = 10 * Math.log10(signal / noise);
    expect(Math.abs(snr - 74.01)).toBeLessThan(0.3);
  });

  it('open span: sample i at phase frac(M·i/N) — N = 8, M = 1 holds the sine at 45° steps (derived)', () => {
    const t = buildTable(wave('sine', 2), { ...dac12, fullScaleV: 4.096 }, 8, rat(1), 'open');
    // LSB = 4.096/4096 = 1 mV: codes = round(1650 + 1000·sin(2πi/8)).
    expect(Array.from(t)).toEqual([1650, 2357, 2650, 2357, 1650, 943, 650, 943]);
  });

  it('closed span repeats the first sample at the end (the off-by-one of inclusive end points)', () => {
    const t = buildTable(wave('sine'), dac12, 64, rat(1), 'closed');
    expect(t[63]).toBe(t[0]);
  });

  it('clipping is counted: 4 Vpp around 1.65 V on a 3.3 V DAC clips both peaks (derived)', () => {
    expect(clippedSamples(wave('sine', 3), dac12, 64, rat(1), 'open')).toBe(0);
    const clipped = clippedSamples(wave('sine', 4), dac12, 64, rat(1), 'open');
    // |sin| > 1.65/2 = 0.825 on 2·(0.5 − asin(0.825)/π) = 37.8 % of the cycle → about 24 of 64.
    expect(clipped).toBeGreaterThanOrEqual(22);
    expect(clipped).toBeLessThanOrEqual(26);
  });
});

describe('seam at the table wrap', () => {
  it.each(['sine', 'square', 'triangle', 'sawtooth'] as const)('whole cycles over an open span: %s seam ok, 0 LSB jump', (shape) => {
    for (const [n, m] of [[64, 1], [100, 7], [4096, 131]] as const) {
      expect(seamCheck(wave(shape), dac12, n, rat(m), 'open')).toEqual({ ok: true, jumpLsb: 0, cause: null });
    }
  });

  it('M = 10.5 cycles is caught as fractional cycles (a sawtooth wraps from mid-ramp, derived)', () => {
    const seam = seamCheck(wave('sawtooth'), dac12, 64, rat(21, 2), 'open');
    expect(seam.ok).toBe(false);
    expect(seam.cause).toBe('fractional-cycles');
    // Sample 0 is at phase 0 (−1.5 V → code 0.15 V/LSB = 186); the next sample on a continuous
    // phase is at phase frac(10.5) = 0.5 (0 V → 2048): a jump of 1862 LSB.
    expect(seam.jumpLsb).toBe(1862);
  });

  it('a sine with M = 10.5 wraps at a zero crossing with the right code but the wrong slope: still caught', () => {
    const seam = seamCheck(wave('sine'), dac12, 64, rat(21, 2), 'open');
    expect(seam).toMatchObject({ ok: false, cause: 'fractional-cycles' });
    // derived: two samples after the wrap the table plays sin(θ), a continuous phase −sin(θ),
    // θ = 2π·10.5·2/64 = 2.0617 rad: 2 · 1.5 V · 0.8819 / (3.3 V/4096) = 3284 LSB.
    expect(seam.jumpLsb).toBeGreaterThanOrEqual(3280);
    expect(seam.jumpLsb).toBeLessThanOrEqual(3288);
  });

  it('a closed span is caught as a repeated sample; 12-bit sine, 3 Vpp, N = 64 jumps 185 LSB (derived)', () => {
    // First = last = code(1.65 V) = 2048; a continuous phase would play phase 64/63 next:
    // 1.65 + 1.5·sin(2π/63) = 1.79935 V → round(1.79935/0.000805664) = 2233.
    expect(seamCheck(wave('sine'), dac12, 64, rat(1), 'closed')).toEqual({ ok: false, jumpLsb: 185, cause: 'repeated-sample' });
  });
});

describe('the duty a square table really has (derived: H = the whole number nearest duty·S, halves up)', () => {
  const dac = { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(1_000_000) };
  const square = (duty: Rational) => ({ shape: 'square' as const, duty: Number(duty.num) / Number(duty.den), dutyExact: duty, amplitudeVpp: 3, offsetV: 1.65 });
  const highOf = (table: Int32Array): number => table.filter((c) => c > 2048).length;

  it('25 samples per cycle at 50 %: 13 high, 52 %; 29 at 30 %: 9 high, 31.03 % — the table and the report agree', () => {
    for (const [duty, s, m, high] of [[rat(1, 2), 25, 1, 13], [rat(3, 10), 29, 1, 9], [rat(1, 2), 25, 4, 13], [rat(1, 4), 16, 2, 4], [rat(3, 10), 5, 1, 2]] as const) {
      const table = buildTable(square(duty), dac, s * m, rat(m), 'open');
      expect(highOf(table), `${s} × ${m} at ${duty.num}/${duty.den}`).toBe(high * m);
      expect(tableDuty(duty, s * m, rat(m), 'open')).toEqual(rat(high, s));
      expect(highSamples(duty, s)).toBe(high);
    }
  });

  it('with S not whole the report counts the table\'s own high samples, and the edges wander by (M − gcd(N, M))/M samples (derived)', () => {
    for (const [n, m] of [[100, 3], [250, 7], [64, 6]] as const) {
      const duty = rat(1, 2);
      const table = buildTable(square(duty), dac, n, rat(m), 'open');
      expect(tableDuty(duty, n, rat(m), 'open')).toEqual(rat(highOf(table), n));
    }
    expect(edgeWanderSamples(100, rat(3))).toBeCloseTo(2 / 3, 12);
    expect(edgeWanderSamples(64, rat(6))).toBeCloseTo(4 / 6, 12);
    expect(edgeWanderSamples(75, rat(3))).toBe(0);
  });
});
