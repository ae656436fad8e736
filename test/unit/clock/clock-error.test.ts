// The system clock's tolerance in every output's error budget: the exact worst case
// |p| + e·(1 + p) against max |(1 + p)(1 ± e) − 1| in fraction.js (a general-purpose exact-rational
// library as the oracle), a hand computation (derived), and the verdicts and messages it changes.
import Fraction from 'fraction.js';
import { describe, expect, it } from 'vitest';
import { type Rational, parseDecimal, rat } from '../../../shared-schema/src/rational';
import { clockAloneExceeds, errorBudget, withinWorstCase, worstErrorHz } from '../../../server/src/planning/clock-error';
import { analyze } from '../../../server/src/spec/analyze';
import { clockBudgetLine, clockShareHint } from '../../../server/src/lsp/clock-views';
import { seededRandom } from '../../support/seeded';

const hz = (t: string): Rational => parseDecimal(t)!;
const fr = (r: Rational) => new Fraction(r.num.toString()).div(r.den.toString());

describe('worst-case error with the clock tolerance (derived: a clock off by e scales f_out by 1 + e)', () => {
  it('-40.69 ppm at 1.5 MHz with a ±50 ppm crystal: 61.03515625 Hz + 50e-6 · 1 499 938.96484375 Hz = 136.0321044921875 Hz = 90.688 ppm (hand computation, derived)', () => {
    const plan = { achievedHz: hz('1499938.96484375'), errorHz: hz('-61.03515625') };
    const e = rat(50n, 1_000_000n);
    expect(worstErrorHz(plan, e)).toEqual(hz('136.0321044921875'));
    const b = errorBudget(plan, hz('1.5e6'), e);
    expect(b.planPpm).toBeCloseTo(-40.690104, 5);
    expect(b.clockPpm).toBeCloseTo(49.997965, 5);
    expect(b.worstPpm).toBeCloseTo(90.688070, 5);
    expect(b.clockDominates).toBe(true);
    expect(withinWorstCase(plan, hz('75'), e)).toBe(false); // 50 ppm of 1.5 MHz
    expect(withinWorstCase(plan, hz('75'), undefined)).toBe(true);
  });

  it('= max |(1 + p)(1 ± e) − 1| exactly, on 2000 seeded (p, e) pairs (fraction.js oracle)', () => {
    const random = seededRandom(77);
    for (let k = 0; k < 2000; k++) {
      const target = rat(BigInt(1 + Math.floor(random() * 1e9)), BigInt(1 + Math.floor(random() * 1000)));
      const errorHz = rat(BigInt(Math.floor((random() - 0.5) * 2e6)), 1_000_000_000n);
      const achievedHz = { num: target.num * errorHz.den + errorHz.num * target.den, den: target.den * errorHz.den };
      const e = rat(BigInt(Math.floor(random() * 200_000)), 1_000_000n);
      const p = fr(errorHz).div(fr(target));
      const plus = p.add(1).mul(fr(e).add(1)).sub(1).abs();
      const minus = p.add(1).mul(new Fraction(1).sub(fr(e))).sub(1).abs();
      const oracleHz = (plus.compare(minus) >= 0 ? plus : minus).mul(fr(target));
      const got = worstErrorHz({ achievedHz: rat(achievedHz.num, achievedHz.den), errorHz }, e);
      expect(fr(got).equals(oracleHz), `case ${k}`).toBe(true);
    }
  });

  it('the clock alone exceeds a tolerance when e · f_target > tolerance (derived)', () => {
    expect(clockAloneExceeds(hz('1e6'), hz('20'), rat(50n, 1_000_000n))).toBe(true);
    expect(clockAloneExceeds(hz('1e6'), hz('50'), rat(50n, 1_000_000n))).toBe(false);
    expect(clockAloneExceeds(hz('1e6'), hz('0'), undefined)).toBe(false);
  });
});

// The board of the clock-tree brief, rebuilt from its description: an invented 100 MHz FPGA board,
// 14-bit DAC, power-of-two tables up to 16384 samples, 64 KiB, a 40 kHz and a 1.5 MHz sine.
const clock = (extra: string) => `system-clock: 100 MHz
${extra}
divider:
  integer: { min: 1, max: 65535 }
dac:
  bits: 14
  sample-bytes: 2
  full-scale: 2 V
  max-sample-rate: 20 MHz
memory:
  budget: 64 KiB
  table-length: { min: 16, max: 16384 }
  power-of-two: true
`;
const wave = `clock: ./board.clock.yaml
outputs:
  tone:
    shape: sine
    frequency: 40 kHz
  fast:
    shape: sine
    frequency: 1.5 MHz
`;
const host = (clockText: string) => ({ readFile: (p: string) => (p.endsWith('board.clock.yaml') ? clockText : undefined) });

describe('the crystal turns a passing plan into an error that says it dominates', () => {
  it('without a clock tolerance the nearest plans -4.36 and -40.69 ppm pass ±50 ppm', () => {
    const a = analyze('/board/board.wave.yaml', wave, host(clock('')));
    expect(a.outputs.map((o) => [o.name, Number(o.planning.plan!.errorPpm.toFixed(2)), o.planning.withinTolerance])).toEqual([
      ['tone', -4.36, true],
      ['fast', -40.69, true],
    ]);
    expect(a.diagnostics.filter((d) => d.severity === 'error')).toEqual([]);
  });

  it('with ±50 ppm the -40.69 ppm output is out of tolerance at 90.69 ppm and the message says the clock dominates', () => {
    const a = analyze('/board/board.wave.yaml', wave, host(clock('system-clock-tolerance: 50 ppm')));
    const fast = a.diagnostics.find((d) => d.output === 'fast')!;
    expect(fast.code).toBe('out-of-tolerance');
    expect(fast.message).toContain('its worst case is 90.69 ppm (plan -40.69 ppm + clock 50 ppm), outside ±50 ppm');
    expect(fast.message).toContain("the clock's share dominates");
    const out = a.outputs.find((o) => o.name === 'fast')!;
    expect(clockBudgetLine(out, a.hardware)).toContain('90.7 ppm = plan -40.7 ppm + clock 50 ppm, outside the tolerance');
    expect(clockShareHint(out, a.hardware)).toBe(" · worst 90.7 ppm with the clock's ±50 ppm");
    // 4.36 + 50·(1 − 4.36e-6) = 54.36 ppm (derived).
    expect(a.diagnostics.find((d) => d.output === 'tone')!.message).toContain('54.36 ppm');
  });

  it('a tolerance tighter than the crystal is an error of its own, not an out-of-tolerance', () => {
    const tight = wave.replace('frequency: 40 kHz', 'frequency: 40 kHz\n    tolerance: 20 ppm');
    const a = analyze('/board/board.wave.yaml', tight, host(clock('system-clock-tolerance: 50 ppm')));
    const tone = a.diagnostics.filter((d) => d.output === 'tone');
    expect(tone.map((d) => d.code)).toEqual(['clock-accuracy']);
    expect(tone[0]!.message).toContain('±2 Hz'); // 50 ppm of 40 kHz
  });
});
