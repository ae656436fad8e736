// The board's memory budget on a 32-output board with a tight budget: the time to choose every
// output's plan so the tables fit (menus built from cold, and again with the menus memoised, as
// after an edit to one output), beside the time to plan the outputs on their own.
// Run: npx tsx bench/board.ts   (least of REPEAT runs)

import { rat } from '../shared-schema/src/rational';
import { fitBoard, type BoardOutput } from '../server/src/planning/board';
import { planOutputUncached, preferenceOf } from '../server/src/planning/choose';
import { ShrinkMenu } from '../server/src/planning/shrink';
import type { Hardware, OutputRequest } from '../server/src/planning/types';
import { seededRandom } from '../test/support/seeded';

const REPEAT = Math.max(1, Number(process.env.REPEAT ?? 5));
const hw: Hardware = {
  systemClockHz: rat(84_000_000),
  divider: { integerMin: 1, integerMax: 65536, fractionBits: 0 },
  dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(2_000_000) },
  memory: { budgetBytes: 64 * 1024, tableLengthMin: 16, tableLengthMax: 32768, powerOfTwo: false },
};
const rnd = seededRandom(0xb0a4d32);
const reqs: OutputRequest[] = [];
for (let i = 0; i < 32; i++) {
  const shape = (['sine', 'sine', 'square', 'triangle'] as const)[i % 4];
  // Tones an engineer would type: whole hertz from 20 Hz to 20 kHz, some with decimals.
  const hz = Math.round(20 * 1000 ** rnd());
  const targetHz = i % 5 === 0 ? rat(hz * 10 + 7, 10) : rat(hz);
  reqs.push({
    targetHz,
    minSamplesPerCycle: rat(shape === 'sine' ? 8 : shape === 'square' ? 16 : 32),
    wholeSamplesPerCycle: shape !== 'sine',
    waveform: { shape, duty: 0.5, amplitudeVpp: 3.3 * 4095 / 4096, offsetV: 1.65 },
    toleranceHz: rat(targetHz.num * 50n, targetHz.den * 1_000_000n),
    jitter: 'forbid',
    maxSamplesPerCycle: rat(shape === 'sine' ? 12865 : shape === 'square' ? 50 : 8190),
    ...(shape === 'square' ? { duty: { asked: rat(1, 2), tolerance: rat(1, 100) } } : {}),
  });
}

let t0 = performance.now();
const planned = reqs.map((r) => planOutputUncached(hw, r));
const planMs = performance.now() - t0;
const own = planned.reduce((t, p) => t + (p.plan?.tableBytes ?? 0), 0);
const menusOf = (): BoardOutput[] =>
  planned.map((p, i) => ({ bytes: p.plan!.tableBytes, pref: preferenceOf(reqs[i]!, hw), menu: new ShrinkMenu(hw, reqs[i]!.targetHz, reqs[i]!.minSamplesPerCycle, preferenceOf(reqs[i]!, hw), p.plan!, reqs[i]!.wholeSamplesPerCycle === true, null) }));

const least = fitBoard(menusOf(), 1).leastBytes;
const budgets: [string, number][] = [
  ['the fewest bytes within tolerance', least],
  ['1.1 × the fewest', Math.floor(least * 1.1)],
  ['2 × the fewest', 2 * least],
  ['own plans less 1 %', Math.floor(own * 0.99)],
];
for (const [label, budget] of budgets) {
  const share = Number((budget / own).toPrecision(2));
  let cold = Infinity;
  let warm = Infinity;
  let fit = fitBoard(menusOf(), budget);
  for (let k = 0; k < REPEAT; k++) {
    const board = menusOf();
    t0 = performance.now();
    fit = fitBoard(board, budget);
    cold = Math.min(cold, performance.now() - t0);
    t0 = performance.now();
    fitBoard(board, budget);
    warm = Math.min(warm, performance.now() - t0);
  }
  const shrunk = fit.plans.filter((p) => p !== null).length;
  console.log(
    `32 outputs, own plans ${own} B, budget ${budget} B (${label}, ${(share * 100).toFixed(0)} % of own): fit ${cold.toFixed(1)} ms cold, ${warm.toFixed(1)} ms with memoised menus; ` +
      `${fit.fits ? `fits in ${fit.totalBytes} B, ${shrunk} shrunk, smallest share ${(Number(fit.minShare!.num) / Number(fit.minShare!.den)).toFixed(3)}` : `no fit (least ${fit.leastBytes} B)`}`,
  );
}
console.log(`planning the 32 outputs on their own: ${planMs.toFixed(1)} ms`);
