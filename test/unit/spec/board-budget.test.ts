// The board's memory budget end to end (server/src/spec/board-budget.ts) on two invented boards
// whose own plans together exceed the budget. Figures are checked independently: f_out =
// f_sys·M/(D·N) (the definition of a divided sample clock) with fraction.js, a general-purpose
// exact rational library, and table bytes = N · sample bytes.

import Fraction from 'fraction.js';
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { analyze, analyzeWhole } from '../../../server/src/spec/analyze';
import { FIXTURES, diskHost } from './fixture-host';

const BOARDS = join(FIXTURES, 'boards');

describe.each([
  ['audio.wave.yaml', 84_000_000, 48 * 1024, 50],
  ['small.wave.yaml', 48_000_000, 2 * 1024, 50],
])('%s', (file, fSys, budget, defaultPpm) => {
  const path = join(BOARDS, file);
  const text = readFileSync(path, 'utf8');
  const a = analyze(path, text, diskHost);

  it('fits its budget with every output within its tolerance and no error', () => {
    expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
    let bytes = 0;
    for (const o of a.outputs) {
      const p = o.planning.plan!;
      bytes += p.tableLength * 2;
      const f = new Fraction(fSys).mul(new Fraction(p.cycles.num, p.cycles.den)).div(new Fraction(p.dividerInteger).mul(p.tableLength));
      const ppm = Math.abs(f.sub(new Fraction(o.targetHz.num, o.targetHz.den)).div(new Fraction(o.targetHz.num, o.targetHz.den)).valueOf()) * 1e6;
      const tol = o.toleranceText === '100 ppm' ? 100 : o.toleranceText === '0.1 %' ? 1000 : defaultPpm;
      expect(ppm, o.name).toBeLessThanOrEqual(tol);
      expect(o.planning.withinTolerance).toBe(true);
    }
    expect(bytes).toBeLessThanOrEqual(budget);
    expect(a.memory).toEqual({ usedBytes: bytes, budgetBytes: budget });
  });

  it('names what each shrunk output gave up, and reads the same whole or output by output', () => {
    const shrunk = a.outputs.filter((o) => o.planning.shrunkFrom);
    expect(shrunk.length).toBeGreaterThan(0);
    const notes = a.diagnostics.filter((d) => d.code === 'fitted-to-budget');
    expect(notes.map((d) => d.output)).toEqual(shrunk.map((o) => o.name));
    for (const o of shrunk) {
      const note = notes.find((d) => d.output === o.name)!;
      expect(note.message).toContain(`${o.planning.shrunkFrom!.tableLength * 2} B`);
      expect(note.message).toContain(`${o.planning.plan!.tableLength * 2} B`);
    }
    expect(analyzeWhole(path, text, diskHost)).toStrictEqual(a);
  });
});

describe('a group under a tight budget keeps its group plans (small board, probes on one sample clock)', () => {
  const path = join(BOARDS, 'small.wave.yaml');
  const text = `${readFileSync(path, 'utf8')}groups:\n  probes:\n    outputs: [probe-a, probe-b]\n`;
  const a = analyze(path, text, diskHost);

  it('the members share one divider and are never shrunk on their own; the others fit around them', () => {
    const [pa, pb] = ['probe-a', 'probe-b'].map((n) => a.outputs.find((o) => o.name === n)!);
    expect(pa!.planning.plan!.dividerInteger).toBe(pb!.planning.plan!.dividerInteger);
    expect([pa!.planning.shrunkFrom, pb!.planning.shrunkFrom]).toEqual([undefined, undefined]);
    expect(a.diagnostics.filter((d) => d.code === 'fitted-to-budget' && (d.output === 'probe-a' || d.output === 'probe-b'))).toEqual([]);
    // Table bytes = Σ N · 2 B, within the 2 KiB budget (derived): the other outputs shrank instead.
    const bytes = a.outputs.reduce((t, o) => t + o.planning.plan!.tableLength * 2, 0);
    expect(a.memory!.usedBytes).toBe(bytes);
    expect(bytes).toBeLessThanOrEqual(2048);
    expect(a.diagnostics.filter((d) => d.code === 'over-budget')).toEqual([]);
    expect(a.outputs.filter((o) => o.planning.shrunkFrom).length).toBeGreaterThan(0);
  });
});
