// One memory budget for the board (server/src/planning/board.ts) against exhaustive search over
// every combination of every output's plans (each plan of its divider kind within tolerance, S ≥
// the floor, no more bytes than its own plan), ranked by the documented objective: the largest
// smallest share of S_own, then the smallest worst error share, then the fewest bytes.

import { describe, expect, it } from 'vitest';
import { type Rational, abs, add, cmp, div, floor, mul, rat, sub } from '../../../shared-schema/src/rational';
import { fitBoard, type BoardOutput } from '../../../server/src/planning/board';
import { planOutputUncached, preferenceOf } from '../../../server/src/planning/choose';
import { ShrinkMenu } from '../../../server/src/planning/shrink';
import type { Hardware, OutputRequest, Plan } from '../../../server/src/planning/types';
import { seededRandom } from '../../support/seeded';

interface Triple {
  share: Rational;
  error: Rational;
  bytes: number;
}

const minR = (a: Rational, b: Rational): Rational => (cmp(a, b) <= 0 ? a : b);
const maxR = (a: Rational, b: Rational): Rational => (cmp(a, b) >= 0 ? a : b);

/** Every plan an output could shrink to, by brute force: (share of S_own, error share, bytes), duplicates removed. */
function oracleMenu(hw: Hardware, req: OutputRequest, own: Plan): Triple[] {
  const k = own.dividerFraction !== 0 ? hw.divider.fractionBits : 0;
  const sOwn = div(rat(own.tableLength), own.cycles);
  const seen = new Map<string, Triple>();
  for (let I = hw.divider.integerMin; I <= hw.divider.integerMax; I++) {
    for (let F = 0; F < 2 ** k; F++) {
      const d = add(rat(I), rat(F, 2 ** k));
      if (cmp(div(hw.systemClockHz, d), hw.dac.maxSampleRateHz) > 0) continue;
      for (let N = Math.max(1, hw.memory.tableLengthMin); N <= own.tableLength; N++) {
        if (hw.memory.powerOfTwo && (N & (N - 1)) !== 0) continue;
        const mMax = Number(floor(div(rat(N), req.minSamplesPerCycle)));
        for (let M = 1; M <= mMax; M++) {
          if (req.wholeSamplesPerCycle && N % M !== 0) continue;
          const f = div(mul(hw.systemClockHz, rat(M)), mul(d, rat(N)));
          const err = abs(sub(f, req.targetHz));
          if (cmp(err, req.toleranceHz) > 0) continue;
          const s = rat(N, M);
          const t = { share: minR(div(s, sOwn), rat(1)), error: req.toleranceHz.num === 0n ? rat(0) : div(err, req.toleranceHz), bytes: N * hw.dac.sampleBytes };
          seen.set(`${t.share.num}/${t.share.den} ${t.error.num}/${t.error.den} ${t.bytes}`, t);
        }
      }
    }
  }
  return [...seen.values()];
}

/** The best combination by the objective, or null when none fits. */
function oracleBoard(menus: Triple[][], fixed: number, budget: number): Triple | null {
  let best: Triple | null = null;
  const walk = (i: number, share: Rational, error: Rational, bytes: number): void => {
    if (bytes + fixed > budget) return;
    if (i === menus.length) {
      const t = { share, error, bytes: bytes + fixed };
      if (best === null || cmp(t.share, best.share) > 0 || (cmp(t.share, best.share) === 0 && (cmp(t.error, best.error) < 0 || (cmp(t.error, best.error) === 0 && t.bytes < best.bytes)))) best = t;
      return;
    }
    for (const t of menus[i]!) walk(i + 1, minR(share, t.share), maxR(error, t.error), bytes + t.bytes);
  };
  walk(0, rat(1), rat(0), 0);
  return best;
}

function randomBoard(rnd: () => number) {
  const int = (lo: number, hi: number): number => lo + Math.floor(rnd() * (hi - lo + 1));
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rnd() * xs.length)]!;
  const systemClockHz = rat(int(10_000, 200_000));
  const integerMin = pick([1, 1, 2]);
  const hw: Hardware = {
    systemClockHz,
    divider: { integerMin, integerMax: integerMin + int(2, 14), fractionBits: pick([0, 0, 0, 1, 2]) },
    dac: { bits: 8, sampleBytes: pick([1, 2]), fullScaleV: 3.3, maxSampleRateHz: systemClockHz },
    memory: { budgetBytes: 1 << 20, tableLengthMin: int(1, 8), tableLengthMax: int(24, 90), powerOfTwo: rnd() < 0.1 },
  };
  const count = pick([2, 2, 3]);
  const reqs: OutputRequest[] = [];
  for (let i = 0; i < count; i++) {
    const square = rnd() < 0.3;
    const d = int(hw.divider.integerMin, hw.divider.integerMax);
    const targetHz = rnd() < 0.6 ? div(systemClockHz, rat(d * int(4, hw.memory.tableLengthMax))) : div(mul(systemClockHz, rat(int(1, 50))), rat(int(200, 20_000)));
    reqs.push({
      targetHz,
      minSamplesPerCycle: rat(pick([2, 3, 4])),
      wholeSamplesPerCycle: square,
      waveform: { shape: square ? 'square' : 'sine', duty: 0.5, amplitudeVpp: 3, offsetV: 1.65 },
      toleranceHz: mul(targetHz, pick([rat(0), rat(1, 1000), rat(1, 100), rat(1, 20)])),
      jitter: pick(['forbid', 'forbid', 'allow']),
      maxSamplesPerCycle: rat(int(4, 80)),
    });
  }
  return { hw, reqs };
}

