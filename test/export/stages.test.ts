// A divider of counter stages in the export: every plan names each stage's value and register
// (JSON `dividerStages`, C `<OUTPUT>_STAGE_<NAME>_VALUE` / `_REGISTER`), the values multiply to
// the divider, each register holds its value + register-offset and fits its register, and the
// frequency the registers make is the plan's — checked by a C program built against the header
// and by fraction.js (a general-purpose exact rational library) on the printed values.
import Fraction from 'fraction.js';
import * as fs from 'node:fs';
import * as path from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { compile, DEMO, run, runBinary, scratch, STRICT } from './support';

const SPEC = path.join(path.dirname(DEMO), 'tone-bench.wave.yaml');

interface Stage {
  name: string;
  value: number;
  register: number;
}
interface JsonStep {
  targetHz: number;
  dividerInteger: number;
  dividerFraction: number;
  achievedHz: number;
  achievedHzExact: string;
  errorHz: number;
  errorPpm: number;
}
interface JsonOutput {
  name: string;
  identifier: string;
  steps?: JsonStep[];
  plan: { dividerInteger: number; dividerStages?: Stage[]; tableLength: number; cycles: number; achievedHzExact: string };
}

let outputs: JsonOutput[] = [];
let printed = new Map<string, Record<string, string>>();
let demoPlans: Array<{ plan: Record<string, unknown> }> = [];

beforeAll(async () => {
  const dir = scratch('stages');
  const r = await run('export', [SPEC, '--c', dir, '--json', path.join(dir, 'plans.json')]);
  expect(r.stderr).toBe('');
  expect(r.code).toBe(0);
  outputs = JSON.parse(fs.readFileSync(path.join(dir, 'plans.json'), 'utf8')).specs[0].outputs;
  // What firmware would read: the header's macros, printed by a program built against it.
  fs.writeFileSync(
    path.join(dir, 'print.c'),
    [
      '#include <stdio.h>',
      '#include "tone_bench.h"',
      '#define PRINT(lower, UPPER) printf("name=%s d=%lu pv=%lu pr=%lu qv=%lu qr=%lu n=%lu m=%lu\\n", #lower, \\',
      '  (unsigned long)UPPER##_DIVIDER_INT, (unsigned long)UPPER##_STAGE_PRESCALER_VALUE, (unsigned long)UPPER##_STAGE_PRESCALER_REGISTER, \\',
      '  (unsigned long)UPPER##_STAGE_PERIOD_VALUE, (unsigned long)UPPER##_STAGE_PERIOD_REGISTER, (unsigned long)UPPER##_TABLE_LENGTH, (unsigned long)UPPER##_CYCLES);',
      // The stepped output's arrays, one line per step.
      'static void steps(void) { unsigned long i; for (i = 0; i < TONE_BENCH_SCALE_STEP_COUNT; i++)',
      '  printf("name=step%lu d=%lu pr=%lu qr=%lu n=%lu m=%lu\\n", i, (unsigned long)tone_bench_scale_step_divider_int[i],',
      '    (unsigned long)tone_bench_scale_step_stage_prescaler_register[i], (unsigned long)tone_bench_scale_step_stage_period_register[i],',
      '    (unsigned long)TONE_BENCH_SCALE_TABLE_LENGTH, (unsigned long)TONE_BENCH_SCALE_CYCLES); }',
      'int main(void) { TONE_BENCH_OUTPUTS(PRINT) steps(); return 0; }',
      '',
    ].join('\n'),
  );
  const built = compile('gcc', ['-std=c99', ...STRICT, '-I', dir, 'print.c', 'tone_bench.c', '-o', 'print'], dir);
  expect(built.output).toBe('');
  printed = new Map(
    runBinary(path.join(dir, 'print'))
      .trim()
      .split('\n')
      .map((line) => {
        const fields = Object.fromEntries(line.split(' ').map((kv) => kv.split('=') as [string, string]));
        return [fields.name!, fields];
      }),
  );
  const demoDir = scratch('stages-demo');
  await run('export', [DEMO, '--c', demoDir, '--json', path.join(demoDir, 'plans.json'), '--force']);
  demoPlans = JSON.parse(fs.readFileSync(path.join(demoDir, 'plans.json'), 'utf8')).specs[0].outputs;
}, 60_000);

