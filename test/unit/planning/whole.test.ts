// Whole samples per cycle (N a multiple of M), as square, triangle and sawtooth tables need,
// against the exhaustive oracle (test/support/exhaustive.ts with whole = true) on seeded small
// domains, plus a worked example.

import { describe, expect, it } from 'vitest';
import { type Rational, div, mul, rat } from '../../../shared-schema/src/rational';
import type { Hardware } from '../../../server/src/planning/types';
import { nearestWholeCycle, wholeCyclePlans } from '../../../server/src/planning/whole';
import { exhaustivePlan, planKey } from '../../support/exhaustive';
import { seededRandom } from '../../support/seeded';

function randomHardware(rnd: () => number): { hw: Hardware; targetHz: Rational; floor: Rational } {
  const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
  const systemClockHz = rat(int(1_000, 400_000), pick([1, 3, 10]));
  const integerMin = pick([1, 1, 2, 5]);
  const integerMax = integerMin + pick([0, 3, int(0, 40), int(20, 120)]);
  const tableLengthMin = int(1, 30);
  const tableLengthMax = tableLengthMin + pick([0, 5, int(0, 80), int(40, 200)]);
  const sampleBytes = pick([1, 2]);
  const hw: Hardware = {
    systemClockHz,
    divider: { integerMin, integerMax, fractionBits: int(0, 3) },
    dac: {
      bits: 12, sampleBytes, fullScaleV: 3.3,
      maxSampleRateHz: rnd() < 0.5 ? systemClockHz : div(systemClockHz, rat(int(2, 4 * integerMax + 3), 2)),
    },
    memory: {
      budgetBytes: rnd() < 0.5 ? tableLengthMax * sampleBytes : int(tableLengthMin, tableLengthMax) * sampleBytes,
      tableLengthMin, tableLengthMax, powerOfTwo: rnd() < 0.3,
    },
  };
  const targetHz = pick([
    () => div(mul(systemClockHz, rat(int(1, 50_000))), rat(int(1, 3_000_000))),
    () => div(systemClockHz, rat(int(1, integerMax + 1) * int(1, tableLengthMax))),
    () => mul(systemClockHz, rat(2)),
  ])();
  return { hw, targetHz, floor: pick([rat(1), rat(2), rat(5, 2), rat(4), rat(7, 3)]) };
}

describe('whole samples per cycle = exhaustive search restricted to N mod M = 0 (oracle: test/support/exhaustive.ts)', () => {
  it('identical plans on 600 seeded random small domains, jitter-free and fractional', () => {
    const rnd = seededRandom(0x3a11_50f7);
    const mismatches: string[] = [];
    let withPlan = 0;
    for (let i = 0; i < 600; i++) {
      const { hw, targetHz, floor } = randomHardware(rnd);
      const req = { targetHz, minSamplesPerCycle: floor };
      for (const fractional of [false, true]) {
        const plan = nearestWholeCycle(hw, req, fractional);
        const oracle = exhaustivePlan(hw, req, fractional, true);
        if (!fractional && oracle) withPlan++;
        if (planKey(plan) !== planKey(oracle)) mismatches.push(`#${i} ${fractional ? 'fractional' : 'jitter-free'}: ${planKey(plan)} vs ${planKey(oracle)}`);
      }
    }
    console.log(`whole-cycle planner vs exhaustive: 600 domains × 2 searches, ${withPlan} with a plan, ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 5)).toEqual([]);
    expect(withPlan).toBeGreaterThan(300);
  });

  it('the outward search over products K = J·S finds the walk\'s plan on 200 seeded medium domains (walk = the separate method)', () => {
    const rnd = seededRandom(0x0a7d_3a11);
    const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
    const mismatches: string[] = [];
    for (let i = 0; i < 200; i++) {
      const systemClockHz = rat(int(1_000_000, 200_000_000), int(1, 3));
      const fractionBits = int(0, 4);
      const integerMax = int(50, 5000);
      const hw: Hardware = {
        systemClockHz,
        divider: { integerMin: int(1, 3), integerMax, fractionBits },
        dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: systemClockHz },
        memory: { budgetBytes: 2 ** 20, tableLengthMin: int(1, 64), tableLengthMax: int(3000, 40_000), powerOfTwo: rnd() < 0.1 },
      };
      // Low targets, where the walk over S is long and the products decide.
      const targetHz = div(mul(systemClockHz, rat(int(1, 1000))), rat(int(10_000, 50_000_000)));
      const req = { targetHz, minSamplesPerCycle: rat(int(4, 32)) };
      const cap = rat(int(20, 6000));
      const pref = { toleranceHz: mul(targetHz, rat(int(0, 100), 1_000_000)), maxSamplesPerCycle: cap, duty: rnd() < 0.5 ? { asked: rat(int(1, 9), 10), tolerance: rat(int(0, 2), 100) } : null };
      for (const fractional of [false, true]) {
        const auto = wholeCyclePlans(hw, req, fractional, pref, 'auto');
        const walk = wholeCyclePlans(hw, req, fractional, pref, 'walk');
        if (planKey(auto.nearest) !== planKey(walk.nearest) || planKey(auto.ranked) !== planKey(walk.ranked)) {
          mismatches.push(`#${i} ${fractional ? 'fractional' : 'jitter-free'}: ${planKey(auto.nearest)} / ${planKey(auto.ranked)} vs walk ${planKey(walk.nearest)} / ${planKey(walk.ranked)}`);
        }
      }
    }
    expect(mismatches.slice(0, 5)).toEqual([]);
  });

  it('a 1 kHz square from 125 MHz: f_sys/(D·S) = 1 kHz exactly with D·S = 125 000 (derived)', () => {
    const hw: Hardware = {
      systemClockHz: rat(125_000_000),
      divider: { integerMin: 1, integerMax: 65535, fractionBits: 0 },
      dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(10_000_000) },
      memory: { budgetBytes: 65536, tableLengthMin: 16, tableLengthMax: 32768, powerOfTwo: false },
    };
    const plan = nearestWholeCycle(hw, { targetHz: rat(1000), minSamplesPerCycle: rat(16) }, false)!;
    expect(plan.errorHz.num).toBe(0n);
    // Largest S first: D ≥ 13 (10 MHz limit) and D·S = 125 000 → D = 20 (first divisor ≥ 13), S = 6250.
    expect(plan.dividerInteger).toBe(20);
    expect(plan.tableLength).toBe(6250);
    expect(plan.cycles).toEqual(rat(1));
  });
});
