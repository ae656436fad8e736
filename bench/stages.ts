// Planner speed with a divider of two 16-bit counter stages (prescaler 1…65536 × period 2…65536,
// the dividers a general-purpose timer makes), side by side with a plain integer divider over the
// same span 2…2^32, on the same targets, in one run.
// Run: npx tsx bench/stages.ts  (TARGETS, default 200, log-uniform 0.1 Hz … 1 MHz with 6 significant
// digits; REPEAT, default 3: each plan is timed REPEAT times and its least time kept, the two
// dividers on alternate calls so both see the same load).

import { rat, parseDecimal, mul } from '../shared-schema/src/rational';
import { nearestJitterFree } from '../server/src/planning/search';
import { nearestWholeCycle } from '../server/src/planning/whole';
import { splitDivider } from '../server/src/planning/stages';
import { planSteps, type StepsQuery } from '../server/src/planning/steps';
import type { Hardware, Plan, PlanRequest } from '../server/src/planning/types';
import { seededRandom } from '../test/support/seeded';

const STAGES = [
  { name: 'prescaler', min: 1, max: 65536, registerOffset: -1 },
  { name: 'period', min: 2, max: 65536, registerOffset: -1 },
];
const board = (stages: boolean): Hardware => ({
  systemClockHz: rat(96_000_000),
  divider: { integerMin: 2, integerMax: 2 ** 32, fractionBits: 0, ...(stages ? { stages: STAGES } : {}) },
  dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(4_000_000) },
  memory: { budgetBytes: 64 * 1024, tableLengthMin: 16, tableLengthMax: 32768, powerOfTwo: false },
});

const TARGETS = Number(process.env.TARGETS ?? 200);
const REPEAT = Math.max(1, Number(process.env.REPEAT ?? 3));
const rnd = seededRandom(0x57a9e);
const requests: PlanRequest[] = [];
for (let i = 0; i < TARGETS; i++) {
  const hz = 10 ** (-1 + rnd() * 7);
  requests.push({ targetHz: parseDecimal(hz.toPrecision(6))!, minSamplesPerCycle: rat(8) });
}

function quantile(xs: number[], q: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * s.length))]!;
}

type Search = (hw: Hardware, req: PlanRequest) => Plan | null;
const searches: Array<[string, Search]> = [
  ['sine (any S)', nearestJitterFree],
  ['square (whole S ≥ 16)', (hw, req) => nearestWholeCycle(hw, { ...req, minSamplesPerCycle: rat(16) }, false)],
];

console.log(`${TARGETS} targets, 0.1 Hz … 1 MHz, f_sys 96 MHz, tables 16…32768, least of ${REPEAT} timings each`);
console.log('search                  divider                       median ms   p95 ms   max ms   writable');
for (const [label, search] of searches) {
  const times = { stages: [] as number[], integer: [] as number[] };
  let writable = 0;
  let needsStages = 0;
  for (const req of requests) {
    const least = { stages: Infinity, integer: Infinity };
    let plans: { stages: Plan | null; integer: Plan | null } = { stages: null, integer: null };
    for (let k = 0; k < REPEAT; k++) {
      for (const kind of ['stages', 'integer'] as const) {
        const t0 = performance.now();
        const plan = search(board(kind === 'stages'), req);
        least[kind] = Math.min(least[kind], performance.now() - t0);
        plans = { ...plans, [kind]: plan };
      }
    }
    times.stages.push(least.stages);
    times.integer.push(least.integer);
    if (plans.stages !== null && splitDivider(STAGES, plans.stages.dividerInteger) !== null) writable++;
    if (plans.integer !== null && splitDivider(STAGES, plans.integer.dividerInteger) === null) needsStages++;
  }
  for (const kind of ['stages', 'integer'] as const) {
    const ms = times[kind];
    const name = kind === 'stages' ? 'two 16-bit stages' : 'integer 2…2^32 (same span)';
    const write = kind === 'stages' ? `${writable}/${TARGETS}` : `${TARGETS - needsStages}/${TARGETS}`;
    console.log(
      `${label.padEnd(24)}${name.padEnd(30)}${quantile(ms, 0.5).toFixed(3).padStart(9)}${quantile(ms, 0.95).toFixed(3).padStart(9)}${Math.max(...ms).toFixed(2).padStart(9)}   ${write}`,
    );
  }
}
console.log('writable: plans whose divider the two stages can make (prescaler · period); the integer divider ignores them.');

// Frequency steps on one table: an equal-tempered octave (13 steps, 440 Hz·2^(n/12) scaled to a
// base note drawn log-uniform 20 Hz … 5 kHz, 9 significant digits), 20 ppm each, on both dividers.
const OCTAVES = Number(process.env.OCTAVES ?? 40);
const octave: StepsQuery[] = [];
for (let i = 0; i < OCTAVES; i++) {
  const base = 20 * 250 ** rnd();
  const steps = [...Array(13).keys()].map((n) => {
    const targetHz = parseDecimal((base * 2 ** (n / 12)).toPrecision(9))!;
    return { targetHz, toleranceHz: mul(targetHz, rat(20, 1_000_000)) };
  });
  octave.push({ steps, minSamplesPerCycle: rat(8), maxSamplesPerCycle: null, wholeSamplesPerCycle: false, fractional: false, clockTolerance: null });
}
for (const kind of ['stages', 'integer'] as const) {
  const ms: number[] = [];
  let within = 0;
  let limited = 0;
  for (const q of octave) {
    let least = Infinity;
    let plan = null;
    for (let k = 0; k < REPEAT; k++) {
      const t0 = performance.now();
      plan = planSteps(board(kind === 'stages'), q);
      least = Math.min(least, performance.now() - t0);
    }
    ms.push(least);
    if (plan?.within) within++;
    if (plan?.steps[0]?.searchLimited) limited++;
  }
  const name = kind === 'stages' ? 'two 16-bit stages' : 'integer 2…2^32 (same span)';
  console.log(
    `${'octave, 13 steps'.padEnd(24)}${name.padEnd(30)}${quantile(ms, 0.5).toFixed(3).padStart(9)}${quantile(ms, 0.95).toFixed(3).padStart(9)}${Math.max(...ms).toFixed(2).padStart(9)}   ${within}/${OCTAVES} within 20 ppm, ${limited} at the work limit`,
  );
}
