// Square, triangle and sawtooth: the ideal shapes' THD (closed forms), the sampled tables' THD
// (derived aliasing sums, and mathjs fft as oracle), and the fidelity of one reconstructed cycle
// (Gibbs overshoot, the Si-function rise time of an ideal low-pass, a triangle's corners).

import { describe, expect, it } from 'vitest';
import { unitWave } from '../../../server/src/planning/table';
import { idealHarmonicRatio, idealThd, shapeTerms } from '../../../server/src/signal/ideal-shapes';
import { evaluateTerms } from '../../../server/src/planning/custom-wave';
import { shapeFidelity } from '../../../server/src/signal/shape-fidelity';
import { oraclePowers } from './oracle';
import { analyse, fullScale, tableOf } from './support';

describe('THD of the ideal shapes', () => {
  it('square (50 %): sqrt(π²/8 − 1) = 48.3426 % (REFERENCES: read)', () => {
    expect(100 * idealThd('square', 0.5)).toBeCloseTo(48.3426, 3);
  });
  it('triangle: sqrt(π⁴/96 − 1) = 12.1153 % (computed); sawtooth: sqrt(π²/6 − 1) = 80.3 % (computed)', () => {
    expect(100 * idealThd('triangle', 0.5)).toBeCloseTo(12.1153, 3);
    expect(100 * idealThd('sawtooth', 0.5)).toBeCloseTo(80.3, 1);
  });
  it('the closed forms equal the sum of the series terms (2·10^5 harmonics)', () => {
    for (const [shape, duty] of [['square', 0.5], ['square', 0.3], ['triangle', 0.5], ['sawtooth', 0.5]] as const) {
      let sum = 0;
      for (let h = 2; h <= 200000; h++) sum += idealHarmonicRatio(shape, duty, h) ** 2;
      expect(Math.sqrt(sum)).toBeCloseTo(idealThd(shape, duty), 3);
    }
  });
  it('the series converge to the shapes of the table code (unitWave) away from their jumps', () => {
    for (const [shape, duty] of [['square', 0.5], ['square', 0.3], ['triangle', 0.5], ['sawtooth', 0.5]] as const) {
      const terms = shapeTerms(shape, duty, 4000);
      for (const phase of [0.1, 0.2, 0.45, 0.7, 0.9]) {
        expect(Math.abs(evaluateTerms(terms, phase) + (shape === 'square' ? 2 * duty - 1 : 0) - unitWave(shape, duty, phase))).toBeLessThan(2e-3);
      }
    }
  });
});

describe('THD of sampled tables (jitter-free, whole S)', () => {
  // Square sampled at P points: harmonic k has amplitude 4/(P·sin(πk/P)) (REFERENCES, derived):
  // THD(8) = sqrt(2) − 1 = 41.4214 %, THD(16) = 46.6827 %.
  it.each([
    [8, 41.4214],
    [16, 46.6827],
  ])('square at S = %i: %f %%', (S, thd) => {
    const f = analyse({ waveform: fullScale('square', 24), bits: 24, N: S, M: 1 }).figures;
    expect(f.thdPercent).toBeCloseTo(thd, 2);
  });

  // Triangle sampled at P points: the aliases of odd harmonics add in phase,
  // Σ_j 1/(k + jP)² = π²/(P²·sin²(πk/P)), so harmonic k has 8/(P²·sin²(πk/P)) (derived).
  it.each([16, 32, 64])('triangle at S = %i: the aliasing sum, and mathjs fft of the table, within 0.01 %%', (S) => {
    let sum = 0;
    for (let k = 3; k < S / 2; k += 2) sum += (Math.sin(Math.PI / S) / Math.sin((Math.PI * k) / S)) ** 4;
    const derived = 100 * Math.sqrt(sum);
    const c = { waveform: fullScale('triangle', 24), bits: 24, N: S, M: 1 };
    const p = oraclePowers(tableOf(c));
    let h = 0;
    for (let k = 2; k < S / 2; k++) h += p[k]!;
    const oracle = 100 * Math.sqrt(h / p[1]!);
    const f = analyse(c).figures;
    expect(Math.abs(f.thdPercent - derived)).toBeLessThan(0.01);
    expect(Math.abs(f.thdPercent - oracle)).toBeLessThan(0.01);
    // Aliasing raises a sampled triangle's harmonics above the ideal 12.1153 % (sin(πk/P) < k·sin(π/P)).
    expect(f.thdPercent).toBeGreaterThan(12.1153);
  });
});

