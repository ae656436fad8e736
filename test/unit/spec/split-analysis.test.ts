// A wave spec read output by output (wave-fast.ts, memoised per output) must give exactly the
// analysis of reading it whole. The oracle for every check below is `analyzeWhole`, the reading the
// fixture and golden tests pin; positions are also checked against the `yaml` library's own
// LineCounter (a general-purpose parser used as an oracle). Specs here are an invented bench.
// While the file is not valid YAML the split reads on where the whole cannot: then it must still
// report a syntax error, and every output whose text the edit left alone must keep the analysis
// it had before the edit (moved by the lines the edit added or removed).
import { readFileSync, readdirSync } from 'node:fs';
import { join } from 'node:path';
import { LineCounter, parseDocument } from 'yaml';
import { describe, expect, it } from 'vitest';
import { analyze, analyzeWhole } from '../../../server/src/spec/analyze';
import type { Analysis, SpecHost } from '../../../server/src/spec/types';
import { splitWave } from '../../../server/src/spec/segments';
import { analyzeWaveFast } from '../../../server/src/spec/wave-fast';
import { seededRandom } from '../../support/seeded';
import { FIXTURES, diskHost } from './fixture-host';

const CLOCK = `# an invented signal board
system-clock: 120 MHz
divider: { integer: { min: 2, max: 4095 }, fraction-bits: 4 }
dac: { bits: 10, sample-bytes: 2, full-scale: 2.5 V, max-sample-rate: 20 MHz }
memory: { budget: 8 MiB, table-length: { min: 16, max: 16384 } }
`;
const SHAPES = ['sine', 'square', 'triangle', 'sawtooth'];
const WAVE = '/bench/rig.wave.yaml';

/** An invented bench with `count` outputs at seeded frequencies from 100 Hz to 1 MHz. */
function bigSpec(count: number): string {
  const random = seededRandom(1);
  const lines = ['# invented test bench', 'clock: ./rig.clock.yaml', 'outputs:'];
  for (let i = 0; i < count; i++) {
    const hz = 10 ** (2 + random() * 4);
    lines.push(`  out-${String(i).padStart(3, '0')}:`, `    shape: ${SHAPES[i % 4]}`, `    frequency: ${hz.toFixed(3)} Hz`, '    tolerance: 50 ppm');
  }
  return lines.join('\n') + '\n';
}

const hostWith = (clock: string): SpecHost => ({ readFile: (p) => (p.endsWith('rig.clock.yaml') ? clock : undefined) });
const host = hostWith(CLOCK);

/** True when the split reading analyses the text rather than declining (the clock is not read). */
function splitTaken(path: string, text: string): boolean {
  const a: Analysis = { path, kind: 'wave', text, diagnostics: [], outputs: [], hardware: null, clockPath: null, memory: null };
  return analyzeWaveFast(a, { maxOutputs: 500, resolveClock: () => null, overBudget: () => undefined });
}

const byOutput = (a: Analysis, name: string) => ({
  output: a.outputs.find((o) => o.name === name),
  diagnostics: a.diagnostics.filter((d) => d.output === name),
});

const moved = <T>(value: T, lines: number): T =>
  JSON.parse(JSON.stringify(value, (k, v) => (k === 'line' && typeof v === 'number' ? v + lines : typeof v === 'bigint' ? `${v}n` : v)));

/**
 * The split reading of `text` equals the whole reading, or (when the text is not valid YAML) it
 * has a syntax error and each output whose piece is the same as in `base` kept its analysis.
 * Returns which of the two held.
 */
function agrees(path: string, text: string, h: SpecHost, base?: string): 'same' | 'tolerant' {
  const whole = analyzeWhole(path, text, h);
  const split = analyze(path, text, h);
  if (!whole.diagnostics.some((d) => d.code === 'yaml-syntax')) {
    expect(split, `${path}\n${text}`).toStrictEqual(whole);
    return 'same';
  }
  expect(split.diagnostics.some((d) => d.code === 'yaml-syntax'), text).toBe(true);
  if (base === undefined) return 'tolerant';
  const before = analyze(path, base, h);
  const [segBefore, segAfter] = [splitWave(base, 500), splitWave(text, 500)];
  if (!segBefore || !segAfter || !split.hardware || split.hardware !== before.hardware) return 'tolerant';
  for (const piece of segAfter.pieces) {
    const old = segBefore.pieces.find((p) => p.keyed && p.name === piece.name && p.text === piece.text && p.follower === piece.follower);
    if (!piece.keyed || !old) continue;
    // A plan fitted to the board's budget, or planned with its group, depends on other outputs and
    // keys, which the edit may have broken.
    if (byOutput(before, piece.name).diagnostics.some((d) => d.code === 'fitted-to-budget')) continue;
    if (before.groups?.some((g) => g.members.includes(piece.name))) continue;
    const shift = piece.line - old.line;
    expect(moved(byOutput(before, piece.name), shift), `${piece.name} in\n${text}`).toStrictEqual(moved(byOutput(split, piece.name), 0));
  }
  return 'tolerant';
}

