// Replays the exported tables in a host C program (replay.c) through a system-clock model of
// the divider and compares what it measures with the plans: the output frequency (rising
// crossings of the mid level over thousands of cycles, counted in system clocks) against the
// achieved frequency, within the output's tolerance; the cycles per pass against M; the wrap
// step against the seam check; the bytes in the binary against the JSON export.
import * as fs from 'node:fs';
import * as path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { compile, DEMO, FIXTURES, REPO, run, runBinary, scratch, STRICT } from './support';

interface Measured {
  name: string;
  hz: number;
  crossings: number;
  passes: number;
  wrap: number;
  sum: number;
  n: number;
  misalign?: number;
}

interface JsonOutput {
  name: string;
  identifier: string;
  shape: 'sine' | 'square' | 'triangle' | 'sawtooth';
  waveform: { duty: number; amplitudeVpp: number; offsetV: number };
  toleranceHz: number;
  tableSpan: 'open' | 'closed';
  plan: { achievedHz: number; cycles: number; tableLength: number; seamOk: boolean; seamJumpLsb: number; jitterFree: boolean };
  table: number[];
  phase?: { rotation: number; sharesTableOf: string | null };
}

function parseReplay(text: string): Map<string, Measured> {
  const out = new Map<string, Measured>();
  for (const line of text.trim().split('\n')) {
    const fields = Object.fromEntries(line.split(' ').map((kv) => kv.split('=') as [string, string]));
    if (fields.error) throw new Error(`replay failed: ${line}`);
    const m = out.get(fields.name) ?? ({ name: fields.name } as Measured);
    if ('misalign' in fields) m.misalign = Number(fields.misalign);
    else Object.assign(m, { hz: Number(fields.hz), crossings: Number(fields.crossings), passes: Number(fields.passes), wrap: Number(fields.wrap), sum: Number(fields.sum), n: Number(fields.n) });
    out.set(fields.name, m);
  }
  return out;
}

// The stage-divider demo replays at the divider its registers make: (prescaler register + 1) ·
// (period register + 1), as examples/tone-bench.clock.yaml describes its timer.
const STAGE_DIVIDER = '-DWAVEPLAN_DIVIDER(U)=((U##_STAGE_PRESCALER_REGISTER + 1ul) * (U##_STAGE_PERIOD_REGISTER + 1ul))';
const cases: Array<[string, string, string[], boolean, string[]?]> = [
  ['tone-lab fixture', path.join(FIXTURES, 'tone-lab.wave.yaml'), [], true],
  ['demo (examples/)', DEMO, ['--force'], false],
  ['stage-divider demo (examples/tone-bench)', path.join(REPO, 'examples/tone-bench.wave.yaml'), [], false, [STAGE_DIVIDER]],
];
const results = new Map<string, { outputs: JsonOutput[]; measured: Map<string, Measured>; dacBits: number; fullScaleV: number }>();
const agreementPpm: string[] = [];

beforeAll(async () => {
  for (const [name, spec, extra, ring, defines = []] of cases) {
    const dir = scratch('replay');
    const r = await run('export', [spec, '--c', dir, '--json', path.join(dir, 'plans.json'), ...extra]);
    expect(r.code, r.stderr).toBeLessThan(2);
    const header = fs.readdirSync(dir).find((f) => f.endsWith('.h'))!;
    const upper = header.slice(0, -2).toUpperCase();
    const built = compile(
      'gcc',
      [
        '-std=c99', ...STRICT, '-O2', '-DWAVEPLAN_ALLOW_UNCHECKED', ...(ring ? ['-DWAVEPLAN_RING'] : []), ...defines,
        `-DWAVEPLAN_HEADER="${header}"`, `-DWAVEPLAN_OUTPUTS=${upper}_OUTPUTS`, `-DWAVEPLAN_CLOCK_HZ=${upper}_SYSTEM_CLOCK_HZ`,
        '-I', dir, path.join(REPO, 'test/export/replay.c'), path.join(dir, `${header.slice(0, -2)}.c`), '-o', path.join(dir, 'replay'),
      ],
      dir,
    );
    expect(built.output).toBe('');
    const plans = JSON.parse(fs.readFileSync(path.join(dir, 'plans.json'), 'utf8'));
    results.set(name, { outputs: plans.specs[0].outputs, measured: parseReplay(runBinary(path.join(dir, 'replay'))), dacBits: plans.specs[0].dacBits, fullScaleV: plans.specs[0].fullScaleV });
  }
}, 120_000);

