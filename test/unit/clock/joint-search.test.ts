// The joint search over every reachable system clock is proven against exhaustive search: on
// seeded small boards with reduced PLL spaces, the pruned search returns the same best clocks,
// in the same order, with the same scores and plans, as planning every output on every clock.
import { describe, expect, it } from 'vitest';
import { type Rational, ZERO, mul, parseDecimal, rat, toNumber } from '../../../shared-schema/src/rational';
import { type ClockTree, FIXED_CLOCK, type PllRanges } from '../../../server/src/planning/clock-source';
import { exactPossible } from '../../../server/src/planning/exact-reach';
import { planOutputUncached } from '../../../server/src/planning/choose';
import { jointSearch, jointSearchExhaustive } from '../../../server/src/planning/joint-search';
import { type GroupSpec, plainSpec } from '../../../server/src/planning/board-plan';
import type { Hardware, OutputRequest } from '../../../server/src/planning/types';
import { seededRandom } from '../../support/seeded';
import { analyze } from '../../../server/src/spec/analyze';
import { clockCandidatesJson } from '../../../server/src/cli/clock-json';

const hz = (t: string): Rational => parseDecimal(t)!;
const sine = { shape: 'sine' as const, duty: 0.5, amplitudeVpp: 1, offsetV: 1 };

function board(random: () => number): { hw: Hardware; requests: OutputRequest[]; groups: GroupSpec[] } {
  const pick = (lo: number, hi: number) => lo + Math.floor(random() * (hi - lo + 1));
  const crystal = [8e6, 10e6, 12e6, 16e6, 25e6][pick(0, 4)]!;
  const r0 = pick(1, 3);
  const n0 = pick(4, 20);
  const pll: PllRanges = {
    crystalHz: rat(crystal),
    referenceDivider: { min: r0, max: r0 + pick(0, 3) },
    feedbackMultiplier: { min: n0, max: n0 + pick(2, 30) },
    phaseDetectorHz: null,
    vcoHz: { min: rat(crystal * 2), max: rat(crystal * pick(8, 40)) },
    postStages: [{ name: 'p', values: [...new Set([pick(1, 3), pick(2, 6), pick(4, 10)])].sort((a, b) => a - b) }],
  };
  const e = [ZERO, rat(20n, 1_000_000n), rat(50n, 1_000_000n)][pick(0, 2)]!;
  const tree: ClockTree = { ...FIXED_CLOCK, source: 'pll', pll, toleranceRatio: e, ratedHz: random() < 0.5 ? rat(crystal * pick(2, 10)) : null };
  const powerOfTwo = random() < 0.5;
  const hw: Hardware = {
    systemClockHz: rat(crystal * pick(2, 6), pick(1, 3)),
    systemClockTolerance: e,
    clockTree: tree,
    divider: { integerMin: 1, integerMax: pick(8, 200), fractionBits: random() < 0.3 ? 2 : 0 },
    dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(crystal * pick(1, 4)) },
    memory: { budgetBytes: 2 * pick(64, 2048), tableLengthMin: pick(4, 16), tableLengthMax: pick(32, 512), powerOfTwo },
  };
  const requests: OutputRequest[] = Array.from({ length: pick(1, 4) }, () => {
    // Half the targets are round numbers that some clocks make exactly; the rest are awkward.
    const target = random() < 0.5 ? rat(pick(1, 400) * 1000) : rat(pick(1, 40_000_000), pick(1, 97));
    const ppm = [0, 1, 10, 50, 100, 1000, 20_000][pick(0, 6)]!;
    return {
      targetHz: target,
      minSamplesPerCycle: rat(pick(4, 16)),
      wholeSamplesPerCycle: random() < 0.3,
      waveform: sine,
      toleranceHz: { num: target.num * BigInt(ppm), den: target.den * 1_000_000n },
      jitter: random() < 0.3 ? 'allow' : 'forbid',
    };
  });
  // A group on a third of the boards with two outputs or more: a shared sample clock, a phase
  // lock with offsets, or one table two DMA channels start at different samples of.
  const groups: GroupSpec[] = [];
  if (requests.length >= 2 && random() < 0.35) {
    // A shared divider is searched one value at a time: a short divider range keeps the oracle quick.
    hw.divider.integerMax = Math.min(hw.divider.integerMax, 40);
    const lock = (['sample-clock', 'phase', 'phase'] as const)[pick(0, 2)]!;
    const sharedTable = lock === 'phase' && random() < 0.4;
    if (lock === 'phase' && !sharedTable && random() < 0.5) requests[1] = { ...requests[1]!, targetHz: mul(requests[0]!.targetHz, rat(pick(2, 3))) };
    if (sharedTable) requests[1] = { ...requests[0]! };
    groups.push({ lock, members: [0, 1], offsetsDeg: lock === 'phase' ? [0, [90, 120, 45][pick(0, 2)]!] : [0, 0], sharedTable });
  }
  return { hw, requests, groups };
}