describe('stage dividers in the export (examples/tone-bench: prescaler 1…4096, period 4…32768, both register-offset -1)', () => {
  it('JSON: each plan names both stages; their product is dividerInteger; register = value - 1', () => {
    expect(outputs.length).toBeGreaterThanOrEqual(3);
    for (const o of outputs) {
      const stages = o.plan.dividerStages!;
      expect(stages.map((st) => st.name), o.name).toEqual(['prescaler', 'period']);
      expect(stages[0]!.value * stages[1]!.value, o.name).toBe(o.plan.dividerInteger);
      for (const st of stages) expect(st.register, `${o.name} ${st.name}`).toBe(st.value - 1);
    }
  });

  it('every stage value is one its register can hold: a 12-bit prescaler and a 15-bit period register', () => {
    for (const o of outputs) {
      const [pre, period] = o.plan.dividerStages!;
      expect(pre!.register).toBeGreaterThanOrEqual(0);
      expect(pre!.register).toBeLessThan(2 ** 12);
      expect(period!.register).toBeGreaterThanOrEqual(3);
      expect(period!.register).toBeLessThan(2 ** 15);
    }
  });

  it('the header carries the same values and registers, and the registers make the plan’s frequency (fraction.js)', () => {
    for (const o of outputs) {
      const c = printed.get(o.identifier)!;
      const [pre, period] = o.plan.dividerStages!;
      expect([c.pv, c.pr, c.qv, c.qr].map(Number), o.name).toEqual([pre!.value, pre!.register, period!.value, period!.register]);
      // f_out = f_sys·M/(D·N) with D = (prescaler register + 1)·(period register + 1) (docs/DESIGN.md "Quantities").
      const d = (Number(c.pr) + 1) * (Number(c.qr) + 1);
      expect(d, o.name).toBe(Number(c.d));
      const f = new Fraction(60_000_000).mul(Number(c.m)).div(d * Number(c.n));
      expect(f.equals(new Fraction(o.plan.achievedHzExact)), o.name).toBe(true);
    }
  });

  it('a stepped output: the arrays hold each step’s divider and registers, which make the step’s frequency (fraction.js)', () => {
    const scale = outputs.find((o) => o.name === 'scale')!;
    const steps = scale.steps!;
    expect(steps).toHaveLength(13);
    for (const [i, st] of steps.entries()) {
      for (const key of ['targetHz', 'dividerInteger', 'dividerFraction', 'achievedHz', 'errorHz', 'errorPpm'] as const) expect(typeof st[key], `${i} ${key}`).toBe('number');
      const c = printed.get(`step${i}`)!;
      const d = (Number(c.pr) + 1) * (Number(c.qr) + 1);
      expect(d, `step ${i}`).toBe(Number(c.d));
      expect(d, `step ${i}`).toBe(st.dividerInteger);
      // f_out = f_sys·M/(D·N) on the one shared table (docs/DESIGN.md "Quantities").
      const f = new Fraction(60_000_000).mul(Number(c.m)).div(d * Number(c.n));
      expect(f.equals(new Fraction(st.achievedHzExact)), `step ${i}`).toBe(true);
      expect(Number(c.n)).toBe(scale.plan.tableLength);
    }
  });

  it('the integer-plus-fraction form has no dividerStages (examples/bench-rig)', () => {
    expect(demoPlans.length).toBeGreaterThan(0);
    for (const o of demoPlans) expect(o.plan).not.toHaveProperty('dividerStages');
  });
});
