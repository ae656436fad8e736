// Time per output of the signal figures, on the planner benchmark's invented board: the exact
// path (one transform of the whole period), the analytic path (the same plans with the transform
// refused: table bins + the jitter term line by line) and the estimate the diagnostics read on
// every edit. Run: npx tsx bench/signal.ts (TARGETS=200, REPEAT=3; the least of REPEAT kept,
// as in bench/plan.ts, and the three paths timed on alternate calls so they see the same load).

import { parseDecimal, rat, toNumber } from '../shared-schema/src/rational';
import { planOutputUncached } from '../server/src/planning/choose';
import { buildTable } from '../server/src/planning/table';
import type { Hardware, OutputRequest, PlanFigures } from '../server/src/planning/types';
import { analyseSignal } from '../server/src/signal/signal-figures';
import { seededRandom } from '../test/support/seeded';
import { analyze } from '../server/src/spec/analyze';
import { floorOf, signalRows } from '../server/src/cli/signal-rows';
import { estimateOfPlan, outputSignal, QUICK_SPECTRUM } from '../server/src/signal/output-signal';
import { spectrumPicture } from '../server/src/signal/spectrum-picture';
import { spectrumSvg } from '../server/src/render/spectrum';

const SYSTEM_CLOCK_HZ = 245_760_000;
const hw: Hardware = {
  systemClockHz: rat(SYSTEM_CLOCK_HZ),
  divider: { integerMin: 1, integerMax: 2 ** 18 - 1, fractionBits: 6 },
  dac: { bits: 12, sampleBytes: 2, fullScaleV: 3.3, maxSampleRateHz: rat(SYSTEM_CLOCK_HZ) },
  memory: { budgetBytes: 64 * 1024, tableLengthMin: 16, tableLengthMax: 2 ** 14 - 1, powerOfTwo: false },
};

const TARGETS = Number(process.env.TARGETS ?? 200);
const REPEAT = Math.max(1, Number(process.env.REPEAT ?? 3));
const rnd = seededRandom(0x5e11a);
const cases: { req: OutputRequest; plan: PlanFigures }[] = [];
for (let i = 0; cases.length < TARGETS && i < TARGETS * 4; i++) {
  const hz = 10 ** (rnd() * Math.log10(2e7));
  const amp = (3.3 * 4095) / 4096;
  const req: OutputRequest = {
    targetHz: parseDecimal(hz.toPrecision(6))!,
    minSamplesPerCycle: rat(8),
    waveform: { shape: 'sine', duty: 0.5, amplitudeVpp: amp, offsetV: amp / 2 },
    toleranceHz: rat(0),
    // Half the targets take the fractional plan, so both the jitter-free and the jittered stream are timed.
    jitter: i % 2 === 0 ? 'forbid' : 'allow',
  };
  const planning = planOutputUncached(hw, req);
  const plan = i % 2 === 0 ? planning.nearestJitterFree : planning.bestFractional;
  if (plan) cases.push({ req, plan });
}

const quantile = (xs: number[], q: number) => [...xs].sort((a, b) => a - b)[Math.min(xs.length - 1, Math.floor(q * xs.length))]!;

const times = { exact: [] as number[], analytic: [] as number[], estimate: [] as number[] };
let exactCount = 0;
for (const { req, plan } of cases) {
  const least = { exact: Infinity, analytic: Infinity, estimate: Infinity };
  for (let k = 0; k < REPEAT; k++) {
    for (const path of ['exact', 'analytic', 'estimate'] as const) {
      const t0 = performance.now();
      if (path === 'estimate') estimateOfPlan(hw, req, plan);
      else {
        const codes = buildTable(req.waveform, hw.dac, plan.tableLength, plan.cycles, 'open');
        const a = analyseSignal(
          {
            codes,
            cycles: plan.cycles,
            span: 'open',
            dividerInteger: plan.dividerInteger,
            dividerFraction: plan.dividerFraction,
            fractionBits: plan.fractionBits,
            shape: 'sine',
            sampleRateHz: toNumber(plan.sampleRateHz),
            achievedHz: toNumber(plan.achievedHz),
          },
          path === 'analytic' ? { maxTransformPoints: 1 } : {},
        );
        if (path === 'exact' && k === 0 && a.figures.method === 'exact') exactCount++;
      }
      least[path] = Math.min(least[path], performance.now() - t0);
    }
  }
  for (const path of ['exact', 'analytic', 'estimate'] as const) times[path].push(least[path]);
}

