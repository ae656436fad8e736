// analyze() end to end on the good fixture pair and on inputs built here. Achieved frequencies
// are checked with f_out = f_sys·M/(D·N) (docs/DESIGN.md "Quantities"; the definition of a
// divided sample clock) computed by fraction.js, a general-purpose exact rational library.
import Fraction from 'fraction.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { MAX_OUTPUTS, analyze } from '../../../server/src/spec/analyze';
import { MAX_FILE_CHARS } from '../../../server/src/spec/source';
import { rat } from '../../../shared-schema/src/rational';
import { FIXTURES, diskHost } from './fixture-host';

const GOOD = join(FIXTURES, 'good');
const wavePath = join(GOOD, 'good.wave.yaml');
const clockPath = join(GOOD, 'bench.clock.yaml');
const waveText = readFileSync(wavePath, 'utf8');
const clockText = readFileSync(clockPath, 'utf8');

describe('the good pair', () => {
  const a = analyze(wavePath, waveText, diskHost);

  it('has no diagnostics and plans every output in file order', () => {
    expect(a.diagnostics).toEqual([]);
    expect(a.kind).toBe('wave');
    expect(a.clockPath).toBe(clockPath);
    expect(a.outputs.map((o) => o.name)).toEqual(['probe-drive', 'marker', 'ramp', 'pinned-tone']);
  });

  it('every plan meets f_out = f_sys·M/(D·N) exactly (fraction.js oracle)', () => {
    for (const o of a.outputs) {
      const p = o.planning.plan!;
      const d = new Fraction(p.dividerInteger).add(new Fraction(p.dividerFraction, 2 ** p.fractionBits));
      const f = new Fraction(125_000_000).mul(new Fraction(p.cycles.num, p.cycles.den)).div(d.mul(p.tableLength));
      expect(`${p.achievedHz.num}/${p.achievedHz.den}`, o.name).toBe(`${f.n}/${f.d}`);
    }
  });

  it('the pinned plan is checked as written: 125 MHz / 100 / 1000 × 1 = 1.25 kHz (derived)', () => {
    const pinned = a.outputs.find((o) => o.name === 'pinned-tone')!;
    expect(pinned.planning.verdict).toBe('pinned');
    expect(pinned.planning.plan?.achievedHz).toEqual(rat(1250n));
  });

  it('tolerances resolve to hertz exactly: 0.01 % of 3.90625 kHz = 0.390625 Hz; default 50 ppm of 1 kHz = 0.05 Hz (derived)', () => {
    expect(a.outputs.find((o) => o.name === 'ramp')!.request.toleranceHz).toEqual(rat(390625n, 1_000_000n));
    expect(a.outputs.find((o) => o.name === 'marker')!.request.toleranceHz).toEqual(rat(1n, 20n));
  });

  it('amplitude defaults to full scale less one LSB (codes 0 … 2^12 − 1), offset to half of it; duty 25 % is 0.25', () => {
    const marker = a.outputs.find((o) => o.name === 'marker')!.request.waveform;
    // derived: 3.3 V · 4095/4096 = 3.299194335937… V; half of it 1.649597167968… V.
    expect(marker).toMatchObject({ shape: 'square', duty: 0.25 });
    expect(marker.amplitudeVpp).toBeCloseTo((3.3 * 4095) / 4096, 12);
    expect(marker.offsetV).toBeCloseTo((3.3 * 4095) / 8192, 12);
    expect(a.outputs.find((o) => o.name === 'ramp')!.request.waveform.amplitudeVpp).toBe(3);
  });

  it('square and sawtooth keep whole samples per cycle by default, a sine does not', () => {
    const whole = Object.fromEntries(a.outputs.map((o) => [o.name, o.request.wholeSamplesPerCycle]));
    expect(whole).toEqual({ 'probe-drive': false, marker: true, ramp: true, 'pinned-tone': false });
    for (const o of a.outputs.filter((x) => x.request.wholeSamplesPerCycle && x.planning.plan)) {
      expect(o.planning.plan!.tableLength % Number(o.planning.plan!.cycles.num)).toBe(0);
    }
  });

  it('min samples per cycle default by shape (sine 8, square 16, sawtooth 32)', () => {
    const floors = Object.fromEntries(a.outputs.map((o) => [o.name, Number(o.request.minSamplesPerCycle.num)]));
    expect(floors).toEqual({ 'probe-drive': 8, marker: 16, ramp: 32, 'pinned-tone': 8 });
  });

  it('memory totals add up the tables: N × sample bytes each (derived)', () => {
    const sum = a.outputs.reduce((s, o) => s + o.planning.plan!.tableLength * 2, 0);
    expect(a.memory).toEqual({ usedBytes: sum, budgetBytes: 65536 });
  });

  it('ranges: name, entry and each value', () => {
    const tone = a.outputs.find((o) => o.name === 'probe-drive')!;
    const lines = waveText.split('\n');
    const at = (r: { start: { line: number; character: number }; end: { line: number; character: number } }) =>
      lines[r.start.line].slice(r.start.character, r.end.character);
    expect(at(tone.nameRange)).toBe('probe-drive');
    expect(at(tone.valueRanges.frequency)).toBe('100 kHz');
    expect(at(tone.valueRanges.offset)).toBe('1.65 V');
    const pinned = a.outputs.find((o) => o.name === 'pinned-tone')!;
    expect(at(pinned.valueRanges['plan.divider'])).toBe('100');
    expect(tone.entryRange.start).toEqual(tone.nameRange.start);
    expect(tone.entryRange.end.line).toBe(tone.nameRange.start.line + 5);
  });

  it('the clock file alone analyses to its hardware, exactly', () => {
    const c = analyze(clockPath, clockText, diskHost);
    expect(c.kind).toBe('clock');
    expect(c.diagnostics).toEqual([]);
    expect(c.hardware?.systemClockHz).toEqual(rat(125_000_000n));
    expect(c.hardware?.dac.maxSampleRateHz).toEqual(rat(12_500_000n));
    expect(c.hardware?.memory.budgetBytes).toBe(65536);
    expect(c.hardware?.divider).toEqual({ integerMin: 1, integerMax: 65535, fractionBits: 8 });
  });
});

