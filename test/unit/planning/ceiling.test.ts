// S max, the default of max-samples-per-cycle: where neighbouring samples of the shape come within
// one LSB of each other (server/src/planning/ceiling.ts). Each default is checked against a direct
// numerical measurement of the steepest step of the sampled waveform (derived), and the sine's
// against the small-angle form π·A (sin x ≈ x, any calculus text; derived).

import { describe, expect, it } from 'vitest';
import { rat } from '../../../shared-schema/src/rational';
import { defaultMaxSamplesPerCycle, derivedMaxSamplesPerCycle } from '../../../server/src/planning/ceiling';
import { unitWave } from '../../../server/src/planning/table';

/** Largest |w(i+1) − w(i)| over one cycle of S samples of a sine of swing A, over a fine grid of sampling phases. */
function measuredSineStep(swing: number, s: number): number {
  let worst = 0;
  for (let k = 0; k < 64; k++) {
    const phase = k / 64;
    for (let i = 0; i < s; i++) {
      const a = (swing / 2) * Math.sin((2 * Math.PI * (i + phase)) / s);
      const b = (swing / 2) * Math.sin((2 * Math.PI * (i + 1 + phase)) / s);
      worst = Math.max(worst, Math.abs(b - a));
    }
  }
  return worst;
}

describe('S max by shape (derived: the S where the steepest step between neighbouring samples falls to 1 LSB)', () => {
  it('sine: the steepest step is ≤ 1 LSB at S max and > 1 LSB one sample below; S max ≈ π·A', () => {
    for (const bits of [6, 8, 10, 12]) {
      const swing = 2 ** bits - 1; // the default amplitude: codes 0 to 2^bits − 1
      const s = derivedMaxSamplesPerCycle('sine', swing, null)!;
      expect(measuredSineStep(swing, s), `${bits} bits at S = ${s}`).toBeLessThanOrEqual(1 + 1e-9);
      expect(measuredSineStep(swing, s - 1), `${bits} bits at S = ${s - 1}`).toBeGreaterThan(1);
      expect(Math.abs(s - Math.PI * swing)).toBeLessThan(1.5);
    }
    // 12-bit full swing: π·4095 = 12864.9… (derived)
    expect(derivedMaxSamplesPerCycle('sine', 4095, null)).toBe(12865);
  });

  it('triangle 2·A and sawtooth A: their ramps step by 2A/S and A/S (derived)', () => {
    expect(derivedMaxSamplesPerCycle('triangle', 1023, null)).toBe(2046);
    expect(derivedMaxSamplesPerCycle('sawtooth', 1023, null)).toBe(1023);
    const step = (shape: 'triangle' | 'sawtooth', s: number): number => {
      let worst = 0;
      // The ramps of the table's own unit waveform, swing 1023 LSB; a sawtooth's reset is left out.
      for (let i = 0; i + 1 < s; i++) worst = Math.max(worst, (1023 / 2) * Math.abs(unitWave(shape, 0.5, (i + 1) / s) - unitWave(shape, 0.5, i / s)));
      return worst;
    };
    expect(step('triangle', 2046)).toBeLessThanOrEqual(1 + 1e-9);
    expect(step('triangle', 2045)).toBeGreaterThan(1);
    expect(step('sawtooth', 1023)).toBeLessThanOrEqual(1 + 1e-9);
    expect(step('sawtooth', 1022)).toBeGreaterThan(1);
  });

  it('square: 1/(2·duty-tolerance), where rounding the high samples lands within the tolerance for any duty (derived)', () => {
    expect(derivedMaxSamplesPerCycle('square', 4095, rat(1, 100))).toBe(50);
    expect(derivedMaxSamplesPerCycle('square', 4095, rat(1, 200))).toBe(100);
    expect(derivedMaxSamplesPerCycle('square', 4095, rat(0))).toBeNull();
    // At S = 50 the worst duty error over every duty in 0.1 % steps is 1/(2·50) = 1 % (derived).
    let worst = 0;
    for (let k = 10; k < 990; k++) {
      const duty = k / 1000;
      worst = Math.max(worst, Math.abs(Math.round(duty * 50) / 50 - duty));
    }
    expect(worst).toBeLessThanOrEqual(0.01 + 1e-12);
  });

  it('never below the S floor', () => {
    expect(defaultMaxSamplesPerCycle('sawtooth', 10, null, rat(32))).toEqual(rat(32));
    expect(defaultMaxSamplesPerCycle('sine', 0.5, null, rat(17, 2))).toEqual(rat(9));
    expect(defaultMaxSamplesPerCycle('sine', 4095, null, rat(8))).toEqual(rat(12865));
  });
});