describe('board budget = exhaustive search over every combination of the outputs\' plans (oracle: brute force in this file)', () => {
  it('reaches the same objective on 300 seeded small boards, or finds no fit exactly when none exists', () => {
    const rnd = seededRandom(0xb0a4d);
    const mismatches: string[] = [];
    const tally = { shrunk: 0, none: 0, keptOwn: 0 };
    for (let b = 0; b < 300; b++) {
      const { hw, reqs } = randomBoard(rnd);
      const planned = reqs.map((r) => planOutputUncached(hw, r));
      const outputs: BoardOutput[] = planned.map((p, i) => {
        const req = reqs[i]!;
        const shrinkable = p.plan !== null && p.withinTolerance;
        const pref = preferenceOf(req, hw);
        return {
          bytes: p.plan?.tableBytes ?? 0,
          pref,
          menu: shrinkable ? new ShrinkMenu(hw, req.targetHz, req.minSamplesPerCycle, pref, p.plan!, req.wholeSamplesPerCycle === true, null) : null,
        };
      });
      const own = outputs.reduce((t, o) => t + o.bytes, 0);
      const fixed = outputs.reduce((t, o) => t + (o.menu === null ? o.bytes : 0), 0);
      const menus = planned.flatMap((p, i) => (outputs[i]!.menu ? [oracleMenu(hw, reqs[i]!, p.plan!)] : []));
      const leastOracle = fixed + menus.reduce((t, m) => t + Math.min(...m.map((x) => x.bytes)), 0);
      const budget = Math.max(1, leastOracle + Math.floor(rnd() * (own - leastOracle + 2)) - (rnd() < 0.15 ? 1 : 0));
      const fit = fitBoard(outputs, budget);
      if (own <= budget) {
        if (fit.over) mismatches.push(`#${b}: not over budget but shrunk`);
        tally.keptOwn++;
        continue;
      }
      const oracle = oracleBoard(menus, fixed, budget);
      if (fit.leastBytes !== leastOracle) mismatches.push(`#${b}: least ${fit.leastBytes} vs oracle ${leastOracle}`);
      if (oracle === null) {
        tally.none++;
        if (fit.fits) mismatches.push(`#${b}: fits but the oracle finds no combination`);
        continue;
      }
      tally.shrunk++;
      if (!fit.fits) {
        mismatches.push(`#${b}: no fit but the oracle has one`);
        continue;
      }
      const got = `${fit.minShare!.num}/${fit.minShare!.den} ${fit.worstErrorShare!.num}/${fit.worstErrorShare!.den} ${fit.totalBytes}`;
      const want = `${oracle.share.num}/${oracle.share.den} ${oracle.error.num}/${oracle.error.den} ${oracle.bytes}`;
      if (got !== want) mismatches.push(`#${b}: ${got} vs oracle ${want}`);
      // The plans it names reach that objective and fit.
      let total = 0;
      fit.plans.forEach((p, i) => {
        const plan = p ?? planned[i]!.plan;
        total += plan ? plan.tableLength * hw.dac.sampleBytes : 0;
        if (p && cmp(abs(p.errorHz), reqs[i]!.toleranceHz) > 0) mismatches.push(`#${b}: output ${i} outside tolerance`);
      });
      if (total !== fit.totalBytes) mismatches.push(`#${b}: plans take ${total} B, reported ${fit.totalBytes} B`);
    }
    console.log(`board budget vs exhaustive: 300 boards, ${tally.shrunk} shrunk to fit, ${tally.none} with no fit, ${tally.keptOwn} within budget as planned; ${mismatches.length} mismatches`);
    expect(mismatches.slice(0, 10)).toEqual([]);
    expect(tally.shrunk).toBeGreaterThan(100);
    expect(tally.none).toBeGreaterThan(10);
  });
});
