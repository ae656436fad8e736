// The hand-built analyses of the formatter tests are true: the planning engine, run on the board
// they describe, reports the same verdicts and the same figures (exact values equal, floating
// figures to 12 digits), and the memory total is the sum of the tables (derived).

import { describe, expect, it } from 'vitest';
import { planOutputUncached } from '../../server/src/planning/choose';
import type { PlanFigures } from '../../server/src/planning/types';
import { HAND_BUILT_HARDWARE, handBuiltWave } from './hand-built';

const analysis = handBuiltWave('/abs/rig/tones.wave.yaml');

function expectSameFigures(hand: PlanFigures | null, engine: PlanFigures | null, label: string): void {
  if (hand === null || engine === null) {
    expect(engine, label).toBe(hand);
    return;
  }
  const { jitter: hj, seam: hs, errorPpm: hp, ...handExact } = hand;
  const { jitter: ej, seam: es, errorPpm: ep, searchLimited, ...engineExact } = engine as PlanFigures & { searchLimited?: true };
  expect(searchLimited, label).toBeUndefined();
  expect(handExact, label).toEqual(engineExact);
  expect(hs, label).toEqual(es);
  expect(hp, label).toBeCloseTo(ep, 9);
  for (const key of Object.keys(ej) as (keyof typeof ej)[]) {
    const h = hj[key];
    const e = ej[key];
    if (Array.isArray(h) && Array.isArray(e)) {
      expect(h.length, `${label} ${key}`).toBe(e.length);
      h.forEach((v, i) => expect(v / e[i]!, `${label} ${key}[${i}]`).toBeCloseTo(1, 12));
    } else if (typeof h === 'number' && typeof e === 'number' && e !== 0) {
      expect(h / e, `${label} ${key}`).toBeCloseTo(1, 12);
    } else {
      expect(h, `${label} ${key}`).toBe(e);
    }
  }
}

describe('hand-built analyses agree with the engine on the board they describe', () => {
  it.each(analysis.outputs.map((o) => [o.name, o] as const))('%s', (_name, output) => {
    const engine = planOutputUncached(HAND_BUILT_HARDWARE, output.request);
    expect(engine.verdict).toBe(output.planning.verdict);
    expect(engine.withinTolerance).toBe(output.planning.withinTolerance);
    expectSameFigures(output.planning.plan, engine.plan, 'plan');
    expectSameFigures(output.planning.nearestJitterFree, engine.nearestJitterFree, 'nearest jitter-free');
  });

  it('the fractional plan has the TIE its closed forms give: 7.875 ns pk-pk, 2.309 ns RMS (derived)', () => {
    const plan = analysis.outputs[1]!.planning.plan!;
    expect(plan.jitter.tiePkPkS * 1e9).toBeCloseTo(7.875, 9);
    expect(plan.jitter.tieRmsS * 1e9).toBeCloseTo(2.3091, 4);
  });

  it('the memory total is the sum of the planned tables', () => {
    const used = analysis.outputs.reduce((a, o) => a + (o.planning.plan?.tableBytes ?? 0), 0);
    expect(analysis.memory).toEqual({ usedBytes: used, budgetBytes: HAND_BUILT_HARDWARE.memory.budgetBytes });
  });
});
