// Joint search speed: one system clock for a 16-output board over the full space of an invented
// PLL, the pruned search (planning/joint-search.ts) against the exhaustive joint search (every
// output planned on every reachable clock), side by side in one run.
// A second run gives the same board a tight memory budget, so most clocks need the board's budget
// fit (the checker's, planning/board-plan.ts) before they can be ranked.
// Run: npx tsx bench/joint.ts   (REPEAT, default 3: each search is timed that many times and its
// least time kept; EXHAUSTIVE=0 skips the exhaustive baselines, which take seconds.)

import { type Rational, parseDecimal, rat, toNumber } from '../shared-schema/src/rational';
import { type ClockTree, FIXED_CLOCK, pllSettingCount, reachableClocks } from '../server/src/planning/clock-source';
import { jointSearch, jointSearchExhaustive } from '../server/src/planning/joint-search';
import { plainSpec } from '../server/src/planning/board-plan';
import type { Hardware, OutputRequest, Shape } from '../server/src/planning/types';

const hz = (t: string): Rational => parseDecimal(t)!;
const REPEAT = Math.max(1, Number(process.env.REPEAT ?? 3));
const EXHAUSTIVE = process.env.EXHAUSTIVE !== '0';

// An invented board: a 12 MHz crystal (±20 ppm), R 1…15 with the phase detector at 1…3 MHz,
// N 32…400, a VCO of 150…500 MHz, one post divider of 2, 3, 4, 6 or 8; rated for 200 MHz.
const tree: ClockTree = {
  ...FIXED_CLOCK,
  source: 'pll',
  pll: {
    crystalHz: hz('12e6'),
    referenceDivider: { min: 1, max: 15 },
    feedbackMultiplier: { min: 32, max: 400 },
    phaseDetectorHz: { min: hz('1e6'), max: hz('3e6') },
    vcoHz: { min: hz('150e6'), max: hz('500e6') },
    postStages: [{ name: 'p', values: [2, 3, 4, 6, 8] }],
  },
  toleranceRatio: rat(20n, 1_000_000n),
  ratedHz: hz('200e6'),
};
const hw: Hardware = {
  systemClockHz: hz('96e6'),
  systemClockTolerance: tree.toleranceRatio,
  clockTree: tree,
  divider: { integerMin: 1, integerMax: 65535, fractionBits: 0 },
  dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: hz('25e6') },
  memory: { budgetBytes: 512 * 1024, tableLengthMin: 16, tableLengthMax: 16384, powerOfTwo: false },
};

// Sixteen outputs of a made-up test bench: round tones, audio, an odd carrier, squares and ramps.
const outputs: Array<[string, string, Shape, string?]> = [
  ['tone-1k', '1e3', 'sine'], ['audio-997', '997', 'sine'], ['a440', '440', 'sine', '100'],
  ['carrier-40k', '40e3', 'sine'], ['fast-1m5', '1.5e6', 'sine'], ['clock-250k', '250e3', 'square'],
  ['coil-5k', '5e3', 'sine', '100'], ['ref-12k5', '12.5e3', 'sine'], ['watch-32k', '32768', 'square'],
  ['mains-50', '50', 'sine', '1000'], ['mains-60', '60', 'sine', '1000'], ['ramp-100k', '100e3', 'sawtooth'],
  ['wide-2m', '2e6', 'sine', '200'], ['if-455k', '455e3', 'sine'], ['uart-ref', '1.8432e6', 'sine', '100'],
  ['tri-7k3', '7.3e3', 'triangle'],
];
const requests: OutputRequest[] = outputs.map(([, f, shape, ppm]) => {
  const target = hz(f);
  return {
    targetHz: target,
    minSamplesPerCycle: rat(shape === 'sine' ? 8 : shape === 'square' ? 16 : 32),
    wholeSamplesPerCycle: shape !== 'sine',
    waveform: { shape, duty: 0.5, amplitudeVpp: 3, offsetV: 1.65 },
    toleranceHz: { num: target.num * BigInt(ppm ?? 50), den: target.den * 1_000_000n },
    jitter: 'forbid',
  };
});

function least<T>(run: () => T): { ms: number; value: T } {
  let best = Infinity;
  let value!: T;
  for (let k = 0; k < REPEAT; k++) {
    const t0 = performance.now();
    value = run();
    best = Math.min(best, performance.now() - t0);
  }
  return { ms: best, value };
}

const settings = pllSettingCount(tree.pll!);
const enumerate = least(() => reachableClocks(tree, hw.systemClockHz)!);
console.log(`PLL space: ${settings} settings → ${enumerate.value.length} distinct system clocks (enumeration ${enumerate.ms.toFixed(1)} ms)`);

function run(label: string, board: Hardware): void {
  const fast = least(() => jointSearch(board, [plainSpec(requests)], 5)!);
  console.log(`joint search, ${requests.length} outputs, ${label}: ${fast.ms.toFixed(1)} ms (least of ${REPEAT}); ${fast.value.clocksPlanned} clocks planned, ${fast.value.plansMade} output plans`);
  for (const c of fast.value.candidates) {
    const s = c.score;
    const fitted = c.plans.filter((p) => p.shrunkFrom).length;
    console.log(`  ${(toNumber(c.clock.systemClockHz) / 1e6).toPrecision(9)} MHz  within ${s.within}/${requests.length}  exact ${s.exact}  jitter-free ${s.jitterFree}  ${s.bytes} B${s.fits ? '' : ' (over budget)'}${fitted ? `, ${fitted} fitted` : ''}  VCO margin ${(s.margin * 100).toFixed(1)} %${s.rated ? '' : '  ABOVE RATED'}`);
  }
  if (EXHAUSTIVE) {
    const slow = least(() => jointSearchExhaustive(board, [plainSpec(requests)], 5)!);
    const key = (r: typeof fast.value) => JSON.stringify(r.candidates.map((c) => [`${c.clock.systemClockHz.num}/${c.clock.systemClockHz.den}`, c.score.exact, c.score.within, c.score.bytes]));
    console.log(`exhaustive joint search: ${slow.ms.toFixed(0)} ms, ${slow.value.plansMade} output plans; same best five: ${key(slow.value) === key(fast.value)}; ratio ${(slow.ms / fast.ms).toFixed(1)}×`);
  }
}

run('budget 512 KiB', hw);
run('budget 96 KiB (the board fit on most clocks)', { ...hw, memory: { ...hw.memory, budgetBytes: 96 * 1024 } });
