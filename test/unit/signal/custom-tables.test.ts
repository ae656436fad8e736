// Band-limited shapes, harmonic lists and sample files: their tables, checked with mathjs fft
// (oracle) and against the plain tables of planning/table.ts.

import { describe, expect, it } from 'vitest';
import { rat } from '../../../shared-schema/src/rational';
import { buildTable } from '../../../server/src/planning/table';
import { bandLimitedWave, harmonicsWave, parseSampleFile, sampleSeam, sampleWave, SAMPLE_FILE_MAX_VALUES } from '../../../server/src/signal/custom-tables';
import { oraclePowers } from './oracle';
import { analyse, dacOf, fullScale } from './support';

describe('band-limited tables keep only the harmonics below f_s/2', () => {
  // S = 16.5 (N = 33, M = 2): a plain square's harmonics above f_s/2 fold onto lines between its
  // harmonics (edges wander from cycle to cycle); the band-limited table has none there.
  const plain = fullScale('square', 12);
  const limited = { ...plain, custom: bandLimitedWave('square', 0.5, 'nyquist') };

  it('mathjs fft of the band-limited table: no line off the harmonics of f_out above the 12-bit noise', () => {
    const table = buildTable(limited, dacOf(12), 33, rat(2), 'open');
    const p = oraclePowers(table);
    // Harmonics of f_out sit at bins 2h (M = 2); the others hold only quantisation error.
    let off = 0;
    for (let k = 1; k <= 16; k++) if (k % 2 !== 0) off = Math.max(off, p[k]!);
    expect(10 * Math.log10(p[2]! / off)).toBeGreaterThan(60);
  });

  it('its SINAD is quantisation-limited; the plain square at the same S is not', () => {
    const a = analyse({ waveform: plain, bits: 12, N: 33, M: 2 }).figures;
    const b = analyse({ waveform: limited, bits: 12, N: 33, M: 2 }).figures;
    expect(a.sinadDb!).toBeLessThan(20);
    expect(b.sinadDb!).toBeGreaterThan(60);
  });

  it('a stated corner keeps the orders h with h·f_target below it: 5.5 kHz over 1 kHz keeps 1…5', () => {
    const w = bandLimitedWave('square', 0.5, { cornerHz: 5500, targetHz: 1000 });
    expect(w.terms!.map((t) => t.order)).toEqual([1, 3, 5]);
  });

  it('the table spans the amplitude exactly like the plain shape: codes 0 … 4095', () => {
    const table = buildTable(limited, dacOf(12), 330, rat(1), 'open');
    expect(Math.min(...table)).toBeLessThanOrEqual(1);
    expect(Math.max(...table)).toBeGreaterThanOrEqual(4094);
  });
});

describe('harmonic lists', () => {
  it('one harmonic of phase 0 is the sine table itself', () => {
    const w = { ...fullScale('sine', 12), custom: harmonicsWave([{ order: 1, amplitude: 1, phaseDeg: 0 }]) };
    const ours = buildTable(w, dacOf(12), 100, rat(3), 'open');
    const sine = buildTable(fullScale('sine', 12), dacOf(12), 100, rat(3), 'open');
    let worst = 0;
    for (let i = 0; i < 100; i++) worst = Math.max(worst, Math.abs(ours[i]! - sine[i]!));
    expect(worst).toBeLessThanOrEqual(1);
  });

  it('a 3rd harmonic at 0.1 of the fundamental gives THD 10 % within 0.05 dB (definition of THD)', () => {
    const w = { ...fullScale('sine', 16), custom: harmonicsWave([{ order: 1, amplitude: 1, phaseDeg: 0 }, { order: 3, amplitude: 0.1, phaseDeg: 90 }]) };
    const f = analyse({ waveform: w, bits: 16, N: 1024, M: 1 }).figures;
    expect(Math.abs(20 * Math.log10(f.thdPercent / 10))).toBeLessThan(0.05);
  });
});

describe('sample files', () => {
  it('one value a line, CRLF, comments and a header', () => {
    const r = parseSampleFile('value\r\n# one cycle\r\n0\r\n1.5\r\n\r\n-2e0\r\n');
    expect(r).toEqual({ ok: true, values: Float64Array.from([0, 1.5, -2]) });
  });
  it('CSV: the last column is the value', () => {
    const r = parseSampleFile('time,value\n0,1\n1e-6,2\n2e-6;3\n');
    expect(r.ok && Array.from(r.values)).toEqual([1, 2, 3]);
  });
  it('a value that is not a number names its line', () => {
    const r = parseSampleFile('1\n2\nthree\n');
    expect(r).toMatchObject({ ok: false, line: 2 });
  });
  it('size limits: too many values', () => {
    const r = parseSampleFile('1\n'.repeat(SAMPLE_FILE_MAX_VALUES + 1));
    expect(r.ok).toBe(false);
  });
  it('the seam: a cycle that repeats its first value at the end is caught; a clean cycle is not', () => {
    const open = Float64Array.from({ length: 64 }, (_, i) => Math.sin((2 * Math.PI * i) / 64));
    const closed = Float64Array.from({ length: 65 }, (_, i) => Math.sin((2 * Math.PI * i) / 64));
    closed[64] = closed[0]!;
    expect(sampleSeam(open).ok).toBe(true);
    expect(sampleSeam(closed)).toMatchObject({ ok: false, repeatsFirst: true });
    // Half a cycle wraps from ~0 back to 0 with the wrong slope but a small step; a ramp
    // without its reset wraps with a step twice the largest: caught.
    const ramp = Float64Array.from({ length: 10 }, (_, i) => i);
    expect(sampleSeam(ramp).ok).toBe(false);
  });
  it('a file\'s cycle scaled to −1 … +1 plays like the shape it holds', () => {
    const values = Float64Array.from({ length: 64 }, (_, i) => 5 + 2 * Math.sin((2 * Math.PI * i) / 64));
    const w = { ...fullScale('sine', 12), custom: sampleWave(values, 'x') };
    const ours = buildTable(w, dacOf(12), 64, rat(1), 'open');
    const sine = buildTable(fullScale('sine', 12), dacOf(12), 64, rat(1), 'open');
    for (let i = 0; i < 64; i++) expect(Math.abs(ours[i]! - sine[i]!)).toBeLessThanOrEqual(1);
  });
});
