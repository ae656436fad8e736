// The planning work budget (server/src/planning/work.ts): counted in steps, shared by a file's
// outputs, and deterministic — a result depends on the output and its share only, never on what
// was planned before it.

import { describe, expect, it } from 'vitest';
import { parseDecimal, rat } from '../../../shared-schema/src/rational';
import { planOutput, planningCache } from '../../../server/src/planning/choose';
import { nearestJitterFree } from '../../../server/src/planning/search';
import type { Hardware, OutputRequest } from '../../../server/src/planning/types';
import { FILE_STEPS, MIN_OUTPUT_STEPS, OUTPUT_STEPS, StepAccount, WorkBudget, stepsPerOutput, withAccount } from '../../../server/src/planning/work';

// An absurd invented domain: a 32-bit divider, 16 fraction bits, 64 Mi-sample tables.
const huge: Hardware = {
  systemClockHz: parseDecimal('3999999999')!,
  divider: { integerMin: 1, integerMax: 2 ** 32, fractionBits: 16 },
  dac: { bits: 24, sampleBytes: 4, fullScaleV: 3.3, maxSampleRateHz: rat(4_000_000_000) },
  memory: { budgetBytes: 2 ** 30, tableLengthMin: 1, tableLengthMax: 2 ** 26, powerOfTwo: false },
};
const sine = (hz: string, tolerance = rat(0)): OutputRequest => ({
  targetHz: parseDecimal(hz)!,
  minSamplesPerCycle: rat(8),
  waveform: { shape: 'sine', duty: 0.5, amplitudeVpp: 3, offsetV: 1.65 },
  toleranceHz: tolerance,
  jitter: 'forbid',
});

describe('the work budget', () => {
  it('a file shares FILE_STEPS over the next power of two of its outputs, within the per-output bounds (derived)', () => {
    expect(stepsPerOutput(1)).toBe(OUTPUT_STEPS);
    expect(stepsPerOutput(3)).toBe(FILE_STEPS / 4);
    expect(stepsPerOutput(4)).toBe(FILE_STEPS / 4);
    expect(stepsPerOutput(500)).toBe(Math.max(MIN_OUTPUT_STEPS, FILE_STEPS / 512));
    // 500 outputs at their share never take more than the file's steps (plus the floor's slack).
    expect(500 * stepsPerOutput(500)).toBeLessThanOrEqual(FILE_STEPS);
  });

  it('every search of an output draws from its account, and the account says when one ran dry', () => {
    const account = new StepAccount(1000);
    withAccount(account, () => {
      const a = new WorkBudget(600);
      for (let i = 0; i < 600; i++) expect(a.take()).toBe(true);
      const b = new WorkBudget(600); // only 400 left in the account
      let taken = 0;
      while (b.take()) taken++;
      expect(taken).toBe(400);
    });
    expect(account.limited).toBe(true);
    expect(account.left).toBeLessThan(0);
  });

  it('a result depends on the share it was planned under, not on the memo\'s history', () => {
    const req = sine('0.0012345678901');
    planningCache.clear();
    const small = planOutput(huge, req, MIN_OUTPUT_STEPS);
    const large = planOutput(huge, req, OUTPUT_STEPS);
    const again = planOutput(huge, req, MIN_OUTPUT_STEPS);
    planningCache.clear();
    const fresh = planOutput(huge, req, MIN_OUTPUT_STEPS);
    expect(small.plan?.searchLimited).toBe(true);
    expect(again.plan).toEqual(fresh.plan);
    expect(small.plan).toEqual(fresh.plan);
    // A plan that finished within a small share is the plan under any larger one, and is reused.
    const easy = sine('1000', rat(1));
    planningCache.clear();
    const first = planOutput(huge, easy, MIN_OUTPUT_STEPS);
    const hits = planningCache.hits;
    expect(planOutput(huge, easy, OUTPUT_STEPS)).toBe(first);
    expect(planningCache.hits).toBe(hits + 1);
  });

  it('an exact target on the 2^32 divider is settled at once and proven (f_out = f_sys·M/(D·N) = 1 Hz, derived)', () => {
    const account = new StepAccount(Infinity);
    const plan = withAccount(account, () => nearestJitterFree(huge, sine('1')))!;
    expect(plan.errorHz.num).toBe(0n);
    expect(plan.searchLimited).toBeUndefined();
    // The number theory settles it: no walk, only a few exact comparisons of its plans (16 steps each).
    expect(account.used).toBeLessThan(100);
  });
});
