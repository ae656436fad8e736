// Outputs with frequency steps in the wave file: how they read, what the checker says about each
// step, and how the hover, the annotation and the JSON show them. The demo's equal-tempered octave
// is checked against its published formula, f = 440 Hz · 2^(n/12) (twelve-tone equal temperament
// with A4 = 440 Hz, the concert pitch of ISO 16).

import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parse } from 'yaml';
import { analyze } from '../../../server/src/spec/analyze';
import type { SpecHost } from '../../../server/src/spec/types';
import { hintText } from '../../../server/src/lsp/inlay-hints';
import { outputCard } from '../../../server/src/lsp/plan-card';
import { stepsHint } from '../../../server/src/lsp/divider-views';
import { stepsJson } from '../../../server/src/cli/format-json';
import { parseDecimal, rat, toNumber } from '../../../shared-schema/src/rational';

const CLOCK = [
  'system-clock: 60 MHz',
  'divider: { integer: { min: 1, max: 65535 }, fraction-bits: 4 }',
  'dac: { bits: 12, sample-bytes: 2, full-scale: 3.3 V, max-sample-rate: 1 MHz }',
  'memory: { budget: 32 KiB, table-length: { min: 16, max: 4096 } }',
  '',
].join('\n');
const host: SpecHost = { readFile: (p) => (p === '/rig/board.clock.yaml' ? CLOCK : undefined) };
const wave = (output: string) => analyze('/rig/tones.wave.yaml', `clock: ./board.clock.yaml\noutputs:\n${output}`, host);

describe('steps in the wave file', () => {
  const a = wave('  tones:\n    shape: sine\n    tolerance: 100 ppm\n    steps:\n      - { frequency: 1 kHz }\n      - { frequency: 1.5 kHz, tolerance: 1 % }\n      - { frequency: 2 kHz }\n');
  const o = a.outputs[0]!;

  it('read exactly, each step with its own tolerance or the output’s (derived: 100 ppm of 1 kHz is 0.1 Hz, 1 % of 1.5 kHz is 15 Hz)', () => {
    expect(a.diagnostics).toEqual([]);
    expect(o.request.steps).toEqual([
      { targetHz: rat(1000), toleranceHz: rat(1, 10) },
      { targetHz: rat(1500), toleranceHz: rat(15) },
      { targetHz: rat(2000), toleranceHz: rat(1, 5) },
    ]);
    expect(o.targetHz).toEqual(rat(1000));
  });

  it('plan one table for every step: each step’s plan has the same N and M, f = f_sys·M/(D·N) (derived)', () => {
    const steps = o.planning.steps!;
    expect(steps).toHaveLength(3);
    expect(o.planning.plan).toBe(steps[0]);
    for (const p of steps) {
      expect(p.tableLength).toBe(steps[0]!.tableLength);
      expect(p.cycles).toEqual(steps[0]!.cycles);
      const d = p.dividerInteger + p.dividerFraction / 2 ** p.fractionBits;
      expect(toNumber(p.achievedHz)).toBeCloseTo((60e6 * Number(p.cycles.num)) / (d * p.tableLength), 6);
    }
    // 1, 1.5 and 2 kHz share 60 MHz / (D·S) exactly when D·S is 60 000, 40 000 and 30 000: exact.
    expect(o.planning.verdict).toBe('exact');
    expect(steps.map((p) => p.errorHz.num)).toEqual([0n, 0n, 0n]);
  });

  it('show the step table in the hover and the step count in the annotation', () => {
    const card = outputCard(o);
    expect(card).toContain('3 frequency steps on this one table');
    expect(card).toContain('| 2 | 1.5 kHz | 1.5 kHz | 0 ppm |');
    expect(stepsHint(o)).toBe(' · 3 steps, worst 0 ppm');
    expect(hintText(o.planning.plan!)).toContain('1 kHz');
  });

  it('give the JSON steps beside the plan, with the fields the format documents', () => {
    const json = stepsJson(o);
    expect(json.map((s) => s.targetHz)).toEqual([1000, 1500, 2000]);
    for (const s of json) for (const key of ['targetHz', 'dividerInteger', 'dividerFraction', 'achievedHz', 'errorHz', 'errorPpm']) expect(s).toHaveProperty(key);
  });
});