describe('reading a wave spec output by output', () => {
  const text = bigSpec(200);

  it('a 200-output spec analysed twice gives deep-equal results, equal to reading it whole (oracle: analyzeWhole)', () => {
    expect(splitTaken(WAVE, text)).toBe(true);
    const first = analyze(WAVE, text, host);
    const second = analyze(WAVE, text, host);
    expect(second).toStrictEqual(first);
    expect(first).toStrictEqual(analyzeWhole(WAVE, text, host));
    expect(first.outputs).toHaveLength(200);
  });

  it('an edit to one output changes only that output (oracle: analyzeWhole)', () => {
    const before = analyze(WAVE, text, host);
    const edited = text.replace(/(  out-100:\n    shape: \w+\n    frequency: )[0-9.]+ Hz/, '$11234.5 Hz');
    expect(edited).not.toBe(text);
    const after = analyze(WAVE, edited, host);
    expect(after).toStrictEqual(analyzeWhole(WAVE, edited, host));
    // 1234.5 Hz is 2469/2 exactly (derived).
    expect(byOutput(after, 'out-100').output?.targetHz).toStrictEqual({ num: 2469n, den: 2n });
    expect(byOutput(after, 'out-100')).not.toStrictEqual(byOutput(before, 'out-100'));
    for (const o of before.outputs.filter((o) => o.name !== 'out-100')) expect(byOutput(after, o.name)).toStrictEqual(byOutput(before, o.name));
    expect(after.diagnostics.filter((d) => !d.output)).toStrictEqual(before.diagnostics.filter((d) => !d.output));
    // The memory total moves by exactly the edited output's table (derived: a sum over outputs).
    const bytes = (a: Analysis) => byOutput(a, 'out-100').output?.planning.plan?.tableBytes ?? 0;
    expect(after.memory!.usedBytes - before.memory!.usedBytes).toBe(bytes(after) - bytes(before));
  });

  it("a line added inside one output moves the later outputs down one line, at the yaml library's own positions (oracle: yaml LineCounter)", () => {
    const edited = text.replace('  out-050:\n', '  out-050:\n    # a note on this output\n');
    const before = analyze(WAVE, text, host);
    const after = analyze(WAVE, edited, host);
    expect(after).toStrictEqual(analyzeWhole(WAVE, edited, host));
    const counter = new LineCounter();
    const doc = parseDocument(edited, { lineCounter: counter });
    for (const [i, o] of after.outputs.entries()) {
      const shift = i > 50 ? 1 : 0;
      expect(o.nameRange.start.line).toBe(before.outputs[i].nameRange.start.line + shift);
      const key = doc.getIn(['outputs'], true) as { items: { key: { range: [number, number, number] } }[] };
      const pos = counter.linePos(key.items[i].key.range[0]);
      // LineCounter counts from 1, LSP positions from 0.
      expect(o.nameRange.start).toStrictEqual({ line: pos.line - 1, character: pos.col - 1 });
    }
  });

  it('a new clock file text re-plans every output on the new hardware (oracle: analyzeWhole)', () => {
    const slower = hostWith(CLOCK.replace('system-clock: 120 MHz', 'system-clock: 96 MHz'));
    for (const h of [host, slower, host]) expect(analyze(WAVE, text, h)).toStrictEqual(analyzeWhole(WAVE, text, h));
    expect(analyze(WAVE, text, slower).hardware?.systemClockHz).toStrictEqual({ num: 96_000_000n, den: 1n });
  });

  it('problems from several outputs come in the order of reading the file whole (oracle: analyzeWhole)', () => {
    const t = bigSpec(3)
      .replace('  out-000:\n    shape: sine\n', '  out-000:\n    shape: sine\n    colour: red\n')
      .replace(/(  out-001:\n[^]*?tolerance: )50 ppm/, '$150 parsecs')
      .replace(/(  out-002:\n[^]*?frequency: )[0-9.]+ Hz/, '$1-3 Hz');
    expect(splitTaken(WAVE, t)).toBe(true);
    const a = analyze(WAVE, t, host);
    expect(a).toStrictEqual(analyzeWhole(WAVE, t, host));
    // Schema first, then quantities key by key: frequency (out-002) before tolerance (out-001).
    expect(a.diagnostics.slice(0, 3).map((d) => d.output)).toStrictEqual(['out-000', 'out-002', 'out-001']);
  });

  it('layouts the split does not cover are read whole with the same result (oracle: analyzeWhole)', () => {
    const small = bigSpec(3);
    const cases = [
      small.replace('    shape: sine', '\tshape: sine'),
      small.replace('  out-001:\n', '  out-001:\n    description: &note shared words\n').replace('  out-002:\n', '  out-002:\n    description: *note\n'),
      small.replace('  out-002:', '  "out-002":'),
      small.replace('  out-002:', '  out-001:'),
    ];
    for (const t of cases) {
      expect(t).not.toBe(small);
      expect(splitTaken(WAVE, t), JSON.stringify(t.slice(0, 120))).toBe(false);
      expect(analyze(WAVE, t, host)).toStrictEqual(analyzeWhole(WAVE, t, host));
    }
  });

  it('CR LF, lone CR and mixed line breaks are read output by output, as reading whole reads them (oracle: analyzeWhole)', () => {
    const small = bigSpec(6);
    const mixed = small.split('\n').map((l, i) => l + ['\r\n', '\r', '\n'][i % 3]).join('');
    for (const t of [small.replace(/\n/g, '\r\n'), small.replace(/\n/g, '\r'), mixed]) {
      expect(splitTaken(WAVE, t), JSON.stringify(t.slice(0, 80))).toBe(true);
      const a = analyze(WAVE, t, host);
      expect(a).toStrictEqual(analyzeWhole(WAVE, t, host));
      // Same outputs at the same lines as the LF file: every break counts as one line (LSP 3.17, "Position").
      expect(a.outputs.map((o) => [o.name, o.nameRange])).toStrictEqual(analyze(WAVE, small, host).outputs.map((o) => [o.name, o.nameRange]));
    }
  });

  it('a line that does not parse leaves every other output as it was, and the error where it is (oracle: the clean file)', () => {
    const small = bigSpec(5);
    const broken = small.replace('  out-002:\n', '  out-002:\n    shape sine\n');
    expect(agrees(WAVE, broken, host, small)).toBe('tolerant');
    const a = analyze(WAVE, broken, host);
    const syntax = a.diagnostics.filter((d) => d.code === 'yaml-syntax');
    const line = broken.split('\n').indexOf('    shape sine');
    expect(syntax.length).toBeGreaterThan(0);
    for (const d of syntax) expect(d.range.start.line).toBe(line);
    expect(a.outputs.map((o) => o.name)).toStrictEqual(['out-000', 'out-001', 'out-003', 'out-004']);
    // A list item among the outputs is no YAML either (a mapping and a sequence at one indentation).
    expect(agrees(WAVE, small.replace('outputs:\n', 'outputs:\n  - not-a-map\n'), host, small)).toBe('tolerant');
  });
});

