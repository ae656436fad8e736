// Divider jitter: closed forms against a step-by-step simulation of the accumulator, a published
// worked example and the jitter-limited SNR formula.

import { describe, expect, it } from 'vitest';
import { rat } from '../../../shared-schema/src/rational';
import { accumulatorJitter, dividerJitter, jitterSnrDb } from '../../../server/src/planning/jitter';
import type { Plan } from '../../../server/src/planning/types';

/** Runs the accumulator for one pattern and measures the edges directly (derived, by definition). */
function simulate(I: number, F: number, modulus: number, tSys: number) {
  let acc = 0;
  let t = 0;
  const edges = [0];
  const periods: number[] = [];
  // One pattern is at most `modulus` periods; run exactly until the accumulator returns to 0.
  do {
    acc += F;
    let period = I;
    if (acc >= modulus) {
      acc -= modulus;
      period += 1;
    }
    periods.push(period * tSys);
    t += period * tSys;
    edges.push(t);
  } while (acc !== 0);
  edges.pop(); // the edge that starts the next pattern
  const mean = (I + F / modulus) * tSys;
  const offsets = edges.map((e, n) => e - n * mean);
  const align = offsets.reduce((a, b) => a + b, 0) / offsets.length;
  const tie = offsets.map((o) => o - align);
  const rms = (xs: number[]): number => Math.sqrt(xs.reduce((a, x) => a + x * x, 0) / xs.length);
  return {
    length: periods.length,
    longShare: periods.filter((p) => p > I * tSys * 1.0000001).length / periods.length,
    periodPkPk: Math.max(...periods) - Math.min(...periods),
    periodRms: rms(periods.map((p) => p - mean)),
    tiePkPk: Math.max(...tie) - Math.min(...tie),
    tieRms: rms(tie),
    tieMaxAbs: Math.max(...tie.map(Math.abs)),
  };
}

describe('closed forms = step-by-step accumulator simulation (derived)', () => {
  it.each([
    [4, 1, 3], [4, 2, 3], [1, 244, 256], [1, 12, 256], [7, 128, 256], [3, 3, 10], [2, 999, 1000], [5, 96, 1024], [9, 1, 2],
  ])('I = %i, F = %i, modulus %i', (I, F, modulus) => {
    const tSys = 1 / 16e6;
    const sim = simulate(I, F, modulus, tSys);
    const j = accumulatorJitter(I, F, modulus, tSys, 1e5, 16e6 / (I + F / modulus));
    expect(j.patternLength).toBe(sim.length);
    expect(j.longShare).toBeCloseTo(sim.longShare, 12);
    expect(j.samplePeriodJitterPkPkS).toBeCloseTo(sim.periodPkPk, 15);
    expect(j.samplePeriodJitterRmsS / sim.periodRms).toBeCloseTo(1, 9);
    expect(j.tiePkPkS / sim.tiePkPk).toBeCloseTo(1, 9);
    expect(j.tieRmsS / sim.tieRms).toBeCloseTo(1, 9);
  });

  it('F = 0 is jitter-free: all zero, pattern 1, SNR unbounded (null)', () => {
    const j = accumulatorJitter(5, 0, 256, 8e-9, 1e6, 25e6);
    expect(j).toMatchObject({ longShare: 0, samplePeriodJitterPkPkS: 0, tieRmsS: 0, patternLength: 1, jitterSnrDb: null });
    expect(j.spurOffsetsHz).toEqual([]);
  });
});

describe('Circuit Cellar #296 (EQ answers): 16 MHz ÷ 4⅓ → periods 4, 4, 5', () => {
  const tSys = 1 / 16e6;
  const j = accumulatorJitter(4, 1, 3, tSys, 1e5, 16e6 / (13 / 3));
  it('pattern of 3 periods, one long (share 1/3)', () => {
    expect(j.patternLength).toBe(3);
    expect(j.longShare).toBeCloseTo(1 / 3, 12);
  });
  it('peak-to-peak period jitter 62.5 ns', () => expect(j.samplePeriodJitterPkPkS * 1e9).toBeCloseTo(62.5, 9));
  it('no edge more than ⅓ clock = 20.8 ns from the mean-aligned grid', () => {
    expect(simulate(4, 1, 3, tSys).tieMaxAbs * 1e9).toBeCloseTo(20.833, 2);
    expect((j.tiePkPkS / 2) * 1e9).toBeCloseTo(20.833, 2);
  });
  it('RMS period jitter sqrt(2/9)·62.5 ns = 29.46 ns (computed from the formula, docs/REFERENCES.md)', () => {
    expect(j.samplePeriodJitterRmsS * 1e9).toBeCloseTo(29.46, 2);
  });
  it('spurs at multiples of f_s/3 (docs/DESIGN.md: f_s·gcd(F, modulus)/modulus)', () => {
    expect(j.spurOffsetsHz.map((x) => x / (16e6 / (13 / 3) / 3))).toEqual([1, 2]);
  });
});

describe('jitter-limited SNR = −20·log10(2π·f·tj) (ADI MT-008)', () => {
  it.each([
    [10e6, 10e-12, 64.04],
    [1e6, 1e-9, 44.04],
    [100e6, 100e-15, 84.04],
  ])('f = %d Hz, tj = %d s → %d dB', (f, tj, db) => expect(jitterSnrDb(f, tj)).toBeCloseTo(db, 2));
});

describe('the 4 MHz plan on 125 MHz with D = 1 + 244/256 (derived)', () => {
  const plan: Plan = {
    dividerInteger: 1,
    dividerFraction: 244,
    fractionBits: 8,
    tableLength: 256,
    cycles: rat(16),
    achievedHz: rat(4_000_000),
    errorHz: rat(0),
  };
  const j = dividerJitter(rat(125_000_000), plan);
  it('about one sample period in 21 is one system clock short (short share 12/256 = 1/21.3)', () => {
    expect(1 - j.longShare).toBeCloseTo(12 / 256, 12);
    expect(1 / (1 - j.longShare)).toBeCloseTo(21.33, 2);
  });
  it('pattern of 64 periods (256/gcd(244, 256)), period jitter one 8 ns clock', () => {
    expect(j.patternLength).toBe(64);
    expect(j.samplePeriodJitterPkPkS).toBeCloseTo(8e-9, 20);
    expect(j.spurOffsetsHz[0]).toBeCloseTo(125e6 / (125 / 64) / 64, 6);
  });
});
