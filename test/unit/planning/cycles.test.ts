// The fast paths of the plan search (exact plans by number theory, the best-first search over
// cycles and products, its divisor and heap helpers) against independent oracles: the
// exhaustive search of test/support/exhaustive.ts, the walk (a separate exact method), plain
// trial division and the JavaScript sort.

import { describe, expect, it } from 'vitest';
import { rat, mul, div, parseDecimal } from '../../../shared-schema/src/rational';
import { bestFractionalBy, nearestJitterFreeBy, type Strategy } from '../../../server/src/planning/search';
import { divisorsInRange, primesUpTo } from '../../../server/src/planning/divisors';
import { ProductHeap } from '../../../server/src/planning/heap';
import type { Hardware, Plan, PlanRequest } from '../../../server/src/planning/types';
import { exhaustivePlan, planKey } from '../../support/exhaustive';
import { seededRandom } from '../../support/seeded';

interface Case {
  hw: Hardware;
  req: PlanRequest;
  label: string;
}

/**
 * Domains where both spans are long next to the target's period, so the cycles search (and not
 * the walk) carries the answer: low targets, many dividers, many table lengths.
 */
function lowTargetCase(rnd: () => number, index: number, size: number): Case {
  const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
  const systemClockHz = rat(int(10_000, 2_000_000), pick([1, 1, 3, 7]));
  const fractionBits = pick([0, 0, 1, 2, 3]);
  const integerMin = pick([1, 1, 2, 5]);
  const integerMax = integerMin + int(size / 4, size);
  const tableLengthMin = int(1, 12);
  const tableLengthMax = tableLengthMin + int(size / 4, size);
  const sampleBytes = pick([1, 2]);
  const budgetBytes = rnd() < 0.7 ? tableLengthMax * sampleBytes : int(tableLengthMin, tableLengthMax) * sampleBytes;
  const hw: Hardware = {
    systemClockHz,
    divider: { integerMin, integerMax, fractionBits },
    dac: { bits: 12, sampleBytes, fullScaleV: 3.3, maxSampleRateHz: rnd() < 0.8 ? systemClockHz : div(systemClockHz, rat(int(2, 9))) },
    memory: { budgetBytes, tableLengthMin, tableLengthMax, powerOfTwo: rnd() < 0.15 },
  };
  // f_sys/(J·N) spans [f_sys/(J max·N max), f_sys]; aim into its lower part, where both spans are long.
  const lowest = div(systemClockHz, rat(integerMax * tableLengthMax));
  const kind = pick(['arbitrary', 'arbitrary', 'arbitrary', 'exact', 'many digits']);
  // 'many digits': a target written with ~18 significant digits, beyond the exact float keys.
  const targetHz =
    kind === 'exact'
      ? div(systemClockHz, rat(int(1, integerMax) * int(1, tableLengthMax), int(1, 3)))
      : kind === 'many digits'
        ? mul(lowest, rat(10n ** 17n + BigInt(int(1, 1e9)) * 999_999_937n, 10n ** 15n + BigInt(int(1, 1e6))))
        : mul(lowest, rat(int(1_000, 400_000), int(100, 1_000)));
  const minSamplesPerCycle = pick([rat(1), rat(2), rat(5, 2), rat(4), rat(7, 3)]);
  return { hw, req: { targetHz, minSamplesPerCycle }, label: `#${index} ${kind}` };
}

describe('cycles search = exhaustive search (oracle: test/support/exhaustive.ts, plain brute force)', () => {
  it('the forced cycles search finds the identical plan on 400 seeded low-target domains, jitter-free and fractional', () => {
    const rnd = seededRandom(0xc1c1e5);
    const mismatches: string[] = [];
    let withPlan = 0;
    for (let i = 0; i < 400; i++) {
      const { hw, req, label } = lowTargetCase(rnd, i, 60);
      for (const fractional of [false, true]) {
        const plan = fractional ? bestFractionalBy(hw, req, 'cycles') : nearestJitterFreeBy(hw, req, 'cycles');
        const oracle = exhaustivePlan(hw, req, fractional);
        if (planKey(plan) !== planKey(oracle)) mismatches.push(`${label} ${fractional ? 'fractional' : 'jitter-free'}: ${planKey(plan)} vs oracle ${planKey(oracle)}`);
        if (oracle !== null) withPlan++;
      }
    }
    expect(mismatches.slice(0, 10)).toEqual([]);
    expect(withPlan).toBeGreaterThan(600);
  });
});

