// The formatters on hand-built analyses (test/cli/hand-built.ts), independent of the engine.

import { describe, expect, it } from 'vitest';
import { rat, sub } from '../../shared-schema/src/rational';
import { exactText, formatJson } from '../../server/src/cli/format-json';
import { sarifLog } from '../../server/src/cli/format-sarif';
import { alignColumns, formatText } from '../../server/src/cli/format-text';
import { formatHz } from '../../shared-schema/src/quantity-format';
import { formatDivider, formatPpm, formatSignedHz } from '../../server/src/cli/units';
import { EXACT_PLAN, FRACTIONAL_PLAN, handBuiltWave } from './hand-built';

const files = [{ path: 'rig/tones.wave.yaml', analysis: handBuiltWave('/abs/rig/tones.wave.yaml') }];

describe('quantities as printed', () => {
  it('shows 125 MHz · 131 / 4096 exactly as 3.997802734375 MHz (trade fact, common practice)', () => {
    expect(formatHz(rat(3997802734375n, 1000000n))).toBe('3.997802734375 MHz');
  });
  it('marks a frequency no short decimal holds: 1 kHz / 3 (derived)', () => {
    expect(formatHz(rat(1000, 3))).toMatch(/^≈333\.333\d* Hz$/);
  });
  it('signs errors, with ≈ in front of the sign: −2197.265625 Hz = 3.997802734375 MHz − 4 MHz (derived)', () => {
    expect(formatSignedHz(rat(-2197265625n, 1000000n))).toBe('-2.197265625 kHz');
    expect(formatSignedHz(rat(1, 1000))).toBe('+1 mHz');
    expect(formatSignedHz(rat(-1000, 3))).toBe('≈-333.3 Hz');
    // 150 MHz · 738 / (379 · 7279) − 40.127 kHz = −3.87858e-5 Hz (derived; Python fractions.Fraction agrees).
    expect(formatSignedHz(sub(rat(150_000_000n * 738n, 379n * 7279n), rat(40127)))).toBe('≈-38.79 µHz');
    expect(formatSignedHz(rat(0))).toBe('0 Hz');
  });
  it('prints relative errors with three significant digits: (3.997802734375 − 4)/4 · 1e6 = −549.31640625 ppm (derived)', () => {
    expect(formatPpm(-549.31640625)).toBe('-549 ppm');
    // Never an exponent, and whole-number digits are kept: 23440 ppm stays 23440 (derived).
    expect(formatPpm(-23440)).toBe('-23440 ppm');
    expect(formatPpm(3.5e-7)).toBe('+350 ppq');
    expect(formatPpm(-1.2345e-12)).toBe('-0.00123 ppq');
    expect(formatPpm(0)).toBe('0 ppm');
    expect(formatPpm(12.5)).toBe('+12.5 ppm');
  });
  it('marks a fractional divider: 4 MHz from 125 MHz with N = 256, M = 16 needs ÷1+244/256 (derived, 125/64)', () => {
    expect(formatDivider({ dividerInteger: 1, dividerFraction: 244, fractionBits: 8 })).toBe('÷1+244/256');
    expect(formatDivider({ dividerInteger: 3, dividerFraction: 0, fractionBits: 8 })).toBe('÷3');
  });
});

describe('text report', () => {
  const text = formatText(files, (p) => p);
  it('has one aligned row per output with the plan figures', () => {
    const rows = text.split('\n').filter((l) => l.startsWith('  '));
    expect(rows).toHaveLength(4); // headings + 3 outputs
    const tableColumn = rows[0].indexOf('N × M');
    expect(rows[1].indexOf('4096 × 131')).toBe(tableColumn);
    expect(rows[2].indexOf('256 × 16')).toBe(tableColumn);
    expect(rows[1]).toContain('3.997802734375 MHz');
    expect(rows[1]).toContain('-549 ppm');
    expect(rows[2]).toContain('÷1+244/256');
    // 8 ns·sqrt(244·12)/256 = 1.6909 ns (derived from RMS = T_sys·sqrt(p(1−p))); TIE RMS
    // 8 ns·sqrt(64² − 1)/(64·sqrt(12)) = 2.309 ns (derived, pattern of 64 periods).
    expect(rows[2]).toContain('rms 1.69 ns, TIE 2.31 ns');
    expect(rows[3]).toContain('no plan');
  });
  it('lists findings as path:line:col (1-based) in line order, then a summary', () => {
    const lines = text.trimEnd().split('\n');
    const findings = lines.filter((l) => l.startsWith('rig/tones.wave.yaml:'));
    expect(findings).toEqual([
      'rig/tones.wave.yaml:4:3: error out-of-tolerance No jitter-free plan meets 1 ppm; the nearest is 3.997802734375 MHz (-549.3 ppm).',
      'rig/tones.wave.yaml:8:3: warning fractional-plan Only a fractional divider meets the tolerance; it adds 1.69 ns RMS period jitter',
    ]);
    expect(lines[lines.length - 1]).toBe('waveplan check FAILED: 1 file, 3 outputs, 1 error, 1 warning');
  });
  it('aligns columns by characters, not bytes (÷ and µ are one column each)', () => {
    expect(alignColumns([['÷1', 'x'], ['÷100', 'y']])).toEqual(['÷1    x', '÷100  y']);
  });
});

