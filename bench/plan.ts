// Planner speed on the full domain, against a plain double loop over every (J, N).
// Run: npx tsx bench/plan.ts  (the machine is shared and noisy: read the medians).

import { rat, parseDecimal, toNumber } from '../shared-schema/src/rational';
import { bestFractional, nearestJitterFree } from '../server/src/planning/search';
import type { Hardware, Plan, PlanRequest } from '../server/src/planning/types';
import { seededRandom } from '../test/support/seeded';


const board = (fractionBits: number): Hardware => ({
  systemClockHz: rat(125_000_000),
  divider: { integerMin: 1, integerMax: 65535, fractionBits },
  dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(125_000_000) },
  memory: { budgetBytes: 64 * 1024, tableLengthMin: 16, tableLengthMax: 32768, powerOfTwo: false },
});

const TARGETS = Number(process.env.TARGETS ?? 200);
const BRUTE = Number(process.env.BRUTE ?? 3);
const rnd = seededRandom(0xbe7c4);
const requests: PlanRequest[] = [];
for (let i = 0; i < TARGETS; i++) {
  // Log-uniform 1 Hz … 20 MHz, written with 6 significant digits as an engineer would type it.
  const hz = 10 ** (rnd() * Math.log10(2e7));
  const text = hz.toPrecision(6);
  requests.push({ targetHz: parseDecimal(text)!, minSamplesPerCycle: rat(4 + Math.floor(rnd() * 29)) });
}

function quantile(xs: number[], q: number): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.min(s.length - 1, Math.floor(q * s.length))]!;
}

function timeEach(run: (req: PlanRequest) => Plan | null): { ms: number[]; plans: (Plan | null)[] } {
  const ms: number[] = [];
  const plans: (Plan | null)[] = [];
  for (const req of requests) {
    const t0 = performance.now();
    plans.push(run(req));
    ms.push(performance.now() - t0);
  }
  return { ms, plans };
}

/** Every J and every N, M = round(f_target·J·N/C) clamped: the plain way, in doubles. */
function plainLoop(hw: Hardware, req: PlanRequest): { j: number; n: number; m: number; err: number } {
  const C = toNumber(hw.systemClockHz);
  const T = toNumber(req.targetHz);
  const s = toNumber(req.minSamplesPerCycle);
  const nMax = Math.min(hw.memory.tableLengthMax, Math.floor(hw.memory.budgetBytes / hw.dac.sampleBytes));
  let best = { j: 0, n: 0, m: 0, err: Infinity };
  for (let j = hw.divider.integerMin; j <= hw.divider.integerMax; j++) {
    const x = (T * j) / C;
    for (let n = hw.memory.tableLengthMin; n <= nMax; n++) {
      const top = Math.floor(n / s);
      const m = Math.min(Math.max(Math.round(x * n), 1), top);
      const err = Math.abs((C * m) / (j * n) - T);
      if (err < best.err) best = { j, n, m, err };
    }
  }
  return best;
}

function report(label: string, ms: number[]): number {
  const total = ms.reduce((a, b) => a + b, 0);
  const median = quantile(ms, 0.5);
  console.log(
    `${label.padEnd(34)} median ${median.toFixed(3)} ms   p95 ${quantile(ms, 0.95).toFixed(3)} ms   ` +
      `max ${Math.max(...ms).toFixed(1)} ms   ${((1000 * ms.length) / total).toFixed(0)} plans/s`,
  );
  return median;
}

console.log(`full domain: 125 MHz, I 1…65535, N 16…32768 (64 KiB, 2-byte samples), S floor 4…32, ${TARGETS} targets 1 Hz…20 MHz`);
timeEach((r) => nearestJitterFree(board(0), r)); // warm-up
const whole = timeEach((r) => nearestJitterFree(board(0), r));
const wholeMedian = report('jitter-free (integer divider)', whole.ms);
const frac = timeEach((r) => bestFractional(board(8), r));
report('fractional (8 fraction bits)', frac.ms);

const bruteMs: number[] = [];
const plannerMs: number[] = [];
let agree = 0;
// Targets for the plain loop: the planner's median case and harder ones (its 80th, 95th percentile).
const byCost = whole.ms.map((ms, i) => [ms, i] as const).sort((a, b) => a[0] - b[0]);
const picks = [0.5, 0.8, 0.95, 0.3, 0.1].slice(0, BRUTE).map((q) => byCost[Math.floor(q * (byCost.length - 1))]![1]);
for (const [k, i] of picks.entries()) {
  const req = requests[i]!;
  const t0 = performance.now();
  const b = plainLoop(board(0), req);
  bruteMs.push(performance.now() - t0);
  plannerMs.push(whole.ms[i]!);
  const p = whole.plans[i]!;
  const pErr = Math.abs(toNumber(p.errorHz));
  // The plain loop cannot separate near-ties in doubles; equal error (to 1e-9 relative) is agreement.
  if (Math.abs(pErr - b.err) <= 1e-9 * toNumber(req.targetHz)) agree++;
  console.log(
    `  target ${toNumber(req.targetHz)} Hz: planner (${whole.ms[i]!.toFixed(3)} ms) I=${p.dividerInteger} N=${p.tableLength} M=${p.cycles.num} err ${pErr.toExponential(3)} Hz; ` +
      `plain loop I=${b.j} N=${b.n} M=${b.m} err ${b.err.toExponential(3)} Hz (${bruteMs[k]!.toFixed(0)} ms)`,
  );
}
const bruteMedian = quantile(bruteMs, 0.5);
console.log(
  `plain double loop over every (J, N), ${BRUTE} targets: median ${bruteMedian.toFixed(0)} ms; planner on the same ` +
    `targets median ${quantile(plannerMs, 0.5).toFixed(3)} ms; speed-up ×${(bruteMedian / quantile(plannerMs, 0.5)).toFixed(0)} ` +
    `(×${(bruteMedian / wholeMedian).toFixed(0)} against the planner's overall median); same error on ${agree}/${BRUTE}`,
);