describe('cycles search with an S ceiling = exhaustive search restricted to S ≤ S max (oracle: test/support/exhaustive.ts)', () => {
  it('the forced cycles search finds the identical plan on 300 seeded low-target domains with a ceiling', () => {
    const rnd = seededRandom(0xc1c1_ce11);
    const mismatches: string[] = [];
    let withPlan = 0;
    for (let i = 0; i < 300; i++) {
      const { hw, req, label } = lowTargetCase(rnd, i, 60);
      const f = Number(req.minSamplesPerCycle.num) / Number(req.minSamplesPerCycle.den);
      const ceiling = rnd() < 0.5 ? rat(Math.ceil(f) + Math.floor(rnd() * 30)) : mul(req.minSamplesPerCycle, rat(5, 2));
      for (const fractional of [false, true]) {
        const plan = fractional ? bestFractionalBy(hw, req, 'cycles', ceiling) : nearestJitterFreeBy(hw, req, 'cycles', ceiling);
        const oracle = exhaustivePlan(hw, req, fractional, false, ceiling);
        if (planKey(plan) !== planKey(oracle)) mismatches.push(`${label} ${fractional ? 'fractional' : 'jitter-free'} ≤ ${ceiling.num}/${ceiling.den}: ${planKey(plan)} vs oracle ${planKey(oracle)}`);
        if (oracle !== null) withPlan++;
      }
    }
    expect(mismatches.slice(0, 10)).toEqual([]);
    expect(withPlan).toBeGreaterThan(300);
  });

  it('auto, cycles and walk agree with a ceiling on 60 seeded medium domains', () => {
    const rnd = seededRandom(0x3ed1_ce11);
    const mismatches: string[] = [];
    for (let i = 0; i < 60; i++) {
      const { hw, req, label } = lowTargetCase(rnd, i, 3000);
      const ceiling = rat(8 + Math.floor(rnd() * 400));
      for (const fractional of [false, true]) {
        const run = (s: Strategy): Plan | null => (fractional ? bestFractionalBy(hw, req, s, ceiling) : nearestJitterFreeBy(hw, req, s, ceiling));
        const walk = run('walk');
        for (const s of ['cycles', 'auto'] as const) {
          const got = run(s);
          if (planKey(got) !== planKey(walk)) mismatches.push(`${label} ${fractional ? 'fractional' : 'jitter-free'} ${s}: ${planKey(got)} vs walk ${planKey(walk)}`);
        }
      }
    }
    expect(mismatches.slice(0, 10)).toEqual([]);
  });
});

describe('the three strategies agree where the oracle is too slow (walk = the separate exact method of scan.ts)', () => {
  it('auto, cycles and walk give the identical plan on 150 seeded medium domains (up to ~3000 dividers × 3000 lengths)', () => {
    const rnd = seededRandom(0x3ed1a);
    const mismatches: string[] = [];
    for (let i = 0; i < 150; i++) {
      const { hw, req, label } = lowTargetCase(rnd, i, 3000);
      for (const fractional of [false, true]) {
        const run = (s: Strategy): Plan | null => (fractional ? bestFractionalBy(hw, req, s) : nearestJitterFreeBy(hw, req, s));
        const walk = run('walk');
        for (const s of ['cycles', 'auto'] as const) {
          const got = run(s);
          if (planKey(got) !== planKey(walk)) mismatches.push(`${label} ${fractional ? 'fractional' : 'jitter-free'} ${s}: ${planKey(got)} vs walk ${planKey(walk)}`);
        }
      }
    }
    expect(mismatches.slice(0, 10)).toEqual([]);
  });

  it('on a large domain (125 MHz, I 1…65535, N 16…32768, 8 fraction bits) for low targets', () => {
    const board = (fractionBits: number): Hardware => ({
      systemClockHz: rat(125_000_000),
      divider: { integerMin: 1, integerMax: 65535, fractionBits },
      dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(125_000_000) },
      memory: { budgetBytes: 64 * 1024, tableLengthMin: 16, tableLengthMax: 32768, powerOfTwo: false },
    });
    // Targets below ~5 kHz, where the walk is long: the slow cases of the walk alone.
    for (const [text, s] of [['3.16254', 4], ['15.3431', 9], ['262.832', 8], ['1858.39', 5], ['4321.77', 17]] as const) {
      const req = { targetHz: parseDecimal(text)!, minSamplesPerCycle: rat(s) };
      expect(planKey(nearestJitterFreeBy(board(0), req, 'auto')), `${text} Hz jitter-free`).toBe(planKey(nearestJitterFreeBy(board(0), req, 'walk')));
      expect(planKey(bestFractionalBy(board(8), req, 'auto')), `${text} Hz fractional`).toBe(planKey(bestFractionalBy(board(8), req, 'walk')));
    }
  });
});

