// Verdicts, figures and the per-output memo.

import { describe, expect, it } from 'vitest';
import { type Rational, rat, parseDecimal } from '../../../shared-schema/src/rational';
import { planOutput, planOutputUncached, planningCache } from '../../../server/src/planning/choose';
import { PlanningCache } from '../../../server/src/planning/cache';
import { memoryTotals } from '../../../server/src/planning/memory';
import { pinnedProblems } from '../../../server/src/planning/pinned';
import type { Hardware, OutputRequest } from '../../../server/src/planning/types';

const hz = (text: string): Rational => parseDecimal(text)!;

// An invented rig: 150 MHz, 50 MHz DAC, 48 KiB, tables 32…16384.
const rig: Hardware = {
  systemClockHz: hz('150e6'),
  divider: { integerMin: 1, integerMax: 65535, fractionBits: 8 },
  dac: { bits: 10, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: hz('50e6') },
  memory: { budgetBytes: 48 * 1024, tableLengthMin: 32, tableLengthMax: 16384, powerOfTwo: false },
};
const sine = { shape: 'sine' as const, duty: 0.5, amplitudeVpp: 2.4, offsetV: 1.65 };
const request = (target: string, extra: Partial<OutputRequest> = {}): OutputRequest => ({
  targetHz: hz(target),
  minSamplesPerCycle: rat(4),
  waveform: sine,
  toleranceHz: rat(0),
  jitter: 'forbid',
  ...extra,
});

describe('verdicts', () => {
  it('100 kHz on the rig is exact and jitter-free: divider 3, 500 samples, 1 cycle, 1000 B (derived: 150 MHz/3/500)', () => {
    const p = planOutputUncached(rig, request('100e3'));
    expect(p.verdict).toBe('exact');
    expect(p.plan).toMatchObject({ dividerInteger: 3, dividerFraction: 0, tableLength: 500, tableBytes: 1000, jitterFree: true });
    expect(p.plan?.cycles).toEqual(rat(1));
    expect(p.plan?.sampleRateHz).toEqual(hz('50e6'));
    expect(p.plan?.seam.ok).toBe(true);
    expect(p.nearestJitterFree).toEqual(p.plan);
    expect(p.withinTolerance).toBe(true);
  });

  it('a pinned plan is checked as written: 150 MHz/125/1000 = 1.2 kHz exactly (derived)', () => {
    const pinned = { dividerInteger: 125, dividerFraction: 0, tableLength: 1000, cycles: rat(1), span: 'open' as const };
    const p = planOutputUncached(rig, request('1200', { pinned }));
    expect(p.verdict).toBe('pinned');
    expect(p.plan?.achievedHz).toEqual(rat(1200));
    expect(p.withinTolerance).toBe(true);
    expect(pinnedProblems(rig, pinned)).toEqual([]);
  });

  const board125: Hardware = {
    systemClockHz: hz('125e6'),
    divider: { integerMin: 1, integerMax: 16, fractionBits: 8 },
    dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: hz('125e6') },
    memory: { budgetBytes: 4096, tableLengthMin: 256, tableLengthMax: 256, powerOfTwo: true },
  };

  it('4 MHz with N = 256: jitter allowed → fractional D = 1 + 244/256, exact (derived)', () => {
    const p = planOutputUncached(board125, request('4e6', { jitter: 'allow', toleranceHz: rat(1) }));
    expect(p.verdict).toBe('fractional');
    expect(p.plan).toMatchObject({ dividerInteger: 1, dividerFraction: 244, jitterFree: false });
    expect(p.plan?.jitter.patternLength).toBe(64);
    expect(p.nearestJitterFree?.jitterFree).toBe(true);
  });

  it('the same with jitter forbidden → out of tolerance; the plan is the nearest jitter-free one, the fractional one still offered', () => {
    const p = planOutputUncached(board125, request('4e6', { toleranceHz: rat(1) }));
    expect(p.verdict).toBe('out-of-tolerance');
    expect(p.plan).toEqual(p.nearestJitterFree);
    expect(p.bestFractional?.dividerFraction).toBe(244);
    expect(p.withinTolerance).toBe(false);
  });

  it('125 MHz, I = 1, N = 4096, 4 MHz: error −2197.265625 Hz = −549.31640625 ppm (derived from 3.997802734375 MHz)', () => {
    const hw: Hardware = {
      ...board125,
      divider: { integerMin: 1, integerMax: 1, fractionBits: 0 },
      memory: { budgetBytes: 8192, tableLengthMin: 4096, tableLengthMax: 4096, powerOfTwo: false },
    };
    const p = planOutputUncached(hw, request('4e6', { toleranceHz: hz('2200') }));
    expect(p.verdict).toBe('within-tolerance');
    expect(p.plan?.errorHz).toEqual(hz('-2197.265625'));
    expect(p.plan?.errorPpm).toBeCloseTo(-549.31640625, 9);
    expect(p.bestFractional).toBeNull();
  });

  it('no plan when every table is over budget', () => {
    const hw: Hardware = { ...rig, memory: { ...rig.memory, budgetBytes: 32 } };
    const p = planOutputUncached(hw, request('1e3'));
    expect(p).toMatchObject({ verdict: 'no-plan', plan: null, nearestJitterFree: null, bestFractional: null, withinTolerance: false });
  });

  it('pinned problems are named: fraction out of range, above the max sample rate, over budget, not whole', () => {
    const problems = pinnedProblems(rig, { dividerInteger: 1, dividerFraction: 300, tableLength: 40000, cycles: rat(3, 2), span: 'open' });
    expect(problems).toEqual([
      'divider-fraction-out-of-range', 'sample-rate-too-high', 'table-length-out-of-range', 'table-over-budget', 'cycles-not-whole',
    ]);
  });
});

describe('memory and memo', () => {
  it('tables of 500 and 4096 two-byte samples take 9192 B of 49152 B', () => {
    expect(memoryTotals(rig, [500, 4096])).toEqual({ usedBytes: 9192, budgetBytes: 49152, overBytes: 0 });
  });

  it('a repeated call with equal values hits the memo and returns the same result', () => {
    planningCache.clear();
    const first = planOutput(rig, request('123.456'));
    const hits = planningCache.hits;
    const second = planOutput({ ...rig }, request('123.456'));
    expect(planningCache.hits).toBe(hits + 1);
    expect(second).toBe(first);
    planOutput(rig, request('123.457'));
    expect(planningCache.misses).toBe(2);
  });

  it('the memo is bounded: the least recently used entry goes first', () => {
    const cache = new PlanningCache(2);
    const value = (): ReturnType<typeof planOutputUncached> => planOutputUncached(rig, request('1e3'));
    cache.getOrCompute('a', value);
    cache.getOrCompute('b', value);
    cache.getOrCompute('a', value); // a is now the most recent
    cache.getOrCompute('c', value); // evicts b
    expect(cache.size).toBe(2);
    cache.getOrCompute('a', value);
    expect(cache.hits).toBe(2);
    cache.getOrCompute('b', value);
    expect(cache.misses).toBe(4);
  });
});
