// What a wave spec says about a clock file that stops it: the clock-invalid finding quotes the
// clock file's first error in file order (the one a reader meets first when opening it), and no
// summary counts the spec's outputs as "0 outputs" as if it had none.

import { describe, expect, it } from 'vitest';
import { analyze, readClock } from '../../../server/src/spec/analyze';
import { formatText } from '../../../server/src/cli/format-text';

// Line 2: a unit no frequency takes (found by the quantity reader); line 5: 99 bits, above the
// schema's 31 (found by schema validation, which runs first): two errors, out of file order.
const BROKEN_CLOCK = [
  '# an invented clock with two mistakes',
  'system-clock: 96 parsecs',
  'divider: { integer: { min: 2, max: 4095 } }',
  'dac:',
  '  bits: 99',
  '  sample-bytes: 2',
  '  full-scale: 2.5 V',
  '  max-sample-rate: 12 MHz',
  'memory: { budget: 32 KiB, table-length: { min: 16, max: 4096 } }',
  '',
].join('\n');
const WAVE = 'clock: ./broken.clock.yaml\noutputs:\n  a: { shape: sine, frequency: 1 kHz }\n  b: { shape: sine, frequency: 2 kHz }\n';

const host = { readFile: (p: string) => (p === '/virtual/broken.clock.yaml' ? BROKEN_CLOCK : undefined) };

describe('a wave spec on an invalid clock file', () => {
  const a = analyze('/virtual/spec.wave.yaml', WAVE, host);

  it('quotes the clock file’s first error in file order (line 2), not the first one found', () => {
    const errors = readClock(BROKEN_CLOCK).diagnostics.filter((d) => d.severity === 'error');
    expect(errors.map((d) => d.range.start.line + 1).sort((x, y) => x - y)).toEqual([2, 5]);
    const [d] = a.diagnostics;
    expect(d.code).toBe('clock-invalid');
    expect(d.message).toMatch(/^The clock file \.\/broken\.clock\.yaml has 2 errors \(line 2: /);
  });

  it('is summarised as not planned because of the clock file, not as "0 outputs"', () => {
    const text = formatText([{ path: 'spec.wave.yaml', analysis: a }], (p) => p);
    const header = text.split('\n')[0];
    expect(header).toBe('spec.wave.yaml  wave spec — outputs not planned: the clock file broken.clock.yaml has errors, clock /virtual/broken.clock.yaml');
    expect(header).not.toContain('0 outputs');
    // The run's last line too: no bare "0 outputs" as if the spec had none.
    const summary = text.trimEnd().split('\n').at(-1);
    expect(summary).toBe('waveplan check FAILED: 1 file, 0 outputs planned (1 wave spec not planned: see its clock file), 1 error, 0 warnings');
  });

  it('and as cannot be read when the clock file is missing', () => {
    const missing = analyze('/virtual/spec.wave.yaml', WAVE.replace('broken', 'gone'), host);
    const header = formatText([{ path: 'spec.wave.yaml', analysis: missing }], (p) => p).split('\n')[0];
    expect(header).toContain('outputs not planned: the clock file gone.clock.yaml cannot be read');
  });
});