// The four shapes as docs/DESIGN.md ("Unit waveforms") defines them (phase in cycles, [0, 1)).
function unit(shape: JsonOutput['shape'], phase: number, duty: number): number {
  if (shape === 'sine') return Math.sin(2 * Math.PI * phase);
  if (shape === 'square') return phase < duty ? 1 : -1;
  if (shape === 'triangle') return phase < 0.5 ? -1 + 4 * phase : 3 - 4 * phase;
  return -1 + 2 * phase;
}

describe.each(cases.map(([name]) => name))('%s', (name) => {
  it('every output is measured', () => {
    const { outputs, measured } = results.get(name)!;
    expect(outputs.length).toBeGreaterThan(0);
    for (const o of outputs) expect(measured.has(o.identifier), o.name).toBe(true);
  });

  it('measured frequency = achieved frequency within the tolerance (f_out = f_s·M/N, docs/DESIGN.md)', () => {
    const { outputs, measured } = results.get(name)!;
    for (const o of outputs) {
      const m = measured.get(o.identifier)!;
      const ppm = ((m.hz - o.plan.achievedHz) / o.plan.achievedHz) * 1e6;
      agreementPpm.push(`${name} ${o.name}: ${ppm.toExponential(2)} ppm`);
      expect(Math.abs(m.hz - o.plan.achievedHz), o.name).toBeLessThanOrEqual(o.toleranceHz);
      // Whole passes over whole divider patterns are exact clock counts: agreement to float precision.
      if (Number.isInteger(o.plan.cycles)) expect(Math.abs(ppm), o.name).toBeLessThan(1e-6);
    }
  });

  it('each pass of the table holds M cycles (crossings per pass)', () => {
    const { outputs, measured } = results.get(name)!;
    for (const o of outputs) {
      const m = measured.get(o.identifier)!;
      if (Number.isInteger(o.plan.cycles)) expect(m.crossings, o.name).toBe(o.plan.cycles * m.passes);
    }
  });

  it('the binary holds the JSON export’s tables', () => {
    const { outputs, measured } = results.get(name)!;
    for (const o of outputs) {
      const m = measured.get(o.identifier)!;
      expect(m.n).toBe(o.table.length);
      expect(m.sum).toBe(o.table.reduce((a, b) => a + b, 0));
    }
  });

  it('the wrap step matches the seam check (jump = |wrap step − the waveform’s own step|, derived)', () => {
    const { outputs, measured, dacBits, fullScaleV } = results.get(name)!;
    for (const o of outputs) {
      const m = measured.get(o.identifier)!;
      const n = o.table.length;
      const last = o.table[n - 1];
      // The sample a continuous phase would play after the last one, from the shape definitions.
      const intervals = o.tableSpan === 'closed' ? n - 1 : n;
      // A phase-locked member's table is rotated: sample i holds phase M·(i + k)/N (derived).
      const shift = o.phase && o.phase.sharesTableOf === null ? o.phase.rotation : 0;
      const phase = ((o.plan.cycles * (n + shift)) / intervals) % 1;
      const top = 2 ** dacBits - 1;
      const { amplitudeVpp, offsetV, duty } = o.waveform;
      const next = Math.min(top, Math.max(0, Math.round((offsetV + (amplitudeVpp / 2) * unit(o.shape, phase, duty)) / (fullScaleV / 2 ** dacBits))));
      const jump = Math.abs(m.wrap - (next - last));
      expect(jump, o.name).toBeCloseTo(o.plan.seamJumpLsb, 6);
      expect(o.plan.seamOk, o.name).toBe(jump <= 1);
    }
  });
});

it('DMA ring tables sit on a multiple of their size in the linked binary', () => {
  const { outputs, measured } = results.get('tone-lab fixture')!;
  for (const o of outputs) expect(measured.get(o.identifier)!.misalign, o.name).toBe(0);
  console.log(`replay agreement with the achieved frequency:\n  ${agreementPpm.join('\n  ')}`);
});