const summary = (r: ReturnType<typeof jointSearch>) =>
  r!.candidates.map((c) => ({
    clock: `${c.clock.systemClockHz.num}/${c.clock.systemClockHz.den}`,
    setting: c.clock.setting && [c.clock.setting.referenceDivider, c.clock.setting.feedbackMultiplier, ...c.clock.setting.postDividers],
    score: { ...c.score, worst: c.score.worst.infinite ? 'inf' : `${c.score.worst.value.num}/${c.score.worst.value.den}`, distance: `${c.score.distance.num}/${c.score.distance.den}`, clockHz: undefined },
    plans: c.plans.map((p) => p.plan && [p.verdict, p.plan.dividerInteger, p.plan.dividerFraction, p.plan.tableLength, `${p.plan.cycles.num}`]),
  }));

describe('joint search = exhaustive joint search (every output planned on every reachable clock)', () => {
  it('identical best five on 300 seeded small boards with reduced PLL spaces', () => {
    const random = seededRandom(2026);
    let clocks = 0;
    let planned = 0;
    let exhaustivePlans = 0;
    let grouped = 0;
    let shrunk = 0;
    let overBudget = 0;
    for (let k = 0; k < 300; k++) {
      const { hw, requests, groups } = board(random);
      const spec = { requests, groups };
      const fast = jointSearch(hw, [spec], 5);
      const slow = jointSearchExhaustive(hw, [spec], 5);
      expect(summary(fast), `board ${k}`).toEqual(summary(slow));
      grouped += groups.length;
      shrunk += slow!.candidates.filter((c) => c.plans.some((p) => p.shrunkFrom)).length;
      overBudget += slow!.candidates.filter((c) => !c.score.fits).length;
      clocks += slow!.reachable;
      planned += fast!.plansMade;
      exhaustivePlans += slow!.plansMade;
    }
    console.log(`joint search vs exhaustive: 300 boards (${grouped} with a group), ${clocks} reachable clocks, ${planned} plans made against ${exhaustivePlans} exhaustive; among the best five ${shrunk} candidates fitted to the budget, ${overBudget} over it; 0 mismatches`);
    // The proof must reach the budget fit and the groups, or it proves less than it says.
    expect(grouped).toBeGreaterThan(30);
    expect(shrunk).toBeGreaterThan(30);
  });

  it('the exact-plan test never rules out a clock where the planner finds an exact plan (1000 seeded cases)', () => {
    const random = seededRandom(99);
    let exact = 0;
    for (let k = 0; k < 1000; k++) {
      const { hw, requests } = board(random);
      for (const req of requests) {
        // A clock that makes the target exactly with some D, N, M (f_sys = f_target·D·N/M), or a random one.
        const [d, n, m] = [1 + Math.floor(random() * hw.divider.integerMax), hw.memory.tableLengthMin + Math.floor(random() * 8), 1 + Math.floor(random() * 2)];
        const clock = random() < 0.7 ? { num: req.targetHz.num * BigInt(d * n), den: req.targetHz.den * BigInt(m) } : rat(Math.round(random() * 1e8) + 1e6, Math.floor(random() * 3) + 1);
        const p = planOutputUncached({ ...hw, systemClockHz: clock }, { ...req, jitter: 'forbid' });
        if (p.nearestJitterFree?.errorHz.num === 0n) {
          exact++;
          expect(exactPossible(hw, { ...req, jitter: 'forbid' }, clock), `case ${k}`).toBe(true);
        }
      }
    }
    expect(exact).toBeGreaterThan(50);
  });
});