describe('shape fidelity of one reconstructed cycle', () => {
  // Si(x) = ∫₀ˣ sin(t)/t dt by Simpson's rule, for the ideal low-pass step response
  // 1/2 + Si(2πBt)/π (any signals text; Gibbs: the peak at Si(π) = 1.8519, 8.95 % over, from memory).
  const Si = (x: number) => {
    const n = 2000;
    let s = 0;
    for (let i = 0; i <= n; i++) {
      const t = (x * i) / n;
      const f = t === 0 ? 1 : Math.sin(t) / t;
      s += f * (i === 0 || i === n ? 1 : i % 2 === 1 ? 4 : 2);
    }
    return (s * x) / (3 * n);
  };
  const solve = (target: number) => {
    let lo = 0;
    let hi = 3;
    for (let k = 0; k < 60; k++) {
      const mid = (lo + hi) / 2;
      if (Si(mid) < target) lo = mid;
      else hi = mid;
    }
    return lo;
  };

  it('a square behind a low-pass below harmonic 21 (S = 1024): rise time u₉₀ − u₁₀ of the Si function within 3 %, overshoot 8.95 % within 0.5', () => {
    const S = 1024;
    const fs = 1.024e6;
    const cycle = tableOf({ waveform: fullScale('square', 24), bits: 24, N: S, M: 1 });
    const fid = shapeFidelity(cycle, 'square', 0.5, fs, 20.5 * (fs / S))!;
    // The partial sum up to harmonic n has the Dirichlet kernel's band (n + ½)·f_out = 20.5 kHz.
    const B = 20.5 * (fs / S);
    const u = solve(0.4 * Math.PI); // Si(u) = 0.4π → the 90 % point; 10 % is at −u
    const rise = (2 * u) / (2 * Math.PI * B);
    expect(Math.abs(fid.riseTimeS! / rise - 1)).toBeLessThan(0.03);
    expect(Math.abs(fid.fallTimeS! / rise - 1)).toBeLessThan(0.03);
    expect(Math.abs(fid.overshootPercent! - 100 * (Si(Math.PI) / Math.PI - 0.5))).toBeLessThan(0.5);
    expect(fid.idealThdPercent).toBeCloseTo(48.3426, 3);
  });

  it('a triangle with only its fundamental below the corner keeps 8/π² of its peaks: corners short by 50·(1 − 8/π²) = 9.47 % (derived)', () => {
    const S = 256;
    const cycle = tableOf({ waveform: fullScale('triangle', 24), bits: 24, N: S, M: 1 });
    const fid = shapeFidelity(cycle, 'triangle', 0.5, 256e3, 1.5e3)!;
    expect(fid.cornerErrorPercent!).toBeCloseTo(50 * (1 - 8 / Math.PI ** 2), 1);
  });

  it('harmonic content against the ideal: a 64-sample square\'s 3rd and 5th harmonics within 0.1 dB of 4/(P·sin(πk/P))', () => {
    const S = 64;
    const cycle = tableOf({ waveform: fullScale('square', 24), bits: 24, N: S, M: 1 });
    const fid = shapeFidelity(cycle, 'square', 0.5, 64e3)!;
    for (const k of [3, 5]) {
      const h = fid.harmonics.find((x) => x.order === k)!;
      expect(h.idealDbc).toBeCloseTo(20 * Math.log10(1 / k), 6);
      expect(Math.abs(h.tableDbc - 20 * Math.log10(Math.sin(Math.PI / S) / Math.sin((Math.PI * k) / S)))).toBeLessThan(0.1);
    }
    expect(fid.edgeResolutionS).toBeCloseTo(1 / 64e3, 12);
  });

  it('a sine has no shape fidelity figures', () => {
    expect(shapeFidelity(tableOf({ waveform: fullScale('sine', 12), bits: 12, N: 64, M: 1 }), 'sine', 0.5, 1e6)).toBeNull();
  });
});