describe('what the checker says about steps', () => {
  it('a step that misses its tolerance is an error on that step, naming it', () => {
    // 1 kHz and 1.0001 kHz within 1 ppb each need D·S = 60 000 and 59 994.0006: no whole divider, no table.
    const a = wave('  tones:\n    shape: sine\n    tolerance: 1 ppb\n    steps:\n      - { frequency: 1 kHz }\n      - { frequency: 1.0001 kHz }\n');
    const errors = a.diagnostics.filter((d) => d.code === 'out-of-tolerance');
    expect(errors.length).toBeGreaterThanOrEqual(1);
    expect(errors.every((d) => /^Step \d of 2/.test(d.message))).toBe(true);
    expect(errors.some((d) => d.range.start.line === 6)).toBe(true);
  });

  it('with jitter allowed a fractional divider serves a step no whole one can, with a warning on that step', () => {
    const a = wave('  tones:\n    shape: sine\n    tolerance: 2 ppm\n    jitter: allow\n    steps:\n      - { frequency: 1 kHz }\n      - { frequency: 1.0001 kHz }\n');
    const o = a.outputs[0]!;
    expect(o.planning.withinTolerance).toBe(true);
    expect(o.planning.verdict).toBe('fractional');
    const warnings = a.diagnostics.filter((d) => d.code === 'fractional-plan');
    expect(warnings.length).toBeGreaterThanOrEqual(1);
    expect(warnings.every((d) => /step \d/.test(d.message))).toBe(true);
  });

  it.each([
    ['frequency beside steps', '    frequency: 1 kHz\n    steps:\n      - { frequency: 2 kHz }\n', 'unused-key', 'warning'],
    ['neither frequency nor steps', '    tolerance: 1 %\n', 'missing-key', 'error'],
    ['a step in the wrong unit', '    steps:\n      - { frequency: 2 kV }\n', 'bad-unit', 'error'],
    ['a pinned plan beside steps', '    plan: { divider: 60, table-length: 1000, cycles: 1 }\n    steps:\n      - { frequency: 1 kHz }\n', 'unused-key', 'warning'],
  ])('%s gets %s', (_, body, code, severity) => {
    const a = wave(`  tones:\n    shape: sine\n${body}`);
    expect(a.diagnostics.map((d) => `${d.code} ${d.severity}`)).toContain(`${code} ${severity}`);
  });
});

describe('the demo’s equal-tempered octave (examples/tone-bench.wave.yaml)', () => {
  const path = join(__dirname, '..', '..', '..', 'examples', 'tone-bench.wave.yaml');
  const text = readFileSync(path, 'utf8');
  const steps = (parse(text).outputs.scale.steps as Array<{ frequency: string }>).map((s) => parseDecimal(s.frequency.replace(/ Hz$/, ''))!);

  it('writes 440 Hz · 2^(n/12), n = 0 … 12, to within 2 ppb (the published formula; the values are irrational but for n = 0 and 12)', () => {
    expect(steps).toHaveLength(13);
    steps.forEach((f, n) => expect(Math.abs(toNumber(f) / (440 * 2 ** (n / 12)) - 1), `n = ${n}`).toBeLessThan(2e-9));
  });

  it('plans every note within its 20 ppm on one table, each step’s divider writable to the two timer registers', () => {
    const a = analyze(path, text, { readFile: (p) => { try { return readFileSync(p, 'utf8'); } catch { return undefined; } } });
    const scale = a.outputs.find((o) => o.name === 'scale')!;
    expect(a.diagnostics.filter((d) => d.output === 'scale')).toEqual([]);
    expect(scale.planning.withinTolerance).toBe(true);
    for (const p of scale.planning.steps!) {
      expect(Math.abs(p.errorPpm)).toBeLessThanOrEqual(20);
      const [pre, period] = p.dividerStages!;
      expect(pre!.value * period!.value).toBe(p.dividerInteger);
      expect(period!.register).toBeLessThan(2 ** 15);
    }
  });
});
