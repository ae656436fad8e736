// The planner against the exhaustive oracle (test/support/exhaustive.ts) on seeded random small
// domains, plus worked examples of the trade.

import { describe, expect, it } from 'vitest';
import { type Rational, rat, mul, div, parseDecimal } from '../../../shared-schema/src/rational';
import { bestFractional, nearestJitterFree } from '../../../server/src/planning/search';
import type { Hardware, PlanRequest } from '../../../server/src/planning/types';
import { exhaustivePlan, planKey } from '../../support/exhaustive';
import { seededRandom } from '../../support/seeded';


interface Case {
  hw: Hardware;
  req: PlanRequest;
  label: string;
}

function randomCase(rnd: () => number, index: number): Case {
  const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
  const systemClockHz = rat(int(1_000, 400_000), pick([1, 1, 3, 7, 10]));
  const fractionBits = int(0, 3);
  const integerMin = pick([1, 1, 1, 2, 3, 6]);
  // Wide divider ranges with short length ranges and the reverse, so both walks (over J and
  // over N) and their fallbacks are exercised; the product stays small for the oracle.
  const wide = pick(['dividers', 'lengths', 'neither']);
  const integerMax = integerMin + (wide === 'dividers' ? int(40, 160) : pick([0, 1, int(0, 8), int(0, 24)]));
  // Half the domains cap the sample rate somewhere inside the divider range.
  const maxSampleRateHz =
    rnd() < 0.5 ? mul(systemClockHz, rat(2)) : div(systemClockHz, rat(int(4, 4 * integerMax + 3), 4));
  const sampleBytes = pick([1, 2, 4]);
  const tableLengthMin = int(1, 40);
  const tableLengthMax = tableLengthMin + (wide === 'lengths' ? int(60, 300) : pick([0, 1, 3, int(0, 60)]));
  const budgetBytes = rnd() < 0.5 ? tableLengthMax * sampleBytes * 4 : int(tableLengthMin, tableLengthMax + 8) * sampleBytes;
  const powerOfTwo = rnd() < 0.3;
  const minSamplesPerCycle = pick([rat(2), rat(5, 2), rat(4), rat(1), rat(7, 3), rat(3), rat(9, 4)]);
  const hw: Hardware = {
    systemClockHz,
    divider: { integerMin, integerMax, fractionBits },
    dac: { bits: 12, sampleBytes, fullScaleV: 3.3, maxSampleRateHz },
    memory: { budgetBytes, tableLengthMin, tableLengthMax, powerOfTwo },
  };
  // Targets: reachable exactly (built from a random I, F, N, M), arbitrary, or out of reach.
  const kind = pick(['exact', 'exact', 'inexact', 'inexact', 'inexact', 'too-high', 'too-low']);
  let targetHz: Rational;
  if (kind === 'exact') {
    const d = rat(integerMin * 2 ** fractionBits + int(0, (integerMax - integerMin + 1) * 2 ** fractionBits - 1), 2 ** fractionBits);
    const n = int(tableLengthMin, tableLengthMax);
    targetHz = div(mul(systemClockHz, rat(int(1, Math.max(1, Math.floor(n / 2))))), mul(d, rat(n)));
  } else if (kind === 'inexact') {
    targetHz = div(mul(systemClockHz, rat(int(1, 100_000))), rat(int(1, 3_000_000)));
  } else if (kind === 'too-high') {
    targetHz = mul(systemClockHz, rat(int(1, 5)));
  } else {
    targetHz = div(systemClockHz, rat(int(100_000, 10_000_000)));
  }
  return { hw, req: { targetHz, minSamplesPerCycle }, label: `#${index} ${kind}` };
}

