// The sources of the README's formula table that no other test names, each checked against the
// engine: the time-interval error by its standard definitions (IEEE Std 2414-2020, ITU-T G.810),
// coherent tables (IEEE Std 1241) and the sine's default floor of samples per cycle (ADI MT-017).

import { describe, expect, it } from 'vitest';
import { rat } from '../../shared-schema/src/rational';
import { DEFAULT_MIN_SAMPLES_PER_CYCLE, DEFAULT_REASONS } from '../../shared-schema/src/defaults';
import { dividerJitter } from '../../server/src/planning/jitter';
import { buildTable, samplePhase } from '../../server/src/planning/table';
import type { Hardware, Plan } from '../../server/src/planning/types';

/** Edge times in system clocks of a first-order accumulator divider, step by step (by definition). */
function edges(I: number, F: number, k: number, count: number): number[] {
  const modulus = 2 ** k;
  const out = [0];
  let acc = 0;
  let t = 0;
  for (let n = 1; n < count; n++) {
    acc += F;
    let period = I;
    if (acc >= modulus) {
      acc -= modulus;
      period += 1;
    }
    t += period;
    out.push(t);
  }
  return out;
}

/** MTIE over windows of `window` edges (ITU-T G.810: the largest peak-to-peak time error in any window). */
function mtie(x: number[], window: number): number {
  let worst = 0;
  for (let s = 0; s + window <= x.length; s++) {
    const part = x.slice(s, s + window);
    worst = Math.max(worst, Math.max(...part) - Math.min(...part));
  }
  return worst;
}

const planOf = (I: number, F: number, k: number): Plan => ({
  dividerInteger: I,
  dividerFraction: F,
  fractionBits: k,
  tableLength: 1000,
  cycles: rat(1),
  achievedHz: rat(1000),
  errorHz: rat(0),
});

describe('time-interval error as IEEE Std 2414-2020 and ITU-T G.810 define it', () => {
  // The reference is the ideal clock of the plan's own mean period D·T_sys; TIE of edge n is its
  // time minus the reference edge's, and the RMS is taken about the mean (the grid aligned to it).
  const fSys = 100_000_000;
  it.each([
    [7, 1, 5], [7, 5, 5], [7, 12, 5], [7, 16, 5], [7, 31, 5], [22, 85, 8], [3, 3, 2],
  ])('I = %i, F = %i, k = %i: RMS and peak-to-peak TIE, and MTIE over a whole pattern', (I, F, k) => {
    const j = dividerJitter(rat(fSys), planOf(I, F, k));
    const tSys = 1 / fSys;
    const d = I + F / 2 ** k;
    const L = j.patternLength;
    const t = edges(I, F, k, 3 * L);
    const x = t.map((e, n) => (e - n * d) * tSys);
    const mean = x.reduce((a, b) => a + b, 0) / x.length;
    const rms = Math.sqrt(x.reduce((a, v) => a + (v - mean) ** 2, 0) / x.length);
    expect(j.tieRmsS / rms).toBeCloseTo(1, 9);
    expect(j.tiePkPkS / (Math.max(...x) - Math.min(...x))).toBeCloseTo(1, 9);
    // G.810 MTIE: a window of one whole pattern (L edges) already holds the full spread …
    expect(mtie(x, L) / j.tiePkPkS).toBeCloseTo(1, 9);
    // … and no window, however long, holds more.
    expect(mtie(x, x.length)).toBeLessThanOrEqual(j.tiePkPkS * (1 + 1e-12));
  });

});

describe('coherent tables (IEEE Std 1241; J. Blair, IMTC 2002)', () => {
  const dac: Hardware['dac'] = { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(1e6) };
  const sine = { shape: 'sine' as const, duty: 0.5, amplitudeVpp: 3, offsetV: 1.65 };

  it('M and N coprime: every sample sits at a distinct phase, together all of j/N', () => {
    for (const [n, m] of [[64, 5], [100, 7], [2048, 901]] as const) {
      const phases = Array.from({ length: n }, (_, i) => samplePhase(i, n, rat(m), 'open')).sort((a, b) => a - b);
      expect(phases.every((p, j) => Math.abs(p - j / n) < 1e-12), `N = ${n}, M = ${m}`).toBe(true);
    }
  });

  it('gcd(M, N) = g > 1: the table is g copies of an N/g-sample table of M/g cycles', () => {
    for (const [n, m] of [[64, 4], [96, 6], [4096, 128]] as const) {
      const g = n === 64 ? 4 : n === 96 ? 6 : 128;
      const table = Array.from(buildTable(sine, dac, n, rat(m), 'open'));
      const part = Array.from(buildTable(sine, dac, n / g, rat(m / g), 'open'));
      expect(table).toEqual(Array.from({ length: g }, () => part).flat());
    }
  });
});

describe("the sine's default floor of samples per cycle (ADI MT-017: zero-order hold sin(x)/x)", () => {
  const droopDb = (fOverFs: number): number => -20 * Math.log10(Math.sin(Math.PI * fOverFs) / (Math.PI * fOverFs));
  const reason = DEFAULT_REASONS.minSamplesPerCycle.sine;

  it('the formula gives the -3.92 dB MT-017 shows at f = f_s/2 (Fig. 1)', () => {
    expect(droopDb(0.5)).toBeCloseTo(3.92, 2);
  });

  it('the documented reason quotes the droop and images of the floor actually set', () => {
    const s = DEFAULT_MIN_SAMPLES_PER_CYCLE.sine;
    const ratio = /f\/fs = 1\/(\d+)/.exec(reason);
    const db = /([\d.]+) dB/.exec(reason);
    const images = /images sit at (\d+)f and (\d+)f/.exec(reason);
    expect(ratio && db && images, reason).toBeTruthy();
    expect(Number(ratio![1])).toBe(s);
    expect(droopDb(1 / s).toFixed(2)).toBe(db![1]);
    // Images of a tone f sit at k·f_s ± f (MT-017); with f_s = S·f the first are (S − 1)f and (S + 1)f (derived).
    expect([Number(images![1]), Number(images![2])]).toEqual([s - 1, s + 1]);
  });
});