console.log(`signal figures per output: ${cases.length} outputs (${exactCount} transformed exactly by default; tables up to ${hw.memory.tableLengthMax} samples, ${hw.divider.fractionBits} fraction bits)`);
for (const path of ['exact', 'analytic', 'estimate'] as const) {
  const ms = times[path];
  console.log(`  ${path.padEnd(9)} median ${quantile(ms, 0.5).toFixed(3)} ms  p95 ${quantile(ms, 0.95).toFixed(3)} ms  max ${Math.max(...ms).toFixed(3)} ms`);
}
console.log(`  ratio exact/estimate (medians) ${(quantile(times.exact, 0.5) / quantile(times.estimate, 0.5)).toFixed(0)}×`);

// What a hover adds per output: the signal rows and the spectrum picture, cold (first hover of a
// plan), on the language-server benchmark's board and mix of outputs (bench/lsp.ts).
{
  const clock = 'system-clock: 245.76 MHz\ndivider:\n  integer: { min: 1, max: 262143 }\n  fraction-bits: 6\ndac:\n  bits: 12\n  sample-bytes: 2\n  full-scale: 3.3 V\n  max-sample-rate: 25 MHz\nmemory:\n  budget: 4 MiB\n  table-length: { min: 32, max: 8192 }\n';
  const r = seededRandom(0x1ab);
  const shapes = ['sine', 'square', 'triangle', 'sawtooth'];
  const lines = ['clock: ./b.clock.yaml', 'outputs:'];
  for (let i = 0; i < TARGETS; i++) {
    lines.push(`  out-${i}:`, `    shape: ${shapes[i % 4]}`, `    frequency: ${(10 ** (2 + r() * 4)).toFixed(3)} Hz`);
    lines.push(i % 10 === 7 ? '    tolerance: 0.01 ppm\n    jitter: allow' : '    tolerance: 50 ppm');
  }
  const wave = lines.join('\n') + '\n';
  const analysis = analyze('/b/b.wave.yaml', wave, { readFile: (p: string) => (p.endsWith('.clock.yaml') ? clock : p.endsWith('.wave.yaml') ? wave : undefined) });
  const hw = analysis.hardware!;
  const ms: number[] = [];
  const cpu: number[] = [];
  for (const o of analysis.outputs) {
    const plan = o.planning.plan;
    if (!plan) continue;
    // CPU time of this process (user + system), steadier than the wall clock on a shared machine.
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    signalRows(hw, o.request, plan, floorOf(o, hw), QUICK_SPECTRUM);
    const a = outputSignal(hw, o.request, plan, QUICK_SPECTRUM);
    if (a) spectrumSvg(spectrumPicture(a, floorOf(o, hw).sfdrDb));
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
    ms.push(performance.now() - t0);
  }
  console.log(`hover's signal rows + spectrum picture, cold, ${ms.length} outputs of the language-server mix:`);
  console.log(`  wall median ${quantile(ms, 0.5).toFixed(3)} ms  p95 ${quantile(ms, 0.95).toFixed(3)} ms  max ${Math.max(...ms).toFixed(3)} ms`);
  console.log(`  CPU  median ${quantile(cpu, 0.5).toFixed(3)} ms  p95 ${quantile(cpu, 0.95).toFixed(3)} ms  max ${Math.max(...cpu).toFixed(3)} ms`);
}
