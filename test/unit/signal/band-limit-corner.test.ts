// `band-limit: <frequency>`, a reconstruction filter's corner: the exported table of a square,
// triangle or sawtooth holds the shape's harmonics below the corner in the proportions of its
// Fourier series (Oppenheim & Willsky, 1997, `from memory`: square 4/(πh) on odd h, triangle
// 8/(π²h²) on odd h, sawtooth 2/(πh) on every h) and nothing above it. Spectrum by mathjs fft
// (oracle) of the codes the C export writes.

import { describe, expect, it } from 'vitest';
import { jsonReport } from '../../../server/src/cli/format-json';
import { exportModel } from '../../../server/src/export/model';
import { analyze } from '../../../server/src/spec/analyze';
import { oraclePowers } from './oracle';

const clock = 'system-clock: 125 MHz\ndivider:\n  integer: { min: 1, max: 65535 }\ndac:\n  bits: 12\n  sample-bytes: 2\n  full-scale: 3.3 V\n  max-sample-rate: 12.5 MHz\nmemory:\n  budget: 24 KiB\n  table-length: { min: 16, max: 16384 }\n';
const host = (wave: string) => ({ readFile: (p: string) => (p.endsWith('.clock.yaml') ? clock : p.endsWith('.wave.yaml') ? wave : undefined) });

// 125 MHz / 125 = 1 MHz sample rate, 1000 samples of one cycle: 1 kHz, harmonic h in bin h.
const spec = (shape: string, limit: string, frequency = 'frequency: 1 kHz') =>
  `clock: ./r.clock.yaml\noutputs:\n  edge:\n    shape: ${shape}\n    ${frequency}\n    band-limit: ${limit}\n    plan: { divider: 125, table-length: 1000, cycles: 1 }\n`;

function run(shape: string, limit: string) {
  const text = spec(shape, limit);
  const analysis = analyze('/w/r.wave.yaml', text, host(text));
  const codes = exportModel({ analysis } as Parameters<typeof exportModel>[0])?.outputs[0]?.codes;
  const json = jsonReport([{ path: 'r.wave.yaml', analysis }], 'test').files[0]!.outputs[0]!;
  return { analysis, codes, json };
}

/** |X_h| / |X_1| for h = 1 … 499 of the exported table. */
function lineRatios(codes: ArrayLike<number>): number[] {
  const p = oraclePowers(codes);
  return Array.from({ length: 500 }, (_, h) => Math.sqrt(p[h]! / p[1]!));
}

const fourier: Record<string, (h: number) => number> = {
  square: (h) => (h % 2 === 1 ? 1 / h : 0),
  triangle: (h) => (h % 2 === 1 ? 1 / (h * h) : 0),
  sawtooth: (h) => 1 / h,
};

describe('band-limit with a filter corner', () => {
  it.each(['square', 'triangle', 'sawtooth'])('%s, corner 7.5 kHz at 1 kHz: harmonics 1…7 as the Fourier series has them, none above', (shape) => {
    const { analysis, codes } = run(shape, '7.5 kHz');
    expect(analysis.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    expect(codes).toBeDefined();
    const r = lineRatios(codes!);
    const series = fourier[shape]!;
    for (let h = 2; h <= 7; h++) {
      // Quantisation (12 bits) leaves about 1e-4 of the fundamental on any line.
      expect(Math.abs(r[h]! - series(h)), `${shape} h=${h}`).toBeLessThan(0.01 * series(h) + 2e-4);
    }
    // Above the corner: nothing but quantisation, below −70 dBc on every line up to f_s/2.
    const above = Math.max(...r.slice(8));
    expect(20 * Math.log10(above), shape).toBeLessThan(-70);
  });

  it.each(['square', 'triangle', 'sawtooth'])('%s without the corner holds its 9th harmonic (the check above can fail)', (shape) => {
    const { codes } = run(shape, 'none');
    const r = lineRatios(codes!);
    expect(r[9]!).toBeGreaterThan(0.5 * fourier[shape]!(9));
    expect(20 * Math.log10(Math.max(...r.slice(8)))).toBeGreaterThan(-40);
  });

  it("the square's THD below 7.5 kHz is sqrt(1/9 + 1/25 + 1/49) = 41.41 % (derived from the Fourier series)", () => {
    const { json } = run('square', '7.5 kHz');
    const expected = 100 * Math.sqrt(1 / 9 + 1 / 25 + 1 / 49);
    expect(Math.abs(json.plan!.thdPercent! - expected)).toBeLessThan(0.1);
  });

  it('a corner as a plain number is in hertz; a corner on a harmonic itself leaves that harmonic out (h·f below the corner)', () => {
    const orders = (limit: string) => run('square', limit).analysis.outputs[0]!.request.waveform.custom!.terms!.map((t) => t.order);
    expect(orders('7500')).toEqual([1, 3, 5, 7]);
    expect(orders('7 kHz')).toEqual([1, 3, 5]);
  });

  it('with steps the highest step decides: 7.5 kHz over steps at 1 and 2 kHz keeps 1 and 3', () => {
    const text = spec('square', '7.5 kHz', 'steps:\n      - { frequency: 1 kHz }\n      - { frequency: 2 kHz }').replace(/\n    plan:.*\n/, '\n');
    const analysis = analyze('/w/r.wave.yaml', text, host(text));
    expect(analysis.outputs[0]!.request.waveform.custom!.terms!.map((t) => t.order)).toEqual([1, 3]);
  });

  it.each([
    ['500 Hz', 'out-of-range', 'not above'],
    ['1 kHz', 'out-of-range', 'not above'],
    ['20 kOhm', 'bad-unit', 'kOhm'],
    ['fast', 'bad-choice', 'a frequency'],
    ['1e-400 kHz', 'out-of-range', 'corner'],
  ])('band-limit: %s is %s on its value, and the output is not planned as something else', (limit, code, words) => {
    const { analysis } = run('square', limit);
    const d = analysis.diagnostics.filter((x) => x.code === code);
    expect(d, JSON.stringify(analysis.diagnostics)).toHaveLength(1);
    expect(d[0]!.message).toContain(words);
    expect(d[0]!.range.start.line).toBe(5);
    expect(d[0]!.range.start.character).toBe('    band-limit: '.length);
    expect(analysis.outputs).toHaveLength(0);
  });
});