describe('seeded edits give the same analysis both ways (mutation testing against analyzeWhole)', () => {
  const PIECES = ['', ' ', '\n', ':', '-', '[', ']', '{', '}', '"', "'", '#', '&a', '*a', '|', '>', '0', '1e999', 'MHz', '%', 'ppm', '\n  x:', '\n    shape: sine', '\n# c', '\n  # c', '\n\n', '\n  out-001:', 'frequency: 5 kHz', '\n  ', '\n    ', 'jitter: allow', ' # x'];
  const EXTRA = ['    description: a & b', '    plan: { divider: 10, table-length: 100, cycles: 1 }', '    tolerance: 1 %', '    shape: triangle', '    duty: 50 %', '    amplitude: 9 Vpp', '    bogus: 1', '    frequency:', '  # between outputs', '', 'description: x'];
  const specs = [
    ...readdirSync(join(FIXTURES, 'good')).map((f) => join(FIXTURES, 'good', f)),
    ...readdirSync(join(FIXTURES, 'bad')).map((f) => join(FIXTURES, 'bad', f)),
    join(__dirname, '..', '..', '..', 'examples', 'bench-rig.wave.yaml'),
  ].filter((f) => f.endsWith('.wave.yaml'));

  it('fixtures, the example and 300 seeded edits of them', () => {
    const random = seededRandom(2024);
    let split = 0;
    let total = 0;
    let tolerant = 0;
    for (const path of specs) {
      const base = readFileSync(path, 'utf8');
      for (let i = 0; i <= 300 / specs.length; i++) {
        let t = base;
        if (i > 0 && random() < 0.5) {
          const at = Math.floor(random() * (t.length + 1));
          t = t.slice(0, at) + PIECES[Math.floor(random() * PIECES.length)] + t.slice(at + Math.floor(random() * 3));
        } else if (i > 0) {
          const lines = t.split('\n');
          lines.splice(Math.floor(random() * lines.length), random() < 0.3 ? 1 : 0, EXTRA[Math.floor(random() * EXTRA.length)]);
          t = lines.join('\n');
        }
        total++;
        if (splitTaken(path, t)) split++;
        if (agrees(path, t, diskHost, base) === 'tolerant') tolerant++;
      }
    }
    // The split reading must have done the work in a good share of the cases, or this proves nothing.
    expect(split).toBeGreaterThan(total / 4);
    expect(tolerant).toBeGreaterThan(total / 20);
  }, 120_000);

  it('40 seeded edits of the 200-output spec, one after another', () => {
    const random = seededRandom(77);
    let t = bigSpec(200);
    for (let i = 0; i < 40; i++) {
      const lines = t.split('\n');
      const at = 3 + Math.floor(random() * (lines.length - 4));
      if (random() < 0.5) lines[at] = lines[at].replace(/[0-9]/, String(Math.floor(random() * 10)));
      else lines.splice(at, 0, EXTRA[Math.floor(random() * EXTRA.length)]);
      const before = t;
      t = lines.join('\n');
      agrees(WAVE, t, host, before);
    }
  }, 120_000);
});