describe('planner = exhaustive search (oracle: test/support/exhaustive.ts, plain brute force)', () => {
  it('finds the identical plan and exact error on 1000 seeded random small domains, jitter-free and fractional', () => {
    const rnd = seededRandom(0x5eed_2024);
    let compared = 0;
    let withPlan = 0;
    const mismatches: string[] = [];
    for (let i = 0; i < 1000; i++) {
      const { hw, req, label } = randomCase(rnd, i);
      const whole = nearestJitterFree(hw, req);
      const wholeOracle = exhaustivePlan(hw, req, false);
      if (planKey(whole) !== planKey(wholeOracle)) mismatches.push(`${label} jitter-free: ${planKey(whole)} vs oracle ${planKey(wholeOracle)}`);
      const frac = bestFractional(hw, req);
      const fracOracle = exhaustivePlan(hw, req, true);
      if (planKey(frac) !== planKey(fracOracle)) mismatches.push(`${label} fractional: ${planKey(frac)} vs oracle ${planKey(fracOracle)}`);
      compared++;
      if (wholeOracle !== null) withPlan++;
    }
    console.log(`planner vs exhaustive: ${compared} domains × 2 searches, ${withPlan} with a plan, ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 10)).toEqual([]);
    expect(compared).toBe(1000);
    expect(withPlan).toBeGreaterThan(500);
  });
});

describe('planner with an S ceiling = exhaustive search restricted to S ≤ S max (oracle: test/support/exhaustive.ts)', () => {
  it('identical plans on 800 seeded random small domains with a ceiling, jitter-free and fractional', () => {
    const rnd = seededRandom(0xce11_1e55);
    const mismatches: string[] = [];
    let withPlan = 0;
    let differs = 0;
    for (let i = 0; i < 800; i++) {
      const { hw, req, label } = randomCase(rnd, i);
      // Ceilings at the floor, a little above it, well above it, and whole numbers of samples.
      const f = req.minSamplesPerCycle;
      const ceiling = [f, mul(f, rat(3, 2)), mul(f, rat(3)), mul(f, rat(10)), rat(Math.ceil(Number(f.num) / Number(f.den)) + Math.floor(rnd() * 40))][Math.floor(rnd() * 5)]!;
      const whole = nearestJitterFree(hw, req, ceiling);
      const wholeOracle = exhaustivePlan(hw, req, false, false, ceiling);
      if (planKey(whole) !== planKey(wholeOracle)) mismatches.push(`${label} jitter-free ≤ ${ceiling.num}/${ceiling.den}: ${planKey(whole)} vs oracle ${planKey(wholeOracle)}`);
      const frac = bestFractional(hw, req, ceiling);
      const fracOracle = exhaustivePlan(hw, req, true, false, ceiling);
      if (planKey(frac) !== planKey(fracOracle)) mismatches.push(`${label} fractional ≤ ${ceiling.num}/${ceiling.den}: ${planKey(frac)} vs oracle ${planKey(fracOracle)}`);
      if (wholeOracle !== null) withPlan++;
      if (planKey(wholeOracle) !== planKey(exhaustivePlan(hw, req, false))) differs++;
    }
    console.log(`planner with S ceiling vs exhaustive: 800 domains × 2 searches, ${withPlan} with a plan, ${differs} where the ceiling changes the plan, ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 10)).toEqual([]);
    expect(withPlan).toBeGreaterThan(400);
    expect(differs).toBeGreaterThan(150);
  });
});

// A board with one fixed divider and one fixed table length, for the worked examples.
function fixed(systemClockHz: Rational, n: number, divider: [number, number], fractionBits = 0): Hardware {
  return {
    systemClockHz,
    divider: { integerMin: divider[0], integerMax: divider[1], fractionBits },
    dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: systemClockHz },
    memory: { budgetBytes: 1 << 20, tableLengthMin: n, tableLengthMax: n, powerOfTwo: false },
  };
}
const MHz = (text: string): Rational => mul(parseDecimal(text)!, rat(1_000_000));

