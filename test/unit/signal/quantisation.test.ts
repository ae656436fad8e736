// The figures of jitter-free tables against outside references: the ideal quantiser's
// 6.02·b + 1.76 dB (W. R. Bennett, BSTJ 1948; ADI MT-229) on simulated tables, and every figure
// against an independent FFT of the exported table (mathjs fft, oracle.ts) within 0.5 dB.

import { describe, expect, it } from 'vitest';
import { rat } from '../../../shared-schema/src/rational';
import { oracleSineFigures } from './oracle';
import { analyse, fullScale, tableOf, type Case } from './support';

describe('ideal quantiser: SNR = 6.02·b + 1.76 dB within 0.3 dB (Bennett 1948; ADI MT-229)', () => {
  // Coherent tables with M and N coprime, so every sample phase is distinct and the error spreads
  // over the band (J. Blair, IMTC 2002; IEEE Std 1241).
  it.each([
    [8, 4096, 127],
    [10, 4096, 127],
    [12, 4096, 127],
    [14, 8191, 1001],
    [16, 16384, 2047],
  ])('%i bits, N = %i, M = %i', (bits, N, M) => {
    const f = analyse({ waveform: fullScale('sine', bits), bits, N, M }).figures;
    const ideal = 6.02 * bits + 1.76;
    expect(f.method).toBe('exact');
    expect(Math.abs(f.sinadDb! - ideal)).toBeLessThan(0.3);
    expect(Math.abs(f.snrDb! - ideal)).toBeLessThan(0.3);
    expect(Math.abs(f.enob! - bits)).toBeLessThan(0.05);
  });

  it('half the amplitude loses 6.02 dB (one bit), within 0.3 dB (MT-229: SNR scales with the signal)', () => {
    const w = fullScale('sine', 12);
    const half = analyse({ waveform: { ...w, amplitudeVpp: w.amplitudeVpp / 2 }, bits: 12, N: 4096, M: 127 }).figures;
    expect(Math.abs(half.snrDb! - (74.02 - 6.02))).toBeLessThan(0.3);
  });
});

describe('every figure agrees with an independent FFT of the exported table within 0.5 dB', () => {
  const cases: [string, Case, number][] = [
    ['12-bit sine, 4096 × 127', { waveform: fullScale('sine', 12), bits: 12, N: 4096, M: 127 }, 127],
    ['10-bit sine, 1000 × 7', { waveform: fullScale('sine', 10), bits: 10, N: 1000, M: 7 }, 7],
    ['8-bit sine, 7279 × 738 (the demo carrier)', { waveform: fullScale('sine', 8), bits: 8, N: 7279, M: 738 }, 738],
    ['12-bit sine at 1 Vpp: 2000 × 3', { waveform: { ...fullScale('sine', 12), amplitudeVpp: 1 }, bits: 12, N: 2000, M: 3 }, 3],
    ['12-bit sine, M = 10.5 pinned (broken seam)', { waveform: fullScale('sine', 12), bits: 12, N: 64, M: rat(21, 2) }, 0],
    ['12-bit sine, closed span 257 × 5', { waveform: fullScale('sine', 12), bits: 12, N: 257, M: 5, span: 'closed' }, 5],
  ];
  it.each(cases)('%s', (_name, c, m1) => {
    const a = analyse(c);
    const f = a.figures;
    const table = tableOf(c);
    // A table of fractional cycles has its fundamental between lines: the nearest one.
    const bin = m1 > 0 ? m1 : Math.round(a.cyclesPerSample * table.length);
    const o = oracleSineFigures(table, bin);
    expect(f.method).toBe('exact');
    expect(Math.abs(f.sinadDb! - o.sinadDb)).toBeLessThan(0.5);
    expect(Math.abs(f.snrDb! - o.snrDb)).toBeLessThan(0.5);
    expect(Math.abs(f.sfdrDb! - o.sfdrDb)).toBeLessThan(0.5);
    // THD as a level: 20·log10 of the ratios within 0.5 dB.
    expect(Math.abs(20 * Math.log10(f.thdPercent / o.thdPercent))).toBeLessThan(0.5);
  });

  it('a 12-bit sine of whole S = 64 has every error on a harmonic: SNR unbounded (null), SINAD and THD finite', () => {
    const c: Case = { waveform: fullScale('sine', 12), bits: 12, N: 64, M: 1 };
    const f = analyse(c).figures;
    const o = oracleSineFigures(tableOf(c), 1);
    expect(f.snrDb).toBeNull();
    expect(o.snrDb).toBe(Infinity);
    expect(Math.abs(f.sinadDb! - o.sinadDb)).toBeLessThan(0.5);
    expect(Math.abs(f.sfdrDb! - o.sfdrDb)).toBeLessThan(0.5);
  });
});
