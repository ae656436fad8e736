// `harmonics:` through the spec layer: the table it exports, its THD and its diagnostics.

import { describe, expect, it } from 'vitest';
import { jsonReport } from '../../../server/src/cli/format-json';
import { exportModel } from '../../../server/src/export/model';
import { analyze } from '../../../server/src/spec/analyze';

const clock = 'system-clock: 125 MHz\ndivider:\n  integer: { min: 1, max: 65535 }\ndac:\n  bits: 12\n  sample-bytes: 2\n  full-scale: 3.3 V\n  max-sample-rate: 12.5 MHz\nmemory:\n  budget: 24 KiB\n  table-length: { min: 16, max: 16384 }\n';
const host = (wave: string) => ({ readFile: (p: string) => (p.endsWith('.clock.yaml') ? clock : p.endsWith('.wave.yaml') ? wave : undefined) });
// 125 MHz / 125 = 1 MHz sample rate, 100 samples of one cycle: 10 kHz.
const wave = (extra: string) => `clock: ./r.clock.yaml\noutputs:\n  tone:\n    shape: sine\n    frequency: 10 kHz\n${extra}    plan: { divider: 125, table-length: 100, cycles: 1 }\n`;
const run = (extra: string) => {
  const text = wave(extra);
  const analysis = analyze('/w/r.wave.yaml', text, host(text));
  const model = exportModel({ analysis } as Parameters<typeof exportModel>[0]);
  return { analysis, text, codes: model?.outputs[0]?.codes, json: jsonReport([{ path: 'r.wave.yaml', analysis }], 'test').files[0]!.outputs[0] };
};

describe('harmonics: on an output', () => {
  it('a list holding only the fundamental gives the codes of shape: sine', () => {
    const plain = run('');
    const listed = run('    harmonics:\n      - { order: 1, amplitude: 1 }\n');
    expect(plain.codes).toBeDefined();
    expect(Array.from(listed.codes!)).toEqual(Array.from(plain.codes!));
  });

  it('a 1st + 3rd harmonic table matches a hand computation (derived) at a few indices', () => {
    const { codes } = run('    harmonics:\n      - { order: 1, amplitude: 1 }\n      - { order: 3, amplitude: 0.5, phase: 90 }\n');
    expect(codes).toBeDefined();
    // derived: u(φ) = sin 2πφ + 0.5·cos 6πφ, scaled so its peak-to-peak spans the amplitude; codes follow u linearly.
    const u = (i: number) => Math.sin((2 * Math.PI * i) / 100) + 0.5 * Math.cos((6 * Math.PI * i) / 100);
    const us = Array.from({ length: 100 }, (_, i) => u(i));
    const c = Array.from(codes!);
    const [lo, hi] = [Math.min(...c), Math.max(...c)];
    const [ulo, uhi] = [Math.min(...us), Math.max(...us)];
    for (const i of [0, 7, 25, 50, 83]) {
      const expected = lo + ((us[i]! - ulo) / (uhi - ulo)) * (hi - lo);
      expect(Math.abs(c[i]! - expected), `index ${i}`).toBeLessThanOrEqual(1);
    }
    // The shape differs from a plain sine: at index 0 the sine is mid-scale, this one is not.
    expect(Math.abs(c[0]! - (lo + hi) / 2)).toBeGreaterThan(0.1 * (hi - lo));
  });

  it('amplitudes 1 and 0.1 give a THD of 10 % (derived: 0.1/1) within the quantisation', () => {
    const { json } = run('    harmonics:\n      - { order: 1, amplitude: 1 }\n      - { order: 2, amplitude: 0.1 }\n');
    expect(json!.plan!.thdPercent).toBeGreaterThan(9.8);
    expect(json!.plan!.thdPercent).toBeLessThan(10.2);
  });

  it.each([
    ['empty list', '    harmonics: []\n'],
    ['order too large', '    harmonics:\n      - { order: 5000, amplitude: 1 }\n'],
    ['order zero', '    harmonics:\n      - { order: 0, amplitude: 1 }\n'],
    ['duplicate order', '    harmonics:\n      - { order: 1, amplitude: 1 }\n      - { order: 1, amplitude: 0.2 }\n'],
    ['negative amplitude', '    harmonics:\n      - { order: 1, amplitude: -1 }\n'],
    ['all zero', '    harmonics:\n      - { order: 1, amplitude: 0 }\n'],
  ])('%s gives a ranged diagnostic, no crash', (_name, extra) => {
    const { analysis, text } = run(extra);
    const harmonicsLine = text.split('\n').findIndex((l) => l.includes('harmonics'));
    const d = analysis.diagnostics.filter((x) => x.severity === 'error' || x.severity === 'warning');
    expect(d.length, JSON.stringify(analysis.diagnostics)).toBeGreaterThan(0);
    expect(d.some((x) => x.range.start.line >= harmonicsLine)).toBe(true);
  });

  it.each([
    ['a repeated order', '    harmonics:\n      - { order: 1, amplitude: 1 }\n      - { order: 1, amplitude: 0.2 }\n', '      - { order: 1, amplitude: 0.2 }'],
    ['every amplitude 0', '    harmonics: [{ order: 1, amplitude: 0 }, { order: 3, amplitude: 0 }]\n', '[{ order: 1, amplitude: 0 }, { order: 3, amplitude: 0 }]'],
  ])('%s is bad-harmonics, an error on the list, and the output is not planned as a plain sine', (_name, extra, marked) => {
    const { analysis, text } = run(extra);
    const found = analysis.diagnostics.filter((d) => d.code === 'bad-harmonics');
    expect(found).toHaveLength(1);
    expect(found[0]!.severity).toBe('error');
    expect(found[0]!.output).toBe('tone');
    expect(analysis.diagnostics.some((d) => d.code === 'unused-key')).toBe(false);
    // The range is the offending item (or the list), by its text.
    const lines = text.split('\n');
    const r = found[0]!.range;
    const line = lines[r.start.line]!;
    expect(marked).toContain(line.slice(r.start.character, r.end.character).trim());
    expect(line.slice(r.start.character, r.end.character).length).toBeGreaterThan(10);
    expect(analysis.outputs).toHaveLength(0);
  });

  it('harmonics on a square is still unused-key (the list is not read), not bad-harmonics', () => {
    const text = wave('    harmonics:\n      - { order: 1, amplitude: 1 }\n').replace('shape: sine', 'shape: square');
    const analysis = analyze('/w/r.wave.yaml', text, host(text));
    expect(analysis.diagnostics.map((d) => d.code)).toContain('unused-key');
    expect(analysis.diagnostics.map((d) => d.code)).not.toContain('bad-harmonics');
  });
});
