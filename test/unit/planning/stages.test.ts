// Dividers made of two counter stages (D = x·y): the set's membership, neighbours and multiples
// against a table of every product (brute force), and the planner against the exhaustive oracle
// that tries every stage pair (test/support/exhaustive.ts) on seeded small domains.

import { describe, expect, it } from 'vitest';
import { type Rational, abs, cmp, div, mul, rat } from '../../../shared-schema/src/rational';
import { nearestJitterFree, nearestJitterFreeBy } from '../../../server/src/planning/search';
import { MemberWalk, StageProducts, splitDivider, type DividerStage } from '../../../server/src/planning/stages';
import type { Hardware, Plan, PlanRequest } from '../../../server/src/planning/types';
import { nearestWholeCycle } from '../../../server/src/planning/whole';
import { exhaustivePlan, planKey } from '../../support/exhaustive';
import { seededRandom } from '../../support/seeded';

const stage = (name: string, min: number, max: number, registerOffset = 0): DividerStage => ({ name, min, max, registerOffset });

/** Every product x·y of the two ranges, marked in a table (the plain way). */
function productTable(x1: number, x2: number, y1: number, y2: number): Uint8Array {
  const member = new Uint8Array(x2 * y2 + 2);
  for (let x = x1; x <= x2; x++) for (let y = y1; y <= y2; y++) member[x * y] = 1;
  return member;
}