describe('cross-file resolution', () => {
  it('an unsaved clock buffer from the host wins over the disk', () => {
    const host = { readFile: (p: string) => (p === clockPath ? clockText.replace('system-clock: 125 MHz', 'system-clock: 100 MHz') : diskHost.readFile(p)) };
    const a = analyze(wavePath, waveText, host);
    expect(a.hardware?.systemClockHz).toEqual(rat(100_000_000n));
  });
  it('a host that throws is treated as an unreadable clock, not a crash', () => {
    const a = analyze(wavePath, waveText, { readFile: () => { throw new Error('EACCES'); } });
    expect(a.diagnostics.map((d) => d.code)).toEqual(['clock-unreadable']);
  });
  it('a plain number keeps its digits: system-clock 125000000.5 is exact, not a double', () => {
    const host = { readFile: (p: string) => (p === clockPath ? clockText.replace('system-clock: 125 MHz', 'system-clock: 125000000.5') : undefined) };
    expect(analyze(wavePath, waveText, host).hardware?.systemClockHz).toEqual(rat(250_000_001n, 2n));
  });
});

describe('inputs built here', () => {
  const wave = (body: string) => analyze(join(GOOD, 'built.wave.yaml'), `clock: ./bench.clock.yaml\n${body}`, diskHost);

  it('a file over the limit (256 KiB of text) gives one file-too-large diagnostic and is not parsed', () => {
    const big = `clock: ./bench.clock.yaml\n# ${'x'.repeat(1024 * 1024)}\n`;
    const a = analyze(join(GOOD, 'big.wave.yaml'), big, diskHost);
    expect(a.diagnostics.map((d) => [d.code, d.severity])).toEqual([['file-too-large', 'error']]);
    expect(a.diagnostics[0].range).toEqual({ start: { line: 0, character: 0 }, end: { line: 0, character: 0 } });
    expect(MAX_FILE_CHARS).toBe(256 * 1024);
    expect(a.diagnostics[0].message).toMatch(/^The file is 1\.0 MiB \(\d+ bytes\), more than a spec can be \(waveplan reads at most 256 KiB of text\)/);
  });

  it('a file just under the limit is read in bounded time', () => {
    const entry = (i: number) => `  o${i}:\n    shape: sine\n    frequency: ${i + 1} Hz\n    plan: { divider: 100, table-length: 1000, cycles: 1 }\n`;
    let text = 'clock: ./bench.clock.yaml\noutputs:\n';
    for (let i = 0; text.length < MAX_FILE_CHARS - 200; i++) text += entry(i);
    const t0 = performance.now();
    const a = analyze(join(GOOD, 'near.wave.yaml'), text, diskHost);
    expect(a.diagnostics.some((d) => d.code === 'too-many-outputs')).toBe(true);
    // Generous: the parse is about a second per megabyte on a loaded machine.
    expect(performance.now() - t0).toBeLessThan(30_000);
  }, 60_000);

  it(`more than ${MAX_OUTPUTS} outputs: too-many-outputs on \`outputs\`, the first ${MAX_OUTPUTS} planned`, () => {
    const entries = Array.from({ length: MAX_OUTPUTS + 1 }, (_, i) => `  t${i}: { shape: sine, frequency: 1.25 kHz, plan: { divider: 100, table-length: 1000, cycles: 1 } }`);
    const a = wave(`outputs:\n${entries.join('\n')}\n`);
    const codes = a.diagnostics.filter((d) => d.code === 'too-many-outputs');
    expect(codes).toHaveLength(1);
    expect(codes[0].range).toEqual({ start: { line: 1, character: 0 }, end: { line: 1, character: 7 } });
    expect(a.outputs).toHaveLength(MAX_OUTPUTS);
  }, 60_000);

  it('an alias bomb stops with too-complex (the YAML 1.2 billion-laughs pattern)', () => {
    const lines = ['a: &a ["x","x","x","x","x","x","x","x","x"]'];
    for (const [p, q] of [['b', 'a'], ['c', 'b'], ['d', 'c'], ['e', 'd'], ['f', 'e']]) lines.push(`${p}: &${p} [${Array(9).fill(`*${q}`).join(',')}]`);
    const a = wave(lines.join('\n') + '\n');
    expect(a.diagnostics.map((d) => d.code)).toEqual(['too-complex']);
  });

  it('block nesting 40 levels deep stops with too-complex', () => {
    let text = '';
    for (let i = 0; i < 40; i++) text += `${' '.repeat(i)}k:\n`;
    expect(wave(text).diagnostics.map((d) => d.code)).toEqual(['too-complex']);
  });

  it('columns count UTF-16 code units (LSP 3.17 default position encoding)', () => {
    const a = wave('outputs:\n  tone: { description: "🎵🎵", shape: sinus, frequency: 1 kHz }\n');
    const d = a.diagnostics.find((x) => x.code === 'bad-choice')!;
    const line = '  tone: { description: "🎵🎵", shape: sinus, frequency: 1 kHz }';
    expect(d.range.start).toEqual({ line: 2, character: line.indexOf('sinus') });
    // Two emoji outside the Basic Multilingual Plane: 2 code points, 4 UTF-16 units.
    expect(line.indexOf('sinus') - [...line.slice(0, line.indexOf('sinus'))].length).toBe(2);
  });

  it('an empty file and a file that is only a scalar say what is missing', () => {
    expect(analyze(join(GOOD, 'e.wave.yaml'), '', diskHost).diagnostics.map((d) => d.code)).toEqual(['wrong-type']);
    expect(analyze(join(GOOD, 'e.clock.yaml'), 'hello\n', diskHost).diagnostics.map((d) => d.code)).toEqual(['wrong-type']);
  });

  it('a missing root key names itself on the first line', () => {
    const a = analyze(join(GOOD, 'm.wave.yaml'), '# no clock here\noutputs: {}\n', diskHost);
    expect(a.diagnostics.map((d) => [d.code, d.message])).toEqual([['missing-key', 'The file has no `clock`: add `clock: ./bench.clock.yaml`.']]);
    expect(a.diagnostics[0].range.start.line).toBe(0);
  });

  it('one broken output does not stop the others from being planned', () => {
    const a = wave('outputs:\n  bad: { shape: sine, frequency: 1 khz }\n  fine: { shape: sine, frequency: 100 kHz }\n');
    expect(a.diagnostics.map((d) => d.code)).toEqual(['bad-unit']);
    expect(a.outputs.map((o) => o.name)).toEqual(['fine']);
  });

  it('mHz is read as millihertz: 500 mHz is 1/2 Hz', () => {
    const a = wave('outputs:\n  slow: { shape: sine, frequency: 500 mHz, tolerance: 1 % }\n');
    expect(a.outputs[0].targetHz).toEqual(rat(1n, 2n));
  });

  it('a whole number given as text is a wrong type, with its range', () => {
    const a = analyze(join(GOOD, 'w.clock.yaml'), clockText.replace('bits: 12', 'bits: "12"'), diskHost);
    expect(a.diagnostics.map((d) => d.code)).toEqual(['wrong-type']);
  });
});
