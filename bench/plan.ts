// Planner speed on the full domain, against the walk alone (the planner before the exact and
// cycles searches, still one of its methods) and a plain double loop over every (J, N).
// Run: npx tsx bench/plan.ts  (the machine is shared and noisy: each target is timed REPEAT times,
// default 3, and its least time kept, which drops pauses from other processes; the planner and the
// walk are timed on alternate calls, so both see the same load).

import { rat, parseDecimal, toNumber } from '../shared-schema/src/rational';
import { bestFractionalBy, nearestJitterFreeBy, type Strategy } from '../server/src/planning/search';
import type { Hardware, Plan, PlanRequest } from '../server/src/planning/types';
import { seededRandom } from '../test/support/seeded';
import { FRACTION_BITS, INTEGER_MAX, SYSTEM_CLOCK_HZ, TABLE_MAX, TABLE_MIN, fullDomainBoard } from './full-domain';


const board = fullDomainBoard;

const TARGETS = Number(process.env.TARGETS ?? 200);
const BRUTE = Number(process.env.BRUTE ?? 3);
const REPEAT = Math.max(1, Number(process.env.REPEAT ?? 3));
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

/** Times both strategies on every request, alternating so that both see the same load. */
function timeBoth(run: (req: PlanRequest, s: Strategy) => Plan | null): Record<'auto' | 'walk', { ms: number[]; plans: (Plan | null)[] }> {
  const out = { auto: { ms: [] as number[], plans: [] as (Plan | null)[] }, walk: { ms: [] as number[], plans: [] as (Plan | null)[] } };
  for (const req of requests) {
    const least = { auto: Infinity, walk: Infinity };
    const plans: Record<'auto' | 'walk', Plan | null> = { auto: null, walk: null };
    for (let k = 0; k < REPEAT; k++) {
      for (const s of ['auto', 'walk'] as const) {
        const t0 = performance.now();
        const plan = run(req, s);
        least[s] = Math.min(least[s], performance.now() - t0);
        plans[s] = plan;
      }
    }
    for (const s of ['auto', 'walk'] as const) {
      out[s].plans.push(plans[s]);
      out[s].ms.push(least[s]);
    }
  }
  return out;
}

/** Same plan (divider, table, cycles) from both strategies on every request. */
function agreement(a: (Plan | null)[], b: (Plan | null)[]): number {
  let same = 0;
  for (let i = 0; i < a.length; i++) {
    const p = a[i]!, q = b[i]!;
    if (p === null || q === null ? p === q : p.dividerInteger === q.dividerInteger && p.dividerFraction === q.dividerFraction &&
      p.tableLength === q.tableLength && p.cycles.num === q.cycles.num && p.cycles.den === q.cycles.den) same++;
  }
  return same;
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
  const within = ms.filter((x) => x <= 2).length;
  console.log(
    `${label.padEnd(40)} median ${median.toFixed(3)} ms   p95 ${quantile(ms, 0.95).toFixed(3)} ms   ` +
      `max ${Math.max(...ms).toFixed(1)} ms   ${((1000 * ms.length) / total).toFixed(0)} plans/s   ≤ 2 ms: ${within}/${ms.length}`,
  );
  return median;
}

console.log(
  `full domain: ${SYSTEM_CLOCK_HZ / 1e6} MHz, I 1…${INTEGER_MAX}, N ${TABLE_MIN}…${TABLE_MAX} (64 KiB, 2-byte samples), S floor 4…32, ` +
    `${TARGETS} targets 1 Hz…20 MHz; ` +
    `least of ${REPEAT} timings per target`,
);
const wholeRun = (r: PlanRequest, s: Strategy): Plan | null => nearestJitterFreeBy(board(0), r, s);
const fracRun = (r: PlanRequest, s: Strategy): Plan | null => bestFractionalBy(board(FRACTION_BITS), r, s);
timeBoth(wholeRun); // warm-up
const wholeTimes = timeBoth(wholeRun);
const whole = wholeTimes.auto;
const wholeMedian = report('jitter-free (integer divider)', whole.ms);
const wholeWalkMedian = report('  the walk alone', wholeTimes.walk.ms);
const fracTimes = timeBoth(fracRun);
const fracMedian = report(`fractional (${FRACTION_BITS} fraction bits)`, fracTimes.auto.ms);
const fracWalkMedian = report('  the walk alone', fracTimes.walk.ms);
console.log(
  `planner over the walk alone: median ×${(wholeWalkMedian / wholeMedian).toFixed(1)} (jitter-free), ` +
    `×${(fracWalkMedian / fracMedian).toFixed(1)} (fractional); same plan on ` +
    `${agreement(whole.plans, wholeTimes.walk.plans)}/${TARGETS} and ${agreement(fracTimes.auto.plans, fracTimes.walk.plans)}/${TARGETS}`,
);

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
if (BRUTE > 0) {
  const bruteMedian = quantile(bruteMs, 0.5);
  console.log(
    `plain double loop over every (J, N), ${BRUTE} targets: median ${bruteMedian.toFixed(0)} ms; planner on the same ` +
      `targets median ${quantile(plannerMs, 0.5).toFixed(3)} ms; speed-up ×${(bruteMedian / quantile(plannerMs, 0.5)).toFixed(0)} ` +
      `(×${(bruteMedian / wholeMedian).toFixed(0)} against the planner's overall median); same error on ${agree}/${BRUTE}`,
  );
}