describe('worked examples of the trade', () => {
  it('125 MHz, I = 1, N = 4096: 4 MHz asks M = 131 → 3.997802734375 MHz exactly (common practice; derived 125e6·131/4096)', () => {
    const plan = nearestJitterFree(fixed(MHz('125'), 4096, [1, 1]), { targetHz: MHz('4'), minSamplesPerCycle: rat(4) });
    expect(plan?.cycles).toEqual(rat(131));
    expect(plan?.achievedHz).toEqual(MHz('3.997802734375'));
  });

  it('125 MHz, I = 1, N = 4096: the lowest frequency is 125 MHz/4096 = 30517.578125 Hz (common practice)', () => {
    const plan = nearestJitterFree(fixed(MHz('125'), 4096, [1, 1]), { targetHz: rat(1), minSamplesPerCycle: rat(4) });
    expect(plan?.cycles).toEqual(rat(1));
    expect(plan?.achievedHz).toEqual(parseDecimal('30517.578125'));
  });

  it('a 256-sample table at divider 1 reaches only 125 MHz·M/256 (common practice): 1 MHz → M = 2 → 976562.5 Hz', () => {
    const plan = nearestJitterFree(fixed(MHz('125'), 256, [1, 1]), { targetHz: MHz('1'), minSamplesPerCycle: rat(4) });
    expect(plan?.cycles).toEqual(rat(2));
    expect(plan?.achievedHz).toEqual(parseDecimal('976562.5'));
  });

  it('4 MHz with N = 256, M = 16 needs D = 125/64 = 1 + 244/256, which 8 fraction bits hold exactly (derived)', () => {
    const hw = fixed(MHz('125'), 256, [1, 16], 8);
    const req = { targetHz: MHz('4'), minSamplesPerCycle: rat(4) };
    const integerOnly = nearestJitterFree(hw, req);
    expect(integerOnly?.errorHz.num).not.toBe(0n);
    const plan = bestFractional(hw, req);
    expect(plan).toMatchObject({ dividerInteger: 1, dividerFraction: 244, tableLength: 256 });
    expect(plan?.cycles).toEqual(rat(16));
    expect(plan?.achievedHz).toEqual(MHz('4'));
  });

  it('Blair, IMTC 2002: N = 2048 at 100 MHz, target 44 MHz → M = 901 → 43 994 140.625 Hz', () => {
    const plan = nearestJitterFree(fixed(MHz('100'), 2048, [1, 1]), { targetHz: MHz('44'), minSamplesPerCycle: rat(2) });
    expect(plan?.cycles).toEqual(rat(901));
    expect(plan?.achievedHz).toEqual(parseDecimal('43994140.625'));
  });
});

describe('work limit (robustness: absurd domains never hang)', () => {
  // A 32-bit divider with 64 Mi-sample tables at a millihertz target: the walk would run for
  // minutes; the search stops at its step budget and says so.
  const hw: Hardware = {
    systemClockHz: parseDecimal('3999999999')!,
    divider: { integerMin: 1, integerMax: 2 ** 32, fractionBits: 16 },
    dac: { bits: 24, sampleBytes: 4, fullScaleV: 3.3, maxSampleRateHz: rat(4_000_000_000) },
    memory: { budgetBytes: 2 ** 30, tableLengthMin: 1, tableLengthMax: 2 ** 26, powerOfTwo: false },
  };
  const req = { targetHz: parseDecimal('0.0012345678901')!, minSamplesPerCycle: rat(8) };

  it('stops within seconds and marks the plan as the best found, not proven nearest', () => {
    const start = performance.now();
    const jitterFree = nearestJitterFree(hw, req);
    const fractional = bestFractional(hw, req);
    expect(performance.now() - start).toBeLessThan(30_000);
    expect(jitterFree?.searchLimited).toBe(true);
    expect(fractional?.searchLimited).toBe(true);
    // derived: whatever was found is still a valid plan, f_out = f_sys·M/(D·N) within 1 ppm here.
    expect(Math.abs(Number(jitterFree!.errorHz.num) / Number(jitterFree!.errorHz.den))).toBeLessThan(1e-9);
  });

  it('a realistic domain never reaches the limit (16-bit divider, 32 Ki-sample tables)', () => {
    const board: Hardware = { ...hw, divider: { integerMin: 1, integerMax: 65535, fractionBits: 8 }, memory: { ...hw.memory, tableLengthMax: 32768 } };
    expect(nearestJitterFree(board, req)?.searchLimited).toBeUndefined();
    expect(bestFractional(board, req)?.searchLimited).toBeUndefined();
  });
});