describe('the board of the clock-tree brief, with a PLL able to reach 120 MHz (invented figures)', () => {
  // 100 MHz FPGA board, 14-bit DAC, power-of-two tables up to 16384, 64 KiB; 40 kHz and 1.5 MHz sines.
  const pll: PllRanges = {
    crystalHz: hz('25e6'),
    referenceDivider: { min: 1, max: 4 },
    feedbackMultiplier: { min: 8, max: 64 },
    phaseDetectorHz: { min: hz('5e6'), max: hz('25e6') },
    vcoHz: { min: hz('400e6'), max: hz('800e6') },
    postStages: [{ name: 'p', values: [2, 4, 5, 6, 8] }],
  };
  const hw: Hardware = {
    systemClockHz: hz('100e6'),
    clockTree: { ...FIXED_CLOCK, source: 'pll', pll, ratedHz: hz('125e6') },
    divider: { integerMin: 1, integerMax: 65535, fractionBits: 0 },
    dac: { bits: 14, sampleBytes: 2, fullScaleV: 2, maxSampleRateHz: hz('20e6') },
    memory: { budgetBytes: 65536, tableLengthMin: 16, tableLengthMax: 16384, powerOfTwo: true },
  };
  const req = (f: string): OutputRequest => ({ targetHz: hz(f), minSamplesPerCycle: rat(8), waveform: sine, toleranceHz: { num: hz(f).num * 50n, den: 1_000_000n }, jitter: 'forbid' });
  const requests = [req('40e3'), req('1.5e6')];

  it('at 100 MHz the nearest plans are -4.36 and -40.69 ppm; the first candidate makes both exact with 16-sample tables (32 B each)', () => {
    const now = requests.map((r) => planOutputUncached(hw, r));
    expect(now.map((p) => Number(p.plan!.errorPpm.toFixed(2)))).toEqual([-4.36, -40.69]);
    const result = jointSearch(hw, [plainSpec(requests)], 5)!;
    const first = result.candidates[0]!;
    expect(first.score.exact).toBe(2);
    expect(first.plans.map((p) => p.plan!.tableLength)).toEqual([16, 16]);
    expect(first.score.bytes).toBe(64);
    expect(now.reduce((s, p) => s + p.plan!.tableBytes, 0)).toBeGreaterThan(first.score.bytes);
    // 120 MHz: 40 kHz = 120 MHz / 375 · 2/16 and 1.5 MHz = 120 MHz / 10 · 2/16 (derived).
    const at120 = result.candidates.find((c) => toNumber(c.clock.systemClockHz) === 120e6);
    expect(at120?.plans.map((p) => [p.plan!.dividerInteger, p.plan!.tableLength, Number(p.plan!.cycles.num)])).toEqual([[375, 16, 2], [10, 16, 2]]);
    expect(summary(result)).toEqual(summary(jointSearchExhaustive(hw, [plainSpec(requests)], 5)));
  });
});

describe('the checker JSON ranks the clocks of a clock file with a PLL', () => {
  const clockText = `system-clock: 100 MHz
rated-system-clock: 125 MHz
pll:
  crystal: 25 MHz
  reference-divider: { min: 1, max: 4 }
  feedback-multiplier: { min: 8, max: 64 }
  phase-detector: { min: 5 MHz, max: 25 MHz }
  vco: { min: 400 MHz, max: 800 MHz }
  post-dividers:
    p: { values: [2, 4, 5, 6, 8] }
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
  const waveText = 'clock: ./board.clock.yaml\noutputs:\n  tone: { shape: sine, frequency: 40 kHz }\n  fast: { shape: sine, frequency: 1.5 MHz }\n';
  it('first: 120 MHz = 25 MHz / 1 · 24 / 5 (VCO 600 MHz, mid-range), both outputs exact in 64 B; the 100 MHz in use fills 48 KiB (derived)', () => {
    const host = { readFile: (p: string) => (p.endsWith('board.clock.yaml') ? clockText : undefined) };
    const a = analyze('/b/board.wave.yaml', waveText, host);
    expect(a.memory?.usedBytes).toBe(48 * 1024);
    const [first] = clockCandidatesJson(a);
    expect(first).toMatchObject({
      systemClockHz: 120e6,
      current: false,
      aboveRated: false,
      pll: { referenceDivider: 1, feedbackMultiplier: 24, postDividers: { p: 5 }, phaseDetectorHz: 25e6, vcoHz: 600e6, vcoMargin: 0.5 },
      exactOutputs: 2,
      withinTolerance: 2,
      worstErrorPpm: 0,
      tableBytes: 64,
    });
  });
});
