// The whole per-output planning step (planOutputUncached: the nearest plan, the ranking's plan
// under S max, the figures) on the full domain, beside the nearest-plan search alone (what an
// output cost before the ranking), for sines (S max from a 12-bit swing) and whole-S squares.
// Run: npx tsx bench/ranking.ts   (least of REPEAT timings per target, both timed alternately)

import { rat, parseDecimal } from '../shared-schema/src/rational';
import { planOutput, planOutputUncached, planningCache } from '../server/src/planning/choose';
import { stepsPerOutput } from '../server/src/planning/work';
import { nearestJitterFree } from '../server/src/planning/search';
import { nearestWholeCycle } from '../server/src/planning/whole';
import type { Hardware, OutputRequest } from '../server/src/planning/types';
import { seededRandom } from '../test/support/seeded';
import { FRACTION_BITS, fullDomainBoard, fullDomainText } from './full-domain';

// The planner benchmark's board, with its fraction bits.
const hw: Hardware = fullDomainBoard(FRACTION_BITS);
const TARGETS = Number(process.env.TARGETS ?? 200);
const REPEAT = Math.max(1, Number(process.env.REPEAT ?? 3));
const rnd = seededRandom(0xbe7c4);

function requests(shape: 'sine' | 'square'): OutputRequest[] {
  const out: OutputRequest[] = [];
  for (let i = 0; i < TARGETS; i++) {
    const targetHz = parseDecimal((10 ** (rnd() * Math.log10(2e6))).toPrecision(6))!;
    out.push({
      targetHz,
      minSamplesPerCycle: rat(shape === 'sine' ? 8 : 16),
      wholeSamplesPerCycle: shape === 'square',
      waveform: { shape, duty: 0.5, amplitudeVpp: 3.3 * 4095 / 4096, offsetV: 1.65 },
      toleranceHz: rat(targetHz.num * 50n, targetHz.den * 1_000_000n),
      jitter: 'forbid',
      maxSamplesPerCycle: rat(shape === 'sine' ? 12865 : 50),
      ...(shape === 'square' ? { duty: { asked: rat(1, 2), tolerance: rat(1, 100) } } : {}),
    });
  }
  return out;
}

const quantile = (xs: number[], q: number): number => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(q * xs.length))]!;

function time(reqs: OutputRequest[], run: (r: OutputRequest) => unknown): number[] {
  return reqs.map((r) => {
    let least = Infinity;
    for (let k = 0; k < REPEAT; k++) {
      const t0 = performance.now();
      run(r);
      least = Math.min(least, performance.now() - t0);
    }
    return least;
  });
}

for (const shape of ['sine', 'square'] as const) {
  const reqs = requests(shape);
  const nearest = (r: OutputRequest): unknown => (shape === 'square' ? nearestWholeCycle(hw, r, false) : nearestJitterFree(hw, r));
  time(reqs, (r) => planOutputUncached(hw, r)); // warm-up
  const before = time(reqs, nearest);
  const after = time(reqs, (r) => planOutputUncached(hw, r));
  const line = (label: string, ms: number[]): string =>
    `${label.padEnd(44)} median ${quantile(ms, 0.5).toFixed(3)} ms  p95 ${quantile(ms, 0.95).toFixed(3)} ms  max ${Math.max(...ms).toFixed(2)} ms  ≤ 2 ms: ${ms.filter((x) => x <= 2).length}/${ms.length}`;
  console.log(`${shape}, ${TARGETS} targets 1 Hz…2 MHz, ${fullDomainText(FRACTION_BITS)}, ±50 ppm:`);
  console.log(line('  nearest plan alone (the search before)', before));
  console.log(line('  planOutput: ranking + figures (now)', after));
  // Within the share of a 500-output file's work (planning/work.ts), realistic outputs still finish.
  planningCache.clear();
  const share = stepsPerOutput(500);
  const limited = reqs.filter((r) => planOutput(hw, r, share).plan?.searchLimited).length;
  console.log(`  proven within a 500-output file's share of ${share} steps: ${reqs.length - limited}/${reqs.length}`);
}

// The fractional search runs only when its plan is read (OutputPlanning.bestFractional): the same
// outputs with and without reading it, as every output paid before it was lazy.
{
  const reqs = requests('sine');
  const lazyMs = time(reqs, (r) => planOutputUncached(hw, r));
  const eagerMs = time(reqs, (r) => planOutputUncached(hw, r).bestFractional);
  const sum = (xs: number[]): number => xs.reduce((a, b) => a + b, 0);
  console.log(`fractional search only when read: ${sum(lazyMs).toFixed(1)} ms for ${reqs.length} sines, ${sum(eagerMs).toFixed(1)} ms reading bestFractional too (×${(sum(eagerMs) / sum(lazyMs)).toFixed(2)})`);
}
