// Clock files whose divider is built of counter stages: what they read as, the checks that span
// their keys, and how plans on them look in the hover card and the annotation. The stage values
// are checked against the definition D = prescaler · period (the clock file's own keys) and
// register = value + register-offset.

import { describe, expect, it } from 'vitest';
import { analyze } from '../../../server/src/spec/analyze';
import type { SpecHost } from '../../../server/src/spec/types';
import { hintText } from '../../../server/src/lsp/inlay-hints';
import { outputCard } from '../../../server/src/lsp/plan-card';

const clockWith = (divider: string): string =>
  [
    'system-clock: 60 MHz',
    'divider:',
    divider,
    'dac: { bits: 12, sample-bytes: 2, full-scale: 3.3 V, max-sample-rate: 1 MHz }',
    'memory: { budget: 32 KiB, table-length: { min: 16, max: 4096 } }',
    '',
  ].join('\n');

const TIMER = clockWith('  stages:\n    prescaler: { min: 1, max: 4096, register-offset: -1 }\n    period: { min: 4, max: 32768, register-offset: -1 }');

function check(clock: string) {
  return analyze('/rig/board.clock.yaml', clock, { readFile: () => undefined });
}

function plan(clock: string, output: string) {
  const host: SpecHost = { readFile: (p) => (p === '/rig/board.clock.yaml' ? clock : undefined) };
  return analyze('/rig/tones.wave.yaml', `clock: ./board.clock.yaml\noutputs:\n${output}`, host);
}

describe('a clock file with divider stages', () => {
  it('reads as the product range with the stages in file order', () => {
    const a = check(TIMER);
    expect(a.diagnostics).toEqual([]);
    expect(a.hardware!.divider).toEqual({
      integerMin: 4,
      integerMax: 4096 * 32768,
      fractionBits: 0,
      stages: [
        { name: 'prescaler', min: 1, max: 4096, registerOffset: -1 },
        { name: 'period', min: 4, max: 32768, registerOffset: -1 },
      ],
    });
  });

  it('register-offset defaults to 0 (the register holds the value itself)', () => {
    const a = check(clockWith('  stages:\n    count: { min: 2, max: 1000 }'));
    expect(a.diagnostics).toEqual([]);
    expect(a.hardware!.divider.stages).toEqual([{ name: 'count', min: 2, max: 1000, registerOffset: 0 }]);
  });

  it.each([
    ['both forms', '  integer: { min: 1, max: 10 }\n  stages:\n    a: { min: 1, max: 10 }', 'divider-form', /both `integer` and `stages`/],
    ['fraction bits beside stages', '  fraction-bits: 2\n  stages:\n    a: { min: 1, max: 10 }', 'divider-form', /whole numbers/],
    ['neither form', '  fraction-bits: 0', 'missing-key', /neither `integer` nor `stages`/],
    ['three stages', '  stages:\n    a: { min: 1, max: 10 }\n    b: { min: 1, max: 10 }\n    c: { min: 1, max: 10 }', 'divider-form', /has 3/],
    ['no stage', '  stages: {}', 'divider-form', /has 0/],
    ['names equal but for case', '  stages:\n    pre: { min: 1, max: 10 }\n    PRE: { min: 1, max: 10 }', 'divider-form', /apart from case/],
    ['min above max', '  stages:\n    a: { min: 9, max: 3 }', 'out-of-range', /min 9 is above its max 3/],
    ['a register below 0', '  stages:\n    a: { min: 1, max: 10, register-offset: -2 }', 'out-of-range', /register value -1/],
    ['a product above 2^32', '  stages:\n    a: { min: 1, max: 65536 }\n    b: { min: 1, max: 65537 }', 'out-of-range', /4295032832/],
    ['a stage name that is no C name part', '  stages:\n    2nd: { min: 1, max: 10 }', 'bad-name', /Stage name `2nd`/],
    ['a stage name with a double underscore (reserved in C and C++ names)', '  stages:\n    pre__scale: { min: 1, max: 10 }', 'bad-name', /Stage name `pre__scale`/],
  ])('%s is an error with its own message', (_, divider, code, message) => {
    const a = check(clockWith(divider));
    const found = a.diagnostics.filter((d) => d.severity === 'error');
    expect(found.map((d) => d.code)).toEqual([code]);
    expect(found[0]!.message).toMatch(message);
    expect(a.hardware).toBeNull();
  });
});

describe('plans on a two-stage timer', () => {
  // derived: 0.2 Hz at 60 MHz is D·S = 300 000 000; exact plans rank first, then the largest S up
  // to the ceiling 4096 (the table's limit too): S = 4000, D = 75 000, above the period's 32 768,
  // so the prescaler takes part of it, as small as it can be: 3 × 25 000.
  const a = plan(TIMER, '  marker:\n    shape: square\n    frequency: 0.2 Hz\n    max-samples-per-cycle: 4096\n');
  const p = a.outputs[0]!.planning.plan!;

  it('name each stage value and register; the values multiply to the divider', () => {
    expect(a.diagnostics).toEqual([]);
    expect(p.errorHz.num).toBe(0n);
    expect(p.dividerInteger).toBe(75_000);
    expect(p.tableLength).toBe(4000);
    expect(p.dividerStages).toEqual([
      { name: 'prescaler', value: 3, register: 2 },
      { name: 'period', value: 25_000, register: 24_999 },
    ]);
  });

  it('show the stages in the annotation and the hover card', () => {
    expect(hintText(p)).toContain('÷3×25000');
    const card = outputCard(a.outputs[0]!);
    expect(card).toContain('÷3×25000');
    expect(card).toContain('prescaler 3 (register 2) × period 25000 (register 24999)');
  });

  it('a pinned divider the stages cannot make is an error naming the nearest they can', () => {
    // 32771 is prime and above the period's top, so no prescaler · period makes it; derived:
    // 32770 = 2 × 16385 and 32772 = 2 × 16386 do.
    const b = plan(TIMER, '  tone:\n    shape: sine\n    frequency: 1 kHz\n    tolerance: 10 %\n    plan: { divider: 32771, table-length: 2000, cycles: 1094 }\n');
    const d = b.diagnostics.filter((x) => x.code === 'pinned-plan');
    expect(d).toHaveLength(1);
    expect(d[0]!.message).toContain('32770 (2 × 16385) and 32772 (2 × 16386)');
  });

  it('a pinned divider the stages make is checked with its stages', () => {
    const b = plan(TIMER, '  tone:\n    shape: sine\n    frequency: 1 kHz\n    plan: { divider: 60, table-length: 1000, cycles: 1 }\n');
    expect(b.diagnostics).toEqual([]);
    expect(b.outputs[0]!.planning.plan!.dividerStages).toEqual([
      { name: 'prescaler', value: 1, register: 0 },
      { name: 'period', value: 60, register: 59 },
    ]);
  });
});