describe('exact plans by number theory (derived: f_out = f_sys·M/(D·N))', () => {
  const hw: Hardware = {
    systemClockHz: rat(125_000_000),
    divider: { integerMin: 1, integerMax: 65535, fractionBits: 0 },
    dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(125_000_000) },
    memory: { budgetBytes: 64 * 1024, tableLengthMin: 16, tableLengthMax: 32768, powerOfTwo: false },
  };

  it('1 MHz from 125 MHz: 125 = D·N/M, the largest S is D = 1, N = 125, M = 1 (derived)', () => {
    const plan = nearestJitterFreeBy(hw, { targetHz: rat(1_000_000), minSamplesPerCycle: rat(4) }, 'auto');
    expect(plan).toMatchObject({ dividerInteger: 1, tableLength: 125 });
    expect(plan?.cycles).toEqual(rat(1));
    expect(plan?.errorHz).toEqual(rat(0));
  });

  it('1 Hz from 125 MHz: D·N = 125e6·M, so D is a multiple of 125e6/n for a divisor n ≤ 32768 of 125e6 = 2^6·5^9; the largest n is 2·5^6 = 31250 → D = 4000, N = 31250, M = 1 (derived)', () => {
    const plan = nearestJitterFreeBy(hw, { targetHz: rat(1), minSamplesPerCycle: rat(4) }, 'auto');
    expect(plan).toMatchObject({ dividerInteger: 4000, tableLength: 31250 });
    expect(plan?.cycles).toEqual(rat(1));
    expect(plan?.errorHz).toEqual(rat(0));
  });

  it('agrees with the walk on 40 exact targets f_sys·M/(D·N) of the full domain (derived)', () => {
    const rnd = seededRandom(0xe6ac7);
    for (let i = 0; i < 40; i++) {
      const d = 1 + Math.floor(rnd() * 65535);
      const n = 16 + Math.floor(rnd() * 32753);
      const m = 1 + Math.floor(rnd() * Math.floor(n / 4));
      const req = { targetHz: div(mul(rat(125_000_000), rat(m)), rat(d * n)), minSamplesPerCycle: rat(4) };
      const fast = nearestJitterFreeBy(hw, req, 'auto');
      expect(fast?.errorHz).toEqual(rat(0));
      expect(planKey(fast), `D=${d} N=${n} M=${m}`).toBe(planKey(nearestJitterFreeBy(hw, req, 'walk')));
    }
  });
});

describe('helpers', () => {
  it('divisorsInRange lists the same divisors as plain trial division (derived), across all three of its methods', () => {
    const rnd = seededRandom(0xd175);
    const out: number[] = [];
    for (let i = 0; i < 3000; i++) {
      const k = i % 3 === 0 ? Math.floor(rnd() * 2 ** 40) + 1 : i % 3 === 1 ? Math.floor(rnd() * 1e6) + 1 : 2 ** Math.floor(rnd() * 30) * 3 ** Math.floor(rnd() * 8);
      const lo = 1 + Math.floor(rnd() * 4000);
      const hi = lo + Math.floor(rnd() * (rnd() < 0.5 ? 40 : 40_000));
      divisorsInRange(k, lo, hi, out);
      const expected: number[] = [];
      for (let n = lo; n <= Math.min(hi, k); n++) if (k % n === 0) expected.push(n);
      expect([...out].sort((x, y) => x - y), `k=${k} [${lo}, ${hi}]`).toEqual(expected);
    }
  });

  it('primesUpTo gives the 168 primes below 1000, the last 997 (any table of primes)', () => {
    const primes = Array.from(primesUpTo(1000)).filter((p) => p < 1000);
    expect(primes.length).toBe(168);
    expect(primes[primes.length - 1]).toBe(997);
  });

  it('ProductHeap hands out keys in the order of Array.prototype.sort (oracle: the JavaScript sort)', () => {
    const rnd = seededRandom(0x4ea9);
    const heap = new ProductHeap();
    const keys: number[] = [];
    for (let i = 0; i < 2000; i++) {
      const key = Math.floor(rnd() * 500) / 7;
      keys.push(key);
      heap.push(key, i, i * 3, i % 2 ? 1 : -1);
    }
    const out: number[] = [];
    while (heap.size > 0) {
      out.push(heap.topKey());
      expect(heap.topProduct()).toBe(heap.topCycles() * 3);
      heap.pop();
    }
    expect(out).toEqual(keys.sort((x, y) => x - y));
  });
});