describe('JSON report', () => {
  const report = JSON.parse(formatJson(files, '9.9.9'));
  it('keeps the documented shape with 1-based positions', () => {
    const file = report.files[0];
    expect(file.path).toBe('rig/tones.wave.yaml');
    expect(file.diagnostics[0]).toMatchObject({ severity: 'error', code: 'out-of-tolerance', line: 4, column: 3 });
    expect(file.outputs.map((o: { name: string }) => o.name)).toEqual(['tone-a', 'tone-b', 'unreachable']);
    expect(file.outputs[2].plan).toBeNull();
  });
  it('turns exact rationals into numbers and keeps the exact text (125e6·131/4096, common practice)', () => {
    const plan = report.files[0].outputs[0].plan;
    expect(plan.achievedHz).toBe(3997802.734375);
    expect(plan.achievedHzExact).toBe('3997802.734375');
    expect(plan.errorHzExact).toBe('-2197.265625');
    expect(plan.systemClockHz).toBe(125e6);
    expect(plan.sampleRateHz).toBe(125e6);
  });
  it('writes exact text as a full decimal when one exists, else as a reduced fraction (derived)', () => {
    expect(exactText(rat(3997802734375n, 1000000n))).toBe('3997802.734375');
    expect(exactText(rat(1000, 3))).toBe('1000/3');
    expect(exactText(rat(131))).toBe('131');
    expect(exactText(rat(-21, 2))).toBe('-10.5');
  });
  it('reports the divider as I and F with D = I + F/2^k (D = 125/64 for the 4 MHz example, derived)', () => {
    const plan = report.files[0].outputs[1].plan;
    expect(plan.dividerInteger + plan.dividerFraction / 2 ** plan.fractionBits).toBe(125 / 64);
    expect(plan.sampleRateHz).toBe(64e6);
    expect(plan.jitterFree).toBe(false);
    expect(plan.samplePeriodJitterPkPkS).toBe(FRACTIONAL_PLAN.jitter.samplePeriodJitterPkPkS);
    expect(plan.achievedHz).toBe(4e6);
    expect(report.files[0].outputs[0].plan.tableBytes).toBe(EXACT_PLAN.tableBytes);
  });
});

describe('SARIF log', () => {
  const rules = [
    { code: 'fractional-plan', severity: 'warning' as const, title: 'Fractional divider chosen', help: 'Only a fractional divider meets the tolerance.' },
    { code: 'out-of-tolerance', severity: 'error' as const, title: 'Out of tolerance', help: 'No allowed plan meets the tolerance' },
  ];
  const log = sarifLog(files, rules, { version: '9.9.9', informationUri: 'https://example.org/waveplan' });
  it('is SARIF 2.1.0 with one rule per catalogue code (OASIS SARIF 2.1.0, §3.49 reportingDescriptor)', () => {
    expect(log.version).toBe('2.1.0');
    const driver = log.runs[0].tool.driver;
    expect(driver.rules?.map((r) => r.id)).toEqual(['fractional-plan', 'out-of-tolerance']);
    expect(driver.rules?.[1].fullDescription?.text).toBe('No allowed plan meets the tolerance.');
    expect(driver.rules?.[1].defaultConfiguration?.level).toBe('error');
  });
  it('points results at 1-based regions under %SRCROOT% (SARIF 2.1.0 §3.30 region)', () => {
    const [first] = log.runs[0].results ?? [];
    expect(first.ruleId).toBe('out-of-tolerance');
    expect(first.ruleIndex).toBe(1);
    const loc = first.locations?.[0].physicalLocation;
    expect(loc?.artifactLocation?.uri).toBe('rig/tones.wave.yaml');
    expect(loc?.region).toEqual({ startLine: 4, startColumn: 3, endLine: 4, endColumn: 9 });
  });
});
