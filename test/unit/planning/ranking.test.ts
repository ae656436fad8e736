// The ranking of an output's plans (server/src/planning/ranking.ts: within tolerance; duty and
// S ≤ S max; |error|; p(1−p); larger S up to S max; fewer bytes; the old tie-breaks) against the
// exhaustive oracle of test/support/exhaustive.ts, which sorts every plan by the documented keys.

import { describe, expect, it } from 'vitest';
import { type Rational, div, mul, rat } from '../../../shared-schema/src/rational';
import { planOutputUncached } from '../../../server/src/planning/choose';
import type { Hardware, OutputRequest, Shape } from '../../../server/src/planning/types';
import { exhaustivePlan, exhaustiveRanked, planKey } from '../../support/exhaustive';
import { seededRandom } from '../../support/seeded';

interface Case {
  hw: Hardware;
  req: OutputRequest;
  label: string;
}

export function rankingCase(rnd: () => number, index: number): Case {
  const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
  const systemClockHz = rat(int(1_000, 400_000), pick([1, 1, 3, 7]));
  const fractionBits = pick([0, 0, 1, 2, 3]);
  const integerMin = pick([1, 1, 2, 3]);
  const integerMax = integerMin + pick([0, 2, int(0, 12), int(10, 60)]);
  const tableLengthMin = int(1, 24);
  const tableLengthMax = tableLengthMin + pick([3, int(0, 60), int(30, 160)]);
  const sampleBytes = pick([1, 2]);
  const hw: Hardware = {
    systemClockHz,
    divider: { integerMin, integerMax, fractionBits },
    dac: { bits: 12, sampleBytes, fullScaleV: 3.3, maxSampleRateHz: rnd() < 0.6 ? systemClockHz : div(systemClockHz, rat(int(2, 2 * integerMax + 3), 2)) },
    memory: { budgetBytes: rnd() < 0.6 ? tableLengthMax * sampleBytes : int(tableLengthMin, tableLengthMax) * sampleBytes, tableLengthMin, tableLengthMax, powerOfTwo: rnd() < 0.15 },
  };
  const shape: Shape = pick(['sine', 'sine', 'square', 'square', 'triangle']);
  const whole = shape !== 'sine' && rnd() < 0.85;
  const minSamplesPerCycle = pick([rat(1), rat(2), rat(5, 2), rat(4), rat(3)]);
  const kind = pick(['exact', 'inexact', 'inexact', 'low']);
  const targetHz =
    kind === 'exact'
      ? div(mul(systemClockHz, rat(int(1, 6))), rat(int(integerMin, integerMax + 1) * int(Math.max(1, tableLengthMin), tableLengthMax)))
      : kind === 'low'
        ? div(systemClockHz, rat(int(integerMax * 4, integerMax * tableLengthMax + 10)))
        : div(mul(systemClockHz, rat(int(1, 20_000))), rat(int(1, 600_000)));
  // Tolerances from none to wide (ppm of the target up to a few per cent), so every branch of the
  // ranking is taken: the ceiling met within tolerance, only above it, nothing within it.
  const toleranceHz = mul(targetHz, pick([rat(0), rat(1, 1_000_000), rat(1, 10_000), rat(1, 1_000), rat(1, 100), rat(5, 100), rat(1, 10), rat(3, 10)]));
  const floorS = Number(minSamplesPerCycle.num) / Number(minSamplesPerCycle.den);
  const maxSamplesPerCycle = rnd() < 0.15 ? undefined : rat(Math.ceil(floorS) + pick([0, 1, int(0, 8), int(4, 40)]));
  const duty = shape === 'square' ? { asked: pick([rat(1, 2), rat(3, 10), rat(1, 3), rat(1, 4)]), tolerance: pick([rat(0), rat(1, 100), rat(1, 20)]) } : undefined;
  const req: OutputRequest = {
    targetHz,
    minSamplesPerCycle,
    wholeSamplesPerCycle: whole,
    waveform: { shape, duty: duty ? Number(duty.asked.num) / Number(duty.asked.den) : 0.5, amplitudeVpp: 3, offsetV: 1.65 },
    toleranceHz,
    jitter: pick(['forbid', 'allow']),
    ...(maxSamplesPerCycle ? { maxSamplesPerCycle } : {}),
    ...(duty ? { duty } : {}),
  };
  return { hw, req, label: `#${index} ${shape}${whole ? ' whole-S' : ''} ${kind}` };
}

const oracleOf = (c: Case) =>
  exhaustiveRanked(c.hw, c.req, {
    toleranceHz: c.req.toleranceHz,
    maxSamplesPerCycle: c.req.maxSamplesPerCycle ?? null,
    duty: c.req.waveform.shape === 'square' && c.req.wholeSamplesPerCycle && c.req.duty ? c.req.duty : null,
    jitter: c.req.jitter,
    whole: c.req.wholeSamplesPerCycle === true,
  });

describe('the ranking = exhaustive search sorted by the documented keys (oracle: test/support/exhaustive.ts)', () => {
  it('chooses the identical plan on 700 seeded random small domains; nearestJitterFree and bestFractional stay the nearest plans', () => {
    const rnd = seededRandom(0x7a4c_1e57);
    const mismatches: string[] = [];
    const tally = { withPlan: 0, differsFromNearest: 0, aboveCeiling: 0, outside: 0, fractional: 0 };
    for (let i = 0; i < 700; i++) {
      const c = rankingCase(rnd, i);
      const planning = planOutputUncached(c.hw, c.req);
      const oracle = oracleOf(c);
      if (planKey(planning.plan) !== planKey(oracle)) mismatches.push(`${c.label} plan: ${planKey(planning.plan)} vs oracle ${planKey(oracle)}`);
      const whole = c.req.wholeSamplesPerCycle === true;
      const nearest = exhaustivePlan(c.hw, c.req, false, whole);
      if (planKey(planning.nearestJitterFree) !== planKey(nearest)) mismatches.push(`${c.label} nearestJitterFree: ${planKey(planning.nearestJitterFree)} vs oracle ${planKey(nearest)}`);
      if (c.hw.divider.fractionBits > 0 && i % 3 === 0) {
        const frac = exhaustivePlan(c.hw, c.req, true, whole);
        if (planKey(planning.bestFractional) !== planKey(frac)) mismatches.push(`${c.label} bestFractional: ${planKey(planning.bestFractional)} vs oracle ${planKey(frac)}`);
      }
      if (oracle === null) continue;
      tally.withPlan++;
      if (planKey(oracle) !== planKey(nearest)) tally.differsFromNearest++;
      const s = rat(oracle.tableLength, oracle.cycles);
      const cap = c.req.maxSamplesPerCycle;
      if (cap && s.num * cap.den > cap.num * s.den) tally.aboveCeiling++;
      if (!planning.withinTolerance) tally.outside++;
      if (oracle.dividerFraction !== 0) tally.fractional++;
    }
    console.log(`ranking vs exhaustive: 700 domains, ${tally.withPlan} with a plan, ${tally.differsFromNearest} where the ranking's plan is not the nearest, ${tally.aboveCeiling} above S max, ${tally.outside} outside the tolerance, ${tally.fractional} fractional; ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 10)).toEqual([]);
    expect(tally.withPlan).toBeGreaterThan(500);
    expect(tally.differsFromNearest).toBeGreaterThan(100);
    expect(tally.aboveCeiling).toBeGreaterThan(20);
    expect(tally.outside).toBeGreaterThan(20);
    expect(tally.fractional).toBeGreaterThan(10);
  });
});