describe('the dividers two stages make (oracle: a table of every product x·y)', () => {
  it('membership, next, previous and next multiple agree with the table on 1500 seeded stage pairs', () => {
    const rnd = seededRandom(0x57a6e5);
    const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
    let queries = 0;
    const mismatches: string[] = [];
    for (let c = 0; c < 1500; c++) {
      const x1 = int(1, 30), x2 = x1 + int(0, 400), y1 = int(1, 30), y2 = y1 + int(0, 400);
      const set = new StageProducts(x1, x2, y1, y2);
      const member = productTable(x1, x2, y1, y2);
      const top = x2 * y2;
      for (let k = 0; k < 30; k++) {
        const lo = int(1, top + 5);
        const hi = lo + int(0, rnd() < 0.5 ? 50 : 3000);
        const g = int(1, 60);
        let next = 0, prev = 0, multiple = 0;
        for (let p = lo; p <= Math.min(hi, top); p++) if (member[p]) { next = p; break; }
        for (let p = Math.min(hi, top); p >= lo; p--) if (member[p]) { prev = p; break; }
        for (let p = lo; p <= Math.min(hi, top); p++) if (member[p] && p % g === 0) { multiple = p; break; }
        const got = [set.has(lo), set.next(lo, hi), set.prev(lo, hi), set.nextMultiple(g, lo, hi)];
        const want = [member[lo] === 1, next, prev, multiple];
        if (got.join() !== want.join()) mismatches.push(`[${x1},${x2}]·[${y1},${y2}] lo ${lo} hi ${hi} g ${g}: ${got} vs ${want}`);
        queries++;
      }
      // The walk over members visits exactly the table's members of a window, in order.
      const lo = int(1, top), hi = lo + int(0, 9000);
      const walk = new MemberWalk(set, lo, hi);
      const seen: number[] = [];
      for (let p = walk.next(); p !== 0; p = walk.next()) seen.push(p);
      const want: number[] = [];
      for (let p = lo; p <= Math.min(hi, top); p++) if (member[p]) want.push(p);
      if (seen.join() !== want.join()) mismatches.push(`walk [${x1},${x2}]·[${y1},${y2}] ${lo}…${hi}: ${seen.length} vs ${want.length} members`);
    }
    console.log(`stage products vs table: 1500 stage pairs, ${queries} queries × 4 + 1500 walks, ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 5)).toEqual([]);
  });

  it('splits each divider with the first stage as small as it can be (documented tie-break), registers = value + offset', () => {
    const rnd = seededRandom(0x5711);
    const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
    let checked = 0;
    for (let c = 0; c < 200; c++) {
      const stages = [stage('pre', int(1, 9), int(10, 60), -1), stage('period', int(2, 9), int(10, 80), int(-1, 1))];
      for (let d = 1; d <= 60 * 80; d += int(1, 40)) {
        // Brute force: every pair, the least first-stage value that makes d.
        let want: [number, number] | null = null;
        for (let x = stages[0]!.min; x <= stages[0]!.max && want === null; x++) {
          if (d % x === 0 && d / x >= stages[1]!.min && d / x <= stages[1]!.max) want = [x, d / x];
        }
        const got = splitDivider(stages, d);
        expect(got === null ? null : got.map((s) => s.value)).toEqual(want);
        if (got !== null) {
          expect(got.map((s) => s.register)).toEqual([got[0]!.value + stages[0]!.registerOffset, got[1]!.value + stages[1]!.registerOffset]);
          expect(got.map((s) => s.name)).toEqual(['pre', 'period']);
        }
        checked++;
      }
    }
    expect(checked).toBeGreaterThan(10_000);
  });
});

function randomStageCase(rnd: () => number): { hw: Hardware; req: PlanRequest } {
  const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
  const systemClockHz = rat(int(1_000, 400_000), pick([1, 1, 3, 7]));
  const x1 = pick([1, 1, 2, 3, 5]);
  const x2 = x1 + pick([0, 1, int(0, 8), int(5, 20)]);
  const y1 = pick([1, 2, 2, 3, 7]);
  const y2 = y1 + pick([1, int(0, 12), int(10, 40)]);
  const stages = [stage('prescaler', x1, x2, -1), stage('period', y1, y2, -1)];
  const integerMin = x1 * y1;
  const integerMax = x2 * y2;
  const maxSampleRateHz = rnd() < 0.5 ? mul(systemClockHz, rat(2)) : div(systemClockHz, rat(int(4, 4 * integerMax + 3), 4));
  const sampleBytes = pick([1, 2]);
  const wideTables = rnd() < 0.4;
  const tableLengthMin = int(1, 40);
  const tableLengthMax = tableLengthMin + (wideTables ? int(60, 250) : pick([0, 1, 3, int(0, 60)]));
  const budgetBytes = rnd() < 0.5 ? tableLengthMax * sampleBytes * 4 : int(tableLengthMin, tableLengthMax + 8) * sampleBytes;
  const hw: Hardware = {
    systemClockHz,
    divider: { integerMin, integerMax, fractionBits: 0, stages },
    dac: { bits: 12, sampleBytes, fullScaleV: 3.3, maxSampleRateHz },
    memory: { budgetBytes, tableLengthMin, tableLengthMax, powerOfTwo: rnd() < 0.25 },
  };
  const kind = pick(['exact', 'exact', 'inexact', 'inexact', 'inexact', 'low', 'high']);
  let targetHz: Rational;
  if (kind === 'exact') {
    const d = int(x1, x2) * int(y1, y2);
    const n = int(tableLengthMin, tableLengthMax);
    targetHz = div(mul(systemClockHz, rat(int(1, Math.max(1, Math.floor(n / 2))))), rat(d * n));
  } else if (kind === 'inexact') {
    targetHz = div(mul(systemClockHz, rat(int(1, 100_000))), rat(int(1, 3_000_000)));
  } else if (kind === 'high') {
    targetHz = mul(systemClockHz, rat(int(1, 3)));
  } else {
    targetHz = div(systemClockHz, rat(int(1_000, 1_000_000)));
  }
  return { hw, req: { targetHz, minSamplesPerCycle: pick([rat(1), rat(2), rat(5, 2), rat(4), rat(7, 3)]) } };
}

describe('planner with a two-stage divider = exhaustive search over every stage pair (oracle: test/support/exhaustive.ts)', () => {
  it('identical plans and exact errors on 800 seeded small domains: the planner and both of its methods alone', () => {
    const rnd = seededRandom(0xd1_5ca1e);
    const mismatches: string[] = [];
    let withPlan = 0;
    for (let i = 0; i < 800; i++) {
      const { hw, req } = randomStageCase(rnd);
      const oracle = planKey(exhaustivePlan(hw, req, false));
      if (oracle !== 'none') withPlan++;
      for (const strategy of ['auto', 'walk', 'cycles'] as const) {
        const got = planKey(nearestJitterFreeBy(hw, req, strategy));
        if (got !== oracle) mismatches.push(`#${i} ${strategy}: ${got} vs oracle ${oracle}`);
      }
      const plan = nearestJitterFree(hw, req);
      // The plan's divider is always one the stages make.
      if (plan !== null && splitDivider(hw.divider.stages!, plan.dividerInteger) === null) mismatches.push(`#${i}: divider ${plan.dividerInteger} is no stage product`);
    }
    console.log(`stage planner vs exhaustive: 800 domains × 3 methods, ${withPlan} with a plan, ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 8)).toEqual([]);
    expect(withPlan).toBeGreaterThan(500);
  });

  it('whole samples per cycle: identical plans on 500 seeded small domains', () => {
    const rnd = seededRandom(0x3a11_57a6);
    const mismatches: string[] = [];
    let withPlan = 0;
    for (let i = 0; i < 500; i++) {
      const { hw, req } = randomStageCase(rnd);
      const oracle = planKey(exhaustivePlan(hw, req, false, true));
      if (oracle !== 'none') withPlan++;
      const got = planKey(nearestWholeCycle(hw, req, false));
      if (got !== oracle) mismatches.push(`#${i}: ${got} vs oracle ${oracle}`);
    }
    console.log(`stage whole-cycle planner vs exhaustive: 500 domains, ${withPlan} with a plan, ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 8)).toEqual([]);
    expect(withPlan).toBeGreaterThan(300);
  });
});

describe('planner with a two-stage divider = the best over every first-stage value (medium domains, too large for the oracle)', () => {
  // Second method: for each prescaler value x the stage problem is the plain one on the clock
  // f_sys/x with the period's range as the divider, solved by the contiguous-divider planner
  // (itself proven against the oracle in search.test.ts); the best of those under the documented
  // order (smaller |error|, larger S, shorter N, lower f_out) is the stage optimum.
  it('identical plans on 60 seeded domains (targets 0.01 Hz to 1 kHz) with a 16-bit period and prescalers up to 24', () => {
    const rnd = seededRandom(0xdec0_4b05);
    const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
    const mismatches: string[] = [];
    let prescaled = 0;
    for (let i = 0; i < 60; i++) {
      const systemClockHz = rat(int(8, 200) * 1_000_000);
      const x2 = int(2, 24);
      const stages = [stage('prescaler', 1, x2, -1), stage('period', 2, 65536, -1)];
      const memory = { budgetBytes: 1 << 16, tableLengthMin: 16, tableLengthMax: int(256, 4096), powerOfTwo: false };
      const dac = { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: div(systemClockHz, rat(int(1, 8))) };
      const hw: Hardware = { systemClockHz, divider: { integerMin: 2, integerMax: x2 * 65536, fractionBits: 0, stages }, dac, memory };
      const targetHz = div(rat(Math.round(10 ** (rnd() * 5) * 1000)), rat(100_000));
      const req = { targetHz, minSamplesPerCycle: rat(int(4, 16)) };
      let best: Plan | null = null;
      for (let x = 1; x <= x2; x++) {
        const sub: Hardware = { systemClockHz: div(systemClockHz, rat(x)), divider: { integerMin: 2, integerMax: 65536, fractionBits: 0 }, dac, memory };
        const q = nearestJitterFree(sub, req);
        if (q === null) continue;
        // The sample-rate limit f_sys/(x·y) ≤ max is the same on the sub-problem's clock.
        const plan: Plan = { ...q, dividerInteger: x * q.dividerInteger };
        if (best === null || rankOrder(plan, best) < 0) best = plan;
      }
      const got = nearestJitterFree(hw, req);
      if (got !== null && got.dividerInteger > 65536) prescaled++;
      if (planKey(got) !== planKey(best)) mismatches.push(`#${i} x2 ${x2} target ${targetHz.num}/${targetHz.den}: ${planKey(got)} vs ${planKey(best)}`);
    }
    console.log(`stage planner vs best over first-stage values: 60 domains, ${prescaled} dividers above the period's range, ${mismatches.length} mismatches`);
    expect(mismatches).toEqual([]);
    expect(prescaled).toBeGreaterThan(15);
  });
});

/** The documented order of jitter-free plans (rank.ts): smaller |error|, larger S, shorter N, lower f_out. */
function rankOrder(a: Plan, b: Plan): number {
  return (
    cmp(abs(a.errorHz), abs(b.errorHz)) ||
    cmp(div(rat(b.tableLength), b.cycles), div(rat(a.tableLength), a.cycles)) ||
    a.tableLength - b.tableLength ||
    cmp(a.achievedHz, b.achievedHz)
  );
}
