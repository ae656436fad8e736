// Extreme values in every quantity key end in a ranged out-of-range finding on the value itself,
// never in an internal error, an empty figure ("null", "Infinity", "NaN") or a plan of "0 cycles
// → 0 Hz". Doubles hold magnitudes of about 1e-308 to 1e308 (IEEE 754 binary64, from memory),
// so 5e-324 is the smallest subnormal and 1e-400 rounds to 0: the exact rationals survive such
// values, the floating-point figures derived from them do not.

import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import { formatJson } from '../../../server/src/cli/format-json';
import { formatText } from '../../../server/src/cli/format-text';
import { FIXTURES, diskHost } from './fixture-host';

const CLOCK = './bench.clock.yaml';
const wavePath = join(FIXTURES, 'good', 'extreme.wave.yaml');

function spec(entry: string): string {
  return `clock: ${CLOCK}\noutputs:\n  probe:\n${entry
    .split('\n')
    .map((l) => `    ${l}`)
    .join('\n')}\n`;
}

const TEN_TO_400 = `1${'0'.repeat(400)}`;

const CASES: Array<[string, string, string]> = [
  ['frequency 1e-400 kHz', 'shape: sine\nfrequency: 1e-400 kHz', 'frequency'],
  ['frequency 5e-324 mHz', 'shape: sine\nfrequency: 5e-324 mHz', 'frequency'],
  ['frequency 1e-20 Hz', 'shape: sine\nfrequency: 1e-20 Hz', 'frequency'],
  ['frequency 10^400 Hz, written out', `shape: sine\nfrequency: ${TEN_TO_400} Hz`, 'frequency'],
  ['frequency 1e400', 'shape: sine\nfrequency: 1e400', 'frequency'],
  ['pinned plan, frequency 1e-400 kHz', 'shape: sine\nfrequency: 1e-400 kHz\nplan: { divider: 10, table-length: 100, cycles: 1 }', 'frequency'],
  ['pinned plan, frequency 5e-324 mHz', 'shape: sine\nfrequency: 5e-324 mHz\nplan: { divider: 10, table-length: 100, cycles: 1 }', 'frequency'],
  ['tolerance 1e-390 ppm', 'shape: sine\nfrequency: 1 kHz\ntolerance: 1e-390 ppm', 'tolerance'],
  ['tolerance 1e300 %', 'shape: sine\nfrequency: 1 kHz\ntolerance: 1e300 %', 'tolerance'],
  ['duty 1e-300', 'shape: square\nfrequency: 1 kHz\nduty: 1e-300', 'duty'],
  ['pinned cycles 1e-200', 'shape: sine\nfrequency: 1 kHz\nplan: { divider: 10, table-length: 100, cycles: 1e-200 }', 'cycles'],
  ['amplitude 1e-300 Vpp', 'shape: sine\nfrequency: 1 kHz\namplitude: 1e-300 Vpp', 'amplitude'],
  ['min-samples-per-cycle 1e-300', 'shape: sine\nfrequency: 1 kHz\nmin-samples-per-cycle: 1e-300', 'min-samples-per-cycle'],
];

describe('extreme values', () => {
  it.each(CASES)('%s: one out-of-range finding on the value, nothing empty anywhere', (_, entry, key) => {
    const text = spec(entry);
    const a = analyze(wavePath, text, diskHost);
    expect(a.diagnostics.map((d) => d.code)).not.toContain('internal-error');
    const found = a.diagnostics.filter((d) => d.code === 'out-of-range');
    expect(found).toHaveLength(1);
    // The range covers the value's text on its own line (0-based line, UTF-16 columns).
    const line = text.split('\n')[found[0].range.start.line];
    const valueText = line.slice(found[0].range.start.character, found[0].range.end.character);
    expect(line).toContain(`${key}:`);
    expect(entry).toContain(valueText);
    expect(valueText.length).toBeGreaterThan(0);

    const json = formatJson([{ path: 'extreme.wave.yaml', analysis: a }], '0');
    expect(json).not.toMatch(/null,\s*"errorPpm"|"errorPpm": null|Infinity|NaN/);
    const shown = formatText([{ path: 'extreme.wave.yaml', analysis: a }], (p) => p);
    expect(shown).not.toMatch(/Infinity|NaN|0 cycles/);
  });

  it('the smallest frequency taken, 1 µHz, plans with finite figures (a control for the bound)', () => {
    const a = analyze(wavePath, spec('shape: sine\nfrequency: 0.001 mHz'), diskHost);
    expect(a.diagnostics.map((d) => d.code)).toEqual(['out-of-tolerance']);
    const p = a.outputs[0].planning.plan!;
    expect(Number.isFinite(p.errorPpm)).toBe(true);
    expect(p.cycles.num > 0n).toBe(true);
  });
});
